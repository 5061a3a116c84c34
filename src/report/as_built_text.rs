//! The lines that say how the wells are taken as built: wellpoint suction from the header,
//! partial penetration and well loss.

use crate::check::run::CheckRun;
use crate::input::model::{WellKind, WellLossSpec};
use crate::input::units::UnitSystem;

/// One paragraph for the terminal, ending in a newline.
pub fn as_built_lines(run: &CheckRun, units: UnitSystem) -> String {
    let m = run.model;
    let l = |x: f64| units.length(x);
    let lu = units.length_unit();
    let mut parts = Vec::new();
    if m.wells.kind == WellKind::Wellpoint {
        parts.push(format!(
            "wellpoint suction: lowest level in a wellpoint {:.2} {lu} = header {:.2} {lu}{} − suction limit {:.2} {lu}",
            l(m.as_built.suction_floor(m.wells.suction_limit)),
            l(m.as_built.header_level),
            if m.as_built.header_given { "" } else { " (ground level, the default)" },
            l(m.wells.suction_limit)
        ));
    }
    if run.field.has_partial_penetration() {
        parts.push(format!(
            "partial penetration: screens short of the saturated thickness ({:.2} {lu}) add the steady correction near each well (uniform flux, cosine modes; K_v/K_h = {}; linearised on the thickness before pumping; each check point at its own target level, uplift points at the top of the pressurised layer, the map at the served excavation's target; in a well its own and the other wells' share averaged over its screen)",
            l(m.aquifer.initial_saturated_thickness()),
            m.as_built.anisotropy
        ));
    }
    match m.as_built.loss {
        WellLossSpec::Jacob(c) => parts.push(format!(
            "well loss: Jacob's C·Q² with C = {c:.0} s²/m⁵, in the well only"
        )),
        WellLossSpec::Efficiency(e) => parts.push(format!(
            "well loss: efficiency {e:.2}: loss = (1/E − 1) × the well's own drawdown at its screen face (its neighbours' share left out), lowering a pumped well and raising a recharge well"
        )),
        WellLossSpec::None => {}
    }
    if parts.is_empty() {
        String::new()
    } else {
        format!("{}\n", parts.join("; "))
    }
}
