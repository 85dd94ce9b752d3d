"""The cases whose samples are pinned by tests/test_golden.py.

Each case is (name, thunk): the thunk draws one sample or runs one chain with a
fixed seed through one kernel and one random stream, and returns the int array
it produced. The pinned value is a SHA-256 digest of that array (int64, C
order) with its shape, so any change of a stream, a kernel's visiting order or
a draw shows as a changed digest.

Regenerate only on a deliberate, announced change of streams:
    python tests/golden/cases.py > tests/golden/digests.json
"""
from __future__ import annotations

import hashlib
import json
from typing import Callable, Dict, List, Tuple

import numpy as np

import frostline as fl
from frostline.custom import ModelRegion, dyck_path_model


def digest(array: np.ndarray) -> str:
    a = np.ascontiguousarray(np.asarray(array), dtype=np.int64)
    h = hashlib.sha256(repr(a.shape).encode())
    h.update(a.tobytes())
    return h.hexdigest()


def _sample(region, method: str, seed: int = 11) -> np.ndarray:
    return region.sample(seed=seed, method=method).heights


def _chain(region, method: str, sweeps: int = 7, start: str = "max") -> np.ndarray:
    return region.chain(seed=5, start=start, method=method).run(sweeps).heights


def cases() -> List[Tuple[str, Callable[[], np.ndarray]]]:
    hexagon = fl.lozenge.hexagon(7, 6, 5)
    weighted = fl.lozenge.hexagon(6, 5, 7, q=0.8)
    general = fl.lozenge.from_boundary("5e 3ne 4nw 5w 3sw 4se")
    general_q = fl.lozenge.trapezoid(6, 4, q=1.3)
    aztec = fl.domino.aztec_diamond(8)
    aztec_biased = fl.domino.aztec_diamond(7, vertical_weight=2.0)
    aztec_big = fl.domino.aztec_diamond(40)
    aztec_two = fl.domino.aztec_diamond(12, two_periodic_weights=(1.0, 0.5))
    rect = fl.domino.rectangle(6, 8)
    ice = fl.square_ice.domain_wall(9)
    ice_weighted = fl.square_ice.domain_wall(8, 1.0, 1.2, 1.5)
    dyck = ModelRegion(dyck_path_model(8))
    return [
        ("hexagon box", lambda: _sample(hexagon, "box")),
        ("hexagon generic", lambda: _sample(hexagon, "generic")),
        ("hexagon q box", lambda: _sample(weighted, "box")),
        ("hexagon q generic", lambda: _sample(weighted, "generic")),
        ("hexagon box chain", lambda: _chain(hexagon, "box")),
        ("hexagon generic chain", lambda: _chain(hexagon, "generic")),
        ("lozenge path generic", lambda: _sample(general, "points-generic")),
        ("lozenge trapezoid q generic", lambda: _sample(general_q, "points-generic")),
        ("lozenge path columns", lambda: _sample(general, "columns")),
        ("lozenge path columns generic", lambda: _sample(general, "generic")),
        ("lozenge trapezoid q columns", lambda: _sample(general_q, "cftp")),
        ("lozenge path chain", lambda: _chain(general, "auto", start="min")),
        ("aztec corner", lambda: _sample(aztec, "cftp")),
        ("aztec generic", lambda: _sample(aztec, "generic")),
        ("aztec biased corner", lambda: _sample(aztec_biased, "cftp")),
        ("aztec shuffling", lambda: _sample(aztec_big, "shuffling")),
        ("aztec biased shuffling", lambda: _sample(aztec_biased, "shuffling")),
        ("aztec two-periodic shuffling", lambda: _sample(aztec_two, "shuffling")),
        ("aztec corner chain", lambda: _chain(aztec, "cftp")),
        ("aztec auto", lambda: _sample(aztec, "auto")),
        ("hexagon samples", lambda: np.stack([s.heights for s in hexagon.samples(3, seed=8, threads=2)])),
        ("rectangle corner", lambda: _sample(rect, "auto")),
        ("square ice corner", lambda: _sample(ice, "cftp")),
        ("square ice generic", lambda: _sample(ice, "generic")),
        ("square ice weighted corner", lambda: _sample(ice_weighted, "cftp")),
        ("square ice weighted generic", lambda: _sample(ice_weighted, "generic")),
        ("square ice chain", lambda: _chain(ice, "cftp")),
        ("dyck generic", lambda: _sample(dyck, "generic")),
        ("dyck chain", lambda: _chain(dyck, "generic", start="min")),
    ]


def compute() -> Dict[str, str]:
    return {name: digest(thunk()) for name, thunk in cases()}


if __name__ == "__main__":
    print(json.dumps(compute(), indent=1, sort_keys=True))
