"""Run in a subprocess by tests/test_untrusted_models.py: random arrays for every field of the
run-time model API, in range and out of range. Every call must end in a Python exception
or a result; a crash of the interpreter fails the test that runs this script."""
import sys

import numpy as np
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import frostline as fl
from frostline.custom import ModelRegion
from frostline.exact import EnumerationTooLarge

REACHED = []
EXPECTED = (ValueError, TypeError, RuntimeError, OverflowError, EnumerationTooLarge)
small = st.integers(-3, 12)
wild = st.one_of(small, st.sampled_from([-2**31, -1, 2**31 - 1, 2**31, 10**9, 2**62]))
arrays = st.lists(wild, min_size=0, max_size=12)


@st.composite
def models(draw):
    n = draw(st.one_of(st.integers(0, 6), st.sampled_from([-1, 2**31])))
    boundary = draw(arrays)
    rows = draw(st.lists(st.tuples(wild, wild, wild), max_size=14))
    shape = draw(st.sampled_from(["rows", "flat", "transposed"]))
    constraints = np.array(rows, dtype=object).reshape(-1, 3) if rows else np.zeros((0, 3), int)
    if shape == "flat":
        constraints = constraints.ravel()
    elif shape == "transposed":
        constraints = constraints.T
    return n, boundary, constraints, draw(arrays), draw(st.sampled_from([0, 1, 2, 3, 4, 2**31])), draw(arrays)


@st.composite
def rules(draw, n_sites):
    kind = draw(st.sampled_from(["none", "thresholds", "context"]))
    if kind == "none":
        return None
    if kind == "thresholds":
        return {"thresholds": np.array(draw(st.lists(st.integers(0, 2**64 - 1), max_size=8)), dtype=np.uint64)}
    return {"context_start": np.array(draw(arrays)), "context_nodes": np.array(draw(arrays)),
            "context_offset": np.array(draw(arrays)),
            "context_table": np.array(draw(st.lists(st.integers(0, 2**64 - 1), max_size=40)), dtype=np.uint64)}


def attempt(f):
    try:
        f()
    except EXPECTED:
        pass


@settings(max_examples=int(sys.argv[1]), deadline=None, derandomize=True,
          suppress_health_check=list(HealthCheck))
@given(st.one_of(models(), st.integers(1, 5)), st.data())
def check(fields, data):
    try:  # random fields, or a valid model (Dyck paths) with a random rule
        model = fl.custom.dyck_path_model(fields) if isinstance(fields, int) else fl.HeightModel(*fields)
    except EXPECTED:
        return
    REACHED.append(1)
    rule = data.draw(rules(model.n_sites))
    q = data.draw(st.sampled_from([1.0, 0.5, 2.0]))
    attempt(lambda: model.extremes())
    attempt(lambda: model.sample(q if rule is None else 1.0, (1, 2), max_start_time=64, rule=rule))
    attempt(lambda: fl.check_monotone(model, q=1.0, rule=rule, max_sites=8))
    attempt(lambda: ModelRegion(model, rule=rule).sample(seed=0, max_start_time=64))
    attempt(lambda: ModelRegion(model, rule=rule).chain(seed=0).run(3))
    attempt(lambda: ModelRegion(model).configurations(cap=200))


if __name__ == "__main__":
    check()
    print(f"no crash; {len(REACHED)} models were built and exercised")
