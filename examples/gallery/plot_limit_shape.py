"""
A prediction for a region with no formula
=========================================

A notched lattice octagon: the variational principle's mean height against
the mean of exact samples, and its frozen boundary over one sample.
"""
import os

import matplotlib.pyplot as plt
import numpy as np

import frostline as fl
from frostline.toolkit import palette

small = os.environ.get("FROSTLINE_GALLERY_SMALL") == "1"
k, count = (3, 40) if small else (10, 400)
region = fl.lozenge.polygon([k * v for v in (1, 1, 1, 2, 2, 1, 3, 3)], ["e", "ne", "nw", "ne", "nw", "w", "sw", "se"])
shape = region.limit_shape()
samples = region.samples(count, seed=7)
mean = np.mean([s.heights for s in samples], axis=0)
gap = np.nanmax(np.abs(shape.heights - mean)) / 3 / region.scale
print(f"{shape.report}; largest |prediction - mean of {count}| = {gap:.4f} scaled units")

fig, (left, right) = plt.subplots(1, 2, figsize=(9, 4.5))
samples[0].plot(ax=left)
for line in shape.frozen_boundary:
    left.plot(line[:, 0] * region.scale, line[:, 1] * region.scale, color=palette.PREDICTED, lw=1.2)
left.set_title("one exact sample and the predicted frozen boundary", fontsize=9)
image = right.imshow((shape.heights - mean).T, origin="lower", cmap="PuOr", vmin=-1, vmax=1)
fig.colorbar(image, ax=right, shrink=0.8, label="prediction - ensemble mean (height units)")
right.set_title("mean heights: prediction against samples", fontsize=9)
right.set_axis_off()
