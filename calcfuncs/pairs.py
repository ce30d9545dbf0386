"""Pairs of directions, and a star's motion between epochs."""

import erfa
import numpy as np

from .errors import rows_failing
from .frames import check_latitudes, degrees_360
from .timescales import erfa_quietly
from .vocabulary import JULIAN_YEAR_DAYS

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
    return degrees_360(pa)


def _propagate(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax, rv):
    """Space motion of a star from catalogue values: proper motions in mas/yr (the one
    in RA multiplied by cos Dec, as catalogues give it), parallax in mas, radial
    velocity in km/s; epochs on TDB (TT is within 2 ms of it).

    With a parallax: rigorous straight-line motion with light time (ERFA pmsafe).
    Without one (0, distance unknown): the direction moves along the straight line
    u0 + t (pm_ra* e_ra + pm_dec e_dec), which is exact for a star at any distance
    with no radial velocity (the radial velocity has no effect without a distance).
    """
    check_latitudes(dec, "declination")
    ra_r, dec_r = np.radians(ra), np.radians(dec)
    near_pole = np.cos(dec_r) < 1e-9
    if np.any(near_pole):
        raise rows_failing(near_pole, "the declination is at a pole, where RA motion is undefined")
    px = np.asarray(parallax, dtype=float)
    if np.any(px < 0.0):
        raise rows_failing(px < 0.0, "the parallax must not be negative (0 means unknown)")
    f, t = from_epoch.to("TDB"), to_epoch.to("TDB")
    pmra = np.asarray(pmra, dtype=float) * MAS
    pmd = np.asarray(pmdec, dtype=float) * MAS
    shape = np.broadcast(ra_r, px, f.jd1, t.jd1).shape

    def b(x):
        return np.broadcast_to(x, shape)

    ra_out = b(ra_r).astype(float).copy()
    dec_out = b(dec_r).astype(float).copy()
    known = b(px > 0.0)
    if np.any(known):
        out = erfa_quietly(erfa.pmsafe, b(ra_r)[known], b(dec_r)[known], b(pmra / np.cos(dec_r))[known],
                           b(pmd)[known], b(px / 1000.0)[known], b(np.asarray(rv, float))[known],
                           b(f.jd1)[known], b(f.jd2)[known], b(t.jd1)[known], b(t.jd2)[known])
        ra_out[known], dec_out[known] = out[0], out[1]
    if not np.all(known):
        years = ((t.jd1 - f.jd1) + (t.jd2 - f.jd2)) / JULIAN_YEAR_DAYS
        u0 = erfa.s2c(ra_r, dec_r)
        east = np.stack([-np.sin(ra_r), np.cos(ra_r), np.zeros_like(ra_r)], axis=-1)
        north = np.stack([-np.sin(dec_r) * np.cos(ra_r), -np.sin(dec_r) * np.sin(ra_r),
                          np.cos(dec_r)], axis=-1)
        moved = u0 + np.asarray(years)[..., None] * (pmra[..., None] * east + pmd[..., None] * north)
        lon, lat = erfa.c2s(moved)
        unknown = ~known
        ra_out[unknown] = b(lon)[unknown]
        dec_out[unknown] = b(lat)[unknown]
    return ra_out, dec_out


def proper_motion_ra_cells(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax=0.0, rv=0.0):
    return degrees_360(_propagate(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax, rv)[0])


def proper_motion_dec_cells(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax=0.0, rv=0.0):
    return np.degrees(_propagate(ra, dec, pmra, pmdec, from_epoch, to_epoch, parallax, rv)[1])
