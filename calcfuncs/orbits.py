"""Two-body (Keplerian) orbits about the Sun, over arrays of rows: each row its own orbit.

Elements are perihelion distance q (au), eccentricity e, inclination i, longitude of the
ascending node and argument of perihelion (degrees, on the ecliptic and equinox of
J2000.0) and the instant of perihelion passage (TT, two-part JD).  A row given a
semi-major axis and a mean anomaly at an epoch is brought to that form first.

Propagation is by the universal variable (Battin's formulation with the Stumpff
functions C(z) and S(z)): one Kepler equation for every conic, so an ellipse, a parabola,
a hyperbola and an orbit with e = 1 +- 1e-9 take the same path, with no division by
1 - e anywhere.  The equation is solved by Laguerre's method (Conway 1986, which
converges from any start for Kepler's equation), polished by Newton steps.

The ecliptic of J2000 is the ICRS equator turned by the IAU 1976/2006 obliquity at J2000,
84381.448 arcsec, with no frame bias: the convention of the Minor Planet Center's and
JPL's elements (and of SPICE's ECLIPJ2000 and skyfield), so the vectors come out on the
ICRS axes.  The Sun's GM is the Gaussian constant squared (k = 0.01720209895, the MPC's).
"""

import math

import numpy as np

from .errors import rows_failing

GAUSS_K = 0.01720209895             # au^(3/2) / day, the Gaussian gravitational constant
GM_SUN = GAUSS_K * GAUSS_K          # au^3 / day^2
SQRT_GM = GAUSS_K
OBLIQUITY_J2000_ARCSEC = 84381.448  # IAU 1976 (and 2006) obliquity at J2000.0

_E = np.radians(OBLIQUITY_J2000_ARCSEC / 3600.0)
# Ecliptic J2000 -> ICRS axes (a rotation about x by minus the obliquity).
ECLIPTIC_TO_ICRS = np.array([[1.0, 0.0, 0.0],
                             [0.0, np.cos(_E), -np.sin(_E)],
                             [0.0, np.sin(_E), np.cos(_E)]])

_SERIES_LIMIT = 1.0       # |z| below this: the Stumpff series (no 1 - cos cancellation)
_SERIES_TERMS = 16        # |z|^16 / 34! < 1e-38: exact in doubles
_C_SERIES = [1.0 / math.factorial(2 * k + 2) for k in range(_SERIES_TERMS)]
_S_SERIES = [1.0 / math.factorial(2 * k + 3) for k in range(_SERIES_TERMS)]
_LAGUERRE_STEPS = 60
_NEWTON_STEPS = 3


def stumpff(z):
    """C(z) = (1 - cos sqrt z) / z and S(z) = (sqrt z - sin sqrt z) / z^(3/2), any sign of z
    (cosh and sinh for z < 0), by their series near zero."""
    z = np.asarray(z, float)
    if z.size == 1:  # one row (a cell): its own branch, without the masks
        return _stumpff_one(z)
    c = np.full_like(z, np.nan)  # (a NaN row takes no branch below)
    s = np.full_like(z, np.nan)
    small = np.abs(z) < _SERIES_LIMIT
    if np.any(small):
        zs = z[small]
        # Horner over the series C = sum (-z)^k / (2k+2)!, S = sum (-z)^k / (2k+3)!.
        cs = np.zeros_like(zs)
        ss = np.zeros_like(zs)
        for c_k, s_k in zip(_C_SERIES[::-1], _S_SERIES[::-1]):
            cs = c_k - zs * cs
            ss = s_k - zs * ss
        c[small], s[small] = cs, ss
    pos = (~small) & (z > 0)
    if np.any(pos):
        w = np.sqrt(z[pos])
        c[pos] = (1.0 - np.cos(w)) / z[pos]
        s[pos] = (w - np.sin(w)) / (w * z[pos])
    neg = (~small) & (z < 0)
    if np.any(neg):
        w = np.sqrt(-z[neg])
        c[neg] = (np.cosh(w) - 1.0) / -z[neg]
        s[neg] = (np.sinh(w) - w) / (w * -z[neg])
    return c, s


