"""Progress on a terminal for the long runs of the command line and the tools.

A column of half a million rows or a workbook of thousands of rise/set cells takes
tens of seconds; a silent terminal looks hung.  ``tqdm`` draws the line (a well-kept
library: rate, elapsed time and redrawing in place are its job, not ours).  The line
appears only when the stream is a terminal, only once a run has lasted
``DELAY_S``, and never when asked to be quiet: a pipe, a log file or a script
reading stderr sees nothing of it.  Without tqdm installed it is silently absent;
the computation never depends on it.

Nothing here is used by the cell functions: the office never imports this module.
"""

import sys
import threading
import time

# Imported here, before anything imports the office bridge: once `uno` is imported its
# import hook turns tqdm's own probe for an optional helper module into an ImportError
# tqdm does not expect, and tqdm fails to import (seen with LibreOffice 7.4's uno.py).
try:
    from tqdm import tqdm
except ImportError:  # an optional extra: no line, same results
    tqdm = None

DELAY_S = 2.0  # a run shorter than this shows no progress at all
TICK_S = 0.5  # how often the elapsed time is redrawn while one long step blocks
REDRAW_S = 0.1  # at most this often on advancing (tqdm's mininterval)


def on_terminal(stream):
    try:
        return stream.isatty()
    except (AttributeError, ValueError):  # no such method, or the stream is closed
        return False


class Progress:
    """A progress line on ``stream`` (stderr by default), or nothing.

        with Progress("SKY.JD", unit="rows", quiet=args.quiet) as progress:
            progress.step("reading")    # what is being done now
            progress.advance(50_000)    # work done so far grows

    ``step`` names what the run is doing; a step that blocks for long (the office
    recomputing a workbook in one call) still shows its elapsed time ticking, redrawn
    by a small background thread.  ``say`` prints a line of its own without tearing
    the progress line."""

    def __init__(self, what, total=None, unit="it", stream=None, quiet=False):
        self.stream = sys.stderr if stream is None else stream
        self.bar = None
        self._stop = threading.Event()
        self._ticker = None
        if quiet or tqdm is None or not on_terminal(self.stream):
            return
        self.bar = tqdm(total=total, desc=what, unit=unit, file=self.stream,
                        delay=DELAY_S, mininterval=REDRAW_S, leave=False,
                        dynamic_ncols=True)
        self._ticker = threading.Thread(target=self._tick, daemon=True)
        self._ticker.start()

    @property
    def shown(self):
        return self.bar is not None

    def _tick(self):
        while not self._stop.wait(TICK_S):
            bar = self.bar
            if bar is not None and time.time() - bar.start_t >= DELAY_S:
                bar.refresh()

    def step(self, text):
        if self.bar is not None:
            self.bar.set_postfix_str(text, refresh=False)

    def advance(self, n=1):
        if self.bar is not None:
            self.bar.update(n)

    def say(self, text, stream=None):
        """Print a line (to stdout by default) above the progress line."""
        stream = sys.stdout if stream is None else stream
        if self.bar is not None:
            self.bar.write(text, file=stream)
        else:
            print(text, file=stream)

    def close(self):
        self._stop.set()
        if self._ticker is not None:
            self._ticker.join()
            self._ticker = None
        if self.bar is not None:
            self.bar.close()
            self.bar = None

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()
        return False
