"""The frostline command line."""
import subprocess
import sys

import pytest

from frostline.cli import main


def test_sample_prints_diagnostics_and_writes_a_picture(tmp_path, capsys):
    picture = tmp_path / "h.svg"
    assert main(["sample", "hexagon", "4", "5", "3", "--seed", "2026", "--picture", str(picture)]) == 0
    out = capsys.readouterr().out
    assert "start time" in out and "seed entropy" in out and "2026" in out
    assert picture.stat().st_size > 1000


def test_same_seed_prints_the_same_sample_diagnostics(capsys):
    main(["sample", "hexagon", "6", "6", "6", "--seed", "9", "--q", "0.9"])
    first = capsys.readouterr().out
    main(["sample", "hexagon", "6", "6", "6", "--seed", "9", "--q", "0.9", "--method", "generic"])
    second = capsys.readouterr().out
    pick = lambda text: [l for l in text.splitlines() if "coalescence time" in l or "site updates  " in l]
    assert pick(first) == pick(second)


def test_count(capsys):
    assert main(["count", "hexagon", "4", "4", "4"]) == 0
    assert capsys.readouterr().out.strip() == "232848"  # OEIS A008793


def test_demo_small(tmp_path, capsys):
    assert main(["demo", "--size", "6", "--folder", str(tmp_path)]) == 0
    assert (tmp_path / "hexagon-uniform.png").exists() and (tmp_path / "hexagon-weighted.png").exists()
    out = capsys.readouterr().out
    # one aligned table per sample: the volume and picture rows start their values in the table's column
    for block in out.strip().split("\n\n"):
        rows = [line for line in block.splitlines()[1:] if line.startswith("  ")]
        starts = {len(line) - len(line[2:].split("  ", 1)[1].lstrip()) for line in rows if "  " in line[2:]}
        assert len(starts) == 1, block
        assert any(line.split()[0] == "picture" for line in rows)
    assert out.count("uniform limit shape: half the box") == 1  # only the uniform box says so


@pytest.mark.parametrize("argv", [["sample", "hexagon", "-1", "2", "2"], ["sample", "hexagon", "2", "2", "2", "--q", "-1"],
                                  ["sample", "hexagon", "2", "2", "2", "--picture", "x.bmp"]])
def test_bad_input_is_a_clear_error(argv, capsys):
    assert main(argv) == 2
    assert "frostline: error:" in capsys.readouterr().err


def test_help_reads_well():
    out = subprocess.run([sys.executable, "-m", "frostline.cli", "sample", "hexagon", "--help"],
                         capture_output=True, text=True, check=True).stdout
    assert "three side lengths A B C" in out and "--picture" in out


