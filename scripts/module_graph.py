#!/usr/bin/env python3
"""Module dependencies of drydig read from the source, not by eye.

Every `crate::a::b::…` path in code (comments skipped) and every `super::…` path is resolved to
the longest prefix that is a module file under src/; group imports (`use crate::{a, b::c}`,
`use super::{a, b}`, `use super::super::x::{y, z}`) are read item by item. An edge A → B means
module A names something of module B. Prints the stages in order and fails (exit 1) when
  - modules import each other in a loop (a strongly connected component of more than one), or
  - a source file in src/ is longer than 800 lines, or
  - a module under report/ names an engine function (see REPORT_RULE below): report/ formats the
    findings and calls no engine stage.
Usage: python3 scripts/module_graph.py [--edges]
"""
import pathlib, re, sys

ROOT = pathlib.Path(__file__).resolve().parent.parent / "src"
MAX_LINES = 800

def module_of(path):
    rel = path.relative_to(ROOT).with_suffix("")
    parts = list(rel.parts)
    if parts[-1] in ("mod", "lib", "main"):
        parts = parts[:-1]
    return tuple(parts)

files = {module_of(p): p for p in ROOT.rglob("*.rs")}
modules = set(files)

def resolve(segments):
    for k in range(len(segments), 0, -1):
        if tuple(segments[:k]) in modules:
            return tuple(segments[:k])
    return None

PATH = re.compile(r"\b(crate|super)((?:::[A-Za-z_][A-Za-z0-9_]*)+)")
GROUP = re.compile(r"\b(crate|super)((?:::[A-Za-z_][A-Za-z0-9_]*)*)::\{([^{}]*)\}")

# REPORT_RULE. report/ reads the findings (src/findings/) and formats them; it makes no engine
# call. From the engine stages below it may name only data: types and their variants (CamelCase),
# constants (UPPER_CASE), and the few pure text or geometry helpers in REPORT_ALLOWED (they read
# a value and compute nothing of the design). Naming an engine module itself (`use
# crate::safety::neighbours;`, `{self, …}`) is refused too, because it opens every function.
ENGINE = {"check", "safety", "optimise", "transient", "test_analysis", "field", "physics", "estimate"}
REPORT_ALLOWED = {
    ("field", "wells_csv", "csv_text"),          # quoting rule of the wells CSV
    ("field", "checkpoints", "inside_point"),    # a label anchor inside an outline (geometry)
    ("field", "checkpoints", "design_target"),   # which target a point is held to (a lookup)
    ("check", "section", "well_band"),           # the drawn width of a well on the section
    ("optimise", "standby", "is_standby"),       # reads the well's standby flag
    ("input", "validate", "programme", "map_file_name"),
    # The fit written as design-file lines (text the design file reads back, kept beside the fit).
    ("test_analysis", "aquifer_lines_in"),
}
# Engine calls report/ still makes, each named with why it is still there; the list may only
# shrink. The map's detail panel computes its finer grid over a window chosen from the page
# geometry.
REPORT_KNOWN = {
    ("report", "map", "inset"): {"field::grid::LevelGrid::compute"},
}

def is_data(name):
    return name[:1].isupper()

edges = {m: set() for m in modules}
report_problems = []
imported_types = {}  # report module → engine types it names (associated functions checked below)

def absolute(mod, is_dir_mod, kind, segs):
    """The absolute segments of a path starting with `crate` or `super` (`segs` without that
    first word; the first `super` is the folder of a plain file, the folder itself for mod.rs)."""
    if kind == "crate":
        return segs
    base = list(mod if is_dir_mod else mod[:-1])
    while segs and segs[0] == "super":
        base, segs = base[:-1], segs[1:]
    return base + segs

def add_edge(mod, full):
    target = resolve(full)
    if target and target != mod and not (mod[: len(target)] == target and len(target) < len(mod)):
        edges[mod].add(target)

