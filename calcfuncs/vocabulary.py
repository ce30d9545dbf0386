"""The core's words and what they mean, said once.

Time scales, models with their validity in years, coordinate systems and their short
names, kinds of place, ephemeris sources, shared physical constants and the Sun
caution.  The registry formats its Function Wizard texts from these, and the core
checks its input against them, so a word or a validity range cannot drift between
what a cell says and what the code does.

Imports nothing (no numpy): the office adapter reads the registry, and with it this
module, when the component loads.
"""

# ---- time ------------------------------------------------------------------------------

# The five scales of ERFA, and the two reached through Delta T at any date.
ERFA_SCALES = ("UTC", "TAI", "TT", "TDB", "UT1")
SCALES = ERFA_SCALES + ("UT", "LMT")
# Delta T models that a UT or LMT scale word may name ("UT ESPENAK2006").
DELTA_T_MODELS = ("SMH2016", "ESPENAK2006")
# What SKY.DELTAT offers: the models, the measured value, or AUTO (measured from 1960
# on, else the scale's own model).
DELTA_T_CHOICES = ("AUTO", "MEASURED") + DELTA_T_MODELS
SCALE_WORDS = (
    "UTC, TAI, TT, TDB, UT1, UT (universal time at any date, through Delta T; add a "
    "model, SMH2016 or ESPENAK2006, or a Delta T in seconds: UT ESPENAK2006, UT 10850) "
    "or LMT with an east longitude (local mean time: LMT 12.4964, LMT 12.4964 ESPENAK2006)"
)

J2000_JD = 2451545.0          # TT, the epoch of the IAU frames
MJD_ZERO = 2400000.5          # MJD = JD - 2400000.5
JULIAN_YEAR_DAYS = 365.25
UTC_START_JD = 2436934.5      # 1960 January 1, where ERFA's UTC begins
DAY_SECONDS = 86400.0

# ---- models and the years they are valid for (Julian epochs, TT) ------------------------

# The IAU polynomials are fits for a few centuries around their epoch: the customary
# +-10 centuries (from memory of the papers' own statements).  Laskar (1986) states
# +-10,000 years around J2000, Vondrak et al. (2011) +-200,000 years.
OBLIQUITY_VALIDITY = {
    "IAU2006": (1000.0, 3000.0),
    "IAU1980": (1000.0, 3000.0),
    "NEWCOMB": (900.0, 2900.0),
    "LASKAR1986": (-8000.0, 12000.0),
    "VONDRAK2011": (-198000.0, 202000.0),
}
OBLIQUITY_MODELS = tuple(OBLIQUITY_VALIDITY)
NUTATION_VALIDITY = {
    "IAU2000A": (1000.0, 3000.0),
    "IAU2000B": (1000.0, 3000.0),
    "IAU1980": (1000.0, 3000.0),
}
NUTATION_MODELS = tuple(NUTATION_VALIDITY)
# The IAU 2006/2000A precession-nutation matrices of date, sidereal time and the
# observed place: the same +-10 centuries.
IAU2006_YEARS = (1000.0, 3000.0)
# Long-term precession of Vondrak et al. (2011).
VONDRAK_YEARS = (-198000.0, 202000.0)
PRECESSION_MODELS = ("AUTO", "IAU2006", "VONDRAK2011")
# ERFA's built-in theories (epv00, plan94, moon98), accepted here with degrading
# accuracy far from their fits.
BUILTIN_YEARS = (1000.0, 3000.0)
# The long-range theories that the built-in source takes outside BUILTIN_YEARS (VSOP87D
# for the Sun and planets, Meeus's abridged ELP-2000/82 for the Moon: calcfuncs/longrange.py).
LONG_RANGE_YEARS = (-4000.0, 8000.0)
# Their largest difference from JPL DE440 over its span, 1550-2650 (geocentric direction,
# arcseconds, measured and rounded up: tests/test_longrange.py asserts each).
LONG_RANGE_VS_DE440 = (("SUN", 0.4), ("MERCURY", 0.6), ("VENUS", 1.2), ("MARS", 8.1),
                       ("JUPITER", 1.5), ("SATURN", 1.9), ("URANUS", 9.7), ("NEPTUNE", 8.8),
                       ("MOON", 14.0))
