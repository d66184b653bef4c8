"""The output folder (--out): checked before the work, written whole or not at all, replaced as a whole,
never merged, and consistent when two runs write to it at once. The promises are the tool's own
(docs/outputs.md, 'The output folder'); there is no published value to hold them to."""
import errno
import json
import os
import subprocess
import sys
import threading
from pathlib import Path

import pytest

from compare.cli import cmd_run
from compare.cli.cmd_run import check_out, write_outputs
from fem.errors import InputError

ROOT = Path(__file__).resolve().parents[1]

ROUND = """
[case]
title = "{title}"
units = "mm-N-MPa"
[section]
shape = "round"
diameter = {d}
[loads]
torque = "100 N*m"
[material]
shear_modulus = "80 GPa"
[analysis]
accuracy = "1 %"
"""


def leftovers(folder: Path):
    return sorted(p.name for p in folder.iterdir() if p.name.startswith(".shaftcheck-"))


def snapshot(folder: Path):
    """Every path below ``folder`` with its content (files), 'folder' or its link target."""
    snap = {}
    for p in sorted(folder.rglob("*")):
        key = str(p.relative_to(folder))
        snap[key] = (f"link to {os.readlink(p)}" if p.is_symlink() else "folder" if p.is_dir() else p.read_bytes())
    return snap


def old_output(folder: Path):
    folder.mkdir()
    (folder / "results.json").write_text('{"old": true}\n')
    (folder / "section.vtu").write_text("<old mesh of another case/>\n")
    return snapshot(folder)


def test_an_earlier_output_is_replaced_as_a_whole_not_merged(tmp_path):
    out = tmp_path / "o"
    old_output(out)
    write_outputs(out, {"results.json": '{"new": true}\n'})
    assert sorted(os.listdir(out)) == ["results.json"]  # the stale section.vtu is gone
    assert json.loads((out / "results.json").read_text()) == {"new": True}
    assert leftovers(tmp_path) == []


def test_new_folders_are_made_with_the_usual_permissions(tmp_path):
    out = tmp_path / "a" / "b" / "o"
    write_outputs(out, {"results.json": "{}\n"})
    assert (out / "results.json").read_text() == "{}\n"
    umask = os.umask(0)
    os.umask(umask)
    assert (out.stat().st_mode & 0o777) == (0o777 & ~umask)
    assert leftovers(out.parent) == []


@pytest.mark.parametrize("make,words", [
    (lambda o: (o.mkdir(), (o / "notes.txt").write_text("mine")), "'notes.txt', which shaftcheck did not write"),
    (lambda o: (o.mkdir(), (o / "results.json").mkdir()), "'results.json', which is not a plain file"),
    (lambda o: (o.mkdir(), (o / "section.vtu").write_text("x"), (o / "sub").mkdir()), "'sub'"),
    (lambda o: o.write_text("a file"), "exists and is not a folder"),
    (lambda o: o.symlink_to(o.parent / "nowhere"), "broken symbolic link"),
])
def test_a_folder_that_is_not_ours_is_refused_and_left_alone(tmp_path, make, words):
    out = tmp_path / "o"
    make(out)
    before = snapshot(tmp_path)
    with pytest.raises(InputError) as e:
        write_outputs(out, {"results.json": "{}\n"})
    assert e.value.field == "--out" and e.value.value == str(out) and words in str(e.value)
    assert "\n" not in str(e.value)
    assert snapshot(tmp_path) == before
    assert leftovers(tmp_path) == []


def test_names_too_long_for_the_file_system_are_refused_before_anything_is_made(tmp_path):
    name_max = os.pathconf(tmp_path, "PC_NAME_MAX")
    for out in (tmp_path / ("x" * (name_max + 1)), tmp_path / "a" / ("y" * (name_max + 1)) / "o"):
        with pytest.raises(InputError) as e:
            check_out(out)
        assert e.value.field == "--out" and "too long for the file system" in str(e.value)
        with pytest.raises(InputError):
            write_outputs(out, {"results.json": "{}\n"})
    assert os.listdir(tmp_path) == []


