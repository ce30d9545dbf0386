"""Where the bodies are: ERFA's built-in theories, or a JPL SPK kernel the user names.

A source answers one question: the barycentric position and velocity (au, au/day, ICRS
axes) of a body at TDB instants.

BUILTIN (no set-up): over 1000-3000 the Earth and the Sun from ERFA epv00
(VSOP2000-based, a few km over 1900-2100), Mercury to Neptune from ERFA plan94 (Simon
et al. 1994: arcseconds to tens of arcseconds), the Moon from ERFA moon98 (ELP-2000/82
truncated); outside, out to -4000 and +8000, the long-range theories of longrange.py
(VSOP87D, Meeus's abridged ELP-2000/82).  No Pluto.

A kernel: a JPL Development Ephemeris in SPK form, named by its word (DE440, DE441:
found by kernelfiles, e.g. the DE440 excerpt shipped in the extension) or by the path of
any .bsp file, its structure checked (spkfile) and then read with jplephem.  Each body
is reached through a chain of segments (Mars: barycentre -> Mars barycentre; the Moon:
barycentre -> Earth-Moon barycentre -> Moon); every date is checked against the spans
of the segments actually used, and a date that no segment covers is refused, never
answered from a neighbour.
A kernel that holds only a planet's system barycentre (DE440 for Mars to Pluto) gives
that barycentre, and the description says so.

Reading a kernel is the one place where a cell function reads a file: only the file
the user names or the kernels found by their word, read-only, never written; a kernel
replaced on disk is read again.
"""

import os
import threading

import erfa
import numpy as np

from . import earth_theory, kernelfiles, nodes, spkfile, vectors
from .errors import RowErrors, SkyError, rows_failing
from .timescales import all_within_years, check_years, julian_year, same_shape, tt_to_tdb
from .vocabulary import (AU_KM, BUILTIN, BUILTIN_YEARS, J2000_JD, LONG_RANGE_YEARS, PLANETS,
                         SOURCE_WORDS)

# NAIF integer codes (an open standard): centres 199 ... 999, system barycentres 1 ... 9.
NAIF_CODES = {"SUN": 10, "MERCURY": 199, "VENUS": 299, "EARTH": 399, "MOON": 301,
              "MARS": 499, "JUPITER": 599, "SATURN": 699, "URANUS": 799, "NEPTUNE": 899,
              "PLUTO": 999}
BARYCENTRE_CODES = {"MERCURY": 1, "VENUS": 2, "MARS": 4, "JUPITER": 5, "SATURN": 6,
                    "URANUS": 7, "NEPTUNE": 8, "PLUTO": 9}
PLAN94_NUMBERS = {"MERCURY": 1, "VENUS": 2, "MARS": 4, "JUPITER": 5, "SATURN": 6,
                  "URANUS": 7, "NEPTUNE": 8}


def check_builtin_years(jd1, jd2):
    """The one range check of the built-in theories, on their argument (TT as TDB):
    ERFA's inside BUILTIN_YEARS, the long-range ones (longrange.py) out to LONG_RANGE_YEARS."""
    check_years(jd1, jd2, LONG_RANGE_YEARS,
                "the built-in theories (ERFA epv00, plan94, moon98; VSOP87D and ELP-2000/82 "
                "outside 1000-3000)", "for other dates give a JPL kernel (source)")


def _calendar(jd):
    y, m, d, _ = erfa.jd2cal(jd, 0.0)
    return f"{int(y):04d}-{int(m):02d}-{int(d):02d}"


# ---- the built-in theories ---------------------------------------------------------------


@nodes.kept_per_instant
def earth_and_sun_floats(tdb1, tdb2):
    """Barycentric p and v of the Earth, then of the Sun, from ERFA epv00's series
    (earth_theory: ERFA's routine or the same series with numpy, the faster) for one
    instant (floats), kept for the row's other columns (nodes.INSTANTS_KEPT): four
    tuples of three floats."""
    return tuple(tuple(v) for v in earth_theory.states_floats(tdb1, tdb2))