def _stumpff_one(z):
    """``stumpff`` of a one-element array, by ``_stumpff_of_float``."""
    c, s = _stumpff_of_float(z.item())
    return np.full(z.shape, c), np.full(z.shape, s)


def _stumpff_of_float(v, functions=np):
    """``stumpff`` of one float by the same operations in the same order: the series in
    Python floats (IEEE double arithmetic, as numpy's), the closed forms with numpy's own
    sqrt, cos, sin, cosh and sinh, so a cell equals its row of a column to the bit (or
    with those of ``functions``: ``_stumpff_floats``)."""
    if abs(v) < _SERIES_LIMIT:
        return _stumpff_series(v)
    if v > 0:
        w = functions.sqrt(v)
        return (1.0 - functions.cos(w)) / v, (w - functions.sin(w)) / (w * v)
    if v < 0:
        w = functions.sqrt(-v)
        return (functions.cosh(w) - 1.0) / -v, (functions.sinh(w) - w) / (w * -v)
    return math.nan, math.nan  # (NaN: no branch takes it)


_C_SERIES_DOWN, _S_SERIES_DOWN = _C_SERIES[::-1], _S_SERIES[::-1]


def _stumpff_series(v):
    """c(v) and s(v) by their series (Horner's scheme, from the last term), |v| small."""
    cs = ss = 0.0
    for c_k, s_k in zip(_C_SERIES_DOWN, _S_SERIES_DOWN):
        cs = c_k - v * cs
        ss = s_k - v * ss
    return cs, ss


