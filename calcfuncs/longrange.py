"""The long-range theories of the built-in source: the Sun and the planets from VSOP87D,
the Moon from the abridged ELP-2000/82 series of Meeus, for any date in -4000 to +8000.

Planets and the Earth: VSOP87 version D (Bretagnon and Francou 1988), truncated
(vsop87_series.py, made by tools/make_vsop87_series.py): heliocentric longitude,
latitude and distance on the mean dynamical ecliptic and equinox of date.  That
equinox of date follows the IAU 1976 precession (Lieske et al. 1977; from memory of
the VSOP87 paper, and borne out by DE440: with it the Earth's residual is flat at
0.3", with Vondrak's precession instead it grows to 2.4" by 2650), so the same
precession takes the place back to the ecliptic and equinox J2000.0 (the ecliptic
precession angles eta, Pi, p as Meeus gives them, Astronomical Algorithms eq. 21.5);
then the published rotation from the VSOP87 J2000 ecliptic to the FK5 equator (from
memory of the VSOP87 documentation) and
ERFA's FK5-to-Hipparcos rotation put it on the ICRS axes.  Velocities come from the
series' own derivatives (the slow turning of the frame of date, under 1e-4 of the
Earth's speed, is left out: a thousandth of an arcsecond of aberration).

The Moon: Meeus's 60 + 60 largest terms of ELP-2000/82 (moon_series.py) with his mean
arguments (Astronomical Algorithms ch. 47), on the mean ecliptic and equinox of date
of the same IAU 1976 precession, taken to the ICRS axes the same way.

Tidal acceleration.  A Delta T found from ancient eclipses is tied to the value of the
Moon's secular acceleration in longitude that its authors' lunar ephemeris used; a Moon
with another value needs the published correction -0.000091 (ndot + 26)(y - 1955)^2 s
to Delta T (Morrison and Stephenson 2004; Espenak and Meeus 2006).  Meeus's mean
arguments here follow the modern ephemerides: against DE440 over 1550-2650 the Moon's
longitude shows no quadratic drift (means per century within 6", tests/test_longrange.py),
so its value is DE440's, about -25.8"/cy^2, the value SMH2016, the default Delta T
model, is tied to (-25.82, from memory of the paper): no correction is needed with it.
ESPENAK2006 is tied to -26"/cy^2: with it the correction would be -0.000091 x 0.18
(y - 1955)^2 s, about 100 s in 600 BC (a minute of arc of the Moon); it is not applied.

No barycentre: the Sun is put at the origin.  Geocentric places are differences of
heliocentric ones, so only the Sun's barycentric motion (about 13 m/s) is lost: under
0.01" of aberration, and under 0.01" through the light time of any body.
"""

import erfa
import numpy as np

from . import moon_series, vectors, vsop87_series
from .vocabulary import J2000_JD

ARCSEC = np.pi / (180.0 * 3600.0)
_CHUNK = 64  # rows per block: the (rows x terms) table stays in the cache (measured fastest)

# ---- the series, parsed once ---------------------------------------------------------------


def _terms(text):
    return np.array(text.split(), dtype=float).reshape(-1, 3)


class _Series:
    """A planet's L, B, R series as one table of terms, ordered by coordinate then power,
    so that one cosine call and two sums by segment evaluate all of them (a single cell
    pays a few numpy calls instead of one per power and coordinate)."""

    def __init__(self, coords):
        blocks, self.power, coord_of = [], [], []
        for j, name in enumerate("LBR"):
            for k, text in enumerate(coords[name]):
                terms = _terms(text)
                if len(terms):
                    blocks.append(terms)
                    self.power.append(k)
                    coord_of.append(j)
        table = np.concatenate(blocks)
        self.a, self.b, self.c = table[:, 0], table[:, 1], table[:, 2]
        self.ac = self.a * self.c
        self.starts = np.cumsum([0] + [len(t) for t in blocks[:-1]])
        self.power = np.array(self.power)
        self.coord_starts = np.searchsorted(coord_of, [0, 1, 2])

    def evaluate(self, t, rate):
        """(L, B, R) at Julian millennia ``t`` (rows), and their rates per millennium."""
        phase = t[:, None] * self.c
        phase += self.b
        terms = np.cos(phase)
        terms *= self.a
        sums = np.add.reduceat(terms, self.starts, axis=1)
        powers = t[:, None] ** np.arange(self.power.max() + 1)
        value = np.add.reduceat(sums * powers[:, self.power], self.coord_starts, axis=1)
        if not rate:
            return value, None
        # d/dt of t^k S(t): k t^(k-1) S + t^k S'
        terms = np.sin(phase, out=terms)
        terms *= self.ac
        d_sums = -np.add.reduceat(terms, self.starts, axis=1)
        k = self.power
        d_powers = np.where(k > 0, k * powers[:, np.maximum(k - 1, 0)], 0.0)
        deriv = np.add.reduceat(sums * d_powers + d_sums * powers[:, k], self.coord_starts,
                                axis=1)
        return value, deriv


