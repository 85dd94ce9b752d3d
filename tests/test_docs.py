"""The examples in docstrings run and give what they show."""
import doctest
import importlib

import pytest

MODULES = ["frostline.lozenge.hexagon", "frostline.lozenge.general", "frostline.lozenge.shapes",
           "frostline.domino.shapes"]


@pytest.mark.parametrize("name", MODULES)
def test_docstring_examples(name):
    module = importlib.import_module(name)
    result = doctest.testmod(module, optionflags=doctest.ELLIPSIS | doctest.NORMALIZE_WHITESPACE)
    assert result.attempted > 0 and result.failed == 0
