"""Sample files are untrusted input: every broken or crafted file gives one clear ValueError.

Truncations, bit flips, random bytes, crafted headers and records, and
decompression bombs; plus the rules of `save` (no silent overwrite, the umask,
symbolic links). Fixed seeds: the fuzz cases are the same on every run.
"""
from __future__ import annotations

import io as _io
import json
import os
import stat
import zipfile

import numpy as np
import pytest

import frostline as fl
from frostline.cli import main

MESSAGE = "not a valid frostline sample file"


def _saved(tmp_path, region=None, name="s.npz"):
    region = region if region is not None else fl.domino.aztec_diamond(3)
    sample = region.sample(seed=4)
    path = tmp_path / name
    fl.save(sample, path)
    return sample, path


def _load_or_clear_error(path, sample):
    """A damaged file either still holds the same sample (a flip in an unchecked zip field) or is refused."""
    try:
        loaded = fl.load(path)
    except ValueError as exc:
        assert MESSAGE in str(exc) or "does not read" in str(exc), str(exc)
        assert "allow_pickle" not in str(exc)
        return "refused"
    np.testing.assert_array_equal(loaded.heights, sample.heights)
    return "same"


def test_truncated_files_are_refused(tmp_path):
    sample, path = _saved(tmp_path)
    data = path.read_bytes()
    for length in [0, 1, 10, 100, len(data) // 3, len(data) // 2, len(data) - 30, len(data) - 1]:
        broken = tmp_path / f"cut{length}.npz"
        broken.write_bytes(data[:length])
        with pytest.raises(ValueError, match=MESSAGE):
            fl.load(broken)


def test_bit_flips_never_give_another_error(tmp_path):
    sample, path = _saved(tmp_path)
    data = bytearray(path.read_bytes())
    rng = np.random.default_rng(20261203)
    outcomes = []
    for trial, position in enumerate(rng.integers(0, len(data), size=120)):
        flipped = bytearray(data)
        flipped[position] ^= 1 << int(rng.integers(0, 8))
        broken = tmp_path / f"flip{trial}.npz"
        broken.write_bytes(bytes(flipped))
        outcomes.append(_load_or_clear_error(broken, sample))
    assert outcomes.count("refused") > 60  # most bytes are checked content (CRC, headers, data)


def test_random_bytes_and_other_files(tmp_path):
    rng = np.random.default_rng(7)
    for k, size in enumerate([1, 64, 5000]):
        junk = tmp_path / f"junk{k}.npz"
        junk.write_bytes(rng.bytes(size))
        with pytest.raises(ValueError, match=MESSAGE):
            fl.load(junk)
    plain = tmp_path / "plain.npz"
    np.savez(plain, x=np.arange(4))
    with pytest.raises(ValueError, match=MESSAGE):
        fl.load(plain)
    with pytest.raises(FileNotFoundError):
        fl.load(tmp_path / "missing.npz")


def _rewrite(path, out, change):
    """Copy the npz at ``path`` to ``out`` with change(name, array) -> array (or None to drop it)."""
    with np.load(path, allow_pickle=False) as data:
        arrays = {k: data[k] for k in data.files}
    new = {}
    for name, array in arrays.items():
        value = change(name, array)
        if value is not None:
            new[name] = value
    np.savez_compressed(out, **new)


def test_crafted_records_are_refused(tmp_path):
    sample, path = _saved(tmp_path, fl.domino.aztec_diamond(3))

    def record_with(**fields):
        def change(name, array):
            if name != "metadata":
                return array
            record = json.loads(str(array))
            record["region"].update(fields)
            return np.array(json.dumps(record))
        return change

    # a crafted order would make the region claim another diamond's count (issue: 1024 for a 64-tiling mask)
    for fields in ({"order": 5}, {"order": "3"}, {"order": -1}, {"shape": "rectangle"}):
        out = tmp_path / "crafted.npz"
        _rewrite(path, out, record_with(**fields))
        with pytest.raises(ValueError, match=MESSAGE):
            fl.load(out)
    # metadata that is not JSON, or not an object
    for bad in ("{", "[1, 2]", "null"):
        out = tmp_path / "badjson.npz"
        _rewrite(path, out, lambda n, a, bad=bad: np.array(bad) if n == "metadata" else a)
        with pytest.raises(ValueError, match=MESSAGE):
            fl.load(out)


def test_crafted_heights_are_refused(tmp_path):
    sample, path = _saved(tmp_path, fl.lozenge.hexagon(3, 4, 2))
    cases = {
        "wrong shape": lambda a: np.zeros((4, 4), dtype=a.dtype),
        "floats": lambda a: a.astype(float),
        "not a plane partition": lambda a: a[::-1].copy(),
        "objects": None,
    }
    for label, make in cases.items():
        out = tmp_path / "h.npz"
        if make is None:  # an object array: refused from its header, never unpickled
            with np.load(path, allow_pickle=False) as data:
                arrays = {k: data[k] for k in data.files}
            arrays["heights"] = np.array([{"x": 1}] * 12, dtype=object).reshape(3, 4)
            np.savez(out, **arrays)
        else:
            _rewrite(path, out, lambda n, a, make=make: make(a) if n == "heights" else a)
        with pytest.raises(ValueError, match=MESSAGE) as caught:
            fl.load(out)
        assert "allow_pickle" not in str(caught.value), label


def test_decompression_bombs_are_refused_before_reading(tmp_path, monkeypatch):
    sample, path = _saved(tmp_path, fl.lozenge.hexagon(3, 4, 2))
    # 200 million zero bytes compress to about 200 kB: a heights array of the wrong shape is refused from its header
    bomb = tmp_path / "bomb.npz"
    with np.load(path, allow_pickle=False) as data:
        arrays = {k: data[k] for k in data.files}
    buffer = zipfile.ZipFile(bomb, "w", compression=zipfile.ZIP_DEFLATED)
    for name, array in arrays.items():
        if name == "heights":
            continue
        stream = _io.BytesIO()
        np.lib.format.write_array(stream, array, allow_pickle=False)
        buffer.writestr(name + ".npy", stream.getvalue())
    header = _io.BytesIO()
    np.lib.format.write_array_header_1_0(header, {"descr": "|i1", "fortran_order": False, "shape": (200_000_000,)})
    with buffer.open("heights.npy", "w", force_zip64=True) as member:
        member.write(header.getvalue())
        chunk = bytes(2**20)
        for _ in range(200_000_000 // 2**20):
            member.write(chunk)
        member.write(bytes(200_000_000 % 2**20))
    buffer.close()
    assert bomb.stat().st_size < 2_000_000
    with pytest.raises(ValueError, match="shape"):
        fl.load(bomb)
    # region arrays above the memory limit are refused before they are read
    _, masked = _saved(tmp_path, fl.domino.aztec_diamond(6), name="masked.npz")
    monkeypatch.setenv("FROSTLINE_MEMORY_LIMIT", "100")
    with pytest.raises(ValueError, match="FROSTLINE_MEMORY_LIMIT"):
        fl.load(masked)


def test_a_declared_size_that_disagrees_with_the_header_is_refused(tmp_path):
    sample, path = _saved(tmp_path, fl.lozenge.hexagon(2, 2, 2))
    with np.load(path, allow_pickle=False) as data:
        arrays = {k: data[k] for k in data.files}
    out = tmp_path / "lying.npz"
    with zipfile.ZipFile(out, "w") as z:
        for name, array in arrays.items():
            stream = _io.BytesIO()
            np.lib.format.write_array(stream, array, allow_pickle=False)
            payload = stream.getvalue()
            z.writestr(name + ".npy", payload + (b"\0" * 64 if name == "heights" else b""))
    with pytest.raises(ValueError, match="declares"):
        fl.load(out)


def test_save_keeps_existing_files_unless_asked(tmp_path):
    sample, path = _saved(tmp_path)
    before = path.read_bytes()
    with pytest.raises(FileExistsError, match="overwrite=True"):
        fl.save(sample, path)
    assert path.read_bytes() == before
    other = fl.domino.aztec_diamond(3).sample(seed=99)
    fl.save(other, path, overwrite=True)
    np.testing.assert_array_equal(fl.load(path).heights, other.heights)
    assert not [p for p in os.listdir(tmp_path) if p.endswith(".tmp")]


def test_save_follows_the_umask_and_symbolic_links(tmp_path):
    sample = fl.domino.aztec_diamond(2).sample(seed=1)
    old = os.umask(0o027)
    try:
        fl.save(sample, tmp_path / "masked.npz")
    finally:
        os.umask(old)
    assert stat.S_IMODE((tmp_path / "masked.npz").stat().st_mode) == 0o640
    target = tmp_path / "real.npz"
    link = tmp_path / "link.npz"
    link.symlink_to(target)
    fl.save(sample, link)
    assert link.is_symlink() and target.is_file()
    np.testing.assert_array_equal(fl.load(link).heights, sample.heights)
    with pytest.raises(FileExistsError):
        fl.save(sample, link)
    fl.save(sample, link, overwrite=True)
    assert link.is_symlink()


def test_command_line_refuses_overwrite_and_broken_files(tmp_path, capsys):
    out = tmp_path / "s.npz"
    assert main(["sample", "aztec", "3", "--seed", "1", "--output", str(out)]) == 0
    assert main(["sample", "aztec", "3", "--seed", "1", "--output", str(out)]) == 2
    assert "--force" in capsys.readouterr().err
    assert main(["sample", "aztec", "3", "--seed", "2", "--output", str(out), "--force"]) == 0
    broken = tmp_path / "broken.npz"
    broken.write_bytes(out.read_bytes()[:200])
    capsys.readouterr()
    assert main(["show", str(broken)]) == 2
    err = capsys.readouterr().err
    assert MESSAGE in err and "Traceback" not in err
