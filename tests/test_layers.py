"""The source tree shows the import tree: layers by folder, arrows downward only, no circles.

A static scan (the ``ast`` of every module, imports inside functions included),
so a lazy import cannot hide an upward arrow. The map from source folders to
package names is read from pyproject.toml ([tool.scikit-build.wheel.packages]),
the same table the build uses. Layers are described in docs/design.md section 2.
"""
from __future__ import annotations

import ast
import sys
from pathlib import Path
from typing import Dict, Set

import pytest

ROOT = Path(__file__).resolve().parents[1]

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    tomllib = pytest.importorskip("tomli")

#: layer of each first-level part of the package (higher imports lower, never the reverse)
ENGINE = {"_core", "_version", "_validate", "_limits", "errors", "seeding", "model", "methods", "sample", "chain",
          "region", "lattice_spec", "registry", "progress", "height_walk", "diagnostics"}
TOOLKIT = {"exact", "toolkit", "variational"}
USER = {"analysis", "plot", "io", "cli", "__main__", "ensemble"}


def package_map() -> Dict[str, Path]:
    table = tomllib.loads((ROOT / "pyproject.toml").read_text())["tool"]["scikit-build"]["wheel"]["packages"]
    return {target.replace("/", "."): ROOT / source for target, source in table.items()}


def modules() -> Dict[str, Path]:
    """Every module of the package, by dotted name, from the mapped source folders."""
    out: Dict[str, Path] = {}
    mapping = package_map()
    for package, folder in mapping.items():
        for path in folder.rglob("*.py"):
            # a folder mapped separately (a lattice inside frostline/) belongs to its own entry
            parts = path.relative_to(folder).with_suffix("").parts
            name = ".".join((package, *parts))
            if name.endswith(".__init__"):
                name = name[: -len(".__init__")]
            owner = max((p for p in mapping if name == p or name.startswith(p + ".")), key=len)
            if owner == package:
                out[name] = path
    return out


LATTICES = {name.split(".")[1] for name in package_map() if name.count(".") == 1}


def layer(module: str) -> int:
    parts = module.split(".")
    if len(parts) == 1:
        return 99  # the package face: re-exports, lattices loaded lazily through the registry
    top = parts[1]
    if top in ENGINE:
        return 1
    if top in TOOLKIT:
        return 2
    if top in LATTICES or top == "custom":
        return 3
    if top in USER:
        return 4
    raise AssertionError(f"{module}: not assigned to a layer; add it to tests/test_layers.py")


def imports(name: str, path: Path) -> Set[str]:
    tree = ast.parse(path.read_text())
    package = name if path.name == "__init__.py" else name.rsplit(".", 1)[0]
    found: Set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            found.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                base = package.split(".")
                base = base[: len(base) - (node.level - 1)]
                target = ".".join(base + ([node.module] if node.module else []))
            else:
                target = node.module or ""
            known = modules()
            for alias in node.names:  # "from . import x" may name a submodule, else a name in target
                sub = f"{target}.{alias.name}"
                found.add(sub if sub in known or sub.split(".")[1:2] == ["_core"] else target)
    known = modules()
    return {t for t in found if t in known and t != name}


GRAPH = {name: imports(name, path) for name, path in modules().items()}


def test_every_module_has_a_layer():
    for name in GRAPH:
        layer(name)


@pytest.mark.parametrize("name", sorted(GRAPH))
def test_arrows_point_down(name):
    mine = layer(name)
    for target in GRAPH[name]:
        if name.split(".")[:2] == target.split(".")[:2]:
            continue  # inside one part: the circle test below covers it
        assert layer(target) <= mine, f"{name} (layer {mine}) imports {target} (layer {layer(target)}): upward"
        if mine == 3 and layer(target) == 3:
            raise AssertionError(f"{name} imports another lattice, {target}")
        if mine == 4 and layer(target) == 3:
            raise AssertionError(f"{name} imports the lattice module {target}; use the registry")


def test_no_import_circles():
    state: Dict[str, int] = {}
    stack: list = []

    def visit(node: str) -> None:
        state[node] = 1
        stack.append(node)
        for nxt in sorted(GRAPH[node]):
            if nxt.startswith(node + "."):
                continue  # a package importing its own submodules is how packages are built
            if state.get(nxt) == 1:
                cycle = stack[stack.index(nxt):] + [nxt]
                raise AssertionError("import circle: " + " -> ".join(cycle))
            if state.get(nxt) is None:
                visit(nxt)
        stack.pop()
        state[node] = 2

    for node in sorted(GRAPH):
        if state.get(node) is None:
            visit(node)