def earth_and_sun_from_nodes(tdb1, tdb2):
    """``earth_and_sun_floats`` from the segment of a dense log's cells (nodes.from_nodes,
    as ``Builtin.earth_and_sun`` takes them for a cell): four lists of three floats."""
    s = nodes.from_nodes("epv00", earth_and_sun_at_points, tdb1, tdb2)
    return s[0:3], s[3:6], s[6:9], s[9:12]


def earth_and_sun_at_points(tdb1, tdb2):
    """(n, 12): ``earth_theory.states_vector`` at a segment's points, kept for the other
    quantities made over the same points (the Earth's own segment, a body's place)."""
    return nodes.shared_at_points("epv00", earth_theory.states_at_points, tdb1, tdb2)


@nodes.kept_per_instant
def _earth_and_sun_one(tdb1, tdb2):
    """``earth_and_sun_floats`` as read-only arrays of one row."""
    out = np.array(earth_and_sun_floats(tdb1, tdb2)).reshape(4, 1, 3)
    out.flags.writeable = False
    return tuple(out)


BIAS_ROWS = erfa.bp06(J2000_JD, 0.0)[0].tolist()  # Builtin._bias, as rows of floats


def heliocentric_floats(body, t1, t2, earth_helio):
    """``Builtin.heliocentric``'s position of the Moon or a planet of plan94 at one
    instant inside BUILTIN_YEARS, on floats: a function of the light time ``tau`` (days)
    giving the body at t1 + t2 - tau as three floats (au, ICRS axes).  ``earth_helio``:
    the Earth's heliocentric (p, v) at t1 + t2, lists of floats, for the Moon.  The same
    for a segment's points at once (bodies._directions_at_points): ``t1``, ``t2``, ``tau``
    and the Earth's components arrays, one ERFA call for all the points, the same
    numbers as point by point."""
    if body == "MOON":  # the Moon and the Earth extrapolated over the light time, as there
        p, v = earth_helio
        pv = erfa.ufunc.moon98(t1, t2)
        m, mv = _components(pv["p"]), _components(pv["v"])

        def at(tau):
            dt = (t1 - t1) + ((t2 - tau) - t2)
            return ((m[0] + dt * mv[0]) + (p[0] + dt * v[0]),
                    (m[1] + dt * mv[1]) + (p[1] + dt * v[1]),
                    (m[2] + dt * mv[2]) + (p[2] + dt * v[2]))
        return at
    number, (b0, b1, b2) = PLAN94_NUMBERS[body], BIAS_ROWS

    def at(tau):
        x, y, z = _components(erfa.ufunc.plan94(t1, t2 - tau, number)[0]["p"])
        return (b0[0] * x + b1[0] * y + b2[0] * z, b0[1] * x + b1[1] * y + b2[1] * z,
                b0[2] * x + b1[2] * y + b2[2] * z)
    return at


def _components(vectors):
    """An ERFA vector's three components: floats for one instant (numpy's own scalars
    would slow a cell's arithmetic), rows of an array for several."""
    return vectors.tolist() if vectors.ndim == 1 else vectors.T


def rough_earth(tt1, tt2):
    """Heliocentric (p, v) of the Earth-Moon barycentre from ERFA plan94 (au, au/day, the
    J2000 axes; its statuses are warnings only) at TT instants: within the Moon's pull
    (4,700 km, 13 m/s) of the Earth.  For locating events only (planets.py,
    smallbodies.py)."""
    pv = erfa.ufunc.plan94(tt1, tt2, 3)[0]
    return pv["p"], pv["v"]


def _earth_and_sun_states(tdb1, tdb2):
    """The barycentric states of earth_theory.states as one array (..., 12), for the
    nodes to interpolate."""
    return np.concatenate(earth_theory.states(tdb1, tdb2), axis=-1)


