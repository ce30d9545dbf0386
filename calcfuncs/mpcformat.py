"""Orbits written in one cell: the Minor Planet Center's one-line formats, and ours.

Three forms are read, each a single line of text:

* the MPC's export format for minor-planet orbits (the layout of MPCORB.DAT: packed
  designation in columns 1-7, H 9-13, G 15-19, packed epoch 21-25, M 27-35, peri 38-46,
  node 49-57, i 60-68, e 71-79, n 81-91, a 93-103, the readable designation 167-194);
* the MPC's export format for comet orbits (CometEls.txt: number 1-4, orbit type 5,
  packed provisional designation 6-12, perihelion time 15-29 as year, month and day
  with its fraction, q 31-39, e 42-49, peri 52-59, node 62-69, i 72-79, epoch 82-89,
  magnitude parameters 92-95 and 97-100, designation and name 103-158);
* our own form, made by SKY.ORBIT.FROM.Q and SKY.ORBIT.FROM.A: words and numbers,
  ``ORBIT Q 1.2 E 0.5 I 10 NODE 80 PERI 20 TP 2460100.25 EPOCH 2460000.5 ...``.

Column positions are those of the MPC's published format descriptions (written here
from memory of them).  Angles are on the ecliptic and equinox of J2000.0, times TT.
A field that does not read is named in the message, with its columns.
"""

import erfa
import numpy as np

from . import orbits
from .bounded import keep
from .errors import RowErrors, SkyError

# Packed digits: 0-9, A-Z (10-35), a-z (36-61), the MPC's base 62.
_DIGITS62 = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz"
_CENTURIES = {"I": 18, "J": 19, "K": 20, "L": 21}


def _value62(ch):
    index = _DIGITS62.find(ch)
    if index < 0 or not ch:
        raise ValueError(ch)
    return index


# ---- packed epochs and designations ---------------------------------------------------


def unpack_epoch(text):
    """(year, month, day) of a packed epoch such as K2555 (2025 May 5): a century letter
    (I 1800s, J 1900s, K 2000s), two digits of the year, then month and day each one
    character of 1-9, A = 10, ... V = 31."""
    t = text.strip()
    if len(t) != 5 or t[0] not in _CENTURIES or not t[1:3].isdigit():
        raise ValueError(text)
    year = _CENTURIES[t[0]] * 100 + int(t[1:3])
    month, day = _value62(t[3]), _value62(t[4])
    if not (1 <= month <= 12 and 1 <= day <= 31):
        raise ValueError(text)
    return year, month, day


def unpack_designation(packed):
    """A minor planet's readable designation from its packed form: a number (00001,
    A0001 = 100001, ~0000 = 620000 and up in base 62), a provisional designation
    (K07Tf8A = 2007 TA418) or a survey designation (PLS2040 = 2040 P-L, T1S3138 =
    3138 T-1).  Text that is none of these is returned as it is."""
    p = packed.strip()
    try:
        if len(p) == 5 and p[0] == "~":
            value = 0
            for ch in p[1:]:
                value = value * 62 + _value62(ch)
            return str(620000 + value)
        if len(p) == 5 and p[1:].isdigit():
            return str(_value62(p[0]) * 10000 + int(p[1:]))
        if len(p) == 7 and p[:3] in ("PLS", "T1S", "T2S", "T3S") and p[3:].isdigit():
            survey = "P-L" if p[:3] == "PLS" else "T-" + p[1]
            return f"{int(p[3:])} {survey}"
        if len(p) == 7 and p[0] in _CENTURIES and p[1:3].isdigit():
            year = _CENTURIES[p[0]] * 100 + int(p[1:3])
            cycle = _value62(p[4]) * 10 + int(p[5])
            return f"{year} {p[3]}{p[6]}{cycle if cycle else ''}"
    except ValueError:
        pass
    return p


