"""Progress on long runs: drawn on a terminal, absent from a pipe, absent when asked.

The terminal is a real pseudo-terminal (``os.openpty``): the line appears only where
``isatty()`` is true, which is exactly what a pipe or a file is not.  The tools that
drive the office (recompute, freeze) are run as a user runs them, in a subprocess,
with their stderr on a pseudo-terminal and then on a pipe.
"""

import csv
import fcntl
import os
import select
import struct
import subprocess
import sys
import termios
import time

import pytest

from calcfuncs import cli, progress

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def _openpty():
    """A pseudo-terminal of 24 rows and 100 columns, as a terminal window has (a fresh
    one has 0 columns, and a line cut to 0 columns is nothing)."""
    master, slave = os.openpty()
    fcntl.ioctl(slave, termios.TIOCSWINSZ, struct.pack("HHHH", 24, 100, 0, 0))
    return master, slave


def _drain(fd, timeout=0.5, at_most=5.0):
    """What the terminal receives until it is quiet for ``timeout`` seconds (or for
    ``at_most`` seconds in all, as a line that keeps redrawing is never quiet)."""
    out = b""
    end = time.monotonic() + at_most
    while time.monotonic() < end and select.select([fd], [], [], timeout)[0]:
        try:
            data = os.read(fd, 65536)
        except OSError:  # the other end closed (Linux answers EIO)
            break
        if not data:
            break
        out += data
    return out.decode("utf-8", "replace")