class Builtin:
    """ERFA's theories inside BUILTIN_YEARS, where they are the better ones; the
    long-range theories of longrange.py (VSOP87D, abridged ELP-2000/82) outside, out to
    LONG_RANGE_YEARS.  A column that crosses the boundary takes each row from its own
    theory.  longrange is imported where first needed: reading its series takes 6 ms,
    which a sheet of present-day dates never pays."""

    name = BUILTIN

    # ICRS from the J2000.0 mean equator and equinox that plan94 refers to (the 23 mas
    # frame bias, far below the theory's error, applied anyway so that every source
    # shares one set of axes).
    _bias = erfa.bp06(J2000_JD, 0.0)[0]

    def describe(self):
        return ("built in: ERFA epv00 (Earth, Sun), plan94 (Mercury to Neptune), moon98 "
                f"(Moon) over {BUILTIN_YEARS[0]:g}-{BUILTIN_YEARS[1]:g}; VSOP87D and "
                f"ELP-2000/82 (abridged) outside, accepted {LONG_RANGE_YEARS[0]:g}-"
                f"{LONG_RANGE_YEARS[1]:g}")

    @staticmethod
    def _by_theory(tdb1, tdb2, with_erfa, long_range):
        """The results (a tuple of arrays, rows first) of ``with_erfa`` for the rows
        inside BUILTIN_YEARS and of ``long_range`` for the others."""
        tdb1, tdb2 = same_shape(tdb1, tdb2)
        if all_within_years(tdb1, tdb2, BUILTIN_YEARS):
            return with_erfa(tdb1, tdb2)
        years = julian_year(tdb1, tdb2)
        inside = (years >= BUILTIN_YEARS[0]) & (years <= BUILTIN_YEARS[1])
        check_builtin_years(tdb1, tdb2)
        if not inside.any():
            return long_range(tdb1, tdb2)
        parts = [(mask, fn(tdb1[mask], tdb2[mask]))
                 for mask, fn in ((inside, with_erfa), (~inside, long_range))]
        out = tuple(np.empty(tdb1.shape + a.shape[1:]) for a in parts[0][1])
        for mask, arrays in parts:
            for whole, a in zip(out, arrays):
                whole[mask] = a
        return out

    def earth_and_sun(self, tdb1, tdb2):
        """Barycentric (p, v) of the Earth and of the Sun (the long-range theories are
        heliocentric: there the Sun is at the origin, see longrange.py)."""
        def with_erfa(t1, t2):
            # A dense column takes the states interpolated over half-day nodes (nodes.py:
            # within 0.5 m and 3 um/s of the series, which is good to kilometres).
            one = nodes.for_one("epv00", earth_and_sun_at_points, t1, t2)  # a cell of a log
            if one is not None:
                return one[..., 0:3], one[..., 3:6], one[..., 6:9], one[..., 9:12]
            if t1.shape == (1,):  # a single cell: kept for the row's other columns
                return _earth_and_sun_one(float(t1[0]), float(t2[0]))
            if nodes.dense(t1, t2) is None:
                return earth_theory.states(t1, t2)
            s = nodes.over_nodes(_earth_and_sun_states, t1, t2)
            return s[..., 0:3], s[..., 3:6], s[..., 6:9], s[..., 9:12]

        def long_range(t1, t2):
            from . import longrange
            p, v = longrange.planet("EARTH", t1, t2, rate=True)
            return p, v, np.zeros_like(p), np.zeros_like(v)

        ep, ev, sp, sv = self._by_theory(tdb1, tdb2, with_erfa, long_range)
        return (ep, ev), (sp, sv)

    def moon_geocentric(self, tdb1, tdb2, velocity=True):
        """Geocentric (p, v) of the Moon, ICRS axes (au, au/day); v None if not
        ``velocity``."""
        def with_erfa(t1, t2):
            pv = erfa.ufunc.moon98(t1, t2)  # no status: nothing to keep quiet
            return pv["p"], pv["v"]

        def long_range(t1, t2):
            from . import longrange
            p = longrange.moon(t1, t2)
            return p, (longrange.moon_velocity(t1, t2) if velocity else np.full(p.shape, np.nan))

        p, v = self._by_theory(tdb1, tdb2, with_erfa, long_range)
        return p, (v if velocity else None)

    def heliocentric(self, body, tdb1, tdb2, earth_helio=None, velocity=True):
        """Heliocentric (p, v) of a planet or the Moon.  ``earth_helio`` = [p, v, jd,
        moon] of the Earth at a nearby instant (bodies.place, for the light-time rounds):
        the Moon's geocentric state there (``moon``, made at the first round and kept in
        the list) and the Earth's are both extrapolated linearly over the light time (1.3
        s: 2 mm of the Moon's curvature, 1 uas; the Earth's, metres at most).
        ``velocity`` False: v is None where the long-range theories would compute it
        for nothing (the light-time iterations want positions; it halves their cost)."""
        if body == "PLUTO":
            raise SkyError("Pluto is not in the built-in theories; give a JPL kernel (source "
                           "DE440 or a .bsp path)")
        if body == "MOON":
            if earth_helio is None:
                mp, mv = self.moon_geocentric(tdb1, tdb2, velocity)
                (ep, ev), (sp, sv) = self.earth_and_sun(tdb1, tdb2)
                return mp + (ep - sp), (mv + (ev - sv) if velocity else None)
            p0, v0, (j1, j2) = earth_helio[:3]
            if earth_helio[3] is None:
                earth_helio[3] = self.moon_geocentric(j1, j2, True)
            m0, mv0 = earth_helio[3]
            dt = ((tdb1 - j1) + (tdb2 - j2))[..., None]
            return (m0 + dt * mv0) + (p0 + dt * v0), (mv0 + v0 if velocity else None)

        def with_erfa(t1, t2):
            # The ufunc: plan94's statuses for our bodies are warnings only (outside
            # 1000-3000, where the long-range source takes over; slow convergence).
            pv = erfa.ufunc.plan94(t1, t2, PLAN94_NUMBERS[body])[0]
            # bias^T applied to each row, with the same arithmetic however many rows
            # there are (a matrix product takes other BLAS paths for one row and for
            # several, which moved the last bit of a cell between a formula and a column).
            return (vectors.apply_transposed(self._bias, pv["p"]),
                    vectors.apply_transposed(self._bias, pv["v"]))

        def long_range(t1, t2):
            from . import longrange
            if velocity:
                return longrange.planet(body, t1, t2, rate=True)
            p = longrange.planet(body, t1, t2)
            return p, np.full(p.shape, np.nan)

        p, v = self._by_theory(tdb1, tdb2, with_erfa, long_range)
        return p, (v if velocity else None)


