"""For the astropy reference checks: an IERS table in which the Earth neither wobbles nor
lags, so that astropy computes with the same Earth orientation as the cells do."""

import numpy as np


def still_earth_table():
    """UT1 = UTC and no polar motion over MJD -200000 to 400000 (years 1311 to 2954);
    a Time that gives its own UT1 - UTC keeps it."""
    import astropy.units as u
    from astropy.table import QTable
    from astropy.utils import iers

    mjd = np.array([-200000.0, 400000.0])
    zeros = np.zeros(2)
    return iers.IERS(QTable({"MJD": mjd * u.d, "UT1_UTC": zeros * u.s,
                             "PM_x": zeros * u.arcsec, "PM_y": zeros * u.arcsec}))
