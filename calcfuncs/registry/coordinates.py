"""Coordinate systems, rectangular vectors, precession, proper motion and pairs."""

from .. import vocabulary as vocab
from .common import (SCALE, SCALES, Arg, CellFunction, Family, angle_arg, choices_text,
                     span_text, system_arg)

_IAU2006 = span_text(vocab.IAU2006_YEARS)
_OPTIONAL_TIME = Arg(
    "time", "time",
    "The date of the DATE and TRUE systems (as for SKY.JD: date-time cell, ISO text, "
    "JD/MJD text or epoch such as J2025.5). Needed only for those systems; default none.",
    default=None,
)
_EPOCH_SCALE = Arg(
    "scale", "scale",
    "Time scale of the epochs: TT (default, as epochs are given), TDB, TAI, UTC or UT1. "
    "Epoch text like J2000.0 or B1950.0 is always TT.",
    default="TT", choices=SCALES,
)


def _epoch(name, what):
    return Arg(name, "time", f"The epoch {what}: J2000.0, B1950.0 (Besselian epoch, TT), "
               "a date-time cell, ISO text or JD/MJD text.")


_COORD_MODEL = (
    "A rotation of the direction: the centre and kind of place (astrometric or apparent) "
    "stay those of the input. Matrices: IAU 2006 frame bias and precession (ERFA bp06, "
    "ecm06), IAU 2006/2000A nutation (ERFA pnm06a's steps, the series of nut06a as the "
    "add-in evaluates it), galactic as for Hipparcos "
    "(ERFA icrs2g), invariable plane from Souami and Souchay (2012: inclination "
    "1°34'43.3\", node 107°34'56\" on the J2000 ecliptic, longitudes from that node). "
    f"DATE and TRUE systems are valid {_IAU2006}; outside, the cell says so."
)


def _coord_args(extra=()):
    return (
        angle_arg("lon", "Longitude of the input: RA for equatorial systems, longitude for the others"),
        angle_arg("lat", "Latitude of the input: Dec for equatorial systems, latitude for the others"),
        system_arg("from_system", "of the input"),
        system_arg("to_system", "of the result"),
    ) + tuple(extra) + (_OPTIONAL_TIME, SCALE)


_DISTANCE = Arg("distance", "number",
                "Distance passed through to the rectangular result, in any unit. Default 1 "
                "(a unit vector).", default=1.0)


def _rect(axis, toward):
    return CellFunction(
        name=f"SKY.COORD.{axis}", method=f"skyCoord{axis}",
        summary=f"Rectangular {axis} of a direction in another coordinate system: {toward}.",
        args=_coord_args((_DISTANCE,)),
        result="the component, in the unit of the distance",
        impl=f"frames:coord_{axis.lower()}_cells", model=_COORD_MODEL,
    )


_XYZ_ARGS = tuple(Arg(c, "number", f"Rectangular {c} of the vector (any unit).") for c in "xyz")

_PAIR_ARGS = (
    angle_arg("ra1", "RA (or longitude) of the first direction"),
    angle_arg("dec1", "Dec (or latitude) of the first direction"),
    angle_arg("ra2", "RA (or longitude) of the second direction"),
    angle_arg("dec2", "Dec (or latitude) of the second direction"),
)

_PRECESS_ARGS = (
    angle_arg("ra", "RA on the mean equator and equinox of the first epoch"),
    angle_arg("dec", "Dec on the mean equator and equinox of the first epoch"),
    _epoch("from_epoch", "of the given position's equinox"),
    _epoch("to_epoch", "of the wanted equinox"),
    _EPOCH_SCALE,
    Arg("model", "choice",
        choices_text(vocab.PRECESSION_MODELS, {
            "AUTO": f"default: IAU2006 when both epochs are within {_IAU2006}, else "
                    "VONDRAK2011",
            "IAU2006": f"Capitaine et al. 2003, {_IAU2006}",
            "VONDRAK2011": f"Vondrak et al. 2011, {span_text(vocab.VONDRAK_YEARS)}",
        }) + ".",
        default="AUTO", choices=vocab.PRECESSION_MODELS),
)
_PRECESS_MODEL = (
    "Precession only (no nutation, no proper motion): IAU 2006 via ERFA pmat06, "
    "long-term via ERFA ltpb, both including the frame bias so that J2000 means the "
    "mean equator and equinox of J2000.0. FK4 (B1950 catalogue) systems are not "
    "handled: B1950.0 here is only an epoch. Outside a model's range the cell says so."
)

