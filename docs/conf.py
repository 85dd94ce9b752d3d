"""Sphinx configuration of frostline's documentation (build: python -m sphinx -W -b html docs docs/_build/html)."""
from __future__ import annotations

import os

import frostline

project = "frostline"
author = "the frostline developers"
release = version = frostline.__version__
extensions = ["sphinx.ext.autodoc", "sphinx.ext.mathjax", "numpydoc", "myst_parser", "sphinx_gallery.gen_gallery"]
source_suffix = {".rst": "restructuredtext", ".md": "markdown"}
exclude_patterns = ["_build", "auto_examples/*.ipynb", "auto_examples/*.py", "auto_examples/*.zip",
                    "auto_examples/*.md5", "auto_examples/*.json"]
html_theme = "furo"
html_title = f"frostline {release}"
numpydoc_show_class_members = False
autodoc_member_order = "bysource"
myst_heading_anchors = 3
# the gallery runs in small mode unless told otherwise (FROSTLINE_GALLERY_SMALL=0 for full sizes)
os.environ.setdefault("FROSTLINE_GALLERY_SMALL", "1")
os.environ.setdefault("MPLBACKEND", "Agg")
sphinx_gallery_conf = {
    "examples_dirs": "../examples/gallery",
    "gallery_dirs": "auto_examples",
    "filename_pattern": r"/plot_",
    "download_all_examples": False,
    "remove_config_comments": True,
    "write_computation_times": False,   # no timing file in the source tree
}
