"""Solar eclipses: the next one anywhere and what a site sees, modern and ancient."""

from .common import (DUT1, EVENT_RESULT_SCALE, LATITUDE, LONG_RANGE_NOTE, LONGITUDE, SCALE,
                     SOURCE, Arg, CellFunction, Family)

_SAFETY = ("Safety: never look at the Sun, however much of it is covered, without a proper "
           "solar filter made for the purpose; only during totality itself is the naked eye "
           "safe.")
_AFTER = Arg("time", "time", "A time before the eclipse (for example its date): the first "
             "solar eclipse whose greatest eclipse follows it is taken. For historical dates "
             "give the scale UT (Delta T from the model) or UT and Delta T in seconds.")
_HEIGHT = Arg("height", "number", "Height of the site above the WGS84 ellipsoid in metres. "
              "Default 0.", default=0.0)
_NSIGMA = Arg("nsigma", "number", "Delta T moved by this many published standard errors "
              "(Morrison and Stephenson 2004, 0.8 u^2 s, for 1000 BC to AD 1200; 1700, 1800, "
              "1900): e.g. -2, -1, 1, 2 to see how a record's site fares. Default 0.",
              default=0.0)
_CONTACT = Arg("contact", "choice", "C1 (first contact, the partial phase begins), C2 "
               "(totality or annularity begins), MAX (default: greatest eclipse at the site), "
               "C3 (totality or annularity ends) or C4 (last contact).", default="MAX",
               choices=("C1", "C2", "MAX", "C3", "C4"))
_METHOD = (
    "Besselian elements made from the add-in's own apparent geocentric Sun and Moon "
    "(Chebyshev series over +-5 h of each new Moon) and the classical local "
    "circumstances, searched by the one shared event search. Lunar radius k = 0.2725076 "
    "Earth radii for the penumbral contacts (C1, C4, the partial phase, the magnitude) and "
    "k = 0.2722810 for the umbral ones (C2, C3, durations), the canons' convention; Sun "
    "959.63\" at 1 au; the WGS84 ellipsoid. The Moon's limb profile (valleys and mountains, "
    "a second or two at C2 and C3) is ignored: the Moon is a sphere. Against the NASA Five "
    "Millennium Canon (Espenak and Meeus, values from memory) for 1999, 2017 and 2024 with "
    "DE440: greatest eclipse within 2 s, gamma and magnitude within 0.0002. The built-in "
    "Moon (ERFA moon98) moves instants by a few seconds more. Delta T enters only through "
    "the Earth's rotation: the scale UTC (or UT from 1960) uses the leap seconds and DUT1; "
    "UT before uses SMH2016, UT <model> or UT <seconds> another. " + LONG_RANGE_NOTE
)
_GLOBAL = ("Greatest eclipse: the instant the shadow's axis passes closest to the Earth's "
           "centre. " + _METHOD + " " + _SAFETY)
_LOCAL = ("At the site: contacts when the Moon's disc touches the Sun's (the site's distance "
          "from the shadow's axis equals the shadow's radius there), the Sun's geometric "
          "altitude (its centre, no refraction). A site outside the penumbra, or with the Sun "
          "below the horizon throughout, shows 'no eclipse seen from here'. " + _METHOD + " "
          + _SAFETY)


def _f(name, method, summary, args, result, impl, model, kind="number"):
    return CellFunction(name=name, method=method, summary=summary, args=args, result=result,
                        impl=impl, model=model, result_kind=kind)


