"""The planets' pull on a minor planet or comet: its orbit integrated numerically.

Cowell's method: the heliocentric position and velocity are integrated under the Sun
and the planets Mercury to Neptune, each planet's pull counted directly and through the
Sun's own acceleration (the indirect term), the planets' places from the chosen source.
The Earth stands for the Earth-Moon pair (4,700 km from their barycentre, which matters
only in an approach to within a few lunar distances).  No relativity, no asteroids, no
comet's non-gravitational forces.

The integrator is the 4-stage Gauss-Legendre implicit Runge-Kutta method (order 8): it
is symplectic and keeps the angular momentum of a two-body orbit to rounding, so a pure
two-body run is a check of it.  Every row takes the same number of equal steps from
the epoch of its elements to its own instant, so a whole column is integrated at once.
"""

import numpy as np
from numpy.polynomial import legendre, polynomial

from . import ephemeris, orbits
from .errors import rows_failing
from .vocabulary import BUILTIN

# Sun / planet mass ratios (the IAU 2009 system of astronomical constants; the Earth
# with the Moon, and Mars to Neptune with their satellites).
MASS_RATIOS = {"MERCURY": 6023597.400017, "VENUS": 408523.719, "EARTH": 328900.5596,
               "MARS": 3098703.59, "JUPITER": 1047.348644, "SATURN": 3497.9018,
               "URANUS": 22902.98, "NEPTUNE": 19412.26}
PLANETS = tuple(MASS_RATIOS)
MAX_STEP_DAYS = 2.0
MAX_STEPS = 10000  # about 55 years of 2-day steps; seconds of work at most
_STAGES = 4
_ITERATIONS = 30


def _gauss_legendre(s):
    """(c, A, b) of the s-stage Gauss-Legendre method: nodes at the roots of the shifted
    Legendre polynomial, A[i, j] the integral from 0 to c_i of the j-th Lagrange basis."""
    x, w = legendre.leggauss(s)
    c = (x + 1.0) / 2.0
    a = np.empty((s, s))
    for j in range(s):
        others = np.delete(c, j)
        basis = polynomial.polyfromroots(others) / np.prod(c[j] - others)
        integral = polynomial.polyint(basis)
        a[:, j] = polynomial.polyval(c, integral)
    return c, a, w / 2.0


_C, _A, _B = _gauss_legendre(_STAGES)


_NODE_DAYS = 0.5  # the planets' states at half-day nodes, interpolated in between


def planet_places(t1, t2, source=BUILTIN, exclude=(), planets=PLANETS):
    """{planet: heliocentric positions (..., 3)} at TDB ``t1 + t2`` from the source."""
    return {body: p for body, (p, _) in
            planet_states(t1, t2, source, exclude, planets).items()}


def planet_states(t1, t2, source=BUILTIN, exclude=(), planets=PLANETS):
    """{planet: heliocentric (position, velocity)} at TDB ``t1 + t2`` from the source."""
    src = ephemeris.get(source)
    shape = np.shape(t2)
    flat1, flat2 = np.ravel(np.broadcast_to(t1, shape)), np.ravel(t2)
    out = {}
    for body in planets:
        if body in exclude:
            continue
        if body == "EARTH":
            (ep, ev), (sp, sv) = src.earth_and_sun(flat1, flat2)
            pj, vj = ep - sp, ev - sv
        else:
            pj, vj = src.heliocentric(body, flat1, flat2)
        out[body] = (pj.reshape(shape + (3,)), vj.reshape(shape + (3,)))
    return out


class _PlanetTable:
    """The planets' states at nodes _NODE_DAYS apart over a span, and cubic Hermite
    interpolation between them (position and velocity at both ends of each interval):
    within a few kilometres for Mercury, the fastest, which moves an asteroid's or a
    comet's acceleration by parts in 1e8 of the planet's small pull.  The integration's
    stages fall at every fraction of a day; the source is asked once a node."""

    def __init__(self, low, high, source, exclude, planets):
        self.base = np.floor(low) - _NODE_DAYS
        count = int(np.ceil((high - self.base) / _NODE_DAYS)) + 2
        offsets = np.arange(count) * _NODE_DAYS
        self.states = planet_states(np.full(count, self.base), offsets, source, exclude,
                                    planets)

    def places(self, t1, t2):
        x = ((np.asarray(t1, float) - self.base) + np.asarray(t2, float)) / _NODE_DAYS
        k = np.floor(x).astype(int)
        s = (x - k)[..., None]
        h00, h10 = 2 * s ** 3 - 3 * s ** 2 + 1, s ** 3 - 2 * s ** 2 + s
        h01, h11 = -2 * s ** 3 + 3 * s ** 2, s ** 3 - s ** 2
        out = {}
        for body, (p, v) in self.states.items():
            out[body] = (h00 * p[k] + h10 * _NODE_DAYS * v[k] + h01 * p[k + 1]
                         + h11 * _NODE_DAYS * v[k + 1])
        return out


def accelerations(r, places):
    """Heliocentric accelerations (au/day^2) at positions ``r`` (..., 3): the Sun, plus
    each planet of ``places`` (planet_places at the same instants), direct and
    indirect."""
    d = np.linalg.norm(r, axis=-1)[..., None]
    acc = -orbits.GM_SUN * r / d ** 3
    for body, pj in places.items():
        mu = orbits.GM_SUN / MASS_RATIOS[body]
        rel = pj - r
        acc += mu * (rel / np.linalg.norm(rel, axis=-1)[..., None] ** 3
                     - pj / np.linalg.norm(pj, axis=-1)[..., None] ** 3)
    return acc


