"""Sidereal time, hour angle, altitude and azimuth at a site, and airmass.

Site: geodetic latitude and longitude in degrees (longitude east-positive), height in
metres above the WGS84 ellipsoid.  Azimuth counts from north through east (N = 0,
E = 90).  Polar motion is taken as zero (under 0.5", and not known ahead).

From a catalogue (ICRS astrometric) place the whole chain is that of ERFA atco13: light
deflection, annual and diurnal aberration, IAU 2006/2000A precession-nutation, Earth
rotation, and refraction when a pressure is given.  From an apparent place of date
(TRUE: true equator and equinox) it is that of ERFA apio13 + atioq, the same chain from
the apparent place on.  The steps are taken one by one (apco or apio, then atciqz, which
is atco13's atciq for a target without proper motion or parallax, and atioq) with our
own TT and UT1, so that dates before UTC (1960) are reached through Delta T; from 1960
on UTC the results are those of atco13 and apio13 to their last bits (the Earth's series
evaluated with numpy, earth_theory.py, is within 7e-15 au of epv00's own).  Refraction
follows ERFA's model (refco), for optical light (0.55 um, relative humidity 0.5);
pressure 0 gives the geometric (unrefracted) place.
"""

import functools
import math

import erfa
import numpy as np

from . import earth_theory, ephemeris, frames, nodes
from .errors import SkyError, rows_failing
from .frames import check_latitudes, degrees_360, degrees_360_float
from .timescales import OneUTC, check_years, within_years_one
from .vocabulary import IAU2006_YEARS

WAVELENGTH_UM = 0.55
# ERFA's refraction (refco: A tan z + B tan^3 z) is good to about zenith distance 85
# degrees and flattens out below; with a pressure given, lower altitudes are refused
# rather than answered with a refraction that is minutes of arc too small.
REFRACTION_MIN_ALTITUDE = 5.0
HUMIDITY = 0.5
# The ranges a site's height (m above the ellipsoid), pressure (hPa) and temperature
# (degrees C) are taken within: the usual path's messages and the float lane's test.
HEIGHT_RANGE_M = (-1000.0, 20000.0)
PRESSURE_RANGE_HPA = (0.0, 1500.0)
TEMPERATURE_RANGE_C = (-80.0, 60.0)


def _check_years(time, what, hint=""):
    tt1, tt2 = time.tt()
    check_years(tt1, tt2, IAU2006_YEARS, f"{what} uses IAU 2006/2000A precession-nutation",
                hint)


def _ut_tt(time):
    ut1 = time.to("UT")  # UT1 from 1960 (DUT1), through Delta T before
    tt = time.to("TT")
    return ut1.jd1, ut1.jd2, tt.jd1, tt.jd2


def sidereal_angle(time, kind="GAST"):
    """Greenwich angle in radians: apparent (GAST, IAU 2006/2000A: ERFA gst06a's steps,
    gst06 of the true equator's matrix), mean (GMST, IAU 2006, ERFA gmst06) sidereal
    time, or the Earth rotation angle (ERA, IAU 2000, ERFA era00)."""
    if kind != "ERA":
        _check_years(time, kind, "the Earth rotation angle (ERA) has no such limit")
    u1, u2, t1, t2 = _ut_tt(time)
    if kind == "ERA":
        return erfa.era00(u1, u2)
    if kind == "GMST":
        return erfa.gmst06(u1, u2, t1, t2)
    return erfa.gst06(u1, u2, t1, t2, _true_equator(t1, t2))


def sidereal_cells(time, kind="GAST", longitude=0.0, unit="DEG"):
    angle = degrees_360(sidereal_angle(time, kind) + np.radians(longitude))
    return angle / 15.0 if unit == "HOURS" else angle


def site_radians(latitude, longitude, height):
    check_latitudes(latitude)
    height = np.asarray(height, dtype=float)
    low, high = HEIGHT_RANGE_M
    bad = (height < low) | (height > high)
    if np.any(bad):
        raise rows_failing(bad, f"the height must be within {low:g} to {high:g} m above the "
                                "ellipsoid")
    return np.radians(longitude), np.radians(latitude), height


def _atmosphere(pressure, temperature):
    if not _within(pressure, PRESSURE_RANGE_HPA):
        raise SkyError(f"the pressure must be 0 (no refraction) to {PRESSURE_RANGE_HPA[1]:g} "
                       f"hPa, not {pressure:g}")
    if not _within(temperature, TEMPERATURE_RANGE_C):
        low, high = TEMPERATURE_RANGE_C
        raise SkyError(f"the temperature must be {low:g} to {high:g} degrees C, not "
                       f"{temperature:g}")
    return pressure, temperature


