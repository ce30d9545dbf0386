"""Apparent visual magnitudes of the planets: Mallama and Hilton (2018).

Mallama, A. and Hilton, J. L. (2018), "Computing apparent planetary magnitudes for The
Astronomical Almanac", Astronomy and Computing 25, 10-24.  Each planet's V magnitude is
5 log10(r d) plus a polynomial in the phase angle alpha (degrees), r and d the planet's
distances from the Sun and the Earth in au; Saturn's adds its rings through the
planetocentric latitude of the Earth, Uranus's the latitudes of the Earth and the Sun as
seen from the planet, Neptune's a brightening from 1980 to 2000.  Each formula holds
only over the phase angles the authors fitted; outside them there is no magnitude.

The coefficients are the paper's, from memory of its equations; where the geocentric
and the wider formulas meet (Saturn's ring latitude, the phase terms of Uranus and
Neptune) the reading was checked against skyfield's magnitudelib, which follows the
authors' own program.  The tests compare with skyfield and with magnitudes the
almanacs printed.  Left out:
Mars's small corrections for its rotation and orbital longitude (a few hundredths to a
tenth of a magnitude, tabulated in the paper) and the formulas for phase angles seen
only from beyond the Earth (Mars above 50 degrees, Jupiter above 12): a geocentric
place never reaches them.
"""

import numpy as np

from . import bodies, ephemeris, vectors
from .errors import RowErrors, SkyError
from .vocabulary import BUILTIN, J2000_JD

# Phase-angle polynomials, constant term first (degrees), and the range each is fitted
# for, as the paper states it (from memory).
MERCURY = (-0.613, 6.3280e-02, -1.6336e-03, 3.3644e-05, -3.4265e-07, 1.6893e-09, -3.0334e-12)
MERCURY_ALPHA = (2.0, 170.0)
VENUS_SMALL = (-4.384, -1.044e-03, 3.687e-04, -2.814e-06, 8.938e-09)   # alpha below 163.7
VENUS_LARGE = (236.05828, -2.81914, 8.39034e-03)                      # 163.7 to 179
VENUS_SPLIT = 163.7
VENUS_ALPHA = (0.0, 179.0)
MARS = (-1.601, 2.267e-02, -1.302e-04)
MARS_ALPHA = (0.0, 50.0)
JUPITER = (-9.395, -3.7e-04, 6.16e-04)
JUPITER_ALPHA = (0.0, 12.0)
# Saturn with its rings: -8.914 - 1.825 sin(beta) + 0.026 alpha - 0.378 sin(beta)
# exp(-2.25 alpha), beta the geometric mean of the Saturnicentric latitudes of the Sun and
# the Earth (0 when they lie on opposite sides of the rings).
SATURN_ALPHA = (0.0, 6.5)
SATURN_MAX_TILT = 27.0
# Uranus: -7.110 - 8.4e-04 phi', phi' the mean of the absolute planetographic latitudes of
# the Earth and the Sun; a phase term only beyond 3.1 degrees (from the Earth up to about
# 3.15 near perihelion).
URANUS_ABSOLUTE = -7.110
URANUS_LATITUDE_TERM = -8.4e-04
URANUS_PHASE = (0.0, 6.587e-03, 1.045e-04)
URANUS_PHASE_FROM = 3.1
# Neptune: -6.89 until 1980, brightening by 0.0054 a year to -7.00 in 2000; beyond a phase
# angle of 1.9 degrees (reached from the Earth only near quadrature) a phase term fitted
# to observations after 2000.
NEPTUNE_PHASE = (0.0, 7.944e-03, 9.617e-05)
NEPTUNE_PHASE_FROM = 1.9

# Poles (IAU WGCCRE report 2015, from memory): RA and Dec of J2000 in degrees, with their
# rates per Julian century for Saturn.  Uranus's flattening turns planetocentric
# latitudes into the planetographic ones its formula takes (radii 25,559 and 24,973 km).
SATURN_POLE = ((40.589, -0.036), (83.537, -0.004))
URANUS_POLE = ((257.311, 0.0), (-15.175, 0.0))
URANUS_FLATTENING = 1.0 - 24973.0 / 25559.0

MAGNITUDE_PLANETS = ("MERCURY", "VENUS", "MARS", "JUPITER", "SATURN", "URANUS", "NEPTUNE")


def _poly(coefficients, x):
    out = np.zeros_like(x)
    for c in reversed(coefficients):
        out = out * x + c
    return out


def pole_vector(pole, tdb1, tdb2):
    (ra0, ra_rate), (dec0, dec_rate) = pole
    centuries = ((tdb1 - J2000_JD) + tdb2) / 36525.0
    ra = np.radians(ra0 + ra_rate * centuries)
    dec = np.radians(dec0 + dec_rate * centuries)
    return np.stack([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)], axis=-1)


def _latitude_deg(pole, direction):
    """Planetocentric latitude (degrees) of the point toward ``direction``."""
    return np.degrees(np.arcsin(np.clip(vectors.dot(pole, vectors.unit(direction)), -1.0, 1.0)))


