"""The two kinds of problem the core reports, both ``ValueError`` for Python callers."""

PREFIX = "#SKY: "


class SkyError(ValueError):
    """A problem with what the user gave, worded for a cell.

    ``str(err)`` is the message without the ``#SKY:`` prefix; the cell layer adds it.
    """


class RowErrors(SkyError):
    """Some rows of a vectorised call cannot be computed; the others can.

    ``messages`` is an object array shaped like the input, ``None`` where the row is
    fine.  The cell layer marks those rows and computes the rest again; a Python
    caller sees the first message.
    """

    def __init__(self, messages):
        self.messages = messages
        first = next((m for m in messages.ravel() if m is not None), "bad input")
        super().__init__(first)


def rows_failing(mask, message):
    """A ``RowErrors`` that puts one message on every row where ``mask`` is true."""
    import numpy as np

    mask = np.asarray(mask, dtype=bool)
    messages = np.full(mask.shape, None, dtype=object)
    messages[mask] = message
    return RowErrors(messages)


def per_row(n, compute):
    """``[compute(0), ..., compute(n - 1)]`` for work that has no array form; rows whose
    computation raises a ``SkyError`` get its message, raised together as a row-aligned
    ``RowErrors`` once every row has been tried."""
    import numpy as np

    results = [None] * n
    messages = np.full(n, None, dtype=object)
    for k in range(n):
        try:
            results[k] = compute(k)
        except SkyError as err:
            messages[k] = str(err)
    if any(m is not None for m in messages):
        raise RowErrors(messages)
    return results


def aligned_rows(compute, idx, n):
    """``compute()``, run for the rows ``idx`` of ``n``; a ``RowErrors`` it raises for
    those rows comes back aligned with all ``n`` rows."""
    import numpy as np

    try:
        return compute()
    except RowErrors as err:
        messages = np.ravel(err.messages)
        if messages.size != idx.size:
            raise
        out = np.full(n, None, dtype=object)
        out[idx] = messages
        raise RowErrors(out) from None