class Orbit:
    """Rows of heliocentric two-body orbits (arrays of equal shape, one row each).

    ``tp1 + tp2`` is the instant of perihelion passage (TT JD).  ``epoch1 + epoch2`` is
    the epoch of osculation the elements were given for (for the age of the elements).
    ``h`` and ``g`` are the magnitude parameters (NaN where not given) and ``comet``
    says how to read them (M1, K1 for a comet, H, G otherwise)."""

    def __init__(self, q, e, i, node, peri, tp1, tp2, epoch1=None, epoch2=None,
                 h=None, g=None, comet=None, name=None):
        q, e, i, node, peri, tp1, tp2 = np.broadcast_arrays(
            *(np.asarray(x, float) for x in (q, e, i, node, peri, tp1, tp2)))
        self.q, self.e, self.tp1, self.tp2 = q, e, tp1, tp2
        self.i, self.node, self.peri = i, node, peri
        self.epoch1 = tp1 if epoch1 is None else np.broadcast_to(np.asarray(epoch1, float), q.shape)
        self.epoch2 = tp2 if epoch2 is None else np.broadcast_to(np.asarray(epoch2, float), q.shape)
        nan = np.full(q.shape, np.nan)
        self.h = nan if h is None else np.broadcast_to(np.asarray(h, float), q.shape)
        self.g = nan if g is None else np.broadcast_to(np.asarray(g, float), q.shape)
        self.comet = (np.zeros(q.shape, bool) if comet is None
                      else np.broadcast_to(np.asarray(comet, bool), q.shape))
        self.name = name
        check_elements(q, e)
        self.p_hat, self.q_hat = _orientation(i, node, peri)

    @property
    def shape(self):
        return self.q.shape

    def take(self, index):
        """The orbits of some rows (an index array or a mask)."""
        out = Orbit.__new__(Orbit)
        for key in ("q", "e", "i", "node", "peri", "tp1", "tp2", "epoch1", "epoch2", "h",
                    "g", "comet", "p_hat", "q_hat"):
            setattr(out, key, getattr(self, key)[index])
        out.name = None if self.name is None else np.asarray(self.name, dtype=object)[index]
        return out

    def copy(self):
        """The same orbits as an object of their own (the arrays shared, nothing kept)."""
        out = Orbit.__new__(type(self))
        out.__dict__.update(self.__dict__)
        out.__dict__.pop("_kept", None)
        return out

    def read_only(self):
        """These orbits with their arrays made read-only (to be shared by copies)."""
        for value in self.__dict__.values():
            if isinstance(value, np.ndarray):
                value.flags.writeable = False
        self._floats_kept = {}  # elements_floats of these fixed arrays (tuples of floats)
        return self

    @property
    def alpha(self):
        """1 / a (au^-1): positive for an ellipse, 0 for a parabola, negative beyond."""
        return (1.0 - self.e) / self.q

    def period_days(self):
        """The orbital period in days (inf where the orbit is not closed)."""
        alpha = self.alpha
        with np.errstate(divide="ignore", invalid="ignore"):
            return np.where(alpha > 0, 2.0 * np.pi / (SQRT_GM * np.sqrt(np.abs(alpha)) ** 3),
                            np.inf)

    _kept = None  # per row: (days from perihelion, position, velocity) last solved

    def state(self, t1, t2):
        """Heliocentric position (au) and velocity (au/day) on the ICRS axes at TT (or
        TDB: 2 ms apart, metres of motion) instants ``t1 + t2``.

        The light-time rounds of bodies.place ask again for instants minutes before the
        ones just solved: each row the f and g series from its last solution reaches
        (fg_series) takes the series instead of a new Kepler solution.  Row by row, so
        a cell and its row of a column take the same path."""
        dt = (np.asarray(t1, float) - self.tp1) + (np.asarray(t2, float) - self.tp2)
        kept = self._kept
        if kept is None or kept[0].shape != dt.shape:
            pos, vel = propagate_from_perihelion(self.q, self.e, self.p_hat, self.q_hat, dt)
            self._kept = (dt, pos, vel)
            return pos, vel
        pos, vel, near = fg_series(kept[1], kept[2], dt - kept[0])
        if near.all():
            return pos, vel
        far, shape = ~near, dt.shape
        pos[far], vel[far] = propagate_from_perihelion(
            np.broadcast_to(self.q, shape)[far], np.broadcast_to(self.e, shape)[far],
            np.broadcast_to(self.p_hat, shape + (3,))[far],
            np.broadcast_to(self.q_hat, shape + (3,))[far], dt[far])
        # The rows just solved are the ones the next round starts from.
        self._kept = (np.where(far, dt, kept[0]), np.where(far[..., None], pos, kept[1]),
                      np.where(far[..., None], vel, kept[2]))
        return pos, vel

    def heliocentric(self, t1, t2, near=None):
        """(p, v), the interface of an ephemeris source's heliocentric(): bodies.place."""
        return self.state(t1, t2)

    def elements_floats(self, row):
        """One row's (q, e, P, Q, tp1, tp2) as floats (P and Q tuples of three): what
        ``helio_floats`` propagates, and a key that tells one two-body orbit from
        another.  Kept for orbits made read-only (``read_only``: a cell's orbit kept by
        its text), whose copies share them."""
        kept = self.__dict__.get("_floats_kept")
        found = None if kept is None else kept.get(row)
        if found is None:
            found = (float(self.q.flat[row]), float(self.e.flat[row]),
                     tuple(self.p_hat.reshape(-1, 3)[row].tolist()),
                     tuple(self.q_hat.reshape(-1, 3)[row].tolist()),
                     float(self.tp1.flat[row]), float(self.tp2.flat[row]))
            if kept is not None:
                kept[row] = found
        return found

    def age_days(self, t1, t2):
        """Time from the epoch of the elements to the instants, days."""
        return (np.asarray(t1, float) - self.epoch1) + (np.asarray(t2, float) - self.epoch2)


