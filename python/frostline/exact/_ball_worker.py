"""Ball-arithmetic enclosures of placement probabilities |K(b, w) K^{-1}(w, b)| (python-flint).

Imports only numpy and flint, so :mod:`.certified_inverse` can also run it as a
script in a child interpreter (``python _ball_worker.py IN.npz OUT.npz``): flint
holds the GIL through a matrix inverse, and a child can be stopped at once.
"""
from __future__ import annotations

import sys
from typing import Optional, Tuple

import numpy as np

_U = 2.0**-53


def ball_entries(k: np.ndarray, rows: np.ndarray, cols: np.ndarray, bits: int
                 ) -> Optional[Tuple[np.ndarray, np.ndarray]]:
    """Midpoints and radii (float64, the radius covering the rounding of the midpoint) of rigorous
    enclosures of |K(b, w) K^{-1}(w, b)| for each (b, w) = (rows[e], cols[e]), at ``bits`` of working
    precision; None when flint cannot certify that K is invertible at this precision."""
    import flint

    old = flint.ctx.prec
    try:
        flint.ctx.prec = bits
        entries = [[flint.acb(v.real, v.imag) if v != 0 else 0 for v in row] for row in k.tolist()]
        try:
            inverse = flint.acb_mat(entries).inv()
        except ZeroDivisionError:            # the enclosure of K contains a singular matrix at this precision
            return None
        mid, rad = np.empty(len(rows)), np.empty(len(rows))
        for e, (b, w) in enumerate(zip(rows.tolist(), cols.tolist())):
            v = complex(k[b, w])
            p = abs(flint.acb(v.real, v.imag) * inverse[w, b])
            m = float(p.mid())
            mid[e] = m
            rad[e] = float(p.rad()) + abs(float(p.mid() - m)) + _U * abs(m)
        return mid, rad
    finally:
        flint.ctx.prec = old


def _main(given: str, answer: str) -> None:
    with np.load(given) as data:
        got = ball_entries(data["k"], data["rows"], data["cols"], int(data["bits"]))
    empty = np.empty(0)
    mid, rad = got if got is not None else (empty, empty)
    np.savez(answer, ok=np.bool_(got is not None), mid=mid, rad=rad)


if __name__ == "__main__":
    _main(sys.argv[1], sys.argv[2])