_PLANETS = {body: _Series(coords) for body, coords in vsop87_series.SERIES.items()}

_MOON_LR = np.array(moon_series.LONGITUDE_DISTANCE.split(), dtype=float).reshape(-1, 6)
_MOON_B = np.array(moon_series.LATITUDE.split(), dtype=float).reshape(-1, 5)

# VSOP87's J2000 ecliptic to the FK5 equator (the matrix published with VSOP87), then
# FK5 to Hipparcos, the ICRS realisation (ERFA fk5hip).
_VSOP_TO_FK5 = np.array([
    [1.0, 0.000000440360, -0.000000190919],
    [-0.000000479966, 0.917482137087, -0.397776982902],
    [0.0, 0.397776982902, 0.917482137087]])
ECLIPTIC_J2000_TO_ICRS = erfa.fk5hip()[0] @ _VSOP_TO_FK5


def _date_to_j2000(t_cy):
    """Rotations from the mean ecliptic and equinox of date (IAU 1976) to those of
    J2000.0: the transpose of R3(-(p + Pi)) R1(eta) R3(Pi), angles of Meeus eq. 21.5
    (from J2000.0, t in Julian centuries)."""
    eta = (47.0029 + (-0.03302 + 0.000060 * t_cy) * t_cy) * t_cy * ARCSEC
    pi = np.radians(174.876384) + (-869.8089 + 0.03536 * t_cy) * t_cy * ARCSEC
    p = (5029.0966 + (1.11113 - 0.000006 * t_cy) * t_cy) * t_cy * ARCSEC
    m = erfa.rz(-(p + pi), erfa.rx(eta, erfa.rz(pi, np.eye(3))))
    return np.swapaxes(m, -1, -2)


def _date_to_icrs(t_cy):
    """Rotations from the mean ecliptic and equinox of date (IAU 1976) to the ICRS axes.
    Products by einsum, row by row, so that a row gets the same bits in a column as
    alone (a BLAS product takes other paths for one row and for several)."""
    return np.einsum("ij,njk->nik", ECLIPTIC_J2000_TO_ICRS, _date_to_j2000(np.ravel(t_cy)))


def _to_icrs(date_vectors, t_cy):
    return vectors.apply(_date_to_icrs(t_cy), date_vectors)


def _flat_days(jd1, jd2):
    jd1, jd2 = np.broadcast_arrays(np.asarray(jd1, float), np.asarray(jd2, float))
    return jd1.shape, ((jd1 - J2000_JD) + jd2).ravel()


def planet(body, jd1, jd2, rate=False):
    """Heliocentric position (au) and, if ``rate``, velocity (au/day) of a planet or
    the EARTH on the ICRS axes at TDB (TT) instants."""
    shape, days = _flat_days(jd1, jd2)
    series = _PLANETS[body]
    p = np.empty(days.shape + (3,))
    v = np.empty(days.shape + (3,)) if rate else None
    for start in range(0, days.size, _CHUNK):
        part = slice(start, start + _CHUNK)
        t = days[part] / 365250.0  # Julian millennia
        value, deriv = series.evaluate(t, rate)
        lon, lat, r = value.T
        m = _date_to_icrs(t * 10.0)
        if rate:
            dlon, dlat, dr = deriv.T / 365250.0  # per day
            pv = erfa.s2pv(lon, lat, r, dlon, dlat, dr)
            p[part] = vectors.apply(m, pv["p"])
            v[part] = vectors.apply(m, pv["v"])
        else:
            p[part] = vectors.apply(m, erfa.s2p(lon, lat, r))
    p = p.reshape(shape + (3,))
    return (p, v.reshape(shape + (3,))) if rate else p