def _within(value, limits):
    return limits[0] <= value <= limits[1]


def observer_astrom(time, latitude, longitude, height, pressure, temperature, frame):
    """ERFA's star-independent astrometry parameters for the observed place at a site:
    for ICRS places the whole chain from the catalogue (ERFA apco: Earth's barycentric
    state from epv00, IAU 2006/2000A CIP and CIO locator, Earth rotation angle, refraction
    constants), for TRUE places the Earth-rotation part only (ERFA apio).

    These are the steps of ERFA apco13 and apio13, taken with our own TT and UT1, so that
    the observed place is computed at any date in its stated span: through UTC and DUT1
    from 1960 (exactly as apco13 does), through Delta T before.  Every input is checked."""
    _check_years(time, "the observed place")
    elong, phi, hm = site_radians(latitude, longitude, height)
    phpa, tc = _atmosphere(pressure, temperature)
    tt1, tt2 = time.tt()
    ut = time.to("UT")
    ut1, ut2 = ut.jd1, ut.jd2
    if _all_one(tt1, tt2, ut1, ut2, elong, phi, hm):
        # One instant at one site for every row (a column of targets): the parameters
        # are made once and serve every row.
        tt1, tt2, ut1, ut2, elong, phi, hm = (np.ravel(v)[:1] for v in
                                               (tt1, tt2, ut1, ut2, elong, phi, hm))
    one = (tt1, tt2, ut1, ut2, elong, phi)
    if all(type(v) is np.ndarray and v.shape == (1,) for v in one) and np.size(hm) == 1:
        # A single cell: kept for the row's other columns (the azimuth beside the
        # altitude), whose parameters are the same.
        t1, t2 = tt1.item(), tt2.item()
        return _astrom_one(t1, t2, *(v.item() for v in one[2:]), float(np.ravel(hm)[0]), phpa,
                           tc, frame, frame == "ICRS" and nodes.cell_is_dense(t1, t2)), phpa
    return _astrom(tt1, tt2, ut1, ut2, elong, phi, hm, phpa, tc, frame), phpa


def _astrom(tt1, tt2, ut1, ut2, elong, phi, hm, phpa, tc, frame, states=None,
            true_equator=None):
    """``observer_astrom``'s parameters from checked inputs (TT and UT1 two-part JDs,
    the site in radians and metres, the atmosphere).  ``states``: earth_theory.states
    at the instants, and ``true_equator`` its matrix, where the caller has them."""
    # ERFA's ufuncs themselves: none of these has a status to read, and pyerfa's Python
    # wrappers around them cost a cell of a log 3 us each (the same results).
    theta = erfa.ufunc.era00(ut1, ut2)
    sp = erfa.ufunc.sp00(tt1, tt2)
    refa, refb = erfa.ufunc.refco(phpa, tc, HUMIDITY, WAVELENGTH_UM)
    if frame != "ICRS":
        return erfa.ufunc.apio(sp, theta, elong, phi, hm, 0.0, 0.0, refa, refb)
    # The Earth from epv00's series (earth_theory; TT taken for TDB, as ERFA's apco13 does).
    earth_p, earth_v, sun_p, _ = earth_theory.states(tt1, tt2) if states is None else states
    x, y = erfa.ufunc.bpn2xy(_true_equator(tt1, tt2) if true_equator is None else true_equator)
    s = erfa.ufunc.s06(tt1, tt2, x, y)
    earth_pv = np.empty(earth_p.shape[:-1], dtype=erfa.dt_pv)
    earth_pv["p"], earth_pv["v"] = earth_p, earth_v
    return erfa.ufunc.apco(tt1, tt2, earth_pv, earth_p - sun_p, x, y, s, theta, elong, phi, hm,
                           0.0, 0.0, sp, refa, refb)


@nodes.kept_per_instant
def _astrom_one(tt1, tt2, ut1, ut2, elong, phi, hm, phpa, tc, frame, dense=False):
    """``_astrom`` of one row (floats), kept: a read-only array of one row.  The Earth's
    state is the instant's kept one (ephemeris.earth_and_sun_floats, the same values as
    earth_theory.states gives a row), shared with the row's places; ``dense``, a cell of
    a log filled down (nodes.cell_is_dense): the Earth and the true equator's matrix from
    their segments, as the places take them."""
    states = true_equator = None
    if dense and frame == "ICRS":
        astrom = _astrom_dense(tt1, tt2, ut1, ut2, elong, phi, hm, phpa, tc)
        astrom.flags.writeable = False
        return astrom
    if frame == "ICRS":
        states = np.array(ephemeris.earth_and_sun_floats(tt1, tt2)).reshape(4, 1, 3)
    astrom = _astrom(*(np.array([v]) for v in (tt1, tt2, ut1, ut2, elong, phi, hm)), phpa,
                     tc, frame, states, true_equator)
    astrom.flags.writeable = False
    return astrom