def test_the_current_folder_and_its_parents_are_refused(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    for out in (".", "..", str(tmp_path)):
        with pytest.raises(InputError) as e:
            check_out(Path(out))
        assert "current folder" in str(e.value) and e.value.value == out


def test_a_link_to_an_output_folder_is_followed(tmp_path):
    real = tmp_path / "real"
    old_output(real)
    (tmp_path / "link").symlink_to(real)
    write_outputs(tmp_path / "link", {"results.json": "{}\n"})
    assert (tmp_path / "link").is_symlink() and sorted(os.listdir(real)) == ["results.json"]
    assert leftovers(tmp_path) == []


@pytest.mark.skipif(os.geteuid() == 0, reason="the superuser writes into read-only folders anyway")
def test_read_only_folders_are_refused(tmp_path):
    ro = tmp_path / "ro"
    ro.mkdir()
    ro.chmod(0o555)
    try:
        with pytest.raises(InputError) as e:
            write_outputs(ro / "o", {"results.json": "{}\n"})
        assert "read-only" in str(e.value) and e.value.field == "--out"
    finally:
        ro.chmod(0o755)
    assert os.listdir(ro) == []


def test_a_refusal_by_the_file_system_while_moving_in_leaves_the_old_output(tmp_path, monkeypatch):
    # the checks cannot foresee everything (access control lists, a full disk, a network share):
    # whatever the system refuses, the earlier output stays as it was and no temporary folder is left
    out = tmp_path / "o"
    before = old_output(out)
    real_rename = os.rename

    def refuse_second(src, dst):  # refuse the new folder, let the old one go back
        if Path(dst) == out and not Path(src).name.startswith(".shaftcheck-old-"):
            raise PermissionError(errno.EACCES, "Permission denied")
        return real_rename(src, dst)

    monkeypatch.setattr(cmd_run.os, "rename", refuse_second)
    with pytest.raises(InputError) as e:
        write_outputs(out, {"results.json": '{"new": true}\n'})
    assert e.value.field == "--out" and "Permission denied" in str(e.value)
    assert snapshot(out) == before
    assert leftovers(tmp_path) == []


def test_a_failure_while_writing_leaves_nothing_and_removes_the_folders_it_made(tmp_path, monkeypatch):
    def broken_vtu(path, analysis):
        Path(path).write_text("half a mesh")
        raise OSError(errno.ENOSPC, "No space left on device")

    monkeypatch.setattr(cmd_run, "write_fields_vtu", broken_vtu)
    out = tmp_path / "new" / "o"
    with pytest.raises(InputError) as e:
        write_outputs(out, {"results.json": "{}\n"}, analysis=object())
    assert "No space left on device" in str(e.value)
    assert os.listdir(tmp_path) == []


def test_threads_writing_to_one_folder_leave_one_complete_consistent_output(tmp_path):
    out = tmp_path / "o"
    errors = []

    def writer(k):
        try:
            for i in range(15):
                token = f"{k}-{i}"
                write_outputs(out, {"results.json": token, "section.vtu": token * 50})
        except Exception as exc:  # noqa: BLE001 - reported below
            errors.append(exc)

    threads = [threading.Thread(target=writer, args=(k,)) for k in range(4)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    assert errors == []
    assert sorted(os.listdir(out)) == ["results.json", "section.vtu"]
    token = (out / "results.json").read_text()
    assert (out / "section.vtu").read_text() == token * 50
    assert leftovers(tmp_path) == []


def test_run_checks_out_before_the_analysis(tmp_path, run_cli, monkeypatch):
    def must_not_run(*a, **k):
        raise AssertionError("the analysis ran before --out was checked")

    monkeypatch.setattr(cmd_run, "analyse", must_not_run)
    case = tmp_path / "c.toml"
    case.write_text(ROUND.format(title="t", d=40))
    out = tmp_path / "o"
    out.mkdir()
    (out / "results.json").mkdir()
    code, stdout, err = run_cli("run", "--no-report", str(case), "--out", str(out))
    assert code == 2 and stdout == ""
    assert err.count("\n") == 1 and err.startswith("shaftcheck: error: --out = ") and "results.json" in err
    assert sorted(os.listdir(out)) == ["results.json"] and os.listdir(out / "results.json") == []


def test_run_replaces_a_stale_mesh_from_another_case(tmp_path, run_cli):
    out = tmp_path / "o"
    old_output(out)
    case = tmp_path / "c.toml"
    case.write_text(ROUND.format(title="new case", d=40))
    code, _, err = run_cli("run", "--no-report", str(case), "--out", str(out), "--no-vtu", "--quiet")
    assert code == 0, err
    assert sorted(os.listdir(out)) == ["results.json"]
    assert json.loads((out / "results.json").read_text())["case"]["title"] == "new case"


def test_two_processes_writing_to_one_folder_leave_one_complete_consistent_output(tmp_path):
    import meshio

    out = tmp_path / "o"
    procs = []
    env = {**os.environ, "PYTHONPATH": str(ROOT), cmd_run.PAUSE_ENV: "0.5"}  # test-only pause before moving in
    for title, d in (("first", 40), ("second", 25)):
        case = tmp_path / f"{title}.toml"
        case.write_text(ROUND.format(title=title, d=d))
        procs.append(subprocess.Popen([sys.executable, "-m", "compare.cli", "run", "--no-report", str(case), "--out", str(out), "--quiet"],
                                      cwd=tmp_path, env=env, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True))
    for p in procs:
        _, err = p.communicate(timeout=300)
        assert p.returncode == 0, err
    assert sorted(os.listdir(out)) == ["results.json", "section.vtu"]
    res = json.loads((out / "results.json").read_text())
    assert res["case"]["title"] in ("first", "second")
    # the mesh beside the results is the one they were computed on
    assert len(meshio.read(out / "section.vtu").points) == res["mesh"]["dofs"]
    assert leftovers(tmp_path) == []
