"""Sidereal time and the horizon: hour angle, altitude and azimuth, air mass."""

from .. import vocabulary as vocab
from .common import (DUT1, HEIGHT, INSTANT, LATITUDE, LONGITUDE, PRESSURE, SCALE, TEMPERATURE,
                     Arg, CellFunction, Family, angle_arg, choices_text, span_text)

_IAU2006 = span_text(vocab.IAU2006_YEARS)
_OBSERVED_AT = Arg("time", "time", "The instant of the observation (as for SKY.JD).")
_HORIZON_FRAME = Arg(
    "frame", "choice",
    "What the RA and Dec are: " + choices_text(vocab.HORIZON_FRAMES, {
        "ICRS": "default; a catalogue place, astrometric",
        "TRUE": "an apparent place on the true equator and equinox of date",
    }) + ".",
    default="ICRS", choices=vocab.HORIZON_FRAMES,
)
_HORIZON_MODEL = (
    "Site longitude east-positive; azimuth from north through east (N 0, E 90, S 180, "
    "W 270). From an ICRS place: the chain of ERFA atco13 (light deflection, annual and "
    "diurnal aberration, IAU 2006/2000A precession-nutation, Earth rotation, refraction: "
    "ERFA apco, atciq, atioq); from a TRUE place: ERFA apio and atioq. Refraction: ERFA refco model at 0.55 um, humidity "
    "0.5, only when a pressure is given, and only above 5 degrees altitude (lower, the "
    "cell says so). The target is taken at infinite distance: no parallax (up to 9\" for "
    f"the Sun and planets, 1 degree for the Moon). Valid {_IAU2006}. Polar motion taken "
    "as zero. Times on UTC from 1960 on; before, give them on UT (universal time through "
    "Delta T) or TT. DUT1 default 0 (up to 0.9 s, about 14\" in hour angle)."
)
_TARGET = (angle_arg("ra", "RA of the target"), angle_arg("dec", "Dec of the target"))
_SEEN = (angle_arg("az", "Azimuth, from north through east"),
         angle_arg("alt", "Altitude (observed: refracted when a pressure is given)"))
# A target at a site: the arguments of the hour angle and the parallactic angle.
_AT_SITE = _TARGET + (_OBSERVED_AT, LATITUDE, LONGITUDE, SCALE, HEIGHT, _HORIZON_FRAME, DUT1)


def _horizon_fn(name, method, summary, first_two, result, impl):
    return CellFunction(
        name=name, method=method, summary=summary,
        args=first_two + (_OBSERVED_AT, LATITUDE, LONGITUDE, SCALE, HEIGHT, PRESSURE,
                          TEMPERATURE, _HORIZON_FRAME, DUT1),
        result=result, impl=impl, model=_HORIZON_MODEL,
    )


FAMILY = Family("horizon", "Sidereal time and the horizon", (
    CellFunction(
        name="SKY.SIDEREAL", method="skySidereal",
        summary="Sidereal time or Earth rotation angle at Greenwich, or at a longitude "
        "(local sidereal time).",
        args=(
            INSTANT,
            SCALE,
            Arg("kind", "choice", choices_text(vocab.SIDEREAL_KINDS, {
                "GAST": "default: apparent sidereal time, IAU 2006/2000A",
                "GMST": "mean, IAU 2006",
                "ERA": "Earth rotation angle, IAU 2000",
            }) + ".", default="GAST", choices=vocab.SIDEREAL_KINDS),
            Arg("longitude", "angle", "East longitude to add for local sidereal time. "
                "Default 0 (Greenwich).", default=0.0),
            Arg("unit", "choice", "DEG (default) or HOURS.", default="DEG",
                choices=("DEG", "HOURS")),
            DUT1,
        ),
        result="angle in [0, 360) degrees, or [0, 24) hours",
        impl="horizon:sidereal_cells",
        model="ERFA gst06a, gmst06, era00 on UT1 = UTC + DUT1 from 1960, and on UT through "
        f"Delta T before (TT for the precession part; GAST and GMST valid {_IAU2006} as "
        "their IAU 2006/2000A parts).",
    ),
    CellFunction(
        name="SKY.HOURANGLE", method="skyHourangle",
        summary="Local hour angle of a target at a site (west of the meridian positive).",
        args=_AT_SITE,
        result="degrees in (-180, 180]", impl="horizon:hour_angle_cells",
        model="The topocentric hour angle of the place as observed without refraction. "
        + _HORIZON_MODEL,
    ),
    _horizon_fn("SKY.HORIZON.ALT", "skyHorizonAlt",
                "Altitude of a target above the horizon at a site and time.", _TARGET,
                "degrees in [-90, 90] (refracted when a pressure is given)",
                "horizon:altitude_cells"),
    _horizon_fn("SKY.HORIZON.AZ", "skyHorizonAz",
                "Azimuth of a target at a site and time, from north through east.", _TARGET,
                "degrees in [0, 360), north 0, east 90", "horizon:azimuth_cells"),
    _horizon_fn("SKY.HORIZON.RA", "skyHorizonRa",
                "RA of the direction seen at a given azimuth and altitude at a site and "
                "time (the inverse of SKY.HORIZON.ALT/AZ).", _SEEN,
                "degrees in [0, 360) in the chosen frame", "horizon:horizon_ra_cells"),
    _horizon_fn("SKY.HORIZON.DEC", "skyHorizonDec",
                "Dec of the direction seen at a given azimuth and altitude at a site and "
                "time (the inverse of SKY.HORIZON.ALT/AZ).", _SEEN,
                "degrees in [-90, 90] in the chosen frame", "horizon:horizon_dec_cells"),
    CellFunction(
        name="SKY.PARALLACTIC", method="skyParallactic",
        summary="Parallactic angle of a target at a site and time: the angle at the "
        "target from the direction of the celestial pole to the zenith.",
        args=_AT_SITE,
        result="degrees in (-180, 180], positive west of the meridian",
        impl="horizon:parallactic_cells",
        model="ERFA hd2pa on the observed (unrefracted) hour angle and declination. "
        + _HORIZON_MODEL,
    ),
    CellFunction(
        name="SKY.AIRMASS", method="skyAirmass",
        summary="Relative air mass along the line of sight at an altitude.",
        args=(
            angle_arg("altitude", "Observed altitude above the horizon, 0 to 90 degrees"),
            Arg("model", "choice", choices_text(vocab.AIRMASS_MODELS, {
                "KASTENYOUNG1989": "default; Kasten and Young 1989, good to the horizon",
                "PICKERING2002": "Pickering 2002",
                "SECZ": "sec z, plane atmosphere; above about 30 degrees only",
            }) + ".", default="KASTENYOUNG1989", choices=vocab.AIRMASS_MODELS),
        ),
        result="air mass, about 1 at the zenith (about 38 at the horizon)",
        impl="horizon:airmass_cells",
        model="Below the horizon the cell says so.",
    ),
))