def unpack_comet(number, orbit_type, packed):
    """A comet's readable designation: 1P, 73P-B, C/1995 O1, P/2010 A2."""
    number, orbit_type, p = number.strip(), orbit_type.strip(), packed.strip()
    fragment = ""
    if number.isdigit():
        if p[-1:].islower() and len(p) <= 2:
            fragment = "-" + p[-1].upper()
        return f"{int(number)}{orbit_type}{fragment}"
    if len(p) == 7 and p[0] in _CENTURIES and p[1:3].isdigit():
        year = _CENTURIES[p[0]] * 100 + int(p[1:3])
        try:
            count = _value62(p[4]) * 10 + int(p[5])
        except ValueError:
            return f"{orbit_type}/{p}"
        last = p[6]
        if last.isupper():  # an asteroid-style designation given to a comet
            return f"{orbit_type}/{year} {p[3]}{last}{count if count else ''}"
        if last.islower():
            fragment = "-" + last.upper()
        return f"{orbit_type}/{year} {p[3]}{count}{fragment}"
    return f"{orbit_type}/{p}" if orbit_type else p


# ---- one line --------------------------------------------------------------------------


def _field(line, first, last, what, kind="MPC minor-planet line", required=True):
    """The number in columns first..last (1-based, inclusive), or a message naming it."""
    text = line[first - 1:last].strip()
    if not text:
        if required:
            raise SkyError(f"{kind}: the {what} (columns {first}-{last}) is empty")
        return np.nan
    try:
        value = float(text)
    except ValueError:
        raise SkyError(f'{kind}: the {what} (columns {first}-{last}) "{text}" is not a '
                       "number") from None
    if not np.isfinite(value):
        raise SkyError(f'{kind}: the {what} (columns {first}-{last}) "{text}" is not a number')
    return value


def _jd(year, month, day, what, kind):
    """Two-part JD (0h of the date, then the fraction of the day) of a calendar date."""
    whole = np.floor(day)
    try:
        jd1, jd2 = erfa.cal2jd(int(year), int(month), int(whole))
    except Exception:
        raise SkyError(f"{kind}: the {what} {int(year)}-{int(month)}-{day:g} is not a "
                       "date") from None
    return float(jd1), float(jd2) + (day - whole)


def _angles(line, columns, kind):
    return [_field(line, a, b, what, kind) for what, (a, b) in columns]


def read_minor_planet(line):
    """The elements of an MPC minor-planet line, as a dict."""
    kind = "MPC minor-planet line"
    if len(line.rstrip()) < 103:
        raise SkyError(f"{kind}: too short ({len(line.rstrip())} characters; the elements "
                       "end in column 103)")
    packed_epoch = line[20:25]
    try:
        year, month, day = unpack_epoch(packed_epoch)
    except ValueError:
        raise SkyError(f'{kind}: the epoch (columns 21-25) "{packed_epoch.strip()}" is not a '
                       "packed epoch such as K2555 (2025 May 5)") from None
    epoch1, epoch2 = _jd(year, month, day, "epoch", kind)
    h = _field(line, 9, 13, "absolute magnitude H", kind, required=False)
    g = _field(line, 15, 19, "slope parameter G", kind, required=False)
    m, peri, node, inc, e = _angles(line, (
        ("mean anomaly", (27, 35)), ("argument of perihelion", (38, 46)),
        ("longitude of the ascending node", (49, 57)), ("inclination", (60, 68)),
        ("eccentricity", (71, 79))), kind)
    a = _field(line, 93, 103, "semi-major axis", kind)
    readable = line[166:194].strip() if len(line) > 166 else ""
    name = readable or unpack_designation(line[0:7])
    return dict(form="A", a=a, e=e, i=inc, node=node, peri=peri, m=m, epoch1=epoch1,
                epoch2=epoch2, h=h, g=g if np.isfinite(g) else (0.15 if np.isfinite(h) else g),
                comet=False, name=name)