FAMILY = Family("solar_eclipses", "Solar eclipses: the next one anywhere, what a site sees, "
                "ancient eclipses and Delta T", (
    _f("SKY.SOLAR.ECLIPSE.NEXT", "skySolarEclipseNext",
       "Greatest eclipse of the next solar eclipse after a time.",
       (_AFTER, SCALE, EVENT_RESULT_SCALE, SOURCE, DUT1),
       "a date-time value on the result scale", "solar_eclipses:next_cells", _GLOBAL,
       "datetime"),
    _f("SKY.SOLAR.ECLIPSE.KIND", "skySolarEclipseKind",
       "Kind of the next solar eclipse after a time: total, annular, hybrid or partial.",
       (_AFTER, SCALE, SOURCE, DUT1),
       'text: "total", "annular", "hybrid", "partial", or "total (non-central)" and '
       '"annular (non-central)" when the shadow\'s axis misses the Earth',
       "solar_eclipses:kind_cells",
       "Hybrid: the central phase is annular at the ends of the path and total near its "
       "middle. " + _GLOBAL, "text"),
    _f("SKY.SOLAR.ECLIPSE.GLOBAL", "skySolarEclipseGlobal",
       "Gamma, magnitude or the place of greatest eclipse of the next solar eclipse after a "
       "time.",
       (_AFTER, SCALE, Arg("quantity", "choice", "GAMMA (default: the least distance of the "
                    "shadow's axis from the Earth's centre in equatorial radii, negative "
                    "south) or MAGNITUDE (central: the ratio of the Moon's apparent "
                    "diameter to the Sun's on the axis; partial: the fraction of the Sun's "
                    "diameter covered at the point of the Earth's limb nearest the axis), LAT or "
                    "LON (geodetic latitude and east longitude of the point of greatest "
                    "eclipse: where the axis meets the Earth, else the limb point nearest "
                    "it).", default="GAMMA", choices=("GAMMA", "MAGNITUDE", "LAT", "LON")),
        SOURCE, DUT1),
       "Earth radii (gamma), a fraction (magnitude) or degrees", "solar_eclipses:global_cells",
       _GLOBAL),
    _f("SKY.SOLAR.ECLIPSE.CONTACT", "skySolarEclipseContact",
       "A contact of the next solar eclipse after a time, at a site: C1, C2, MAX, C3 or C4.",
       (_AFTER, LATITUDE, LONGITUDE, SCALE, _CONTACT, EVENT_RESULT_SCALE, _HEIGHT, _NSIGMA,
        SOURCE, DUT1),
       "a date-time value on the result scale (on UT, with Delta T moved by nsigma), or "
       "words when there is none", "solar_eclipses:contact_cells", _LOCAL, "datetime"),
    _f("SKY.SOLAR.ECLIPSE.LOCAL", "skySolarEclipseLocal",
       "What a site sees of the next solar eclipse after a time: magnitude, obscuration, "
       "duration of totality or annularity, or the Sun's altitude or azimuth at a contact.",
       (_AFTER, LATITUDE, LONGITUDE, SCALE,
        Arg("quantity", "choice", "MAGNITUDE (default: the fraction of the Sun's diameter "
            "covered at maximum), OBSCURATION (the fraction of its disc covered), DURATION "
            "(seconds of totality or annularity, 0 for a partial eclipse), ALT or AZ (the "
            "Sun's altitude or azimuth at the contact, degrees; azimuth from north through "
            "east).", default="MAGNITUDE",
            choices=("MAGNITUDE", "OBSCURATION", "DURATION", "ALT", "AZ")),
        _CONTACT, _HEIGHT, _NSIGMA, SOURCE, DUT1),
       "a fraction, seconds or degrees", "solar_eclipses:local_cells", _LOCAL),
    _f("SKY.SOLAR.ECLIPSE.SEEN", "skySolarEclipseSeen",
       "In words, what a site sees of the next solar eclipse after a time.",
       (_AFTER, LATITUDE, LONGITUDE, SCALE, _HEIGHT, _NSIGMA, SOURCE, DUT1),
       'text, e.g. "total eclipse seen, 231 s of totality; the Sun 65 degrees high at '
       'maximum" or "no eclipse seen from here (...)"', "solar_eclipses:seen_cells", _LOCAL,
       "text"),
    _f("SKY.SOLAR.ECLIPSE.DELTAT", "skySolarEclipseDeltat",
       "For a historical record: the range of Delta T for which the total or annular phase "
       "of the next solar eclipse after a time reaches a site with the Sun up, the model's "
       "Delta T, or its published uncertainty.",
       (_AFTER, LATITUDE, LONGITUDE, SCALE,
        Arg("quantity", "choice", "LOW (default: the least Delta T of the range), HIGH (the "
            "greatest), MODEL (the Delta T of the scale at the eclipse) or SIGMA (the "
            "published standard error there).", default="LOW",
            choices=("LOW", "HIGH", "MODEL", "SIGMA")),
        _HEIGHT, SOURCE, DUT1),
       "seconds", "solar_eclipses:delta_t_cells",
       "Searched over Delta T within 3 hours of the model's: a change of Delta T turns the "
       "Earth under the shadow (15.04\" of longitude a second). Of several ranges, the one "
       "holding the model's Delta T, else the nearest. " + _LOCAL),
))
