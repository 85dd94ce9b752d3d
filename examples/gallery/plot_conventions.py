"""
Heights, tiles and coordinates, drawn
=====================================

frostline's contract for lozenges: lattice point (i, j) is the plane point
i (1, 0) + j (1/2, sqrt 3 / 2); along the edge directions (1, 0), (-1, 1),
(0, -1) the height rises by 1 where no lozenge crosses and falls by 2 where
one does. For dominoes: corner (r, c) is the top-left corner of cell (r, c),
Thurston's height rises by 1 along an edge with a black cell on its left
unless a domino crosses it (then it falls by 3). Both pictures label every
point of a small exact sample with its height.
"""
import matplotlib.pyplot as plt
import numpy as np

import frostline as fl
from frostline.lozenge import plane_points

lozenges = fl.lozenge.hexagon_region(2, 2, 2)
sample = lozenges.sample(seed=3)
dominoes = fl.domino.aztec_diamond(2)
tiling = dominoes.sample(seed=3)

fig, (left, right) = plt.subplots(1, 2, figsize=(9, 4.5))
sample.plot(ax=left)
i0, j0 = lozenges.origin
for (p, q) in np.argwhere(lozenges.vertex_mask):
    x, y = plane_points(np.array([p + i0, q + j0]))
    left.annotate(f"{sample.heights[p, q]}", (x, y), fontsize=7, ha="center", va="center",
                  bbox={"boxstyle": "circle,pad=0.15", "fc": "white", "lw": 0.3})
left.set_title("lozenges: lattice-point heights (step 3)", fontsize=9)

tiling.plot(ax=right, key=None)
x0, y0 = dominoes.plane_origin
for (r, c) in np.argwhere(dominoes.corner_mask):
    right.annotate(f"{tiling.heights[r, c]}", (c, -r), fontsize=7, ha="center", va="center",
                   bbox={"boxstyle": "circle,pad=0.15", "fc": "white", "lw": 0.3})
right.set_title("dominoes: Thurston's corner heights (step 4)", fontsize=9)
fig.tight_layout()
