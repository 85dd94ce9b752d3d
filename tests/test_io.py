"""Sample files: write, read back, metadata record; the command line around them."""
import json

import numpy as np
import pytest

import frostline as fl
from frostline.cli import main
from frostline.progress import StderrProgress


@pytest.mark.parametrize("make", [
    lambda: fl.lozenge.hexagon(4, 3, 5, q=0.8),
    lambda: fl.lozenge.from_boundary("2(e ne) 3nw 2w 2sw 3se"),
    lambda: fl.lozenge.trapezoid(5, 3, q=1.2),
])
def test_round_trip(tmp_path, make):
    S = make().sample(seed=12)
    path = fl.save(S, tmp_path / "s.npz")
    T = fl.load(path)
    assert np.array_equal(T.heights, S.heights)
    assert np.array_equal(T.tiles, S.tiles)
    assert T.info == S.info
    assert T.region.describe() == S.region.describe()
    # the rebuilt region samples the same configuration from the same seed
    assert np.array_equal(T.region.sample(seed=12).heights, S.heights)


def test_metadata_record(tmp_path):
    S = fl.lozenge.hexagon(3, 3, 3, q=0.9).sample(seed=np.random.SeedSequence(5).spawn(3)[2])
    with np.load(fl.save(S, tmp_path / "s.npz")) as data:
        record = json.loads(str(data["metadata"]))
    assert record["lattice"] == "lozenge" and record["weights"] == {"q": 0.9}
    assert record["seed"] == {"entropy": 5, "spawn_key": [2], "pool_size": 4}
    assert record["frostline_version"] == fl.__version__
    assert record["diagnostics"]["method"] == "cftp"
    assert record["diagnostics"]["report"]["start_time"] == S.info.start_time == S.info.report["start_time"]


def test_bad_files(tmp_path):
    with pytest.raises(ValueError, match=".npz"):
        fl.save(fl.lozenge.hexagon(1, 1, 1).sample(seed=0), tmp_path / "s.txt")
    np.savez(tmp_path / "other.npz", x=np.zeros(3))
    with pytest.raises(ValueError, match="not a valid frostline sample"):
        fl.load(tmp_path / "other.npz")
    assert not list(tmp_path.glob(".*tmp"))  # no temporary file left behind


def test_cli_path_output_and_show(tmp_path, capsys):
    out = tmp_path / "region.npz"
    assert main(["sample", "path", "2(e ne) 3nw 2w 2sw 3se", "--seed", "4", "--output", str(out)]) == 0
    assert main(["show", str(out), "--picture", str(tmp_path / "again.png")]) == 0
    text = capsys.readouterr().out
    assert "shape=boundary" in text and (tmp_path / "again.png").exists()


def test_cli_path_from_file_and_count(tmp_path, capsys):
    outline = tmp_path / "outline.txt"
    outline.write_text("3e 3ne\n3nw 3w\n3sw 3se\n")
    assert main(["count", "path", "--file", str(outline)]) == 0
    assert capsys.readouterr().out.strip() == "980"  # OEIS A008793: the 3,3,3 hexagon
    assert main(["count", "trapezoid", "4", "3", "--notches", "0", "3", "6"]) == 0
    assert int(capsys.readouterr().out) == fl.lozenge.trapezoid(4, 3, [0, 3, 6]).count()


def test_cli_refuses_bad_paths(capsys):
    assert main(["sample", "path", "3e 3ne 3nw"]) == 2
    assert "open" in capsys.readouterr().err


def test_progress_lines(capsys):
    import sys

    hook = StderrProgress("coupling from the past", stream=sys.stderr, after=0.0, every=0.0)
    hook(64, 10**6, 0.5)
    hook.finish()
    err = capsys.readouterr().err
    assert "coupling from the past: start time 64 sweeps back" in err