def report_check(mod, path, full):
    if not mod or mod[0] != "report" or not full or full[0] not in ENGINE:
        return
    if "::".join(full) in REPORT_KNOWN.get(mod, ()):
        return
    target = resolve(full)
    if target is None:
        return
    rest = full[len(target):]
    if not rest:
        report_problems.append(f"{path.relative_to(ROOT.parent)} names the engine module {'::'.join(full)}")
        return
    if tuple(full) in REPORT_ALLOWED:
        return
    if is_data(rest[0]):
        if len(rest) > 1 and not is_data(rest[1]):
            report_problems.append(f"{path.relative_to(ROOT.parent)} calls the engine: {'::'.join(full)}")
        else:
            imported_types.setdefault(mod, set()).add((rest[0], tuple(full[:len(target) + 1])))
        return
    report_problems.append(f"{path.relative_to(ROOT.parent)} calls the engine: {'::'.join(full)}")

for mod, path in files.items():
    is_dir_mod = path.name == "mod.rs"
    code = "\n".join(l.split("//")[0] for l in path.read_text().splitlines())
    code = code.split("#[cfg(test)]")[0] if mod and mod[0] == "report" else code
    for g in GROUP.finditer(code):
        prefix = [s for s in g.group(2).split("::") if s]
        prefix = absolute(mod, is_dir_mod, g.group(1), prefix)
        for item in g.group(3).split(","):
            segs = [s for s in item.strip().split(" as ")[0].strip().split("::") if s]
            if not segs:
                continue
            full = prefix + ([] if segs == ["self"] else segs)
            add_edge(mod, full)
            report_check(mod, path, full)
    for m in PATH.finditer(code):
        segs = [s for s in m.group(2).split("::") if s]
        full = absolute(mod, is_dir_mod, m.group(1), segs)
        add_edge(mod, full)
        if not code.startswith("::{", m.end()):
            report_check(mod, path, full)

# An engine type named in report/ may be read, not asked to compute: `LevelGrid::for_run(…)`.
for mod, names in imported_types.items():
    path = files[mod]
    code = "\n".join(l.split("//")[0] for l in path.read_text().splitlines()).split("#[cfg(test)]")[0]
    for name, full in names:
        for call in re.finditer(r"\b" + name + r"::([a-z_][A-Za-z0-9_]*)\s*[(<]", code):
            named = "::".join(full + (call.group(1),))
            if full + (call.group(1),) not in REPORT_ALLOWED and named not in REPORT_KNOWN.get(mod, ()):
                report_problems.append(f"{path.relative_to(ROOT.parent)} calls the engine: {'::'.join(full)}::{call.group(1)}")

# Tarjan's strongly connected components.
index, low, stack, on, sccs, counter = {}, {}, [], set(), [], [0]
def strong(v):
    index[v] = low[v] = counter[0]; counter[0] += 1
    stack.append(v); on.add(v)
    for w in edges[v]:
        if w not in index:
            strong(w); low[v] = min(low[v], low[w])
        elif w in on:
            low[v] = min(low[v], index[w])
    if low[v] == index[v]:
        comp = []
        while True:
            w = stack.pop(); on.discard(w); comp.append(w)
            if w == v: break
        sccs.append(comp)
sys.setrecursionlimit(10000)
for v in sorted(modules):
    if v not in index:
        strong(v)

name = lambda m: "::".join(m) or "crate"
failed = False
loops = [c for c in sccs if len(c) > 1]
for c in loops:
    failed = True
    print("import loop:", " ↔ ".join(sorted(name(m) for m in c)))
for problem in sorted(set(report_problems)):
    failed = True
    print("report/ computes:", problem)
for mod, path in sorted(files.items()):
    n = len(path.read_text().splitlines())
    if n > MAX_LINES:
        failed = True
        print(f"too long: {path.relative_to(ROOT.parent)} has {n} lines (limit {MAX_LINES})")
if "--edges" in sys.argv:
    for m in sorted(modules):
        print(f"{name(m):32} → {', '.join(sorted(name(t) for t in edges[m]))}")
print(f"{len(modules)} modules, {sum(len(e) for e in edges.values())} edges, "
      f"{len(loops)} import loops, longest file {max(len(p.read_text().splitlines()) for p in files.values())} lines")
sys.exit(1 if failed else 0)