def check_elements(q, e):
    """Refuse what no conic has: e < 0, q <= 0, or numbers that are not finite."""
    bad_e = ~np.isfinite(e) | (e < 0)
    if np.any(bad_e):
        raise rows_failing(bad_e, "the eccentricity must be a number >= 0 (0 a circle, "
                           "below 1 an ellipse, 1 a parabola, above 1 a hyperbola)")
    bad_q = ~np.isfinite(q) | (q <= 0)
    if np.any(bad_q):
        raise rows_failing(bad_q, "the perihelion distance q must be a positive number of "
                           "au (and a semi-major axis positive for e < 1, negative for e > 1)")


def _orientation(i, node, peri):
    """Unit vectors towards perihelion (P) and 90 degrees ahead in the orbit (Q), on the
    ICRS axes, from the angles on the ecliptic of J2000."""
    i, o, w = np.radians(i), np.radians(node), np.radians(peri)
    co, so, ci, si, cw, sw = np.cos(o), np.sin(o), np.cos(i), np.sin(i), np.cos(w), np.sin(w)
    p = np.stack([co * cw - so * sw * ci, so * cw + co * sw * ci, sw * si], axis=-1)
    q = np.stack([-co * sw - so * cw * ci, -so * sw + co * cw * ci, cw * si], axis=-1)
    return p @ ECLIPTIC_TO_ICRS.T, q @ ECLIPTIC_TO_ICRS.T


def from_mean_anomaly(a, e, mean_anomaly_deg, epoch1, epoch2):
    """(q, tp1, tp2) from a semi-major axis (au; negative for a hyperbola), the mean
    anomaly at the epoch (degrees) and the epoch (TT JD in two parts)."""
    a, e, m = (np.asarray(x, float) for x in (a, e, mean_anomaly_deg))
    bad = ~np.isfinite(a) | (a == 0) | ((e < 1) & (a < 0)) | ((e > 1) & (a > 0)) | (e == 1)
    if np.any(bad):
        raise rows_failing(bad, "the semi-major axis must be positive for e < 1 and negative "
                           "for e > 1 (a parabola, e = 1, needs q and the time of perihelion)")
    n = SQRT_GM / np.sqrt(np.abs(a)) ** 3                # radians a day
    m = np.radians(np.where(e < 1, (m + 180.0) % 360.0 - 180.0, m))  # the nearest perihelion
    return a * (1.0 - e), np.asarray(epoch1, float), np.asarray(epoch2, float) - m / n


# The f and g series (fg_series) stand for a Kepler solution where their first omitted
# terms, ten times over, move the position by under SERIES_POSITION_AU (15 mm: 0.2 uas
# of a light-time place at 0.1 au) and the velocity by under SERIES_VELOCITY_AU_DAY
# (0.17 mm/s, 1e-8 of a minor planet's speed; the rates of motion use the velocity).
SERIES_POSITION_AU = 1e-13
SERIES_VELOCITY_AU_DAY = 1e-10


def fg_series(pos, vel, h):
    """Two-body states ``h`` days from (pos, vel) by the f and g series to the third power
    of h (the position; the second for the velocity), with where the rest of the series
    is certainly negligible: (position, velocity, mask).

    r(t + h) = f r + g v, with u = GM / r^3, s = r.v / r^2, w = v.v / r^2 - u:
    f = 1 - u h^2 / 2 + u s h^3 / 2 + u (3w - 15s^2 + u) h^4 / 24 + ...,
    g = h - u h^3 / 6 + u s h^4 / 4 + ... (the classical series of orbit determination,
    as in Escobal's Methods of Orbit Determination, 1965, written here from memory and
    checked against SPICE prop2b in tests/test_smallbodies.py); the h^4 terms, bounded,
    decide the mask."""
    h = np.asarray(h, float)
    r2 = np.add.reduce(pos * pos, axis=-1)
    r = np.sqrt(r2)
    u = GM_SUN / (r2 * r)
    s = np.add.reduce(pos * vel, axis=-1) / r2
    v2 = np.add.reduce(vel * vel, axis=-1)
    w = v2 / r2 - u
    f, g, f_dot, g_dot, h2, h3 = _series_coefficients(u, s, h)
    out_p = f[..., None] * pos + g[..., None] * vel
    out_v = f_dot[..., None] * pos + g_dot[..., None] * vel
    # The first omitted terms' sizes: position (h^4) and velocity (h^3, their rates).
    fourth = (np.abs(u * (3.0 * w - 15.0 * s * s + u)) * r / 24.0
              + np.abs(u * s) * np.sqrt(v2) / 4.0)
    with np.errstate(invalid="ignore", over="ignore"):
        near = (10.0 * fourth * h2 * h2 <= SERIES_POSITION_AU) & (
            40.0 * fourth * np.abs(h3) <= SERIES_VELOCITY_AU_DAY)
    return out_p, out_v, near


