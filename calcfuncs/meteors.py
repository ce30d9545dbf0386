"""Meteor rates: the zenithal hourly rate of a watch, and a shower radiant's drift.

Both are common practice of the trade, as the visual observers' organisations teach them:

  ZHR = N F r^(6.5 - LM) / (T_eff sin(h_R)^gamma),   F = 1 / (1 - k)

N meteors of the shower seen in T_eff hours of effective watching, with limiting magnitude
LM at the field's centre, the population index r, the radiant at altitude h_R, a fraction
k of the field hidden by cloud; gamma is 1 in the usual form (some work fits other values).
Its uncertainty, from the Poisson statistics of the count, is ZHR / sqrt(N).

The radiant moves along the sky as the Earth moves along its orbit: from a reference place
at one solar longitude and a daily drift in RA and Dec, the place at another solar longitude
is the reference plus the drift times the days between, 360 / 365.2422 degrees of solar
longitude to the day (the mean rate).
"""

import numpy as np

from .errors import RowErrors

# Degrees of solar longitude per day, on average: 360 over the tropical year.
SOLAR_LONGITUDE_PER_DAY = 360.0 / 365.2422
# The standard limiting magnitude to which a ZHR is reduced.
STANDARD_LM = 6.5


def _check(rows):
    """Raise the first message of each row: ``rows`` is a list of (mask, message)."""
    messages = None
    for mask, message in rows:
        mask = np.asarray(mask, dtype=bool)
        if np.any(mask):
            if messages is None:
                messages = np.full(mask.shape, None, dtype=object)
            take = mask & np.equal(messages, None)
            messages[take] = message
    if messages is not None:
        raise RowErrors(messages)


def zhr(count, hours, limiting_mag, radiant_alt, population_index, cloud=0.0, exponent=1.0):
    """The zenithal hourly rate (the usual formula above), arrays in, array out."""
    count, hours, lm, alt, r, k, gamma = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in
          (count, hours, limiting_mag, radiant_alt, population_index, cloud, exponent)))
    _check([
        (count < 0, "the count of meteors cannot be negative"),
        (count != np.floor(count), "the count of meteors must be a whole number"),
        (hours <= 0, "the effective observing time must be more than 0 hours"),
        (alt <= 0, "the radiant is below the horizon: no ZHR (the formula is customarily "
                   "used only with the radiant above about 20 degrees)"),
        (alt > 90, "the radiant's altitude cannot exceed 90 degrees"),
        (r <= 1, "the population index must be more than 1 (usually 2 to 3.5)"),
        ((k < 0) | (k >= 1), "the cloud cover is the fraction of the field hidden, from 0 "
                             "to below 1 (0.2 for 20 %)"),
        (gamma <= 0, "the zenith exponent must be positive (usually 1)"),
        ((lm < 0) | (lm > 9), "the limiting magnitude must be within 0 to 9"),
    ])
    return (count * r ** (STANDARD_LM - lm)
            / ((1.0 - k) * hours * np.sin(np.radians(alt)) ** gamma))


def zhr_cells(count, hours, limiting_mag, radiant_alt, population_index, cloud=0.0,
              exponent=1.0):
    return zhr(count, hours, limiting_mag, radiant_alt, population_index, cloud, exponent)


def zhr_error_cells(count, hours, limiting_mag, radiant_alt, population_index, cloud=0.0,
                    exponent=1.0):
    """The ZHR's Poisson uncertainty, ZHR / sqrt(N)."""
    rate = zhr(count, hours, limiting_mag, radiant_alt, population_index, cloud, exponent)
    count = np.broadcast_to(np.asarray(count, dtype=float), rate.shape)
    _check([(count == 0, "no meteors counted: the Poisson uncertainty needs at least one")])
    return rate / np.sqrt(count)


def _drifted(place, drift, reference_lon, solar_lon):
    delta = np.mod(np.asarray(solar_lon, float) - np.asarray(reference_lon, float) + 180.0,
                   360.0) - 180.0
    return np.asarray(place, float) + np.asarray(drift, float) * delta / SOLAR_LONGITUDE_PER_DAY


def radiant_ra_cells(ra, dec, reference_lon, solar_lon, ra_drift, dec_drift):
    """RA of the radiant at a solar longitude, degrees in [0, 360)."""
    dec_now = _drifted(dec, dec_drift, reference_lon, solar_lon)
    _check([(np.abs(dec_now) > 90, "the drift carries the radiant past a pole: use a nearer "
                                   "reference place")])
    return np.mod(_drifted(ra, ra_drift, reference_lon, solar_lon), 360.0)


def radiant_dec_cells(ra, dec, reference_lon, solar_lon, ra_drift, dec_drift):
    """Dec of the radiant at a solar longitude, degrees."""
    dec_now = _drifted(dec, dec_drift, reference_lon, solar_lon)
    _check([(np.abs(dec_now) > 90, "the drift carries the radiant past a pole: use a nearer "
                                   "reference place")])
    return dec_now
