"""
The arctic circle of the Aztec diamond
======================================

One exact sample of a large Aztec diamond by domino shuffling, its four
frozen corners, the arctic circle (Jockusch, Propp and Shor 1998) and the
boundary the variational principle predicts for the same region. Big pictures
are drawn as one image, a pixel per cell.
"""
import os

import matplotlib.pyplot as plt

import frostline as fl
from frostline.toolkit import palette

small = os.environ.get("FROSTLINE_GALLERY_SMALL") == "1"
n = 60 if small else 400
region = fl.domino.aztec_diamond(n)
sample = region.sample(seed=2026, method="shuffling")
shape = fl.domino.aztec_diamond(min(n, 100)).limit_shape()

fig, ax = plt.subplots(figsize=(6, 6))
sample.plot(ax=ax, key=None)
for k, line in enumerate(shape.frozen_boundary):
    ax.plot(line[:, 0] * n + n, line[:, 1] * n - n, color=palette.PREDICTED, lw=2.0,
            label="variational prediction" if k == 0 else None)
circle = region.arctic_curve()
ax.plot(circle[:, 0] + n, circle[:, 1] - n, color=palette.THEORY, lw=1.0, ls="--", label="arctic circle")
ax.legend(loc="lower left", fontsize=8, frameon=False)
ax.set_title(f"Aztec diamond of order {n}, one exact sample", fontsize=9)