_MOTION_ARGS = (
    angle_arg("ra", "RA at the first epoch (ICRS, as catalogues give it)"),
    angle_arg("dec", "Dec at the first epoch"),
    Arg("pmra", "number", "Proper motion in RA times cos(Dec), in mas per year, as "
        "catalogues (Gaia, Hipparcos) give it."),
    Arg("pmdec", "number", "Proper motion in Dec in mas per year."),
    _epoch("from_epoch", "of the catalogue position (J2016.0 for Gaia DR3, J1991.25 for "
           "Hipparcos)"),
    _epoch("to_epoch", "wanted"),
    _EPOCH_SCALE,
    Arg("parallax", "number", "Parallax in mas. Default 0 (distance unknown: the motion is "
        "then taken across the sky only).", default=0.0),
    Arg("rv", "number", "Radial velocity in km/s, positive receding. Default 0.", default=0.0),
)
_MOTION_MODEL = (
    "Straight-line motion at constant velocity in the frame of the catalogue, no "
    "precession: with a parallax, rigorous space motion with light time (ERFA pmsafe); "
    "with parallax 0 (distance unknown), the direction moves along the straight line "
    "of its proper motion (exact for any distance when there is no radial velocity)."
)

FAMILY = Family(
    "coordinates",
    "Coordinates: ecliptic, equatorial, galactic, invariable; precession; pairs", (
        CellFunction(
            name="SKY.COORD.LON", method="skyCoordLon",
            summary="Longitude (or RA) of a direction converted between coordinate systems: "
            "equatorial, ecliptic, galactic and invariable, on J2000, mean or true equinox.",
            args=_coord_args(),
            result="degrees in [0, 360): RA for equatorial systems, longitude for the others",
            impl="frames:coord_lon_cells", model=_COORD_MODEL,
        ),
        CellFunction(
            name="SKY.COORD.LAT", method="skyCoordLat",
            summary="Latitude (or Dec) of a direction converted between coordinate systems.",
            args=_coord_args(),
            result="degrees in [-90, 90]: Dec for equatorial systems, latitude for the others",
            impl="frames:coord_lat_cells", model=_COORD_MODEL,
        ),
        _rect("X", "toward the system's origin of longitude (the equinox, or the node)"),
        _rect("Y", "90 degrees east along the fundamental plane"),
        _rect("Z", "toward the system's north pole"),
        CellFunction(
            name="SKY.RECT.LON", method="skyRectLon",
            summary="Longitude of a rectangular vector (x toward longitude 0, z to the pole).",
            args=_XYZ_ARGS, result="degrees in [0, 360)", impl="frames:rect_lon_cells",
        ),
        CellFunction(
            name="SKY.RECT.LAT", method="skyRectLat",
            summary="Latitude of a rectangular vector (x toward longitude 0, z to the pole).",
            args=_XYZ_ARGS, result="degrees in [-90, 90]", impl="frames:rect_lat_cells",
        ),
        CellFunction(
            name="SKY.RECT.DIST", method="skyRectDist",
            summary="Length of a rectangular vector.",
            args=_XYZ_ARGS, result="the length, in the unit of x, y, z",
            impl="frames:rect_dist_cells",
        ),
        CellFunction(
            name="SKY.PRECESS.RA", method="skyPrecessRa",
            summary="RA precessed from the mean equator and equinox of one epoch to those of "
            "another.",
            args=_PRECESS_ARGS, result="degrees in [0, 360)", impl="frames:precess_ra_cells",
            model=_PRECESS_MODEL,
        ),
        CellFunction(
            name="SKY.PRECESS.DEC", method="skyPrecessDec",
            summary="Dec precessed from the mean equator and equinox of one epoch to those of "
            "another.",
            args=_PRECESS_ARGS, result="degrees in [-90, 90]", impl="frames:precess_dec_cells",
            model=_PRECESS_MODEL,
        ),
        CellFunction(
            name="SKY.PROPER.RA", method="skyProperRa",
            summary="RA of a star moved by its proper motion, parallax and radial velocity "
            "from one epoch to another.",
            args=_MOTION_ARGS, result="degrees in [0, 360)", impl="pairs:proper_motion_ra_cells",
            model=_MOTION_MODEL,
        ),
        CellFunction(
            name="SKY.PROPER.DEC", method="skyProperDec",
            summary="Dec of a star moved by its proper motion, parallax and radial velocity "
            "from one epoch to another.",
            args=_MOTION_ARGS, result="degrees in [-90, 90]", impl="pairs:proper_motion_dec_cells",
            model=_MOTION_MODEL,
        ),
        CellFunction(
            name="SKY.SEPARATION", method="skySeparation",
            summary="Angular separation between two directions given in the same system.",
            args=_PAIR_ARGS, result="degrees in [0, 180]", impl="pairs:separation_cells",
            model="ERFA seps: accurate for tiny and for near-antipodal separations.",
        ),
        CellFunction(
            name="SKY.POSITION.ANGLE", method="skyPositionAngle",
            summary="Position angle of the second direction as seen from the first, counted "
            "from north through east.",
            args=_PAIR_ARGS, result="degrees in [0, 360)", impl="pairs:position_angle_cells",
            model="ERFA pas; north is the pole of the system the directions are given in.",
        ),
    ))