# ---- JPL kernels -------------------------------------------------------------------------


class Kernel:
    """A JPL SPK kernel (one file or several, e.g. DE441's two parts) read with jplephem,
    each file's structure checked first (spkfile), with coverage checked per date and
    segment.  ``name`` is what messages call it; ``origin`` where it was found; ``hint``
    is added to the message for a date outside it."""

    def __init__(self, paths, name=None, origin=None, hint=""):
        try:
            from jplephem.daf import DAF
            from jplephem.spk import SPK
        except ImportError:
            raise SkyError("reading a JPL kernel needs the Python package jplephem (Debian: "
                           "python3-jplephem; pip: jplephem)") from None
        paths = (paths,) if isinstance(paths, str) else tuple(paths)
        self.paths = paths
        self.label = name or os.path.basename(paths[0])
        self.origin, self.hint = origin, hint
        self.stamps, self.spks = [], []
        self.segments = {}
        try:
            for path in paths:
                self._open(path, SPK, DAF)
        except BaseException:
            self.close()
            raise
        for spk in self.spks:
            for seg in spk.segments:
                self.segments.setdefault(seg.target, []).append(seg)

    def _open(self, path, SPK, DAF):
        f, stamp = spkfile.open_checked(path)
        try:
            spk = SPK(DAF(f))
        except Exception as err:  # the structure passed; jplephem may still refuse it
            f.close()
            raise SkyError(f'cannot read "{os.path.basename(path)}" as a JPL SPK kernel '
                           f"({err})") from None
        self.spks.append(spk)
        self.stamps.append(stamp)

    def close(self):
        for spk in self.spks:
            try:
                spk.close()
            except Exception:  # closing what jplephem mapped: nothing more to do
                pass
        self.spks = []

    def describe(self):
        spans = {(s.start_jd, s.end_jd) for segs in self.segments.values() for s in segs}
        text = ", ".join(f"{_calendar(a)} to {_calendar(b)}" for a, b in sorted(spans))
        barys = [b.capitalize() for b in PLANETS
                 if self._code(b) is not None and self._code(b) < 10]
        note = f"; {', '.join(barys)} as system barycentres" if barys else ""
        files = ", ".join(os.path.basename(p) for p in self.paths)
        folder = os.path.dirname(self.paths[0])
        where = (f"{self.label}: JPL kernel {files} from {self.origin} ({folder})"
                 if self.origin else f"JPL kernel {self.label}")
        return f"{where}, {text}{note}"

    def _code(self, body):
        """The NAIF code used for a body: its centre if the kernel reaches it, else the
        system barycentre (planets), else None."""
        for code in (NAIF_CODES[body], BARYCENTRE_CODES.get(body)):
            if code is not None and self._chain(code) is not None:
                return code
        return None

    def _chain(self, code):
        """Target codes from the body down to the solar-system barycentre (0)."""
        chain, seen = [], set()
        while code != 0:
            segs = self.segments.get(code)
            if not segs or code in seen:
                return None
            seen.add(code)
            chain.append(code)
            code = segs[0].center
        return chain

    def _segment_state(self, code, tdb1, tdb2, body):
        """(p, v) in km, km/day of one link, each date from the segment that covers it."""
        p = np.zeros(tdb1.shape + (3,))
        v = np.zeros(tdb1.shape + (3,))
        jd = tdb1 + tdb2
        todo = np.ones(jd.shape, dtype=bool)
        for seg in self.segments[code]:
            inside = todo & (jd >= seg.start_jd) & (jd <= seg.end_jd)
            if not np.any(inside):
                continue
            try:
                pos, vel = seg.compute_and_differentiate(tdb1[inside], tdb2[inside])
            except (ValueError, AttributeError) as err:
                raise SkyError(f"{self.label}: cannot evaluate segment type {seg.data_type} "
                               f"({err})") from None
            p[inside] = np.asarray(pos).T
            v[inside] = np.asarray(vel).T
            todo &= ~inside
        if np.any(todo):
            spans = "; ".join(f"{_calendar(s.start_jd)} to {_calendar(s.end_jd)}"
                              for s in self.segments[code])
            raise rows_failing(todo, f"the date is outside the span of {self.label} for "
                                     f"{body.capitalize()} ({spans}){self.hint}")
        return p, v

    def barycentric(self, body, tdb1, tdb2):
        code = self._code(body)
        if code is None:
            raise SkyError(f"{self.label} does not hold {body.capitalize()}")
        tdb1, tdb2 = np.broadcast_arrays(np.asarray(tdb1, float), np.asarray(tdb2, float))
        p = np.zeros(tdb1.shape + (3,))
        v = np.zeros(tdb1.shape + (3,))
        for link in self._chain(code):
            dp, dv = self._segment_state(link, tdb1, tdb2, body)
            p += dp
            v += dv
        return p / AU_KM, v / AU_KM

    def earth_and_sun(self, tdb1, tdb2):
        return self.barycentric("EARTH", tdb1, tdb2), self.barycentric("SUN", tdb1, tdb2)

    def heliocentric(self, body, tdb1, tdb2, earth_helio=None, velocity=True):
        # (The kernel gives positions and velocities together: ``velocity`` changes nothing.)
        bp, bv = self.barycentric(body, tdb1, tdb2)
        sp, sv = self.barycentric("SUN", tdb1, tdb2)
        return bp - sp, bv - sv