def test_ctrl_c_stops_cleanly():
    # SIGINT to a long run: the engine notices within ~10^8 updates, exit status 130.
    # The child restores Python's Ctrl-C handler itself (a parent may ignore SIGINT)
    # and says when it has started, so the signal never races interpreter start-up.
    import signal

    code = ("import signal, sys; signal.signal(signal.SIGINT, signal.default_int_handler)\n"
            "from frostline.cli import main\nprint('started', flush=True)\n"
            "sys.exit(main(['sample', 'hexagon', '400', '400', '400', '--seed', '1']))\n")
    proc = subprocess.Popen([sys.executable, "-c", code], stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    try:
        assert proc.stdout.readline().strip() == "started"
        import time

        time.sleep(1.0)
        proc.send_signal(signal.SIGINT)
        out, err = proc.communicate(timeout=60)
        assert proc.returncode == 130, err
        assert "interrupted" in err
    finally:
        if proc.poll() is None:
            proc.kill()
            proc.wait()


def test_domino_commands(tmp_path, capsys):
    drawing = tmp_path / "region.txt"
    drawing.write_text(".##.\n####\n####\n.##.\n")
    assert main(["count", "mask", str(drawing)]) == 0
    assert capsys.readouterr().out.strip() == "8"  # the Aztec diamond of order 2 (OEIS A006125)
    assert main(["count", "aztec", "5"]) == 0
    assert capsys.readouterr().out.strip() == "32768"  # OEIS A006125
    assert main(["count", "rectangle", "4", "4"]) == 0
    assert capsys.readouterr().out.strip() == "36"  # OEIS A004003
    out = tmp_path / "aztec.npz"
    assert main(["sample", "aztec", "6", "--vertical-weight", "2", "--method", "cftp", "--seed", "1",
                 "--output", str(out), "--picture", str(tmp_path / "aztec.png")]) == 0
    import frostline as fl

    S = fl.load(out)
    assert S.region.weights is not None and S.tiles.shape == (42, 2, 2)


def test_square_ice_commands(tmp_path, capsys):
    assert main(["count", "square_ice", "6"]) == 0
    assert capsys.readouterr().out.strip() == "7436"  # OEIS A005130
    for view in ("vertices", "matrix", "heights"):
        picture = tmp_path / f"ice-{view}.png"
        assert main(["sample", "square_ice", "12", "--seed", "3", "--view", view, "--picture", str(picture)]) == 0
        assert picture.stat().st_size > 1000
    assert main(["sample", "square_ice", "6", "--weights", "1", "2", "1.9"]) == 2
    assert "non-monotone" in capsys.readouterr().err


def test_density_pictures(tmp_path, capsys):
    for argv in (["density", "hexagon", "6", "5", "4"], ["density", "aztec", "8"]):
        picture = tmp_path / f"{argv[1]}.png"
        assert main(argv + ["--picture", str(picture)]) == 0
        assert picture.stat().st_size > 5000
    assert main(["density", "square_ice", "4", "--picture", str(tmp_path / "ice.png")]) == 2
    assert "no Kasteleyn matrix" in capsys.readouterr().err


def test_compare_writes_figure_and_table(tmp_path, capsys):
    prefix = tmp_path / "cmp"
    assert main(["compare", "--sizes", "12", "20", "--prefix", str(prefix), "--seed", "1"]) == 0
    for ext in (".png", ".pdf"):
        assert (tmp_path / f"cmp{ext}").stat().st_size > 5000
    rows = (tmp_path / "cmp.csv").read_text().strip().splitlines()
    assert rows[0] == "lattice,size,distance,seconds,predicted_vs_theory,sample_vs_predicted"
    assert len(rows) == 1 + 3 * 2
    # the prediction is drawn for lozenges and dominoes (at these small sizes its distance to the published
    # curve is dominated by the tangency points; tests/test_limit_shape.py checks its accuracy), not for ice
    for row in rows[1:]:
        label, _, _, _, predicted, _ = row.rsplit(",", 5)
        assert (predicted == "nan") == ("ice" in label)
        if "ice" not in label:
            assert float(predicted) < 0.35
    assert main(["compare", "--sizes", "2"]) == 2


def test_count_of_a_weighted_region_is_its_partition_function(capsys):
    # a weighted count used to print the unweighted number (980 for the 3 x 3 x 3 box at any q)
    assert main(["count", "hexagon", "3", "3", "3", "--q", "0.5"]) == 0
    out = capsys.readouterr().out
    assert "partition function" in out and "980" not in out.split(":")[-1]
    assert main(["count", "hexagon", "3", "3", "3"]) == 0
    assert capsys.readouterr().out.strip() == "980"


def test_compare_table_is_valid_csv():
    import csv
    import io

    from frostline.analysis.compare import ComparisonRow, table

    rows = [ComparisonRow("square ice, domain wall", 30, 0.1234, 1.5, None, [], None, 1.0)]
    parsed = list(csv.reader(io.StringIO(table(rows))))
    assert parsed[1] == ["square ice, domain wall", "30", "0.1234", "1.500", "nan", "nan"]


def test_old_picture_shape_still_works_with_a_warning(tmp_path, capsys):
    import frostline as fl

    drawing = tmp_path / "region.txt"
    drawing.write_text("##\n##\n")
    with pytest.warns(fl.FrostlineWarning, match="now called 'mask'"):
        assert main(["count", "picture", str(drawing)]) == 0
    assert capsys.readouterr().out.strip() == "2"
    # the renamed shape and the --picture option no longer read alike
    out = tmp_path / "r.png"
    assert main(["sample", "mask", str(drawing), "--seed", "1", "--picture", str(out)]) == 0
    assert out.exists()


def test_regions_are_described_in_words(capsys, tmp_path):
    import frostline as fl

    assert fl.lozenge.hexagon(3, 4, 5, q=0.9).summary() == "lozenge box: sides 3 x 4 x 5, q = 0.9"
    assert fl.domino.rectangle(4, 6).summary() == "domino rectangle: rows 4, columns 6"
    assert main(["sample", "square_ice", "5", "--seed", "2"]) == 0
    out = capsys.readouterr().out
    assert "exact sample of square ice domain wall: n 5" in out and "SquareIceRegion(" not in out


def test_predict_draws_the_limit_shape(tmp_path, capsys):
    for argv in (["predict", "hexagon", "8", "7", "6"], ["predict", "aztec", "12"],
                 ["predict", "hexagon", "4", "4", "4", "--resolution", "2"]):
        picture = tmp_path / f"{argv[1]}-{len(argv)}.png"
        assert main(argv + ["--picture", str(picture)]) == 0
        assert picture.stat().st_size > 5000
        out = capsys.readouterr().out
        assert "log Z ~" in out and "converged" in out
    assert main(["predict", "square_ice", "4", "--picture", str(tmp_path / "ice.png")]) == 2
    assert "no variational principle" in capsys.readouterr().err
    assert main(["predict", "hexagon", "3", "3", "3", "--resolution", "0", "--picture", str(tmp_path / "x.png")]) == 2


def test_method_choices_follow_the_shape(capsys):
    with pytest.raises(SystemExit) as stop:
        main(["sample", "aztec", "4", "--method", "box"])
    assert stop.value.code == 2 and "choose from 'auto', 'cftp', 'generic', 'shuffling'" in capsys.readouterr().err
    assert main(["sample", "aztec", "4", "--method", "shuffling", "--seed", "1"]) == 0
    assert main(["sample", "hexagon", "3", "3", "3", "--method", "box", "--seed", "1"]) == 0
    with pytest.raises(SystemExit):
        main(["sample", "square_ice", "4", "--method", "shuffling"])


def test_hexagon_asks_for_three_sides(capsys):
    assert main(["sample", "hexagon", "3", "3"]) == 2
    assert "needs three side lengths A B C" in capsys.readouterr().err


def test_ensemble_reducers_and_statistics_file(tmp_path, capsys, monkeypatch):
    import numpy as np

    (tmp_path / "study_reducers.py").write_text(
        "import numpy as np\n"
        "def type_counts(sample):\n"
        "    return np.bincount(sample.tiles[:, 2], minlength=3).astype(np.int64)\n")
    monkeypatch.syspath_prepend(str(tmp_path))
    statistics = tmp_path / "stats.npz"
    argv = ["ensemble", "hexagon", "4", "3", "3", "--size", "20", "--seed", "1", "--workers", "2",
            "--tile-counts", "1.0", "--reducer", "types=study_reducers:type_counts", "--statistics", str(statistics)]
    assert main(argv) == 0
    data = np.load(statistics)
    # every plane partition of the 4 x 3 x 3 box has ab = 12, bc = 9, ca = 12 lozenges of the three types
    np.testing.assert_array_equal(data["reduced_types"], [20 * 12, 20 * 9, 20 * 12])
    assert int(data["reduced_tile_counts"].sum()) == 20 * 33 and data["mean_heights"].shape == (4, 3)
    assert main(argv) == 2 and "--force" in capsys.readouterr().err      # the file is kept
    assert main(argv[:-4] + ["--reducer", "types=study_reducers:missing"]) == 2
    assert "cannot find missing" in capsys.readouterr().err
    assert main(argv[:-4] + ["--reducer", "no-separator"]) == 2


def test_every_option_of_every_command_has_help():
    import argparse

    from frostline.cli import _parser

    missing = []

    def walk(parser, path):
        for action in parser._actions:
            if isinstance(action, argparse._SubParsersAction):
                for name, sub in action.choices.items():
                    walk(sub, path + [name])
            elif not action.help and not isinstance(action, argparse._HelpAction):
                missing.append(" ".join(path + [action.option_strings[0] if action.option_strings else action.dest]))

    walk(_parser(), ["frostline"])
    assert missing == []
