"""Eclipsheet's core: astronomical cell functions over numpy arrays, computed with ERFA.

Importing this package is cheap on purpose (no numpy, no erfa): the office adapter
imports the registry when the component loads, and the heavy modules only on the
first call, so a missing numpy shows up as a message in the cell, not as a failed
install.
"""

__version__ = "0.1.0"


def call(name, *args, null_date=(1899, 12, 30), **kwargs):
    """Evaluate one cell function from Python, as a cell would: the short name of
    ``calcfuncs.api.call``, which says the rest.

    ``name`` is a display name (``"SKY.JD"``) or an API name (``"jd"``); the arguments
    are the cell's, by position or keyword.  A problem raises ``calcfuncs.api.SkyError``
    (a ``ValueError``) with the text the cell would show.  A list or tuple is a column
    and gives a list back (rows of values give a list of rows).
    """
    from . import api

    return api.call(name, *args, null_date=null_date, **kwargs)
