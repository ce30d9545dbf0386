"""Angles as observers write them: sexagesimal text in, decimal degrees out, and back.

Accepted text (signs + - and the minus sign U+2212; spaces anywhere between fields):
  degrees   -23°26'21.4"   -23°26′21.4″   23d26m21.4s   -23 26 21.4   -23:26:21.4
            -23.4393   -23.4393°   -23 26.35
  hours     12h34m56.7s   12h 34m 56.7s   12.5h   and, read as right ascension,
            12:34:56.7   12 34 56.7
Only the last field may have a fraction; minutes and seconds must be below 60.
"""

import re

import numpy as np

from .errors import RowErrors, SkyError

_FIELD = re.compile(r"\s*(\d+(?:\.\d*)?|\.\d+)\s*(deg|°|º|d|h|m|s|'|\"|:)?\s*", re.IGNORECASE)
_RANK_OF_MARK = {"deg": 0, "°": 0, "º": 0, "d": 0, "h": 0, "m": 1, "'": 1, "s": 2, '"': 2}
_ACCEPTED = (
    "write degrees as -23°26'21.4\", -23 26 21.4, -23:26:21.4 or -23.4393, "
    "hours as 12h34m56.7s"
)
MAX_FORMAT_DEGREES = 1.0e6


def _normalise(text):
    return (
        text.strip()
        .replace("\u2212", "-")
        .replace("\u2032", "'")
        .replace("\u2033", '"')
        .replace("''", '"')
    )


def parse_angle(text, hours_by_default=False):
    """Decimal degrees from sexagesimal or decimal text; ``SkyError`` if unreadable.

    Unmarked fields are degrees, or hours when ``hours_by_default``; an ``h`` mark
    always means hours and a degree mark always means degrees.
    """
    s = _normalise(str(text))
    if not s:
        raise SkyError("the angle is empty; " + _ACCEPTED)
    sign = 1.0
    if s[0] in "+-":
        sign = -1.0 if s[0] == "-" else 1.0
        s = s[1:]
    fields = []
    pos = 0
    while pos < len(s):
        m = _FIELD.match(s, pos)
        if not m or m.end() == pos:
            raise SkyError(f'"{text}" is not an angle; {_ACCEPTED}')
        fields.append((m.group(1), (m.group(2) or "").lower()))
        pos = m.end()
    if not fields or len(fields) > 3:
        raise SkyError(f'"{text}" is not an angle; {_ACCEPTED}')

    marks = {mark for _, mark in fields}
    in_hours = "h" in marks or (hours_by_default and not marks & {"°", "º", "d", "deg"})
    if "h" in marks and marks & {"°", "º", "d", "deg"}:
        raise SkyError(f'"{text}" mixes hours and degrees; {_ACCEPTED}')

    total = 0.0
    rank = -1
    for k, (number, mark) in enumerate(fields):
        new_rank = _RANK_OF_MARK.get(mark, rank + 1)
        if new_rank <= rank or new_rank > 2:
            raise SkyError(f'"{text}" has its fields out of order; {_ACCEPTED}')
        if "." in number and k != len(fields) - 1:
            raise SkyError(f'"{text}": only the last field may have a fraction')
        value = float(number)
        if new_rank > 0 and k > 0 and value >= 60.0:
            unit = ("minutes", "seconds")[new_rank - 1]
            raise SkyError(f'"{text}": {unit} must be below 60')
        total += value / 60.0**new_rank
        rank = new_rank
    return sign * total * (15.0 if in_hours else 1.0)


def _read_column(values, hours_by_default):
    values = np.asarray(values, dtype=object)
    out = np.zeros(values.shape)
    messages = np.full(values.shape, None, dtype=object)
    for idx, v in np.ndenumerate(values):
        if isinstance(v, (float, int)) and not isinstance(v, bool):
            if not np.isfinite(v):
                messages[idx] = f"{v!r} is not a finite angle"
            else:
                out[idx] = float(v) * (15.0 if hours_by_default else 1.0)
            continue
        try:
            out[idx] = parse_angle(v, hours_by_default)
        except SkyError as err:
            messages[idx] = str(err)
    if any(m is not None for m in messages.ravel()):
        raise RowErrors(messages)
    return out


