"""Delta T = TT - UT, from measurement (1960 on) and from the published models.

  MEASURED     32.184 s + (TAI - UTC) - DUT1: the leap-second table, from 1960
  SMH2016      Stephenson, Morrison and Hohenkerk (2016), Proc. R. Soc. A 472, 20160404,
               with the 2020 addendum of Morrison, Stephenson, Hohenkerk and Zawilski
               (2021), Proc. R. Soc. A 478, 20200776: their cubic spline, Table S15
               (v. 2020), valid -720.0 to 2019.0; before -720 their long-term parabola
               -320 + 32.5 u^2, u = (year - 1825)/100, shifted by a constant of ours so
               that it meets the spline at -720 (the two differ there by 358 s).
  ESPENAK2006  Espenak and Meeus (2006), Five Millennium Canon of Solar Eclipses: their
               polynomials for -1999 to +3000 and -20 + 32 u^2, u = (year - 1820)/100,
               outside (Morrison and Stephenson 2004).
  AUTO         MEASURED from 1960 on, SMH2016 before (the model of record).

Uncertainty: the only published estimates used are those of Morrison and Stephenson
(2004), sigma = 0.8 u^2 s with u = (year - 1820)/100, stated for 1000 BC to AD 1200, and
the telescopic-era values of Stephenson and Houlden (1986): 5 s in 1700, 1 s in 1800,
0.1 s in 1900.  For other dates there is no published figure, and the cell says so.
"""

import numpy as np

from .vocabulary import DELTA_T_MODELS
from .errors import SkyError, rows_failing


