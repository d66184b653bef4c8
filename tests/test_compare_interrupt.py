"""Interruption: SIGINT and SIGTERM end a run with one line on stderr, exit 128 + the signal number (the
shell's custom, common practice), leave an earlier output as it was and no temporary folder behind.
Real processes, real signals, sent while the section is being solved and while the results are
being written (held there by the test-only pause of compare.cli.cmd_run.PAUSE_ENV)."""
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from compare.cli import cmd_run, interrupt

ROOT = Path(__file__).resolve().parents[1]
SLOW = ROOT / "cases" / "conveyor_gear_seat.toml"  # several seconds of meshing and solving
QUICK = """
[case]
units = "mm-N-MPa"
[section]
shape = "round"
diameter = 40
[loads]
torque = "100 N*m"
[material]
shear_modulus = "80 GPa"
[analysis]
accuracy = "1 %"
"""

pytestmark = pytest.mark.skipif(not sys.platform.startswith("linux"), reason="signals and /proc as on Linux")


def _gmsh_loaded(pid: int) -> bool:
    """gmsh's library is mapped: the process has started meshing."""
    try:
        return "gmsh" in Path(f"/proc/{pid}/maps").read_text()
    except OSError:
        return False


def _temporary(folder: Path):
    return [p for p in folder.iterdir() if p.name.startswith(".shaftcheck-")]


def _wait_for(cond, proc, what, timeout=120.0):
    t0 = time.monotonic()
    while not cond():
        if proc.poll() is not None:
            pytest.fail(f"the run ended (exit {proc.returncode}) before {what}: {proc.stderr.read()}")
        if time.monotonic() - t0 > timeout:
            proc.kill()
            pytest.fail(f"timed out waiting for {what}")
        time.sleep(0.02)


@pytest.mark.parametrize("moment", ["solve", "write"])
@pytest.mark.parametrize("sig", [signal.SIGINT, signal.SIGTERM])
def test_a_signal_ends_the_run_with_one_line_and_leaves_nothing_behind(tmp_path, sig, moment):
    out = tmp_path / "o"
    out.mkdir()
    (out / "results.json").write_text('{"earlier": true}\n')
    (out / "section.vtu").write_text("<earlier/>\n")
    case = SLOW
    if moment == "write":
        case = tmp_path / "quick.toml"
        case.write_text(QUICK)
    env = {**os.environ, "PYTHONPATH": str(ROOT), cmd_run.PAUSE_ENV: "60"}
    proc = subprocess.Popen([sys.executable, "-m", "compare.cli", "run", "--no-report", str(case), "--out", str(out)],
                            cwd=tmp_path, env=env, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    if moment == "solve":
        _wait_for(lambda: _gmsh_loaded(proc.pid), proc, "meshing started")
        time.sleep(0.3)
        assert not _temporary(tmp_path), "the run was already writing; the signal would not land in the solve"
    else:  # paused after writing results.json and section.vtu into the temporary folder
        _wait_for(lambda: any((p / "section.vtu").exists() for p in _temporary(tmp_path)), proc, "the write")
    proc.send_signal(sig)
    stdout, err = proc.communicate(timeout=120)
    assert proc.returncode == 128 + sig, err
    assert err == f"shaftcheck: interrupted by {signal.Signals(sig).name}; no partial output was left\n"
    assert "Traceback" not in err and stdout == ""
    assert _temporary(tmp_path) == []
    assert sorted(os.listdir(tmp_path)) == sorted(["o"] + (["quick.toml"] if moment == "write" else []))
    assert (out / "results.json").read_text() == '{"earlier": true}\n'
    assert (out / "section.vtu").read_text() == "<earlier/>\n"


def test_held_defers_a_signal_to_the_end_of_the_step():
    restore = interrupt.install_handlers()
    try:
        done = []
        with pytest.raises(interrupt.Interrupted) as e:
            with interrupt.held():
                os.kill(os.getpid(), signal.SIGTERM)
                for _ in range(20):
                    time.sleep(0.005)  # the handler runs here, and must not raise
                done.append("step")
        assert done == ["step"] and e.value.exit_code == 128 + signal.SIGTERM
        os.kill(os.getpid(), signal.SIGINT)  # a second signal while cleaning up is ignored
        time.sleep(0.05)
    finally:
        restore()
    assert signal.getsignal(signal.SIGINT) is not interrupt._handler
    assert signal.getsignal(signal.SIGTERM) is not interrupt._handler


def test_outside_held_the_first_signal_raises_at_once():
    restore = interrupt.install_handlers()
    try:
        with pytest.raises(interrupt.Interrupted) as e:
            os.kill(os.getpid(), signal.SIGINT)
            for _ in range(100):
                time.sleep(0.01)
            pytest.fail("SIGINT did not interrupt")
        assert e.value.name == "SIGINT" and e.value.exit_code == 130
    finally:
        restore()