# ERFA dtdb's series of TDB - TT, used inside this span only (its Poisson terms grow
# without bound far from J2000).
TDB_SERIES_YEARS = (1000.0, 3000.0)


def years_text(span):
    """A validity span as the cells word it: "1000 to 3000"."""
    return f"{span[0]:g} to {span[1]:g}"


# ---- coordinate systems ---------------------------------------------------------------

SYSTEMS = (
    "ICRS", "EQUATORIAL J2000", "EQUATORIAL DATE", "EQUATORIAL TRUE",
    "ECLIPTIC J2000", "ECLIPTIC DATE", "ECLIPTIC TRUE", "GALACTIC", "INVARIABLE",
)
DATED_SYSTEMS = ("EQUATORIAL DATE", "EQUATORIAL TRUE", "ECLIPTIC DATE", "ECLIPTIC TRUE")
SYSTEM_ALIASES = (
    ("EQ J2000", "EQUATORIAL J2000"), ("EQ DATE", "EQUATORIAL DATE"),
    ("EQ TRUE", "EQUATORIAL TRUE"), ("ECL J2000", "ECLIPTIC J2000"),
    ("ECL DATE", "ECLIPTIC DATE"), ("ECL TRUE", "ECLIPTIC TRUE"), ("GAL", "GALACTIC"),
)
# A body's place is asked for in a frame word; these are the systems it means.
ECLIPTIC_OF_FRAME = {"J2000": "ECLIPTIC J2000", "DATE": "ECLIPTIC DATE",
                     "TRUE": "ECLIPTIC TRUE"}
EQUATORIAL_OF_FRAME = {"J2000": "EQUATORIAL J2000", "DATE": "EQUATORIAL DATE",
                       "TRUE": "EQUATORIAL TRUE", "ICRS": "ICRS"}
SIDEREAL_KINDS = ("GAST", "GMST", "ERA")
HORIZON_FRAMES = ("ICRS", "TRUE")
AIRMASS_MODELS = ("KASTENYOUNG1989", "PICKERING2002", "SECZ")

# ---- places of bodies and where they come from --------------------------------------------

# GEOMETRIC: at the same instant; ASTROMETRIC: light time; APPARENT: light time, light
# deflection and aberration.
KINDS = ("APPARENT", "ASTROMETRIC", "GEOMETRIC")
PLANETS = ("MERCURY", "VENUS", "MARS", "JUPITER", "SATURN", "URANUS", "NEPTUNE", "PLUTO")
BUILTIN = "BUILTIN"
SOURCE_WORDS = ("BUILTIN (default: ERFA's theories), DE440 (JPL; 1900-2100 comes with the "
                "add-in), DE441 (JPL; its files in your kernel folder) or the full path of a "
                "JPL .bsp kernel file")

# ---- physical constants ---------------------------------------------------------------

# IAU 2012 Resolution B2: the astronomical unit is 149,597,870,700 m exactly (ERFA DAU).
AU_M = 149597870700.0
AU_KM = AU_M / 1000.0
# The speed of light, m/s (SI definition), and the light time for one au (ERFA AULT).
SPEED_OF_LIGHT_M_S = 299792458.0
AU_LIGHT_SECONDS = AU_M / SPEED_OF_LIGHT_M_S
LIGHT_DAYS_PER_AU = AU_LIGHT_SECONDS / DAY_SECONDS
# IERS Conventions 2010 equatorial radius of the Earth, km (common practice for the
# Moon's distance in Earth radii).
EARTH_RADIUS_KM = 6378.1366

# ---- the Sun --------------------------------------------------------------------------

SUN_CAUTION = ("Caution: never look at the Sun, or point binoculars, a telescope or a "
               "camera at it, without a proper solar filter made for that purpose.")
SUN_CAUTION_SHORT = "never look at the Sun without a proper solar filter"