# Table S15 (v. 2020): rows of (K_i, K_i+1, a0, a1, a2, a3); Delta T in seconds is
# a0 + a1 t + a2 t^2 + a3 t^3 with t = (Y - K_i) / (K_i+1 - K_i).
SMH_TABLE = np.array([
    (-720.0, -100.0, 20371.848, -9999.586, 776.247, 409.160),
    (-100.0, 400.0, 11557.668, -5822.270, 1303.151, -503.433),
    (400.0, 1000.0, 6535.116, -5671.519, -298.291, 1085.087),
    (1000.0, 1150.0, 1650.393, -753.210, 184.811, -25.346),
    (1150.0, 1300.0, 1056.647, -459.628, 108.771, -24.641),
    (1300.0, 1500.0, 681.149, -421.345, 61.953, -29.414),
    (1500.0, 1600.0, 292.343, -192.841, -6.572, 16.197),
    (1600.0, 1650.0, 109.127, -78.697, 10.505, 3.018),
    (1650.0, 1720.0, 43.952, -68.089, 38.333, -2.127),
    (1720.0, 1800.0, 12.068, 2.507, 41.731, -37.939),
    (1800.0, 1810.0, 18.367, -3.481, -1.126, 1.918),
    (1810.0, 1820.0, 15.678, 0.021, 4.629, -3.812),
    (1820.0, 1830.0, 16.516, -2.157, -6.806, 3.250),
    (1830.0, 1840.0, 10.804, -6.018, 2.944, -0.096),
    (1840.0, 1850.0, 7.634, -0.416, 2.658, -0.539),
    (1850.0, 1855.0, 9.338, 1.642, 0.261, -0.883),
    (1855.0, 1860.0, 10.357, -0.486, -2.389, 1.558),
    (1860.0, 1865.0, 9.040, -0.591, 2.284, -2.477),
    (1865.0, 1870.0, 8.255, -3.456, -5.148, 2.720),
    (1870.0, 1875.0, 2.371, -5.593, 3.011, -0.914),
    (1875.0, 1880.0, -1.126, -2.314, 0.269, -0.039),
    (1880.0, 1885.0, -3.210, -1.893, 0.152, 0.563),
    (1885.0, 1890.0, -4.388, 0.101, 1.842, -1.438),
    (1890.0, 1895.0, -3.884, -0.531, -2.474, 1.871),
    (1895.0, 1900.0, -5.017, 0.134, 3.138, -0.232),
    (1900.0, 1905.0, -1.977, 5.715, 2.443, -1.257),
    (1905.0, 1910.0, 4.923, 6.828, -1.329, 0.720),
    (1910.0, 1915.0, 11.142, 6.330, 0.831, -0.825),
    (1915.0, 1920.0, 17.479, 5.518, -1.643, 0.262),
    (1920.0, 1925.0, 21.617, 3.020, -0.856, 0.008),
    (1925.0, 1930.0, 23.789, 1.333, -0.831, 0.127),
    (1930.0, 1935.0, 24.418, 0.052, -0.449, 0.142),
    (1935.0, 1940.0, 24.164, -0.419, -0.022, 0.702),
    (1940.0, 1945.0, 24.426, 1.645, 2.086, -1.106),
    (1945.0, 1950.0, 27.050, 2.499, -1.232, 0.614),
    (1950.0, 1953.0, 28.932, 1.127, 0.220, -0.277),
    (1953.0, 1956.0, 30.002, 0.737, -0.610, 0.631),
    (1956.0, 1959.0, 30.760, 1.409, 1.282, -0.799),
    (1959.0, 1962.0, 32.652, 1.577, -1.115, 0.507),
    (1962.0, 1965.0, 33.621, 0.868, 0.406, 0.199),
    (1965.0, 1968.0, 35.093, 2.275, 1.002, -0.414),
    (1968.0, 1971.0, 37.956, 3.035, -0.242, 0.202),
    (1971.0, 1974.0, 40.951, 3.157, 0.364, -0.229),
    (1974.0, 1977.0, 44.244, 3.199, -0.323, 0.172),
    (1977.0, 1980.0, 47.291, 3.069, 0.193, -0.192),
    (1980.0, 1983.0, 50.361, 2.878, -0.384, 0.081),
    (1983.0, 1986.0, 52.936, 2.354, -0.140, -0.165),
    (1986.0, 1989.0, 54.984, 1.577, -0.637, 0.448),
    (1989.0, 1992.0, 56.373, 1.648, 0.708, -0.276),
    (1992.0, 1995.0, 58.453, 2.235, -0.121, 0.110),
    (1995.0, 1998.0, 60.678, 2.324, 0.210, -0.313),
    (1998.0, 2001.0, 62.898, 1.804, -0.729, 0.109),
    (2001.0, 2004.0, 64.083, 0.674, -0.402, 0.199),
    (2004.0, 2007.0, 64.553, 0.466, 0.194, -0.017),
    (2007.0, 2010.0, 65.197, 0.804, 0.144, -0.084),
    (2010.0, 2013.0, 66.061, 0.839, -0.109, 0.128),
    (2013.0, 2016.0, 66.920, 1.007, 0.277, -0.095),
    (2016.0, 2019.0, 68.109, 1.277, -0.007, -0.139),
])
SMH_START, SMH_END = SMH_TABLE[0, 0], SMH_TABLE[-1, 1]


def _smh_parabola(year):
    u = (year - 1825.0) / 100.0
    return -320.0 + 32.5 * u * u


def _smh_spline(year):
    k = np.clip(np.searchsorted(SMH_TABLE[:, 1], year, side="right"), 0, len(SMH_TABLE) - 1)
    row = SMH_TABLE[k]
    t = (year - row[..., 0]) / (row[..., 1] - row[..., 0])
    return row[..., 2] + t * (row[..., 3] + t * (row[..., 4] + t * row[..., 5]))


# Our constant join of the parabola to the spline at -720 (see the module text).
SMH_JOIN = float(_smh_spline(np.array(SMH_START)) - _smh_parabola(SMH_START))


