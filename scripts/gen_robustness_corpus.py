#!/usr/bin/env python3
"""Writes the robustness part of tests/bad_inputs/ (issue 9): one file per case, each a small
variation of a valid design file, and prints the matching CASES rows for tests/bad_input.rs.
Run from the repository root: python3 scripts/gen_robustness_corpus.py"""

BASE = '''[site]
name = "Corpus test pit"
ground_level = "10.0 m"

[aquifer]
kind = "unconfined"
conductivity = "2e-4 m/s"
base_level = "-6.0 m"
groundwater_level = "8.5 m"
specific_yield = 0.15

[[excavation]]
name = "Pit A"
outline = [[0, 0], [30, 0], [30, 20], [0, 20]]
formation_level = "5.0 m"
target_margin = "0.5 m"

[influence]
method = "sichardt"

[wells]
radius = "0.15 m"
'''

NEIGHBOUR = '''
[[neighbour]]
name = "North terrace"
footprint = [[0, 40], [30, 40], [30, 52], [0, 52]]
allowable_settlement = "25 mm"

[[neighbour.layer]]
name = "soft clay"
thickness = "4 m"
m_v = "3e-4 1/kPa"
'''

def sub(old, new, text=BASE):
    assert old in text, old
    return text.replace(old, new, 1)

def big_points(n, base):
    return base + "".join(f'\n[[checks.point]]\nname = "P{i}"\nx = {i % 100}\ny = {i // 100}\n' for i in range(n))

cases = []  # (file, comment, text, field-kind, field, valid, line_at)
def case(file, comment, text, field, valid, line_at=None, kind="Slot"):
    cases.append((file, comment, text, kind, field, valid, line_at))

# Overflow or out of range once the unit is applied.
case("level_in_km_overflows.toml", "a ground level in kilometres near the largest double",
     sub('ground_level = "10.0 m"', 'ground_level = "1e306 km"'), "ground_level", "beyond the largest length", 'ground_level = ')
case("conductivity_overflows_in_cm_per_s.toml", "a conductivity that overflows in cm/s",
     sub('conductivity = "2e-4 m/s"', 'conductivity = "1e307 cm/s"'), "conductivity", "beyond the largest hydraulic conductivity", 'conductivity = ')
case("conductivity_below_any_soil.toml", "a conductivity of 1e-20 m/s",
     sub('conductivity = "2e-4 m/s"', 'conductivity = "1e-20 m/s"'), "conductivity", "below the smallest non-zero hydraulic conductivity", 'conductivity = ')
case("rate_overflows_in_m3_per_h.toml", "a listed well rate that is enormous in m3/h",
     BASE + '\n[[well]]\nname = "W1"\nx = -5\ny = 10\nrate = "1e300 m3/h"\n', "rate", "beyond the largest flow rate", 'rate = "1e300')
case("pumping_time_overflows_in_weeks.toml", "a Cooper-Jacob pumping time of 1e306 weeks",
     sub('method = "sichardt"', 'method = "cooper-jacob"\npumping_time = "1e306 weeks"'), "pumping_time", "beyond the largest duration", 'pumping_time = ')
case("compressibility_absurd.toml", "a coefficient of volume compressibility of 1e300 1/kPa",
     sub('m_v = "3e-4 1/kPa"', 'm_v = "1e300 1/kPa"', BASE + NEIGHBOUR), "m_v", "beyond the largest coefficient of volume compressibility", 'm_v = ')
case("layer_thickness_1e300_m.toml", "a neighbour layer 1e300 m thick",
     sub('thickness = "4 m"', 'thickness = "1e300 m"', BASE + NEIGHBOUR), "thickness", "beyond the largest length", 'thickness = ')
case("well_radius_a_nanometre.toml", "a well radius of a nanometre",
     sub('radius = "0.15 m"', 'radius = "1e-9 m"'), "radius", "below the smallest non-zero length", 'radius = ')
case("soil_weight_overflows.toml", "an uplift soil unit weight of 1e9 kN/m3",
     BASE + '\n[uplift]\nlayer_top = "2.0 m"\npiezometric_level = "8.0 m"\nsoil_unit_weight = "1e9 kN/m3"\n', "soil_unit_weight", "beyond the largest unit weight", 'soil_unit_weight = ')
case("groundwater_level_50_km.toml", "a groundwater level 50 km above datum",
     sub('groundwater_level = "8.5 m"', 'groundwater_level = "5e4 m"'), "aquifer.groundwater_level", "of the datum", 'groundwater_level = ')
case("formation_level_minus_20_km.toml", "a formation level 20 km below datum",
     sub('formation_level = "5.0 m"', 'formation_level = "-2e4 m"'), "excavation[1].formation_level", "of the datum", 'formation_level = ')