def _astrom_dense(tt1, tt2, ut1, ut2, elong, phi, hm, phpa, tc):
    """``_astrom`` of one row of a log filled down (floats in, one row out), on the
    segments of its cells (nodes.py), one table of them: the Earth, the true equator's
    matrix, whose third row's first two elements are the CIP's x and y (ERFA bpn2xy),
    and the series of the CIO locator s (ERFA s06 less its -xy/2); the refraction
    constants kept by the atmosphere.  Within
    1 uas of the direct parameters' place (tests/test_nodes.py), for some twenty
    microseconds fewer a row in a loop than ``_astrom``'s calls of ERFA on one-row arrays
    (refco, bpn2xy, s06 and the arrays made for them)."""
    found = nodes.from_nodes("site-free parameters", _site_free_at_points, tt1, tt2)
    e_p, e_v, s_p = found[0:3], found[3:6], found[6:9]
    x, y = found[18], found[19]  # the true equator's matrix's third row
    s = found[21] - x * y / 2.0
    refa, refb = _refraction_constants(phpa, tc)
    earth_pv = np.empty(1, dtype=erfa.dt_pv)
    earth_pv["p"], earth_pv["v"] = e_p, e_v
    heliocentric = [[e_p[0] - s_p[0], e_p[1] - s_p[1], e_p[2] - s_p[2]]]
    return erfa.ufunc.apco(tt1, tt2, earth_pv, heliocentric, x, y, s, erfa.ufunc.era00(ut1, ut2),
                           elong, phi, hm, 0.0, 0.0, erfa.ufunc.sp00(tt1, tt2), refa, refb)


def _site_free_at_points(jd1, jd2):
    """(n, 22) at a segment's points, one table so that a row interpolates once: the
    Earth's and the Sun's barycentric states (12, shared with the places' segments over
    the same points), the true equator's matrix (9) and the series of ERFA s06 (s + xy/2:
    s06 with x = y = 0)."""
    return np.concatenate((
        ephemeris.earth_and_sun_at_points(jd1, jd2),
        frames.matrices_at_points("EQUATORIAL TRUE", jd1, jd2).reshape(-1, 9),
        erfa.ufunc.s06(jd1, jd2, 0.0, 0.0)[:, None]), axis=1)


@functools.lru_cache(maxsize=64)
def _refraction_constants(phpa, tc):
    """ERFA refco's A and B (radians) for an atmosphere (the humidity and wavelength
    fixed here), as floats, kept: a log's rows share one site's."""
    refa, refb = erfa.ufunc.refco(phpa, tc, HUMIDITY, WAVELENGTH_UM)
    return float(refa), float(refb)


def _true_equator(tt1, tt2):
    """ERFA pnm06a's matrix (the true equator and equinox of date) as the coordinate
    systems build it: the same steps, with the nutation of iau2000a.py (a third of
    nut06a's cost on distinct instants; within 1e-14 of pnm06a, tested)."""
    return frames.system_matrix("EQUATORIAL TRUE", tt1, tt2)


def _equation_of_origins(time):
    """ERFA eo06a's steps at the instants (once for a column that shares one instant):
    the equation of the origins from the true equator's matrix and the CIO locator s."""
    tt1, tt2 = time.tt()
    if _all_one(tt1, tt2):
        tt1, tt2 = np.ravel(tt1)[:1], np.ravel(tt2)[:1]
    m = _true_equator(tt1, tt2)
    x, y = erfa.bpn2xy(m)
    return erfa.eors(m, erfa.s06(tt1, tt2, x, y))


def _all_one(*arrays):
    """Whether every array holds one value repeated (and more than one row)."""
    if all(type(a) is np.ndarray and a.size < 2 for a in arrays):  # one cell: nothing to share
        return False
    if max(np.size(a) for a in arrays) < 2:
        return False
    flat = [np.ravel(a) for a in arrays]
    return all(np.all(a == a[0]) for a in flat)