def _series_coefficients(u, s, h):
    """The f and g series' f, g, f', g' over ``h`` days (``fg_series``'s u and s), and h^2
    and h^3: floats or arrays alike."""
    h2 = h * h
    h3 = h2 * h
    f = 1.0 - 0.5 * u * h2 + 0.5 * u * s * h3
    g = h - u * h3 / 6.0
    f_dot = -u * h + 1.5 * u * s * h2
    g_dot = 1.0 - 0.5 * u * h2 + u * s * h3
    return f, g, f_dot, g_dot, h2, h3


def propagate_from_perihelion(q, e, p_hat, q_hat, dt):
    """Position and velocity (..., 3) at ``dt`` days after perihelion passage.

    At perihelion r0 = q P and v0 = sqrt(GM (1 + e) / q) Q, and r0 . v0 = 0, so the
    universal Kepler equation is  sqrt(GM) dt = q x + e x^3 S(alpha x^2)  with
    alpha = (1 - e) / q, and r = q + e x^2 C(alpha x^2)."""
    q, e, dt = np.broadcast_arrays(np.asarray(q, float), np.asarray(e, float),
                                   np.asarray(dt, float))
    alpha = (1.0 - e) / q
    # An ellipse repeats: keep dt within half a period of the perihelion, so the universal
    # anomaly stays within |E| <= pi (z <= pi^2), where the solution is best conditioned.
    with np.errstate(divide="ignore", invalid="ignore"):
        period = np.where(alpha > 0, 2.0 * np.pi / (SQRT_GM * np.sqrt(np.abs(alpha)) ** 3),
                          np.inf)
        wrapped = np.where(np.isfinite(period) & (np.abs(dt) > 0.5 * period),
                           dt - period * np.round(dt / period), dt)
    x = _solve_universal(q, e, alpha, SQRT_GM * wrapped)
    z = alpha * x * x
    c, s = stumpff(z)
    fq, gv, fdq, gdv = _along_p_and_q(q, e, x, z, c, s, wrapped, np.sqrt(GM_SUN * (1.0 + e) / q))
    pos = fq[..., None] * p_hat + gv[..., None] * q_hat
    vel = fdq[..., None] * p_hat + gdv[..., None] * q_hat
    return pos, vel


def _along_p_and_q(q, e, x, z, c, s, wrapped, v0):
    """The position's and the velocity's components along P and Q, (f q, g v0, f' q,
    g' v0), from the universal anomaly ``x`` (``z`` = alpha x^2, ``c`` and ``s`` its
    Stumpff functions) ``wrapped`` days after perihelion, with v0 the speed there:
    floats or arrays alike."""
    r = q + e * x * x * c
    f = 1.0 - x * x * c / q
    g = wrapped - x * x * x * s / SQRT_GM
    fdot = SQRT_GM / (r * q) * x * (z * s - 1.0)
    gdot = 1.0 - x * x * c / r
    return f * q, g * v0, fdot * q, gdot * v0