def step_limit(r, v):
    """The longest step (days) for rows at (r, v): a thirtieth of the time scale r / v at
    perihelion, from the osculating orbit, and at most MAX_STEP_DAYS."""
    d = np.linalg.norm(r, axis=-1)
    h = np.cross(r, v)
    p = np.sum(h * h, axis=-1) / orbits.GM_SUN
    e_vec = np.cross(v, h) / orbits.GM_SUN - r / d[..., None]
    e = np.linalg.norm(e_vec, axis=-1)
    q = p / (1.0 + e)
    scale = q ** 1.5 / np.sqrt(orbits.GM_SUN * (1.0 + e))
    return np.minimum(MAX_STEP_DAYS, scale / 30.0)


def integrate(p0, v0, start1, start2, end1, end2, source=BUILTIN, exclude=(),
              planets=PLANETS, max_step=None):
    """Position and velocity at ``end`` of rows that start at (p0, v0) at ``start``
    (TDB two-part JDs, arrays of rows), integrated under the Sun and the planets."""
    p, v = np.array(p0, float), np.array(v0, float)
    span = (np.asarray(end1, float) - start1) + (np.asarray(end2, float) - start2)
    limit = step_limit(p, v) if max_step is None else max_step
    with np.errstate(invalid="ignore", divide="ignore", over="ignore"):
        need = np.abs(span) / limit
    too_long = ~np.isfinite(need) | (need > MAX_STEPS)
    if np.any(too_long):
        # A perihelion very near the Sun or a span of decades would take millions of
        # steps: refused, so that no cell can keep the office busy for minutes.
        raise rows_failing(too_long, f"integrating this orbit over this span would take "
                           f"over {MAX_STEPS} steps (a perihelion very near the Sun, or "
                           "years from the epoch): use model TWO BODY, or elements with an "
                           "epoch nearer the date")
    steps = max(1, int(np.ceil(np.max(need)))) if span.size else 1
    h = span / steps
    t1 = np.broadcast_to(np.asarray(start1, float), h.shape)
    t2 = np.asarray(start2, float) + np.zeros(h.shape)
    hh = h[:, None, None]
    if planets:
        ends = np.concatenate([np.ravel(t1 + t2), np.ravel(t1 + t2 + span)])
        table = _PlanetTable(ends.min(), ends.max(), source, exclude, planets)
    for n in range(steps):
        stage2 = t2[:, None] + n * h[:, None] + _C[None, :] * h[:, None]  # (rows, s)
        stage1 = np.broadcast_to(t1[:, None], stage2.shape)
        # Fixed-point iteration of the stage equations, started from the Taylor guess.
        kv = np.repeat(v[:, None, :], _STAGES, axis=1)           # stage velocities
        # The planets at the stage times, once a step: the iterations move only the body.
        places = table.places(stage1, stage2) if planets else {}
        ka = accelerations(p[:, None, :] + kv * (_C[None, :, None] * hh), places)
        for _ in range(_ITERATIONS):
            sp = p[:, None, :] + hh * np.einsum("ij,rjk->rik", _A, kv)
            sv = v[:, None, :] + hh * np.einsum("ij,rjk->rik", _A, ka)
            new_ka = accelerations(sp, places)
            # Both halves must have settled (the first pass only repeats the guess's
            # accelerations, since the rows of A sum to c).
            change = max(np.max(np.abs(new_ka - ka)) / max(np.max(np.abs(new_ka)), 1e-300),
                         np.max(np.abs(sv - kv)) / max(np.max(np.abs(sv)), 1e-300))
            kv, ka = sv, new_ka
            if change < 2e-16:
                break
        p = p + h[:, None] * np.einsum("j,rjk->rk", _B, kv)
        v = v + h[:, None] * np.einsum("j,rjk->rk", _B, ka)
    return p, v


class PerturbedOrbit:
    """Orbits whose elements osculate at their epochs, moved by the planets: the
    ``heliocentric(t1, t2)`` of bodies.place.  The last integration is kept, so the
    light-time iterations (minutes from it) take a Taylor step from it instead of a new
    integration."""

    _TAYLOR_DAYS = 0.05

    def __init__(self, orbit, source=BUILTIN):
        self.orbit, self.source = orbit, source
        self._kept = None

    def heliocentric(self, t1, t2, near=None):
        t1 = np.broadcast_to(np.asarray(t1, float), self.orbit.q.shape)
        t2 = np.broadcast_to(np.asarray(t2, float), self.orbit.q.shape)
        kept = self._kept
        if kept is not None:
            k1, k2, p, v = kept
            dt = (t1 - k1) + (t2 - k2)
            if np.all(np.abs(dt) < self._TAYLOR_DAYS):
                a = accelerations(p, planet_places(k1, k2, self.source))
                jerk_free = dt[..., None]
                return p + jerk_free * v + 0.5 * jerk_free ** 2 * a, v + jerk_free * a
        o = self.orbit
        p0, v0 = o.state(o.epoch1, o.epoch2)
        p, v = integrate(p0, v0, o.epoch1, o.epoch2, t1, t2, self.source)
        self._kept = (t1.copy(), t2.copy(), p, v)
        return p, v

    def state(self, t1, t2):
        return self.heliocentric(t1, t2)