# Meeus eqs. 47.1 to 47.5 and his A1, A2, A3 (degrees; coefficients of t^0 ... t^4, t in
# Julian centuries of TT): the mean longitude L', elongation D, the Sun's anomaly M, the
# Moon's anomaly M', the argument of latitude F, and the three additive arguments.
_MOON_MEAN = np.array([
    (218.3164477, 481267.88123421, -0.0015786, 1 / 538841, -1 / 65194000),
    (297.8501921, 445267.1114034, -0.0018819, 1 / 545868, -1 / 113065000),
    (357.5291092, 35999.0502909, -0.0001536, 1 / 24490000, 0.0),
    (134.9633964, 477198.8675055, 0.0087414, 1 / 69699, -1 / 14712000),
    (93.2720950, 483202.0175233, -0.0036539, -1 / 3526000, 1 / 863310000),
    (119.75, 131.849, 0.0, 0.0, 0.0),
    (53.09, 479264.290, 0.0, 0.0, 0.0),
    (313.45, 481266.484, 0.0, 0.0, 0.0)])
# Meeus's additive terms (1e-6 degree): multiples of (L', D, M, M', F, A1, A2, A3), then
# the coefficient in longitude and in latitude.
_MOON_ADDITIVE = np.array([
    (0, 0, 0, 0, 0, 1, 0, 0, 3958.0, 0.0),
    (1, 0, 0, 0, -1, 0, 0, 0, 1962.0, 0.0),
    (0, 0, 0, 0, 0, 0, 1, 0, 318.0, 0.0),
    (1, 0, 0, 0, 0, 0, 0, 0, 0.0, -2235.0),
    (0, 0, 0, 0, 0, 0, 0, 1, 0.0, 382.0),
    (0, 0, 0, 0, -1, 1, 0, 0, 0.0, 175.0),
    (0, 0, 0, 0, 1, 1, 0, 0, 0.0, 175.0),
    (1, 0, 0, -1, 0, 0, 0, 0, 0.0, 127.0),
    (1, 0, 0, 1, 0, 0, 0, 0, 0.0, -115.0)])
# The periodic terms of both tables as one: multiples of (D, M, M', F), and each term's
# power of E (the eccentricity factor, to the power |multiple of M|).
_MOON_MULTIPLES = np.concatenate([_MOON_LR[:, :4], _MOON_B[:, :4]])
_MOON_E_POWER = np.abs(_MOON_MULTIPLES[:, 1])
_N_LR = len(_MOON_LR)


def moon_ecliptic_of_date(jd1, jd2):
    """Geocentric (longitude, latitude) in radians and distance in km of the Moon on the
    mean ecliptic and equinox of date (IAU 1976 precession) at TT instants (flat).
    Every table is applied by einsum, row by row (the same bits alone or in a column)."""
    _, days = _flat_days(jd1, jd2)
    t = days / 36525.0
    angles = np.radians(np.einsum("nk,jk->nj", t[:, None] ** np.arange(5), _MOON_MEAN))
    e = 1.0 - t * (0.002516 + 0.0000074 * t)  # the decreasing eccentricity of the Earth's orbit
    phase = np.einsum("na,ka->nk", angles[:, 1:5], _MOON_MULTIPLES)
    scale = e[:, None] ** _MOON_E_POWER
    sines = np.sin(phase) * scale
    sl = np.einsum("nk,k->n", sines[:, :_N_LR], _MOON_LR[:, 4])
    sb = np.einsum("nk,k->n", sines[:, _N_LR:], _MOON_B[:, 4])
    sr = np.einsum("nk,k->n", np.cos(phase[:, :_N_LR]) * scale[:, :_N_LR], _MOON_LR[:, 5])
    extra = np.sin(np.einsum("nj,kj->nk", angles, _MOON_ADDITIVE[:, :8]))
    sl = sl + np.einsum("nk,k->n", extra, _MOON_ADDITIVE[:, 8])
    sb = sb + np.einsum("nk,k->n", extra, _MOON_ADDITIVE[:, 9])
    lon = angles[:, 0] + np.radians(sl * 1e-6)
    lat = np.radians(sb * 1e-6)
    return lon, lat, 385000.56 + sr / 1000.0


def moon(jd1, jd2):
    """Geocentric position of the Moon (au, ICRS axes) at TT instants."""
    from .vocabulary import AU_KM

    shape, days = _flat_days(jd1, jd2)
    lon, lat, km = moon_ecliptic_of_date(jd1, jd2)
    p = _to_icrs(erfa.s2p(lon, lat, km / AU_KM), days / 36525.0)
    return p.reshape(shape + (3,))


def moon_velocity(jd1, jd2, step=0.01):
    """Geocentric velocity of the Moon (au/day) by a central difference over
    +-``step`` days (the series' error over 0.02 day is far below its own)."""
    jd1 = np.asarray(jd1, float)
    jd2 = np.asarray(jd2, float)
    return (moon(jd1, jd2 + step) - moon(jd1, jd2 - step)) / (2.0 * step)