def read_comet(line):
    """The elements of an MPC comet line, as a dict."""
    kind = "MPC comet line"
    if len(line.rstrip()) < 79:
        raise SkyError(f"{kind}: too short ({len(line.rstrip())} characters; the elements "
                       "end in column 79)")
    year = _field(line, 15, 18, "year of perihelion", kind)
    month = _field(line, 20, 21, "month of perihelion", kind)
    day = _field(line, 23, 29, "day of perihelion", kind)
    if not (1 <= month <= 12 and 0 <= day < 32) or year != int(year) or month != int(month):
        raise SkyError(f"{kind}: the perihelion time (columns 15-29) "
                       f'"{line[14:29].strip()}" is not a date')
    tp1, tp2 = _jd(year, month, day, "perihelion time", kind)
    q, e, peri, node, inc = _angles(line, (
        ("perihelion distance", (31, 39)), ("eccentricity", (42, 49)),
        ("argument of perihelion", (52, 59)), ("longitude of the ascending node", (62, 69)),
        ("inclination", (72, 79))), kind)
    epoch_text = line[81:89].strip()
    epoch1, epoch2 = tp1, tp2
    if epoch_text:
        if not (len(epoch_text) == 8 and epoch_text.isdigit()):
            raise SkyError(f'{kind}: the epoch (columns 82-89) "{epoch_text}" is not a date '
                           "written YYYYMMDD")
        epoch1, epoch2 = _jd(int(epoch_text[:4]), int(epoch_text[4:6]),
                             float(epoch_text[6:8]), "epoch", kind)
    m1 = _field(line, 92, 95, "absolute magnitude M1", kind, required=False)
    n = _field(line, 97, 100, "slope parameter", kind, required=False)
    readable = line[102:158].strip() if len(line) > 102 else ""
    name = readable or unpack_comet(line[0:4], line[4:5], line[5:12])
    # The comet line's slope field holds n of m = M1 + 5 log D + 2.5 n log r: K1 = 2.5 n.
    return dict(form="Q", q=q, e=e, i=inc, node=node, peri=peri, tp1=tp1, tp2=tp2,
                epoch1=epoch1, epoch2=epoch2, h=m1, g=2.5 * n, comet=True, name=name)


_OWN_KEYS = ("Q", "A", "E", "I", "NODE", "PERI", "TP", "M", "EPOCH", "H", "G", "M1", "K1")


def read_own(text):
    """Our own form: ORBIT followed by pairs of a word and a number (TT JDs for TP and
    EPOCH), and optionally NAME and the rest of the text."""
    body = text.strip()[5:]
    name = ""
    if " NAME " in body + " ":
        body, _, name = (body + " ").partition(" NAME ")
    words = body.split()
    if len(words) % 2:
        raise SkyError("orbit text: words and numbers must come in pairs (ORBIT Q 1.2 E "
                       "0.5 ...)")
    found = {}
    for key, value in zip(words[0::2], words[1::2]):
        key = key.upper()
        if key not in _OWN_KEYS:
            raise SkyError(f'orbit text: unknown element "{key}"; use ' + ", ".join(_OWN_KEYS))
        try:
            found[key] = float(value)
        except ValueError:
            found[key] = np.nan
        if not np.isfinite(found[key]):
            raise SkyError(f'orbit text: the {key} "{value}" is not a number')
    for key in ("E", "I", "NODE", "PERI"):
        if key not in found:
            raise SkyError(f"orbit text: the element {key} is missing")
    comet = "M1" in found or "K1" in found
    out = dict(e=found["E"], i=found["I"], node=found["NODE"], peri=found["PERI"],
               h=found.get("M1", found.get("H", np.nan)),
               g=found.get("K1", found.get("G", np.nan)), comet=comet, name=name.strip())
    if "Q" in found and "TP" in found:
        tp = found["TP"]
        epoch = found.get("EPOCH", tp)
        out.update(form="Q", q=found["Q"], tp1=tp, tp2=0.0, epoch1=epoch, epoch2=0.0)
    elif "A" in found and "M" in found and "EPOCH" in found:
        out.update(form="A", a=found["A"], m=found["M"], epoch1=found["EPOCH"], epoch2=0.0)
    else:
        raise SkyError("orbit text: give Q and TP (perihelion distance and time), or A, M "
                       "and EPOCH (semi-major axis, mean anomaly and its epoch)")
    return out


def read_line(text):
    """The elements (a dict) of one orbit cell, in any of the three forms."""
    if not isinstance(text, str):
        raise SkyError("the orbit must be text: an MPC minor-planet or comet line, or the "
                       "result of SKY.ORBIT.FROM.Q or SKY.ORBIT.FROM.A")
    line = text.rstrip("\r\n")
    if line.strip().upper().startswith("ORBIT"):
        return read_own(line)
    if _looks_minor(line):
        return read_minor_planet(line)
    if len(line) >= 29 and line[14:18].strip().lstrip("-").isdigit():
        return read_comet(line)
    if len(line.strip()) == 0:
        raise SkyError("the orbit is empty")
    raise SkyError("the orbit is neither an MPC minor-planet line (packed epoch in columns "
                   "21-25), an MPC comet line (perihelion year in columns 15-18) nor ORBIT "
                   "text from SKY.ORBIT.FROM.Q or SKY.ORBIT.FROM.A")


