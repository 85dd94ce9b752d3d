"""Golden values: every kernel and random stream is pinned (common practice for
counter-based streams), so a refactor or a faster kernel cannot change the
sample of a seed without this test failing. The compatibility policy (same
seed and version give the same sample) is in README.md; a deliberate change of
streams regenerates tests/golden/digests.json and is announced in CHANGELOG.md.
"""
from __future__ import annotations

import json
from pathlib import Path

import pytest
from golden.cases import cases, digest

PINNED = json.loads((Path(__file__).parent / "golden" / "digests.json").read_text())


def test_every_case_is_pinned():
    assert sorted(PINNED) == sorted(name for name, _ in cases())


@pytest.mark.parametrize("name, thunk", cases(), ids=[name for name, _ in cases()])
def test_sample_matches_golden_digest(name, thunk):
    assert digest(thunk()) == PINNED[name], f"the stream or kernel behind {name!r} changed"
