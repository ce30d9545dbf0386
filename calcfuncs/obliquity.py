"""Obliquity of the ecliptic and nutation, under the published models.

Mean obliquity (angle between the mean equator and the ecliptic of date):
  IAU2006     Hilton et al. (2006), the P03 precession of Capitaine et al. (2003); ERFA obl06
  IAU1980     Lieske et al. (1977), adopted by the IAU in 1976/1980; ERFA obl80
  NEWCOMB     Newcomb's formula as in the Explanatory Supplement (1961), argument in
              tropical centuries from B1900.0
  LASKAR1986  Laskar (1986), a tenth-degree polynomial in units of 10,000 Julian years
  VONDRAK2011 Vondrak, Capitaine and Wallace (2011) long-term precession: the angle
              between their equator pole and ecliptic pole of date; ERFA ltpequ, ltpecl
Nutation (delta psi, delta epsilon):
  IAU2000A    Mathews, Herring and Buffett (2002) with the IAU 2006 adjustments; the
              model of ERFA nut06a, evaluated by iau2000a.py
  IAU2000B    McCarthy and Luzum (2003), 77 terms; ERFA nut00b
  IAU1980     Wahr (1981); ERFA nut80

Every model has a validity range in Julian years (TT); dates outside it are refused
with a message naming a model that covers them, never extrapolated silently.
"""

from functools import lru_cache, partial

import erfa
import numpy as np

from . import frames, iau2000a, vectors
from .errors import SkyError, rows_failing
from .timescales import all_within_years, julian_year
from .vocabulary import (J2000_JD, JULIAN_YEAR_DAYS, NUTATION_VALIDITY,  # validity: see there
                         OBLIQUITY_VALIDITY)

ARCSEC = np.pi / (180.0 * 3600.0)

# Newcomb's obliquity: 23°27'08.26" - 46.845" T - 0.0059" T^2 + 0.00181" T^3.
NEWCOMB_COEFFS_ARCSEC = (84428.26, -46.845, -0.0059, 0.00181)
B1900_JD = 2415020.31352
TROPICAL_CENTURY_DAYS = 36524.21988

# Laskar (1986): 23°26'21.448" and ten more terms, argument U = T / 100 with T in
# Julian centuries from J2000.
LASKAR_COEFFS_ARCSEC = (
    84381.448, -4680.93, -1.55, 1999.25, -51.38, -249.67,
    -39.05, 7.12, 27.87, 5.79, 2.45,
)

UNIT_FACTORS = {"DEG": 180.0 / np.pi, "ARCSEC": 180.0 * 3600.0 / np.pi, "RAD": 1.0}


def _check_model(model, table, kind):
    name = str(model).strip().upper()
    if name not in table:
        raise SkyError(f'unknown {kind}model "{model}"; use ' + ", ".join(table))
    return name


def _alternatives(table, epochs, exclude):
    """Names of the models in ``table`` that cover every given epoch."""
    lo, hi = float(np.min(epochs)), float(np.max(epochs))
    return [n for n, (a, b) in table.items() if n != exclude and a <= lo and hi <= b]


def _check_validity(model, table, jd1, jd2, kind):
    """Refuse the rows outside the model's span (Julian years); one instant inside it
    is told on floats (timescales.all_within_years, the same years to the bit)."""
    lo, hi = table[model]
    if jd1.size == 1 and all_within_years(jd1, jd2, (lo, hi)):
        return
    epochs = julian_year(jd1, jd2)
    outside = (epochs < lo) | (epochs > hi)
    if np.any(outside):
        others = _alternatives(table, epochs[outside], model)
        hint = f"; use {' or '.join(others)}" if others else ""
        raise rows_failing(
            outside,
            f"the date is outside the {kind} model {model} (valid {lo:g} to {hi:g})" + hint,
        )


def mean_obliquity(jd1, jd2, model="IAU2006"):
    """Mean obliquity in radians at TT two-part JD(s)."""
    model = _check_model(model, OBLIQUITY_VALIDITY, "")
    jd1 = np.asarray(jd1, dtype=float)
    jd2 = np.asarray(jd2, dtype=float)
    _check_validity(model, OBLIQUITY_VALIDITY, jd1, jd2, "obliquity")
    if model == "IAU2006":
        return erfa.obl06(jd1, jd2)
    if model == "IAU1980":
        return erfa.obl80(jd1, jd2)
    if model == "NEWCOMB":
        t = ((jd1 - B1900_JD) + jd2) / TROPICAL_CENTURY_DAYS
        return np.polynomial.polynomial.polyval(t, NEWCOMB_COEFFS_ARCSEC) * ARCSEC
    if model == "LASKAR1986":
        u = ((jd1 - J2000_JD) + jd2) / (10000.0 * JULIAN_YEAR_DAYS)
        return np.polynomial.polynomial.polyval(u, LASKAR_COEFFS_ARCSEC) * ARCSEC
    # VONDRAK2011: the mean obliquity is the angle between the two poles of date.
    epochs = julian_year(jd1, jd2)
    return vectors.angle_between(erfa.ltpequ(epochs), erfa.ltpecl(epochs))


@lru_cache(maxsize=4096)
def _nutation_one(jd1, jd2, model):
    # A sheet asks for the same dates over and over (every recalculation, several
    # columns per row), so single dates are cached (IAU2000A: with the coordinate
    # systems' own, frames.nutation_one, so a row's places and obliquity share it).
    return _NUTATION[model](jd1, jd2)


# IAU2000A: the model of ERFA nut06a as iau2000a.py evaluates it, the series the
# coordinate systems take (frames.py), so a true obliquity here is theirs to the bit.
_NUTATION = {"IAU2000A": iau2000a.nutation, "IAU2000B": erfa.nut00b, "IAU1980": erfa.nut80}


def nutation_angles(jd1, jd2, model="IAU2000A"):
    """(delta psi, delta epsilon) in radians at TT two-part JD(s)."""
    model = _check_model(model, NUTATION_VALIDITY, "nutation ")
    jd1 = np.asarray(jd1, dtype=float)
    jd2 = np.asarray(jd2, dtype=float)
    _check_validity(model, NUTATION_VALIDITY, jd1, jd2, "nutation")
    if jd1.size == 1:
        one = frames.nutation_one if model == "IAU2000A" else partial(_nutation_one, model=model)
        dpsi, deps = one(float(jd1.ravel()[0]), float(jd2.ravel()[0]))
        return np.full(jd1.shape, dpsi), np.full(jd1.shape, deps)
    return _NUTATION[model](jd1, jd2)


def true_obliquity(jd1, jd2, model="IAU2006", nutation_model="IAU2000A"):
    """True obliquity (mean + delta epsilon) in radians at TT two-part JD(s)."""
    mean = mean_obliquity(jd1, jd2, model)
    return mean + nutation_angles(jd1, jd2, nutation_model)[1]


def _in_unit(radians, unit):
    return radians * UNIT_FACTORS[unit]


# ---- cell functions -----------------------------------------------------------------


def mean_obliquity_cells(time, model="IAU2006", unit="DEG"):
    return _in_unit(mean_obliquity(*time.tt(), model), unit)


def true_obliquity_cells(time, model="IAU2006", nutation="IAU2000A", unit="DEG"):
    return _in_unit(true_obliquity(*time.tt(), model, nutation), unit)


def nutation_lon_cells(time, nutation="IAU2000A", unit="DEG"):
    return _in_unit(nutation_angles(*time.tt(), nutation)[0], unit)


def nutation_obl_cells(time, nutation="IAU2000A", unit="DEG"):
    return _in_unit(nutation_angles(*time.tt(), nutation)[1], unit)