def _solve_universal(q, e, alpha, target):
    """The universal anomaly x with F(x) = q x + e x^3 S(alpha x^2) - target = 0.

    F is increasing (F' = r > 0), so the root is unique; Laguerre's iteration (n = 5)
    converges from any start, and a few Newton steps then bring it to the last bit.
    One row (a cell) iterates on floats by the same steps (_laguerre_step, _newton_step
    take floats and arrays alike), a column on arrays, each row until it settles."""
    with np.errstate(over="ignore", invalid="ignore", divide="ignore"):
        x = _first_guess(q, e, alpha, target)
    if x.size == 1:
        xs, qs, es, als, ts = (float(np.ravel(v)[0]) for v in (x, q, e, alpha, target))
        for _ in range(_LAGUERRE_STEPS):
            xs, done = _laguerre_step(xs, qs, es, als, ts, _stumpff_of_float)
            if done:
                break
        for _ in range(_NEWTON_STEPS):
            xs = _newton_step(xs, qs, es, als, ts, _stumpff_of_float)
        return np.full(x.shape, xs)
    active = np.ones(x.shape, bool)
    everyone = True  # every row still iterating: no gathering
    for _ in range(_LAGUERRE_STEPS):
        if everyone:
            new, done = _laguerre_step(x, q, e, alpha, target, stumpff)
            x = new
            active = ~done
            everyone = not done.any()
        elif not active.any():
            break
        else:
            new, done = _laguerre_step(x[active], q[active], e[active], alpha[active],
                                       target[active], stumpff)
            x[active] = new
            idx = np.flatnonzero(active)
            active[idx[done]] = False
    for _ in range(_NEWTON_STEPS):
        x = _newton_step(x, q, e, alpha, target, stumpff)
    return x


def _laguerre_step(x, q, e, alpha, target, stumpff_of):
    """Laguerre's step (n = 5) on F from x: (the next x, whether the step was negligible).
    Floats or arrays alike (numpy's functions on either), so both give the same bits."""
    z = alpha * x * x
    c, s = stumpff_of(z)
    f = q * x + e * (x * x * x) * s - target
    f1 = q + e * x * x * c                    # dF/dx = r
    f2 = e * x * (1.0 - z * s)                # d2F/dx2 = r . v / sqrt(GM)
    # n = 5: (n - 1)^2 = 16, n (n - 1) = 20.
    root = np.sqrt(np.abs(16.0 * f1 * f1 - 20.0 * f * f2))
    step = 5.0 * f / (f1 + np.sign(f1) * root)
    done = np.abs(step) <= 1e-13 * np.maximum(np.abs(x), 1e-300) + 1e-300
    return x - step, done


def _newton_step(x, q, e, alpha, target, stumpff_of):
    z = alpha * x * x
    c, s = stumpff_of(z)
    f = q * x + e * (x * x * x) * s - target
    return x - f / (q + e * x * x * c)