def smh2016(year):
    year = np.asarray(year, dtype=float)
    late = year > SMH_END
    if np.any(late):
        raise rows_failing(late, "SMH2016 ends in 2019.0; for later dates use the scale UTC "
                                 "(measured Delta T) or ESPENAK2006 (extrapolated)")
    early = year < SMH_START
    return np.where(early, _smh_parabola(year) + SMH_JOIN, _smh_spline(np.maximum(year, SMH_START)))


def _long_term_1820(year):
    u = (year - 1820.0) / 100.0
    return -20.0 + 32.0 * u * u


def _espenak_one(y):
    if y < -500.0 or y >= 2150.0:
        return _long_term_1820(y)
    if y < 500.0:
        u = y / 100.0
        c = (10583.6, -1014.41, 33.78311, -5.952053, -0.1798452, 0.022174192, 0.0090316521)
    elif y < 1600.0:
        u = (y - 1000.0) / 100.0
        c = (1574.2, -556.01, 71.23472, 0.319781, -0.8503463, -0.005050998, 0.0083572073)
    elif y < 1700.0:
        u = y - 1600.0
        c = (120.0, -0.9808, -0.01532, 1.0 / 7129.0)
    elif y < 1800.0:
        u = y - 1700.0
        c = (8.83, 0.1603, -0.0059285, 0.00013336, -1.0 / 1174000.0)
    elif y < 1860.0:
        u = y - 1800.0
        c = (13.72, -0.332447, 0.0068612, 0.0041116, -0.00037436, 0.0000121272,
             -0.0000001699, 0.000000000875)
    elif y < 1900.0:
        u = y - 1860.0
        c = (7.62, 0.5737, -0.251754, 0.01680668, -0.0004473624, 1.0 / 233174.0)
    elif y < 1920.0:
        u = y - 1900.0
        c = (-2.79, 1.494119, -0.0598939, 0.0061966, -0.000197)
    elif y < 1941.0:
        u = y - 1920.0
        c = (21.20, 0.84493, -0.076100, 0.0020936)
    elif y < 1961.0:
        u = y - 1950.0
        c = (29.07, 0.407, -1.0 / 233.0, 1.0 / 2547.0)
    elif y < 1986.0:
        u = y - 1975.0
        c = (45.45, 1.067, -1.0 / 260.0, -1.0 / 718.0)
    elif y < 2005.0:
        u = y - 2000.0
        c = (63.86, 0.3345, -0.060374, 0.0017275, 0.000651814, 0.00002373599)
    elif y < 2050.0:
        u = y - 2000.0
        c = (62.92, 0.32217, 0.005589)
    else:
        return _long_term_1820(y) - 0.5628 * (2150.0 - y)
    return float(np.polynomial.polynomial.polyval(u, c))


def espenak2006(year):
    year = np.asarray(year, dtype=float)
    return np.vectorize(_espenak_one, otypes=[float])(year)


def model_delta_t(year, model):
    """Delta T in seconds at decimal years from a published model."""
    if model == "SMH2016":
        return smh2016(year)
    if model == "ESPENAK2006":
        return espenak2006(year)
    raise SkyError(f'unknown Delta T model "{model}"; use ' + ", ".join(DELTA_T_MODELS))


def uncertainty(year):
    """Published standard error of Delta T at decimal years (see the module text)."""
    year = np.asarray(year, dtype=float)
    out = np.full(year.shape, np.nan)
    # The tabulated years -1000 (1001 BC) to AD 1200, each whole (our decimal
    # years are Julian years from J2000, a few hundredths off calendar years).
    ancient = (year >= -1000.0) & (year < 1201.0)
    u = (year - 1820.0) / 100.0
    out[ancient] = (0.8 * u * u)[ancient]
    for y, sigma in ((1700.0, 5.0), (1800.0, 1.0), (1900.0, 0.1)):
        out[np.abs(year - y) < 0.5] = sigma
    missing = np.isnan(out)
    if np.any(missing):
        raise rows_failing(missing, "no published uncertainty of Delta T for this date (the "
                                    "estimates used cover 1000 BC to AD 1200, and 1700, 1800, 1900)")
    return out