def _log_csv(path, rows):
    with open(path, "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(["timestamp"])
        for k in range(rows):
            w.writerow([f"2024-03-{1 + k % 28:02d}T{k % 24:02d}:00:00Z"])


def _run_cli_on(err, tmp_path, *extra, rows=3000):
    src, out = tmp_path / "log.csv", tmp_path / "jd.csv"
    _log_csv(src, rows)
    status = cli.main(["SKY.JD", "--in", str(src), "--arg", "time=timestamp", "--out",
                       str(out), *extra], out=sys.stdout, err=err)
    assert status == 0
    got = list(csv.reader(open(out, encoding="utf-8")))
    assert len(got) == rows + 1  # the progress never costs a row
    # 2024-03-01T00:00Z is JD 2460370.5 (JD of 2000-01-01T12:00 is 2451545.0, common
    # practice; 8825.5 days later): the rows are the real results.
    assert float(got[1][1]) == 2460370.5


@pytest.fixture
def terminal():
    # tqdm is a dev dependency (requirements-dev.txt): its absence would hide the line.
    assert progress.tqdm is not None
    master, slave = _openpty()
    stream = os.fdopen(slave, "w", buffering=1, encoding="utf-8")
    assert stream.isatty()
    yield master, stream
    stream.close()
    os.close(master)


@pytest.fixture
def at_once(monkeypatch):
    """No waiting before the line appears, and a chunk every 500 rows, so a short test
    run shows what a long one shows."""
    monkeypatch.setattr(progress, "DELAY_S", 0.0)
    monkeypatch.setattr(progress, "REDRAW_S", 0.0)
    monkeypatch.setattr(cli, "CHUNK_ROWS", 500)


def test_the_command_line_shows_progress_on_a_terminal(terminal, at_once, tmp_path):
    master, stream = terminal
    _run_cli_on(stream, tmp_path)
    shown = _drain(master)
    # tqdm's line: the function, the count of rows done and the rate.
    assert "SKY.JD" in shown
    assert "3000 rows" in shown or "3.00k rows" in shown, shown
    assert "rows/s" in shown, shown
    # and the summary after it, as always
    assert "SKY.JD: 3000 rows, 3000 computed" in shown


def test_the_command_line_is_quiet_when_asked(terminal, at_once, tmp_path):
    master, stream = terminal
    _run_cli_on(stream, tmp_path, "--quiet")
    shown = _drain(master)
    assert "rows/s" not in shown and "\r" not in shown.replace("\r\n", "\n")
    assert "SKY.JD: 3000 rows, 3000 computed" in shown


def test_the_command_line_shows_nothing_for_a_short_run(terminal, monkeypatch, tmp_path):
    # A run shorter than the delay (two seconds by default) draws no line at all.
    monkeypatch.setattr(progress, "DELAY_S", 60.0)
    master, stream = terminal
    _run_cli_on(stream, tmp_path)
    shown = _drain(master)
    assert "rows/s" not in shown
    assert shown.strip().startswith("SKY.JD: 3000 rows")


def test_the_command_line_writes_no_progress_into_a_pipe(tmp_path):
    # A real run as a user types it, stderr to a pipe: only the summary line comes.
    src, out = tmp_path / "log.csv", tmp_path / "jd.csv"
    _log_csv(src, 2000)
    done = subprocess.run(
        [sys.executable, "-m", "calcfuncs", "SKY.JD", "--in", str(src), "--arg",
         "time=timestamp", "--out", str(out)], cwd=ROOT, capture_output=True, text=True,
        env=dict(os.environ, PYTHONPATH=ROOT), timeout=120)
    assert done.returncode == 0, done.stderr
    assert done.stderr == "SKY.JD: 2000 rows, 2000 computed\n"


def test_a_long_step_keeps_its_clock_running(terminal, monkeypatch):
    # One office call can block for tens of seconds; the line still moves meanwhile.
    monkeypatch.setattr(progress, "DELAY_S", 0.0)
    monkeypatch.setattr(progress, "TICK_S", 0.1)
    master, stream = terminal
    with progress.Progress("recompute", total=1, unit=" workbooks", stream=stream) as p:
        p.step("opening and recomputing log.ods")
        time.sleep(1.3)  # a blocking call: no advance() meanwhile
        during = _drain(master, 0.2, at_most=0.5)
        p.advance()
    assert "opening and recomputing log.ods" in during
    assert "00:01" in during, during  # the elapsed time was redrawn while it blocked
    assert "0/1" in during


def test_progress_is_off_on_a_file_or_a_pipe(tmp_path):
    with open(tmp_path / "log.txt", "w") as f:
        assert not progress.Progress("x", stream=f).shown
    read, write = os.pipe()
    with os.fdopen(write, "w") as w:
        assert not progress.Progress("x", stream=w).shown
    os.close(read)


def _run_tool_with_stderr_on(argv, stderr_fd):
    return subprocess.run([sys.executable, *argv], cwd=ROOT, stdout=subprocess.PIPE,
                          stderr=stderr_fd, text=True, timeout=300)


def _tool_on_terminal(argv):
    master, slave = _openpty()
    try:
        proc = subprocess.Popen([sys.executable, *argv], cwd=ROOT, stdout=subprocess.PIPE,
                                stderr=slave, text=True)
        os.close(slave)
        seen = ""
        while proc.poll() is None:
            seen += _drain(master, 0.5)
        seen += _drain(master, 0.2)
        out = proc.stdout.read()
        return proc.returncode, out, seen
    finally:
        os.close(master)


@pytest.mark.office
def test_recompute_shows_what_it_does_on_a_terminal_and_nothing_in_a_pipe(oxt, tmp_path):
    sheet = os.path.join(ROOT, "sample_sheets", "observing_log.ods")
    argv = [os.path.join(ROOT, "tools", "recompute.py"), "--oxt", oxt, "--out",
            str(tmp_path / "a"), "--messages-expected", "Bad input", sheet]
    status, out, seen = _tool_on_terminal(argv)
    assert status == 0, out + seen
    # Starting an office and recomputing a workbook outlasts the two-second delay.
    assert "recompute" in seen and "workbooks" in seen, seen
    assert "observing_log.ods" in seen, seen
    assert "wrote" in out
    piped = _run_tool_with_stderr_on(argv[:4] + [str(tmp_path / "b")] + argv[5:],
                                     subprocess.PIPE)
    assert piped.returncode == 0
    assert piped.stderr == "", piped.stderr
    quiet_status, _, quiet_seen = _tool_on_terminal(argv[:4] + [str(tmp_path / "c"), "-q"]
                                                    + argv[5:])
    assert quiet_status == 0 and "workbooks" not in quiet_seen, quiet_seen


@pytest.mark.office
def test_freeze_shows_what_it_does_on_a_terminal(oxt, tmp_path):
    sheet = os.path.join(ROOT, "sample_sheets", "observing_log.ods")
    argv = [os.path.join(ROOT, "tools", "freeze.py"), "--oxt", oxt, sheet,
            str(tmp_path / "frozen.ods")]
    status, out, seen = _tool_on_terminal(argv)
    assert status == 0, out + seen
    assert "freeze" in seen and "cells" in seen, seen
    assert "froze" in out and os.path.getsize(tmp_path / "frozen.ods") > 10_000
