"""Slowly varying quantities over a column of instants: computed exactly at a few
instants (nodes) and interpolated between them.

A column from an observing log holds many instants a day, and the costly parts of a
place (the IAU 2000A nutation series, about 30 us an instant, and the Earth's state
from ERFA epv00, about 25 us) change smoothly on a scale of days.  Nodes sit on TT
half-day marks (exact in one double, so neighbouring rows and later calls share them);
each instant takes the polynomial through the six nodes around it (Lagrange), two
before its half day and three after.  Against the direct computation over dense
random instants 1000-3000 (tests/test_nodes.py): the nutation within 1.5 uas (1.13
measured), the Earth's position within 0.5 m (0.41) and its velocity within 3 um/s
(2.1).

A column is interpolated only when it is dense: fewer distinct nodes than a quarter of
its rows.  One instant, a short column, or instants spread over the centuries are
computed directly, so a cell alone gives ERFA's own value; a dense column differs from
it by the bounds above, far below the stated accuracy of every model involved (the
built-in theories are good to tens of milliarcseconds, the nutation model to a fraction
of a milliarcsecond).
"""

import numpy as np

SPACING = 0.5   # days between nodes
NODES = 6       # nodes around each instant
BEFORE = 2      # nodes before the half day that holds the instant
DENSE_RATIO = 4  # rows per distinct node, at least, before a column is interpolated

# Each node's Lagrange denominator: the product of its distances to the others.
_DENOMINATORS = np.array([np.prod([k - j for j in range(NODES) if j != k])
                          for k in range(NODES)], dtype=float)


def weights(x):
    """Lagrange weights (rows x NODES) at ``x``, in node steps from the first node: for
    each node the product of the gaps to the other nodes, over its own denominator."""
    gaps = x[:, None] - np.arange(NODES, dtype=float)[None, :]
    before = np.ones((x.size, NODES + 1))
    after = np.ones((x.size, NODES + 1))
    before[:, 1:] = np.cumprod(gaps, axis=1)
    after[:, :-1] = np.cumprod(gaps[:, ::-1], axis=1)[:, ::-1]
    return before[:, :-1] * after[:, 1:] / _DENOMINATORS


class Nodes:
    """The nodes of a set of instants (TT or TDB, two-part JDs, any shape): ``unique``
    holds the distinct node instants, ``index`` (rows x NODES) each row's nodes among
    them, ``origin`` each row's first node."""

    def __init__(self, jd1, jd2, cells=None):
        self.shape = np.shape(jd1)
        self.jd1 = np.ravel(jd1)
        self.jd2 = np.ravel(jd2)
        if cells is None:
            cells = _half_days(self.jd1, self.jd2)
        cell = cells[0][cells[1]]
        # The distinct nodes: every half day's six, merged.
        around = (cells[0][:, None] + np.arange(-BEFORE, NODES - BEFORE)[None, :]) * SPACING
        self.unique, where = np.unique(around, return_inverse=True)
        self.index = where.reshape(around.shape)[cells[1]]
        self.origin = (cell - BEFORE) * SPACING
        self._weights = None

    def interpolate(self, values):
        """Per row, the polynomial through its nodes' ``values`` (distinct nodes x k)."""
        if self._weights is None:  # the same for every quantity over these instants
            self._weights = weights(((self.jd1 - self.origin) + self.jd2) / SPACING)
        out = np.einsum("mk,mkc->mc", self._weights, values[self.index])
        return out.reshape(self.shape + values.shape[1:])


def _half_days(jd1, jd2):
    """(distinct half days, each row's index among them) of flat two-part JDs."""
    return np.unique(np.floor((jd1 + jd2) / SPACING), return_inverse=True)


# The last dense column's nodes: the nutation and the Earth's state of one column are
# asked for the same instants (TT, which the built-in theories take for TDB), and
# finding the nodes (two sorts) costs as much as interpolating.
_LAST = [None]


def dense(jd1, jd2):
    """The ``Nodes`` of the instants if interpolating them is worth it, else None."""
    n = np.size(jd1)
    if n < 4 * DENSE_RATIO * NODES:
        return None
    flat1, flat2 = np.ravel(jd1), np.ravel(jd2)
    last = _LAST[0]
    if (last is not None and last.shape == np.shape(jd1) and np.array_equal(last.jd1, flat1)
            and np.array_equal(last.jd2, flat2)):
        return last
    if not np.all(np.isfinite(flat1 + flat2)):
        return None
    # A cheap first look: the distinct half days bound the distinct nodes from below.
    cells = _half_days(flat1, flat2)
    if cells[0].size * DENSE_RATIO > n:
        return None
    nodes = Nodes(flat1.copy(), flat2.copy(), cells)
    nodes.shape = np.shape(jd1)
    if nodes.unique.size * DENSE_RATIO > n:
        return None
    _LAST[0] = nodes
    return nodes


def over_nodes(compute, jd1, jd2):
    """``compute(jd1, jd2)`` -> array (..., k), interpolated over nodes for a dense
    column and computed directly otherwise."""
    nodes = dense(jd1, jd2)
    if nodes is None:
        return compute(jd1, jd2)
    at_nodes = compute(nodes.unique, np.zeros(nodes.unique.shape))
    return nodes.interpolate(at_nodes)