# ---- choosing a source ------------------------------------------------------------------

# Open kernels, keyed by what identifies each file's present content (spkfile.stamp:
# path, inode, size, modification time), so that a kernel replaced on disk is read again.
_OPEN = {}
_LOCK = threading.Lock()
KERNEL_WORDS = kernelfiles.KERNEL_WORDS


def check_source(value):
    """The source's normalised name: BUILTIN, DE440 or DE441 (kernels found by their
    word: kernelfiles), or the absolute path of a kernel that opens."""
    text = str(value).strip().strip('"')
    word = text.upper()
    if word in ("", BUILTIN, "BUILT IN", "BUILT-IN", "ERFA"):
        return BUILTIN
    if word in KERNEL_WORDS:
        get(word)  # found and opened now, so a problem is reported once for the column
        return word
    path = _typed_path(text)
    if not path.lower().endswith(".bsp"):
        raise SkyError(f'unknown ephemeris source "{text}"; use ' + SOURCE_WORDS)
    if not os.path.isabs(path):
        # Relative to what? The office's working folder is not the sheet's.
        raise SkyError(f'give the full path of the kernel file, not "{text}"')
    path = os.path.normpath(path)
    get(path)  # opens it now, so a bad path is reported once for the whole column
    return path


def _typed_path(text):
    """The file a typed path or file:// URL names (not yet checked)."""
    if text.startswith("file://"):
        from urllib.parse import unquote, urlparse
        text = unquote(urlparse(text).path)
    return os.path.expanduser(text)


