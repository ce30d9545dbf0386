"""Eclipsheet's core: astronomical cell functions over numpy arrays, computed with ERFA.

Importing this package is cheap on purpose (no numpy, no erfa): the office adapter
imports the registry when the component loads, and the heavy modules only on the
first call, so a missing numpy shows up as a message in the cell, not as a failed
install.
"""

__version__ = "0.1.0"


def call(name, *args, null_date=(1899, 12, 30)):
    """Evaluate one cell function by display name, as a cell would, from Python.

    Unlike a cell, a problem raises ``ValueError`` with the same text the cell would
    show.  Ranges are tuples of row tuples and give tuples back.
    """
    from . import cells

    return cells.call_strict(name, args, null_date)