def observed(ra, dec, time, latitude, longitude, height=0.0, pressure=0.0,
             temperature=10.0, frame="ICRS"):
    """(azimuth, zenith distance, hour angle, declination) observed, in radians."""
    check_latitudes(dec, "declination")
    astrom, phpa = observer_astrom(time, latitude, longitude, height, pressure, temperature, frame)
    rc, dc = np.radians(ra), np.radians(dec)
    if frame == "ICRS":
        ri, di = erfa.atciqz(rc, dc, astrom)  # (a target without proper motion or parallax)
    else:
        # TRUE: apparent RA on the equinox; the CIO-based RA that ERFA's observed chain
        # takes is larger by the equation of the origins.
        ri, di = rc + _equation_of_origins(time), dc
    aob, zob, hob, dob, _ = erfa.atioq(ri, di, astrom)
    check_refraction_range(phpa, 90.0 - np.degrees(zob))
    return aob, zob, hob, dob


def check_refraction_range(pressure, altitude_deg):
    if pressure > 0.0:
        low = np.asarray(altitude_deg) < REFRACTION_MIN_ALTITUDE
        if np.any(low):
            raise rows_failing(
                low,
                f"refraction is modelled for altitudes above {REFRACTION_MIN_ALTITUDE:g} degrees "
                "(ERFA refco); lower down give pressure 0 for the geometric place",
            )


def from_observed(az, alt, time, latitude, longitude, height=0.0, pressure=0.0,
                  temperature=10.0, frame="ICRS"):
    """(RA, Dec) in radians from observed azimuth and altitude (degrees)."""
    check_latitudes(alt, "altitude")
    astrom, phpa = observer_astrom(time, latitude, longitude, height, pressure, temperature, frame)
    a = np.radians(az)
    check_refraction_range(phpa, alt)
    z = np.radians(90.0 - np.asarray(alt, dtype=float))
    ri, di = erfa.atoiq("A", a, z, astrom)
    if frame == "ICRS":
        return erfa.aticq(ri, di, astrom)
    return ri - _equation_of_origins(time), di


def _deg180(rad):
    d = np.degrees(erfa.anpm(rad))
    return np.where(d <= -180.0, d + 360.0, d)


# ---- cell functions -----------------------------------------------------------------


def _a_log_of_cells(cells):
    """A cell function of the observed place: a log of its cells filled down takes the
    Earth and the true equator from segments (nodes.single_cells), as places do."""
    @functools.wraps(cells)  # (its signature too: the cell layer reads the arguments)
    def within(*args, **kwargs):
        with nodes.single_cells():
            return cells(*args, **kwargs)
    return within



@_a_log_of_cells
def altitude_cells(ra, dec, time, latitude, longitude, height=0.0, pressure=0.0,
                   temperature=10.0, frame="ICRS"):
    _, zob, _, _ = observed(ra, dec, time, latitude, longitude, height, pressure, temperature, frame)
    return 90.0 - np.degrees(zob)


@_a_log_of_cells
def azimuth_cells(ra, dec, time, latitude, longitude, height=0.0, pressure=0.0,
                  temperature=10.0, frame="ICRS"):
    aob, _, _, _ = observed(ra, dec, time, latitude, longitude, height, pressure, temperature, frame)
    return degrees_360(aob)


def _observed_on_floats(ra, dec, time, latitude, longitude, height=0.0, pressure=0.0,
                        temperature=10.0, frame="ICRS"):
    """``observed``'s (azimuth, zenith distance, hour angle, declination), radians, of a
    single cell on floats
    (cells.py's float lane: ``time`` a timescales.OneUTC, the rest floats), or None
    where the cell's usual path has more to do: a TRUE place, an input out of range or
    a date outside the IAU models' years (it gives the message), a refracted place too
    low.  The same steps and ERFA calls with the same inputs, so the same values to the
    bit: the site's parameters kept per instant (``_astrom_one``, shared with the
    usual path and the row's other column), ERFA atciqz and atioq on one row."""
    if frame != "ICRS" or not (abs(dec) <= 90.0 and abs(latitude) <= 90.0
                               and _within(height, HEIGHT_RANGE_M)
                               and _within(pressure, PRESSURE_RANGE_HPA)
                               and _within(temperature, TEMPERATURE_RANGE_C)):
        return None
    if not within_years_one(*time.tt, IAU2006_YEARS):
        return None
    tt1, tt2 = time.tt
    with nodes.single_cells():
        dense = nodes.cell_is_dense(tt1, tt2)
    return _observed_one(ra, dec, tt1, tt2, time.day, time.fraction, time.dut1, latitude,
                         longitude, float(height), pressure, temperature, dense)