def _first_guess(q, e, alpha, target):
    """A start for the iteration: the parabola's exact root (Cardano, S = 1/6), which
    bounds the root from above for an ellipse and from below for a hyperbola; for a
    strongly hyperbolic orbit far from perihelion the logarithmic estimate of the
    hyperbolic anomaly, which is closer."""
    # e x^3 / 6 + q x = T: depressed cubic x^3 + p x - r = 0 with p = 6q/e, r = 6T/e.
    p = 6.0 * q / np.maximum(e, 1e-300)
    r = 6.0 * target / np.maximum(e, 1e-300)
    disc = np.sqrt((r / 2.0) ** 2 + (p / 3.0) ** 3)
    # x = cbrt(r/2 + disc) + cbrt(r/2 - disc), written to avoid cancellation.
    u = np.cbrt(np.abs(r) / 2.0 + disc)
    x = np.sign(r) * (u - p / (3.0 * u))
    x = np.where(e < 1e-8, target / q, x)  # a circle: x = sqrt(GM) dt / a
    # Hyperbola: x = H / sqrt(-alpha), with e sinh H - H = M; for large M, H ~ asinh(M / e).
    hyper = alpha < 0
    if np.any(hyper):
        sa = np.sqrt(-alpha[hyper])
        mean = target[hyper] * sa ** 3
        h = np.arcsinh(mean / e[hyper])
        xh = h / sa
        x[hyper] = np.where(np.abs(mean) > 1.0, np.where(np.abs(xh) < np.abs(x[hyper]), xh,
                                                            x[hyper]), x[hyper])
    ellipse = alpha > 0
    if np.any(ellipse):
        sa = np.sqrt(alpha[ellipse])
        mean = target[ellipse] * sa ** 3              # the mean anomaly, |M| <= pi
        big_e = mean + e[ellipse] * np.sin(mean)      # a start for E (Danby-like)
        xe = np.clip(big_e, -np.pi, np.pi) / sa
        x[ellipse] = np.where(np.abs(xe) < np.abs(x[ellipse]), xe, x[ellipse])
    return x


# ---- one row on floats --------------------------------------------------------------
#
# A cell's place of a minor planet (bodies.rows_on_floats) asks for one orbit at one
# instant and twice more at its light times: on arrays of one row each step is a numpy
# call of a microsecond or more.  The same steps on Python floats, for a cell and for
# each row of a column alike (so the two agree to the bit): ``Orbit.state``'s choice of
# the f and g series or a new solution, ``propagate_from_perihelion`` and
# ``_first_guess``, with the same Laguerre and Newton steps.


def helio_floats(elements, t1, t2):
    """For one orbit (``Orbit.elements_floats``) at the instant t1 + t2 (TT, floats): a
    function of the light time ``tau`` (days) giving the heliocentric position (three
    floats, au, ICRS axes) at t1 + t2 - tau.  As ``Orbit.state``: the first instant
    solved, the next ones from the f and g series of the last solution where they
    reach, solved anew where not."""
    q, e, p_hat, q_hat, tp1, tp2 = elements
    last = []

    def at(tau):
        dt = (t1 - tp1) + ((t2 - tau) - tp2)
        if last:
            pos, vel, near = _fg_series_floats(last[1], last[2], dt - last[0])
            if near:
                return pos
        pos, vel = _propagate_floats(q, e, p_hat, q_hat, dt)
        last[:] = (dt, pos, vel)
        return pos
    return at


def _fg_series_floats(pos, vel, h):
    """``fg_series`` of one row on floats: (position, velocity, whether it reaches)."""
    r2 = pos[0] * pos[0] + pos[1] * pos[1] + pos[2] * pos[2]
    r = math.sqrt(r2)
    u = GM_SUN / (r2 * r)
    s = (pos[0] * vel[0] + pos[1] * vel[1] + pos[2] * vel[2]) / r2
    v2 = vel[0] * vel[0] + vel[1] * vel[1] + vel[2] * vel[2]
    w = v2 / r2 - u
    f, g, f_dot, g_dot, h2, h3 = _series_coefficients(u, s, h)
    (px, py, pz), (vx, vy, vz) = pos, vel
    out_p = (f * px + g * vx, f * py + g * vy, f * pz + g * vz)
    out_v = (f_dot * px + g_dot * vx, f_dot * py + g_dot * vy, f_dot * pz + g_dot * vz)
    fourth = abs(u * (3.0 * w - 15.0 * s * s + u)) * r / 24.0 + abs(u * s) * math.sqrt(v2) / 4.0
    near = (10.0 * fourth * h2 * h2 <= SERIES_POSITION_AU
            and 40.0 * fourth * abs(h3) <= SERIES_VELOCITY_AU_DAY)
    return out_p, out_v, near


