"""Pairs of directions, and a star's motion between epochs."""

import warnings

import erfa
import numpy as np

from .errors import rows_failing
from .frames import check_latitudes

MAS = np.pi / (180.0 * 3600.0 * 1000.0)


def separation_cells(ra1, dec1, ra2, dec2):
    """Angular separation in degrees (ERFA seps, accurate at every angle)."""
    check_latitudes(dec1, "first declination")
    check_latitudes(dec2, "second declination")
    return np.degrees(erfa.seps(np.radians(ra1), np.radians(dec1), np.radians(ra2), np.radians(dec2)))


def position_angle_cells(ra1, dec1, ra2, dec2):
    """Position angle of the second direction seen from the first, degrees from north
    through east, in [0, 360) (ERFA pas)."""
    check_latitudes(dec1, "first declination")
    check_latitudes(dec2, "second declination")
    pa = erfa.pas(np.radians(ra1), np.radians(dec1), np.radians(ra2), np.radians(dec2))
    return np.degrees(erfa.anp(pa))


def _propagate(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax, rv):
    """Space motion of a star (ERFA pmsafe): catalogue proper motions in mas/yr, the one
    in RA multiplied by cos(Dec) as catalogues give it; parallax in mas; radial
    velocity in km/s.  Epochs on TDB (TT given is within 2 ms of it)."""
    check_latitudes(dec, "declination")
    dec_r = np.radians(dec)
    near_pole = np.cos(dec_r) < 1e-9
    if np.any(near_pole):
        raise rows_failing(near_pole, "the declination is at a pole, where RA motion is undefined")
    bad_px = np.asarray(parallax, dtype=float) < 0.0
    if np.any(bad_px):
        raise rows_failing(bad_px, "the parallax must not be negative (0 means unknown)")
    f1, f2 = from_epoch.to("TDB").jd1, from_epoch.to("TDB").jd2
    t1, t2 = to_epoch.to("TDB").jd1, to_epoch.to("TDB").jd2
    pmr = np.asarray(pmra, dtype=float) * MAS / np.cos(dec_r)
    pmd = np.asarray(pmdec, dtype=float) * MAS
    with warnings.catch_warnings():
        # pmsafe warns when it substitutes a tiny parallax for 0 (distance unknown).
        warnings.simplefilter("ignore", erfa.ErfaWarning)
        out = erfa.pmsafe(np.radians(ra), dec_r, pmr, pmd, np.asarray(parallax, float) / 1000.0,
                          np.asarray(rv, float), f1, f2, t1, t2)
    return out[0], out[1]


def proper_motion_ra_cells(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax=0.0, rv=0.0):
    return np.degrees(erfa.anp(_propagate(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax, rv)[0]))


def proper_motion_dec_cells(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax=0.0, rv=0.0):
    return np.degrees(_propagate(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax, rv)[1])