case("piezometric_level_far.toml", "an uplift piezometric level 90 km up",
     BASE + '\n[uplift]\nlayer_top = "2.0 m"\npiezometric_level = "9e4 m"\nsoil_unit_weight = "20 kN/m3"\n', "uplift.piezometric_level", "of the datum", 'piezometric_level = ')
case("sichardt_c_1e300.toml", "a Sichardt coefficient of 1e300",
     sub('method = "sichardt"', 'method = "sichardt"\nsichardt_c = 1e300'), "influence.sichardt_c", "outside what a site can have")
case("storativity_infinite.toml", "a storativity of inf",
     sub('specific_yield = 0.15', 'specific_yield = 0.15\nstorativity = inf'), "aquifer.storativity", "outside what a site can have")
case("trench_aspect_1e300.toml", "a trench aspect ratio of 1e300",
     BASE + '\n[allowances]\ntrench_aspect_ratio = 1e300\n', "allowances.trench_aspect_ratio", "outside what a site can have")
case("compression_index_1e300.toml", "a compression index of 1e300",
     sub('m_v = "3e-4 1/kPa"', 'c_c = 1e300\ne0 = 0.9\nsigma0 = "60 kPa"', BASE + NEIGHBOUR), "neighbour[1].layer[1].c_c", "outside what a site can have")

# Derived quantities that collapse to zero.
case("distance_of_influence_collapses.toml", "a Sichardt coefficient so small the distance of influence is zero",
     sub('method = "sichardt"', 'method = "sichardt"\nsichardt_c = 1e-300'), "influence", "distance of influence")
case("fixed_distance_a_millimetre.toml", "a fixed distance of influence of 1 mm",
     sub('method = "sichardt"', 'method = "fixed"\ndistance = "1 mm"'), "influence", "distance of influence")
case("leakage_factor_near_zero.toml", "a leakage factor of 10 micrometres",
     sub('kind = "unconfined"', 'kind = "leaky"\ntop_level = "0.0 m"\nleakage_factor = "1e-5 m"', sub('specific_yield = 0.15', 'storativity = 2e-4')),
     "aquifer.leakage_factor", "below 0.1 m")
case("aquitard_resistance_a_millisecond.toml", "an aquitard resistance of a millisecond, so B is about a millimetre",
     sub('kind = "unconfined"', 'kind = "leaky"\ntop_level = "0.0 m"\naquitard_resistance = "1e-3 s"', sub('specific_yield = 0.15', 'storativity = 2e-4')),
     "aquifer.leakage_factor", "below 0.1 m")
case("cooper_jacob_instant.toml", "a Cooper-Jacob pumping time of a millisecond",
     sub('method = "sichardt"', 'method = "cooper-jacob"\npumping_time = "1e-3 s"'), "influence", "distance of influence")

# Huge counts.
case("ring_of_a_billion_wells.toml", "a ring of 1e9 wells",
     BASE + '\n[layout]\nkind = "ring"\ncount = 1000000000\nrate = "2 L/s"\n', "layout.count", "give a smaller count")
case("standby_a_hundred_million.toml", "1e8 standby wells",
     sub('radius = "0.15 m"', 'radius = "0.15 m"\nstandby = 100000000'), "wells.standby", "usual 1 … 3")
case("grid_of_a_kilometre_pit_at_0_1_m.toml", "a 1 km pit with a 0.1 m check-point grid",
     sub('outline = [[0, 0], [30, 0], [30, 20], [0, 20]]', 'outline = [[0, 0], [1000, 0], [1000, 1000], [0, 1000]]') + '\n[checks]\ngrid_spacing = "0.1 m"\n',
     "checks.grid_spacing", "give a larger checks.grid_spacing")
case("neighbour_with_300_layers.toml", "a neighbour with 300 soil layers",
     BASE + NEIGHBOUR + "".join(f'\n[[neighbour.layer]]\nname = "layer {i}"\nthickness = "1 m"\nincompressible = true\n' for i in range(299)),
     "neighbour[1].layer", "give fewer soil layers")
# 11 000 named check points: generated in tests/robustness.rs (too large to commit).

# Far coordinates.
case("outline_at_1e300.toml", "an outline with corners near 1e300 m",
     sub('outline = [[0, 0], [30, 0], [30, 20], [0, 20]]', 'outline = [[1e300, 0], [1.0000001e300, 0], [1.0000001e300, 20], [1e300, 20]]'),
     "excavation[1].outline", "beyond ±1e7 m", 'outline = ')
case("outline_at_1e154.toml", "an outline near 1e154 m, where a ring would move wells forever",
     sub('outline = [[0, 0], [30, 0], [30, 20], [0, 20]]', 'outline = [[1e154, 1e154], [1.00000001e154, 1e154], [1.00000001e154, 1.00000001e154]]'),
     "excavation[1].outline", "projected coordinates", 'outline = ')
