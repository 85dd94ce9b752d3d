"""Ctrl-C stops long computations promptly (a subprocess gets SIGINT after a fixed delay)."""
from __future__ import annotations

import signal
import subprocess
import sys
import textwrap
import time

import pytest

import frostline as fl
from frostline.custom import ModelRegion, dyck_path_model

SCRIPT = textwrap.dedent("""
    import sys
    from frostline.custom import ModelRegion, dyck_path_model
    region = ModelRegion(dyck_path_model(30))
    print("started", flush=True)
    try:
        region.configurations(cap=10**7)
    except KeyboardInterrupt:
        print("interrupted", flush=True)
        sys.exit(3)
""")


def test_enumeration_stops_on_ctrl_c():
    run = subprocess.Popen([sys.executable, "-c", SCRIPT], stdout=subprocess.PIPE, text=True)
    assert run.stdout.readline().strip() == "started"
    time.sleep(1.0)
    run.send_signal(signal.SIGINT)
    start = time.perf_counter()
    out, _ = run.communicate(timeout=30)
    assert run.returncode == 3 and "interrupted" in out
    assert time.perf_counter() - start < 5.0


def test_enumeration_cap_is_checked_against_memory(monkeypatch):
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", "1e7")
    with pytest.raises(fl.RegionTooLargeError, match="lower cap"):
        ModelRegion(dyck_path_model(30)).configurations(cap=10**7)