def _looks_minor(line):
    """An MPC minor-planet line has the decimal point of its mean anomaly (f9.5 in
    columns 27-35) in column 30, where a comet line has a blank."""
    return len(line) >= 30 and line[29:30] == "." and line[14:18].strip()[:1] != ""


def to_orbit_row(el):
    """(q, e, i, node, peri, tp1, tp2, epoch1, epoch2, h, g, comet) of one element dict,
    checked by the orbit's own rules."""
    e = np.asarray(el["e"], float)
    if el["form"] == "A":
        epoch1, epoch2 = el["epoch1"], el["epoch2"]
        q, tp1, tp2 = orbits.from_mean_anomaly(el["a"], e, el["m"], epoch1, epoch2)
    else:
        q, tp1, tp2, epoch1, epoch2 = el["q"], el["tp1"], el["tp2"], el["epoch1"], el["epoch2"]
    orbits.check_elements(np.atleast_1d(q), np.atleast_1d(e))
    return (float(q), float(e), el["i"], el["node"], el["peri"], float(tp1), float(tp2),
            float(epoch1), float(epoch2), el["h"], el["g"], el["comet"])


_CACHE = {}
_CACHE_LIMIT = 5000


def _row_of(text):
    """The element row of an orbit text, or the message it gives (kept, by the text)."""
    hit = _CACHE.get(text)
    if hit is None:
        try:
            el = read_line(text)
            hit = (to_orbit_row(el), el["name"])
        except RowErrors as err:
            hit = str(err.messages.ravel()[0])
        except SkyError as err:
            hit = str(err)
        if len(_CACHE) > _CACHE_LIMIT:
            _CACHE.clear()
        if isinstance(text, str):
            _CACHE[text] = hit
    return hit


# A cell's orbit made from its one text (its orientation's sines and cosines, the checks),
# kept by the text: each call gets a copy of its own (orbits.Orbit.copy) that shares the
# kept one's read-only arrays, so nothing one cell's computation keeps reaches another.
_ONE_ORBIT = {}
ONE_ORBITS_KEPT = 4096  # (each about 2 kB: 8 MB when full)


def orbits_of(texts):
    """An ``orbits.Orbit`` for a column of orbit cells (each distinct text read once);
    rows that do not read get their message in a ``RowErrors``."""
    texts = np.asarray(texts, dtype=object).reshape(-1)
    one = texts[0] if texts.size == 1 and type(texts[0]) is str else None
    if one is not None:
        made = _ONE_ORBIT.get(one)
        if made is not None:
            return made.copy()
    made = _orbits_of(texts)
    if one is not None:
        keep(_ONE_ORBIT, one, made.read_only(), ONE_ORBITS_KEPT)
        return made.copy()
    return made


def kept_orbit(text):
    """The orbit of one cell's text as kept by ``orbits_of`` (read-only arrays, not a copy:
    for reading its elements only, as a cell's float lane does), or None where none is
    kept yet."""
    return _ONE_ORBIT.get(text)


def _orbits_of(texts):
    rows = []
    names = []
    messages = np.full(texts.size, None, dtype=object)
    for k, text in enumerate(texts):
        hit = _row_of(text) if isinstance(text, str) else _message_for(text)
        if isinstance(hit, str):
            messages[k] = hit
            rows.append(None)
            names.append("")
        else:
            rows.append(hit[0])
            names.append(hit[1])
    if any(m is not None for m in messages):
        raise RowErrors(messages)
    columns = list(zip(*rows))
    return orbits.Orbit(*columns[:7], epoch1=columns[7], epoch2=columns[8], h=columns[9],
                        g=columns[10], comet=columns[11], name=np.array(names, dtype=object))


def _message_for(value):
    try:
        read_line(value)
    except SkyError as err:
        return str(err)
    return "the orbit must be text"