@nodes.kept_per_instant
def _observed_one(ra, dec, tt1, tt2, day, fraction, dut1, latitude, longitude, height,
                  pressure, temperature, dense):
    """``_observed_on_floats``'s place of a target at an instant (its TT, its UTC day and
    fraction, the cell's DUT1: timescales.OneUTC's) and a site (floats), kept for the
    row's other columns: the azimuth beside the altitude finds it rather than running
    atciqz and atioq again.  ``dense``: the site's parameters from the segments of a log
    (``_astrom_one``)."""
    ut1 = OneUTC((tt1, tt2), day, fraction, dut1).ut1()
    astrom = _astrom_one(tt1, tt2, *ut1, math.radians(longitude), math.radians(latitude),
                         height, pressure, temperature, "ICRS", dense)
    ri, di = erfa.ufunc.atciqz(math.radians(ra), math.radians(dec), astrom)
    aob, zob, hob, dob = (v.item() for v in erfa.ufunc.atioq(ri, di, astrom)[:4])
    if pressure > 0.0 and not 90.0 - math.degrees(zob) >= REFRACTION_MIN_ALTITUDE:
        return None
    return aob, zob, hob, dob


def _altitude_on_floats(*args, **kwargs):
    found = _observed_on_floats(*args, **kwargs)
    return None if found is None else 90.0 - math.degrees(found[1])


def _azimuth_on_floats(*args, **kwargs):
    found = _observed_on_floats(*args, **kwargs)
    return None if found is None else degrees_360_float(found[0])


def _hour_angle_on_floats(ra, dec, time, latitude, longitude, height=0.0, frame="ICRS"):
    found = _observed_on_floats(ra, dec, time, latitude, longitude, height, 0.0, 10.0, frame)
    return None if found is None else float(_deg180(found[2]))


def _parallactic_on_floats(ra, dec, time, latitude, longitude, height=0.0, frame="ICRS"):
    found = _observed_on_floats(ra, dec, time, latitude, longitude, height, 0.0, 10.0, frame)
    if found is None:
        return None
    return math.degrees(erfa.ufunc.hd2pa(found[2], found[3], math.radians(latitude)))


altitude_cells.on_floats = _altitude_on_floats
azimuth_cells.on_floats = _azimuth_on_floats


@_a_log_of_cells
def hour_angle_cells(ra, dec, time, latitude, longitude, height=0.0, frame="ICRS"):
    _, _, hob, _ = observed(ra, dec, time, latitude, longitude, height, 0.0, 10.0, frame)
    return _deg180(hob)


@_a_log_of_cells
def parallactic_cells(ra, dec, time, latitude, longitude, height=0.0, frame="ICRS"):
    _, _, hob, dob = observed(ra, dec, time, latitude, longitude, height, 0.0, 10.0, frame)
    return np.degrees(erfa.hd2pa(hob, dob, np.radians(latitude)))


hour_angle_cells.on_floats = _hour_angle_on_floats
parallactic_cells.on_floats = _parallactic_on_floats


@_a_log_of_cells
def horizon_ra_cells(az, alt, time, latitude, longitude, height=0.0, pressure=0.0,
                     temperature=10.0, frame="ICRS"):
    ra, _ = from_observed(az, alt, time, latitude, longitude, height, pressure, temperature, frame)
    return degrees_360(ra)


@_a_log_of_cells
def horizon_dec_cells(az, alt, time, latitude, longitude, height=0.0, pressure=0.0,
                      temperature=10.0, frame="ICRS"):
    _, dec = from_observed(az, alt, time, latitude, longitude, height, pressure, temperature, frame)
    return np.degrees(dec)


def airmass_cells(altitude, model="KASTENYOUNG1989"):
    """Relative air mass at an altitude in degrees (the refracted, observed one).

    KASTENYOUNG1989: Kasten and Young (1989), 1 / (sin h + 0.50572 (h + 6.07995)^-1.6364).
    PICKERING2002: Pickering (2002), 1 / sin(h + 244 / (165 + 47 h^1.1)).
    SECZ: the plane-parallel sec z (common practice; good above about 30 degrees).
    """
    h = np.asarray(altitude, dtype=float)
    below = h < 0.0
    if np.any(below):
        raise rows_failing(below, "the altitude is below the horizon; air mass is for altitudes 0 to 90")
    above = h > 90.0
    if np.any(above):
        raise rows_failing(above, "the altitude must be 0 to 90 degrees")
    if model == "KASTENYOUNG1989":
        return 1.0 / (np.sin(np.radians(h)) + 0.50572 * (h + 6.07995) ** -1.6364)
    if model == "PICKERING2002":
        return 1.0 / np.sin(np.radians(h + 244.0 / (165.0 + 47.0 * h ** 1.1)))
    low = h < 1.0
    if np.any(low):
        raise rows_failing(low, "sec z is infinite at the horizon; use KASTENYOUNG1989 below 30 degrees")
    return 1.0 / np.sin(np.radians(h))


