#!/usr/bin/env python3
"""Module dependencies of drydig read from the source, not by eye.

Every `crate::a::b::…` path in code (comments skipped) and every `super::…` path is resolved to
the longest prefix that is a module file under src/; an edge A → B means module A names
something of module B. Prints the stages in order and fails (exit 1) when
  - modules import each other in a loop (a strongly connected component of more than one), or
  - a source file in src/ is longer than 800 lines.
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
GROUP = re.compile(r"\bcrate::\{([^}]*)\}")
edges = {m: set() for m in modules}
for mod, path in files.items():
    is_dir_mod = path.name == "mod.rs"
    code = "\n".join(l.split("//")[0] for l in path.read_text().splitlines())
    for g in GROUP.finditer(code):
        for item in g.group(1).split(","):
            segs = [s for s in item.strip().split("::") if s and s != "self"]
            target = resolve(segs) if segs else None
            if target and target != mod:
                edges[mod].add(target)
    for m in PATH.finditer(code):
        segs = [s for s in m.group(2).split("::") if s]
        if m.group(1) == "crate":
            base = []
        else:
            base = list(mod if is_dir_mod else mod[:-1])
            while segs and segs[0] == "super":
                base, segs = base[:-1], segs[1:]
        target = resolve(base + segs)
        if target and target != mod and not (mod[: len(target)] == target and len(target) < len(mod)):
            edges[mod].add(target)

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
