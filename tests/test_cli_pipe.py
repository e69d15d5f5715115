"""Output to a pipe: no rich import, and a reader that stops early gets a quiet exit 141.

* A piped ``check`` prints through the plain writer (shaftcheck.output.terminal), so rich is not
  imported at all; on a terminal rich is used (tests/test_console_plain.py holds the bytes).
* When the reader closes the pipe before the output is written (``| head``), shaftcheck stops
  without a message and exits 141, what a shell reports for a program ended by SIGPIPE, not a
  verdict (0/1) and not an internal error (3).
"""

from __future__ import annotations

import subprocess

from conftest import ROOT, SHAFTCHECK_CMD, TUBULAR, run_cli


def test_piped_check_does_not_import_rich():
    code = ("import sys, runpy\n"
            f"sys.argv = ['shaftcheck', 'check', {str(TUBULAR)!r}]\n"
            "try:\n    runpy.run_module('shaftcheck', run_name='__main__')\n"
            "except SystemExit:\n    pass\n"
            "rich = any(m.split('.')[0] == 'rich' for m in sys.modules)\n"
            "sys.stderr.write(f'RICH={rich}')\n")
    out = subprocess.run([SHAFTCHECK_CMD[0], "-c", code], capture_output=True, text=True,
                         cwd=ROOT, timeout=120)
    assert "RICH=False" in out.stderr, out.stderr
    assert "stiffness_mismatch" in out.stdout


def test_a_reader_that_stops_early_gets_a_quiet_141():
    proc = subprocess.Popen([*SHAFTCHECK_CMD, "sweep", str(TUBULAR), "--travel-step", "1",
                             "--rack-step", "5"], stdout=subprocess.PIPE,
                            stderr=subprocess.PIPE, cwd=ROOT)
    first = proc.stdout.read(200)  # the output is > 200 kB, far more than a pipe holds
    proc.stdout.close()
    _, err = proc.communicate(timeout=120)
    assert first.startswith(b"rows: wheel travel")
    assert proc.returncode == 141
    assert err == b""


def test_the_whole_output_read_keeps_the_verdict_status():
    out = run_cli("sweep", TUBULAR, "--travel-step", "1", "--rack-step", "5")
    assert out.returncode == 0 and len(out.stdout) > 100_000
