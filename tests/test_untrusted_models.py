"""Untrusted input to the run-time model API cannot crash the interpreter (common practice:
fuzz in a subprocess, so that a segfault fails this test instead of the whole run)."""
import subprocess
import sys
from pathlib import Path


def test_random_model_arrays_never_crash():
    script = Path(__file__).with_name("untrusted_models_script.py")
    done = subprocess.run([sys.executable, str(script), "300"], capture_output=True, text=True, timeout=600)
    assert done.returncode == 0, f"exit {done.returncode}\n{done.stdout[-2000:]}\n{done.stderr[-4000:]}"
    assert "no crash" in done.stdout
