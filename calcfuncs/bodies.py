"""The place of a solar-system body as seen from the Earth's centre, from any source.

The one pipeline for the planets, and for the Sun and the Moon from a kernel:
  GEOMETRIC   body minus Earth at the same instant (no light time)
  ASTROMETRIC the body where the light left it: light time found by iteration,
              the body at t - tau minus the Earth at t (BCRS, ICRS axes)
  APPARENT    astrometric, then the Sun's light deflection (ERFA ld, the body at its
              finite distance) and annual aberration (ERFA ab, relativistic): the
              direction observed from the geocentre, on the GCRS axes
The geocentric parallax of a site (up to 9" for Venus, a degree for the Moon) is not
applied.  Times are TDB; the built-in theories take TT for TDB (under 2 ms apart).
"""

import erfa
import numpy as np

from . import ephemeris, frames

LIGHT_DAYS_PER_AU = erfa.AULT / erfa.DAYSEC
KINDS = ("APPARENT", "ASTROMETRIC", "GEOMETRIC")


def _unit(v):
    return v / np.linalg.norm(v, axis=-1)[..., None]


class Place:
    """The geocentric place of a body at some instants, and what it was made from."""

    __slots__ = ("direction", "distance", "helio", "earth_helio", "_states", "_sun")

    def __init__(self, direction, distance, helio, earth_helio, states):
        self.direction = direction      # unit vectors, GCRS axes, of the requested kind
        self.distance = distance        # au: |body(t - tau) - Earth(t)| ("true" distance)
        self.helio = helio              # heliocentric body at t - tau (au)
        self.earth_helio = earth_helio  # heliocentric Earth at t (au)
        self._states = states           # barycentric (p, v) of the Earth and the Sun at t
        self._sun = None

    @property
    def sun_direction(self):
        """The apparent Sun (unit vectors), for elongations; made when first asked."""
        if self._sun is None:
            self._sun = _sun_geocentric(*self._states, "APPARENT")[0]
        return self._sun


def _sun_geocentric(earth_b, sun_b, kind):
    """(unit vectors, geometric distance) of the Sun from the barycentric states at t:
    the light time (about 499 s) from the Sun's slow barycentric motion, then for
    APPARENT the annual aberration (the Sun's own light is not deflected)."""
    (ep, ev), (sp, sv) = earth_b, sun_b
    geometric = sp - ep
    distance = np.linalg.norm(geometric, axis=-1)
    if kind == "GEOMETRIC":
        return geometric / distance[..., None], distance
    tau = distance * LIGHT_DAYS_PER_AU
    u = _unit(geometric - tau[..., None] * sv)
    return (_aberrate(u, ev, distance) if kind == "APPARENT" else u), distance


def _aberrate(u, earth_v, sun_distance):
    c = earth_v * LIGHT_DAYS_PER_AU
    bm1 = np.sqrt(1.0 - np.sum(c * c, axis=-1))
    return erfa.ab(u, c, sun_distance, bm1)


def place(body, tdb1, tdb2, kind="APPARENT", source=ephemeris.BUILTIN):
    """The ``Place`` of ``body`` (SUN, MOON or a planet) at the source's argument times
    (ephemeris.times_for)."""
    src = ephemeris.get(source)
    tdb1, tdb2 = np.broadcast_arrays(np.asarray(tdb1, float), np.asarray(tdb2, float))
    earth_b, sun_b = src.earth_and_sun(tdb1, tdb2)
    (ep, ev), (sp, sv) = earth_b, sun_b
    earth_helio = ep - sp
    if body == "SUN":
        u, distance = _sun_geocentric(earth_b, sun_b, kind)
        return Place(u, distance, np.zeros_like(ep), earth_helio, (earth_b, sun_b))
    em = np.linalg.norm(earth_helio, axis=-1)
    near = (earth_helio, ev - sv, (tdb1, tdb2))

    def helio_at(tau):
        return src.heliocentric(body, tdb1, tdb2 - tau, near)[0]

    def geocentric(helio, tau):
        # The Sun's barycentric place at t - tau, from its slow motion at t.
        return helio + (sp - tau[..., None] * sv) - ep

    tau = np.zeros(tdb1.shape)
    helio = helio_at(tau)
    vector = geocentric(helio, tau)
    if kind != "GEOMETRIC":
        for _ in range(3):  # each round gains a factor v/c: three leave nanoseconds
            tau = np.linalg.norm(vector, axis=-1) * LIGHT_DAYS_PER_AU
            helio = helio_at(tau)
            vector = geocentric(helio, tau)
    distance = np.linalg.norm(vector, axis=-1)
    u = vector / distance[..., None]
    if kind == "APPARENT":
        e = earth_helio / em[..., None]
        u = _aberrate(erfa.ld(1.0, u, _unit(helio), e, em, 1e-9), ev, em)
    return Place(u, distance, helio, earth_helio, (earth_b, sun_b))


def heliocentric(body, tdb1, tdb2, source=ephemeris.BUILTIN):
    """Geometric heliocentric position (au, ICRS axes) of a planet at the instants."""
    src = ephemeris.get(source)
    tdb1, tdb2 = np.broadcast_arrays(np.asarray(tdb1, float), np.asarray(tdb2, float))
    if body == "EARTH":
        (ep, _), (sp, _) = src.earth_and_sun(tdb1, tdb2)
        return ep - sp
    return src.heliocentric(body, tdb1, tdb2)[0]


def in_system(vectors, system, tt1, tt2):
    m = frames.system_matrix(system, tt1, tt2)
    return np.einsum("...ij,...j->...i", m, vectors)


def phase_angle(p):
    """Sun-body-Earth angle in radians, from a ``Place``."""
    to_sun = -p.helio
    to_earth = -(p.helio - p.earth_helio)  # the Earth minus the body
    cross = np.linalg.norm(np.cross(to_sun, to_earth), axis=-1)
    return np.arctan2(cross, np.sum(to_sun * to_earth, axis=-1))


def elongation(p):
    """Angle between the body and the Sun (apparent, geocentric), radians."""
    cross = np.linalg.norm(np.cross(p.direction, p.sun_direction), axis=-1)
    return np.arctan2(cross, np.sum(p.direction * p.sun_direction, axis=-1))
