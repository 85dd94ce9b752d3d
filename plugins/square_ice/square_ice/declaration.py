"""The square_ice lattice's declaration: what the rest of frostline may know of it."""
from __future__ import annotations

from frostline.lattice_spec import Argument, LatticeSpec, Shape

from .conversions import VERTEX_TYPES
from .counts import asm_count, izergin_korepin
from .records import region_from_record
from .region import domain_wall

LATTICE = LatticeSpec(
    name="square_ice",
    summary="square ice / six-vertex model (alternating sign matrices with domain-wall boundary)",
    shapes=(
        Shape("square_ice", "square ice (six-vertex model) with domain-wall boundary",
              lambda size, weights=(1.0, 1.0, 1.0): domain_wall(size, *weights),
              (Argument("size", "N, the order of the matrices"),
               Argument("weights", "vertex weights a, b, c (exact sampling needs c >= max(a, b)); default 1 1 1",
                        type=float, nargs=3, default=(1.0, 1.0, 1.0), metavar=("A", "B", "C"), flag="--weights"),
               Argument("view", "what the picture shows (default: vertex types)", type=str, default="vertices",
                        flag="--view", choices=("vertices", "matrix", "heights"), style="kind")),
              "Square ice on N x N vertices with domain-wall boundary (alternating sign matrices when uniform); "
              "vertex weights A, B, C."),
    ),
    closed_forms={"asm_count": asm_count, "izergin_korepin": izergin_korepin},
    tile_classes=tuple(VERTEX_TYPES),
    theory_curves=("free fermion c^2 = a^2 + b^2: an ellipse (tangent method)",
                   "uniform alternating sign matrices: the Colomo-Pronko curve (proved by Aggarwal 2020)"),
    weight_keys=("a", "b", "c"),
    region_from_record=region_from_record,
    comparison=("square ice, domain wall", lambda n: domain_wall(n)),
)