case("listed_well_at_1e154.toml", "a listed well at x = 1e154 m",
     BASE + '\n[[well]]\nname = "W1"\nx = 1e154\ny = 10\nrate = "2 L/s"\n', "well[1].x", "beyond ±1e7 m")
case("named_point_at_1e300.toml", "a named check point at 1e300 m",
     BASE + '\n[[checks.point]]\nname = "Gate"\nx = 1e300\ny = 5\n', "checks.point[1].x", "beyond ±1e7 m")
case("boundary_points_at_1e300.toml", "a boundary line given by points at ±1e300 m",
     BASE + '\n[[boundary]]\nname = "River"\nkind = "constant-head"\nline = [[-1e300, -100], [1e300, -100]]\n', "boundary[1].line", "beyond ±1e7 m", 'line = [[-1e300')
case("footprint_far_away.toml", "a neighbour footprint 1e12 m away",
     sub('footprint = [[0, 40], [30, 40], [30, 52], [0, 52]]', 'footprint = [[1e12, 40], [30, 40], [30, 52], [0, 52]]', BASE + NEIGHBOUR),
     "neighbour[1].footprint", "beyond ±1e7 m", 'footprint = ')
case("keep_out_far_away.toml", "a keep-out zone 1e9 m away",
     BASE + '\n[[keep_out]]\nname = "Crane"\noutline = [[1e9, 0], [1e9, 5], [5, 5]]\n', "keep_out[1].outline", "beyond ±1e7 m", 'outline = [[1e9')
case("centre_line_far_away.toml", "a trench centre line at 1e200 m",
     BASE + '\n[layout]\nkind = "line"\nspacing = "1.5 m"\ncentre_line = [[0, 10], [1e200, 10]]\n', "layout.centre_line", "beyond ±1e7 m", 'centre_line = ')

# Control characters and reserved words in names.
case("site_name_with_escape_codes.toml", "a site name with a terminal escape sequence",
     sub('name = "Corpus test pit"', 'name = "Corpus \\u001b[31mtest\\u001b[0m pit"'), "site.name", "control character")
case("excavation_name_with_newline.toml", "an excavation name with a newline",
     sub('name = "Pit A"', 'name = "Pit\\nA"'), "excavation[1].name", "control character")
case("well_name_with_tab.toml", "a listed well name with a tab",
     BASE + '\n[[well]]\nname = "W\\t1"\nx = -5\ny = 10\nrate = "2 L/s"\n', "well[1].name", "control character")
case("neighbour_name_with_bell.toml", "a neighbour name with a bell character",
     sub('name = "North terrace"', 'name = "North\\u0007terrace"', BASE + NEIGHBOUR), "neighbour[1].name", "control character")
case("layer_name_with_carriage_return.toml", "a soil layer name with a carriage return",
     sub('name = "soft clay"', 'name = "soft\\rclay"', BASE + NEIGHBOUR), "neighbour[1].layer[1].name", "control character")
case("boundary_name_with_delete.toml", "a boundary name with a DEL character",
     BASE + '\n[[boundary]]\nname = "River\\u007f"\nkind = "constant-head"\nline = [[-50, -100], [-50, 100]]\n', "boundary[1].name", "control character")
case("point_name_with_nul.toml", "a named point whose name holds an escaped NUL",
     BASE + '\n[[checks.point]]\nname = "Gate\\u0000"\nx = 50\ny = 5\n', "checks.point[1].name", "control character")
case("keep_out_name_with_escape.toml", "a keep-out name with an escape character",
     BASE + '\n[[keep_out]]\nname = "\\u001bCrane"\noutline = [[40, 0], [45, 0], [45, 5]]\n', "keep_out[1].name", "control character")
case("datum_with_form_feed.toml", "a datum text with a form feed",
     sub('ground_level = "10.0 m"', 'ground_level = "10.0 m"\ndatum = "OD\\f"'), "site.datum", "control character")
case("site_name_is_nan.toml", "a site called NaN",
     sub('name = "Corpus test pit"', 'name = "NaN"'), "site.name", "choose another name")
case("site_name_too_long.toml", "a site name of 300 characters",
     sub('name = "Corpus test pit"', 'name = "' + "x" * 300 + '"'), "site.name", "shorten it")

if __name__ == "__main__":
    import pathlib
    d = pathlib.Path("tests/bad_inputs")
    for file, comment, text, kind, field, valid, line_at in cases:
        (d / file).write_text(f"# Malformed on purpose: {comment}.\n{text}")
        la = "None" if line_at is None else 'Some(' + '"' + line_at.replace('"', '\\"') + '")'
        print(f'    case("{file}", {kind}("{field}"), "{valid}", {la}),')
