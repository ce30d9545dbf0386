"""Write the sample sheets in sample_sheets/ with a real office and the built extension.

    .venv/bin/python tools/make_sample_sheets.py --oxt dist/eclipsheet.oxt [--out sample_sheets]

Fourteen workbooks, one office session, one module each in tools/samples/:

  observing_log.ods      a season's estimate times: Julian dates, time scales, obliquity,
                         nutation, angle text (the time, angle and obliquity families)
  target_list.ods        one night's targets: coordinate systems, precession, proper
                         motion, sidereal time and the horizon (the coordinates and
                         horizon families)
  historical_record.ods  an invented chronicle's dated sky events: historical dates in
                         both calendars, local mean time, Delta T and its uncertainty,
                         long-term obliquity, the 1960s UTC steps (time across history)
  meteor_watch.ods       an invented club's meteor watches reduced to solar longitude, a
                         year of nights (sunset, twilight, transit, sundial time), the
                         seasons and the Sun's place (the Sun family)
  timing_and_moon.ods    a variable-star timing log carried to BJD_TDB and HJD, and the
                         Moon's phases of a year with the eclipse seasons (the timing,
                         Moon and eclipse families)
  planet_watch.ods       a planet calendar of a year and an archive of heliocentric
                         timings carried over to BJD_TDB (the planets family)
  reductions.ods         the Sun's constellation through a year, meteor rates, a time of
                         minimum by Kwee and van Woerden, the planets' magnitudes (the
                         constellations, meteors, variable-star and magnitude families)
  night_plan.ods         a night's plan at the circle's Kettle Hill observatory: the
                         fields' rising, setting and observing windows, the Moon and the
                         planets from the site, altitudes through the night, and a year
                         of Moon-free dark hours (the site family)
  sky_charts.ods         native Calc charts over computed columns: the obliquity by five
                         models over 20,000 years, the equation of time, the Sun's
                         declination and the analemma, the Moon's illuminated fraction
  minor_planets.ods      the minor-planet section's target list of orbits (MPC lines and
                         elements in cells) and a month's ephemeris of one target (the
                         orbits family)
  lunar_eclipses.ods     the circle's lunar-eclipse nights of 2025-2032 from Kettle Hill,
                         and ancient lunar eclipses seen from Holmwray Abbey with Delta T
                         moved by its published standard error (the lunar-eclipse family)
  eclipses.ods           an invented eclipse-chasing club's trips to real solar eclipses
                         with the local circumstances at its camps, and an invented
                         historian's table of recorded eclipses tested against Delta T
                         (the solar-eclipse family)
  first_crescent.ods     the crescent watch's evenings after each new Moon of a year with
                         Yallop's and Odeh's criteria, and heliacal dates (the
                         visibility family)

The scenarios are invented: the Saltmarsh Variable Star Circle, observing from its
Kettle Hill site and from a second field site, Curlew Staithe, whose coordinates are
made up too; the Annals of Holmwray Abbey; the Tollmere Meteor Section at Whinburn
Common; the Harrowdene Crescent Watch at Sarrow Ridge.  Observers, nights, fields, stars,
entries and counts are made up.  The sheets hold formulas (no macros), so opening them never asks about macro security.  Every
sheet about the Sun carries the caution never to look at it, or point optics at it,
without a proper solar filter.
"""

import argparse
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
sys.path.insert(0, os.path.dirname(HERE))

import officekit  # noqa: E402
from samples import (  # noqa: E402
    common,
    eclipses,
    first_crescent,
    historical_record,
    lunar_eclipses,
    meteor_watch,
    minor_planets,
    night_plan,
    observing_log,
    planet_watch,
    reductions,
    sky_charts,
    target_list,
    timing_and_moon,
)

# In this order, in one office session.
BOOKS = (observing_log, target_list, historical_record, meteor_watch, timing_and_moon,
         planet_watch, reductions, night_plan, sky_charts,
         minor_planets, lunar_eclipses, eclipses, first_crescent)


def build(oxt, out_dir, only=()):
    """Write every workbook, or those whose file names are in ``only``."""
    books = [b for b in BOOKS if not only or b.FILE_NAME in only]
    unknown = set(only) - {b.FILE_NAME for b in BOOKS}
    if unknown:
        raise SystemExit(f"no sample workbook {sorted(unknown)}; the workbooks: "
                         + ", ".join(b.FILE_NAME for b in BOOKS))
    os.makedirs(out_dir, exist_ok=True)
    with officekit.Office(oxt=oxt) as office:
        paths = [common.write_book(office, out_dir, book) for book in books]
    for path in paths:
        print(path)
    return paths


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--oxt", required=True)
    ap.add_argument("--out", default=os.path.join(os.path.dirname(HERE), "sample_sheets"))
    ap.add_argument("--only", action="append", default=[], metavar="FILE.ods",
                    help="write only this workbook (repeatable); default: all of them")
    args = ap.parse_args(argv)
    build(args.oxt, args.out, args.only)


if __name__ == "__main__":
    main()