def _propagate_floats(q, e, p_hat, q_hat, dt):
    """``propagate_from_perihelion`` of one row on floats: (position, velocity), lists."""
    alpha = (1.0 - e) / q
    wrapped = dt
    if alpha > 0:  # an ellipse repeats: within half a period of the perihelion
        period = 2.0 * math.pi / (SQRT_GM * math.sqrt(alpha) ** 3)
        if math.isfinite(period) and abs(dt) > 0.5 * period:
            wrapped = dt - period * round(dt / period)
    target = SQRT_GM * wrapped
    x = _first_guess_floats(q, e, alpha, target)
    for _ in range(_LAGUERRE_STEPS):
        x, done = _laguerre_step_floats(x, q, e, alpha, target)
        if done:
            break
    for _ in range(_NEWTON_STEPS):
        z = alpha * x * x
        c, s = _stumpff_floats(z)
        x = x - (q * x + e * (x * x * x) * s - target) / (q + e * x * x * c)
    z = alpha * x * x
    c, s = _stumpff_floats(z)
    fq, gv, fdq, gdv = _along_p_and_q(q, e, x, z, c, s, wrapped, math.sqrt(GM_SUN * (1.0 + e) / q))
    (px, py, pz), (qx, qy, qz) = p_hat, q_hat
    return ((fq * px + gv * qx, fq * py + gv * qy, fq * pz + gv * qz),
            (fdq * px + gdv * qx, fdq * py + gdv * qy, fdq * pz + gdv * qz))


def _stumpff_floats(z):
    """``_stumpff_of_float`` on Python floats, its closed forms by the math module: a
    numpy function called on one float costs a microsecond, and an orbit's place calls
    this seven times.  A cell and every row a column computes on floats take this one
    function, so they agree to the bit; against numpy's closed forms (the arrays' path)
    the place differs in its last bits at most (tests/test_float_places.py).  A cosh
    that overflows raises, and the row is computed on arrays (bodies._FLOAT_FAILURES)."""
    return _stumpff_of_float(z, math)


def _laguerre_step_floats(x, q, e, alpha, target):
    """``_laguerre_step`` on Python floats: the same operations (square roots correctly
    rounded by both; F' = r > 0, so numpy's sign of it is the sign copied here)."""
    z = alpha * x * x
    c, s = _stumpff_floats(z)
    f = q * x + e * (x * x * x) * s - target
    f1 = q + e * x * x * c
    f2 = e * x * (1.0 - z * s)
    root = math.sqrt(abs(16.0 * f1 * f1 - 20.0 * f * f2))
    step = 5.0 * f / (f1 + math.copysign(root, f1))
    return x - step, abs(step) <= 1e-13 * max(abs(x), 1e-300) + 1e-300


# The cube root of a float: the math module's from Python 3.11, numpy's before (the
# one a cell's and a column's rows on floats alike take on a given Python).
_cube_root = getattr(math, "cbrt", None) or (lambda v: float(np.cbrt(v)))


def _first_guess_floats(q, e, alpha, target):
    """``_first_guess`` of one row on floats."""
    if e < 1e-8:  # a circle: x = sqrt(GM) dt / a
        x = target / q
    else:
        p = 6.0 * q / e
        r = 6.0 * target / e
        disc = math.sqrt((r / 2.0) ** 2 + (p / 3.0) ** 3)
        u = _cube_root(abs(r) / 2.0 + disc)
        x = math.copysign(1.0, r) * (u - p / (3.0 * u)) if r != 0.0 else 0.0
    if alpha < 0:
        sa = math.sqrt(-alpha)
        mean = target * sa ** 3
        xh = math.asinh(mean / e) / sa
        if abs(mean) > 1.0 and abs(xh) < abs(x):
            x = xh
    elif alpha > 0:
        sa = math.sqrt(alpha)
        mean = target * sa ** 3
        big_e = mean + e * math.sin(mean)
        xe = min(max(big_e, -math.pi), math.pi) / sa
        if abs(xe) < abs(x):
            x = xe
    return x