def _files_of(source):
    """(paths, name, origin, hint) of a normalised kernel source."""
    if source in KERNEL_WORDS:
        found = kernelfiles.find(source)
        return found.paths, source, found.origin, found.hint
    return (source,), None, None, ""


def content_stamp(value):
    """What a source typed in a cell stands for now, cheaply (no file is opened): None
    for the built-in theories, else the stamps of its kernel files (spkfile.stamp) or
    the message that finding them gives."""
    word = str(value).strip().strip('"').upper()
    if word in ("", BUILTIN, "BUILT IN", "BUILT-IN", "ERFA"):
        return None
    try:
        if word in KERNEL_WORDS:
            paths = kernelfiles.find(word).paths
        else:
            paths = (os.path.normpath(_typed_path(str(value).strip().strip('"'))),)
        return tuple(spkfile.stamp(p) for p in paths)
    except SkyError as err:
        return str(err)


def get(source):
    """The source object for a normalised name (kernels stay open while their files are
    unchanged, one per set of files)."""
    if source == BUILTIN:
        return _BUILTIN
    paths, name, origin, hint = _files_of(source)
    key = (name,) + tuple(spkfile.stamp(p) for p in paths)
    with _LOCK:
        kernel = _OPEN.get(key)
        if kernel is None:
            kernel = Kernel(paths, name, origin, hint)
            key = (name,) + tuple(kernel.stamps)
            # The same files' older content: let it go (its maps, its descriptors).
            for old in [k for k in _OPEN if k[0] == name and
                        {s[0] for s in k[1:]} & set(paths)]:
                _OPEN.pop(old).close()
            _OPEN[key] = kernel
    return kernel


_BUILTIN = Builtin()


def times_for(source, tt1, tt2):
    """The TT instants as the source's argument: TDB for a kernel; the built-in theories
    take TT as it is (under 2 ms from TDB, 60 m of the Earth's motion), which spares
    ERFA dtdb in event searches that evaluate a place many times."""
    if source == BUILTIN:
        return tt1, tt2
    return tt_to_tdb(tt1, tt2)


def describe_cells(source):
    """What each source named in the rows is (a row per cell, each checked on its own)."""
    out = np.empty(len(source), dtype=object)
    messages = np.full(len(source), None, dtype=object)
    for i, value in enumerate(source):
        try:
            if not isinstance(value, str):
                raise SkyError("source must be a text: " + SOURCE_WORDS)
            out[i] = get(check_source(value)).describe()
        except SkyError as err:
            messages[i] = str(err)
    if any(m is not None for m in messages):
        raise RowErrors(messages)
    return out