def angle_from_text(text):
    """Degrees from angle text (unmarked fields are degrees); numbers pass through."""
    return _read_column(text, hours_by_default=False)


def angle_from_hours_text(text):
    """Degrees from right-ascension text (unmarked fields are hours); numbers are hours."""
    return _read_column(text, hours_by_default=True)


def wrap_360(degrees):
    """Angles in [0, 360)."""
    r = np.mod(np.asarray(degrees, dtype=float), 360.0)
    # np.mod of a tiny negative number rounds to 360.0 itself.
    return np.where(r >= 360.0, 0.0, r)


def wrap_180(degrees):
    """Angles in (-180, 180]."""
    r = 180.0 - np.mod(180.0 - np.asarray(degrees, dtype=float), 360.0)
    return np.where(r <= -180.0, r + 360.0, r)


def _check_decimals(decimals):
    if not 0 <= decimals <= 9:
        raise SkyError(f"decimals must be 0 to 9, not {decimals}")


def _split(units, decimals):
    """(whole units, minutes, seconds text) of a non-negative amount, rounded once so
    that 59.96 s at one decimal carries into the minutes instead of showing 60.0."""
    scale = 10**decimals
    q = int(round(units * 3600.0 * scale))
    whole, rest = divmod(q, 3600 * scale)
    minutes, sec_scaled = divmod(rest, 60 * scale)
    sec_whole, sec_frac = divmod(sec_scaled, scale)
    seconds = f"{sec_whole:02d}" + (f".{sec_frac:0{decimals}d}" if decimals else "")
    return whole, minutes, seconds


_DMS_LAYOUT = {"MARKS": "{s}{d:02d}°{m:02d}'{sec}\"", "COLONS": "{s}{d:02d}:{m:02d}:{sec}",
               "SPACES": "{s}{d:02d} {m:02d} {sec}"}
_HMS_LAYOUT = {"MARKS": "{h:02d}h{m:02d}m{sec}s", "COLONS": "{h:02d}:{m:02d}:{sec}",
               "SPACES": "{h:02d} {m:02d} {sec}"}


def _format_column(degrees, decimals, one):
    _check_decimals(decimals)
    degrees = np.asarray(degrees, dtype=float)
    bad = ~np.isfinite(degrees) | (np.abs(np.nan_to_num(degrees)) > MAX_FORMAT_DEGREES)
    if np.any(bad):
        from .errors import rows_failing

        raise rows_failing(bad, f"the angle must be a finite number of degrees within +-{MAX_FORMAT_DEGREES:g}")
    return np.array([one(float(v)) for v in degrees.ravel()], dtype=object).reshape(degrees.shape)


def dms_text(degrees, decimals=1, style="MARKS"):
    """Signed degrees, arcminutes, arcseconds text; the sign is always shown."""
    layout = _DMS_LAYOUT[style]

    def one(v):
        d, m, sec = _split(abs(v), decimals)
        # -0.00001 degrees rounded to +00°00'00.0" shows no minus sign.
        negative = v < 0 and (d > 0 or m > 0 or sec.strip("0.") != "")
        return layout.format(s="-" if negative else "+", d=d, m=m, sec=sec)

    return _format_column(degrees, decimals, one)


def hms_text(degrees, decimals=2, style="MARKS"):
    """Hours, minutes, seconds text of an angle brought into [0, 360)."""
    layout = _HMS_LAYOUT[style]

    def one(v):
        h, m, sec = _split(float(wrap_360(v)) / 15.0, decimals)
        if h >= 24:  # 23h59m59.999s rounded up to a full day
            h = 0
        return layout.format(h=h, m=m, sec=sec)

    return _format_column(degrees, decimals, one)