def _outside(mask, message):
    mask = np.asarray(mask, dtype=bool)
    messages = np.full(mask.shape, None, dtype=object)
    messages[mask] = message
    return messages


def _range_message(body, span):
    return (f"the phase angle is outside {span[0]:g} to {span[1]:g} degrees, the range "
            f"Mallama and Hilton (2018) fitted for {body.capitalize()}: no magnitude")


def geometry(body, tdb1, tdb2, source=BUILTIN):
    """(r, d, alpha in degrees, the planet's heliocentric vector, the Earth's) at the
    instants: the planet where the light left it (light time), from the one pipeline."""
    p = bodies.place(body, tdb1, tdb2, "ASTROMETRIC", source)
    r = vectors.norm(p.helio)
    alpha = np.degrees(bodies.phase_angle(p))
    return r, p.distance, alpha, p.helio, p.earth_helio


def magnitude(body, tdb1, tdb2, source=BUILTIN):
    """V magnitudes, and an object array of messages (None where the formula holds)."""
    if body not in MAGNITUDE_PLANETS:
        raise SkyError(f"Mallama and Hilton (2018) give no magnitude for {body.capitalize()}; "
                       "use " + ", ".join(MAGNITUDE_PLANETS))
    tdb1, tdb2 = np.broadcast_arrays(np.asarray(tdb1, float), np.asarray(tdb2, float))
    r, d, alpha, helio, earth_helio = geometry(body, tdb1, tdb2, source)
    distance_term = 5.0 * np.log10(r * d)
    if body == "MERCURY":
        v, span = _poly(MERCURY, alpha), MERCURY_ALPHA
    elif body == "VENUS":
        v = np.where(alpha < VENUS_SPLIT, _poly(VENUS_SMALL, alpha), _poly(VENUS_LARGE, alpha))
        span = VENUS_ALPHA
    elif body == "MARS":
        v, span = _poly(MARS, alpha), MARS_ALPHA
    elif body == "JUPITER":
        v, span = _poly(JUPITER, alpha), JUPITER_ALPHA
    elif body == "SATURN":
        pole = pole_vector(SATURN_POLE, tdb1, tdb2)
        of_earth = _latitude_deg(pole, earth_helio - helio)
        of_sun = _latitude_deg(pole, -helio)
        product = of_earth * of_sun
        tilt = np.where(product > 0.0, np.sqrt(np.abs(product)), 0.0)
        sin_tilt = np.sin(np.radians(tilt))
        v = (-8.914 - 1.825 * sin_tilt + 0.026 * alpha
             - 0.378 * sin_tilt * np.exp(-2.25 * alpha))
        span = SATURN_ALPHA
        messages = _outside(tilt > SATURN_MAX_TILT,
                            f"the rings are tilted more than {SATURN_MAX_TILT:g} degrees, "
                            "beyond the fit of Mallama and Hilton (2018): no magnitude")
    elif body == "URANUS":
        pole = pole_vector(URANUS_POLE, tdb1, tdb2)
        latitudes = [_planetographic(_latitude_deg(pole, toward))
                     for toward in (earth_helio - helio, -helio)]
        mean_latitude = 0.5 * (np.abs(latitudes[0]) + np.abs(latitudes[1]))
        v = (URANUS_ABSOLUTE + URANUS_LATITUDE_TERM * mean_latitude
             + np.where(alpha > URANUS_PHASE_FROM, _poly(URANUS_PHASE, alpha), 0.0))
        span = (0.0, 180.0)
    else:  # NEPTUNE
        year = 2000.0 + ((tdb1 - J2000_JD) + tdb2) / 365.25
        v = np.clip(-6.89 - 0.0054 * (year - 1980.0), -7.00, -6.89)
        beyond = alpha > NEPTUNE_PHASE_FROM
        v = v + np.where(beyond, _poly(NEPTUNE_PHASE, alpha), 0.0)
        span = (0.0, 180.0)
        messages = _outside(beyond & (year < 2000.0),
                            f"a phase angle above {NEPTUNE_PHASE_FROM:g} degrees before 2000: "
                            "Mallama and Hilton (2018) fitted its term only to later "
                            "observations; no magnitude")
    if body not in ("SATURN", "NEPTUNE"):
        messages = np.full(alpha.shape, None, dtype=object)
    outside = (alpha < span[0]) | (alpha > span[1])
    take = outside & np.equal(messages, None)
    messages[take] = _range_message(body, span)
    return distance_term + v, messages


def _planetographic(latitude_deg):
    """Uranus's planetographic latitude from a planetocentric one (oblate spheroid)."""
    lat = np.radians(latitude_deg)
    return np.degrees(np.arctan(np.tan(lat) / (1.0 - URANUS_FLATTENING) ** 2))


# ---- cell function ---------------------------------------------------------------------


def magnitude_cells(body, time, source=BUILTIN):
    tdb1, tdb2 = ephemeris.times_for(source, *time.tt())
    v, messages = magnitude(body, tdb1, tdb2, source)
    if any(m is not None for m in np.ravel(messages)):
        raise RowErrors(messages)
    return v
