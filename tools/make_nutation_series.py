"""Write calcfuncs/nutation_series.py: the IAU 2000A nutation series, as data.

The IAU 2000A nutation model (Mathews, Herring and Buffett 2002, the MHB2000 series;
IERS Conventions 2003, chapter 5, tables 5.3a and 5.3b) is a published data set: 678
luni-solar terms, each a set of integer multiples of the Delaunay arguments l, l', F, D,
Omega with the coefficients of its sine and cosine in longitude and obliquity (and
their rates), and 687 planetary terms on the multiples of l, F, D, Omega, the planets'
mean longitudes Mercury to Neptune and the general precession in longitude.  The
numbers are read here from the copy skyfield (1.55, a test dependency: PyPI) keeps in
its data/nutation.npz; only the numbers are taken, written one term a line.

Run:  .venv/bin/python tools/make_nutation_series.py
"""

import os

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
OUT = os.path.join(ROOT, "calcfuncs", "nutation_series.py")

HEADER = '''"""The IAU 2000A nutation series (MHB2000), as data.

Source: Mathews, Herring and Buffett (2002), J. Geophys. Res. 107, B4; IERS Conventions
(2003), IERS Technical Note 32, chapter 5, tables 5.3a and 5.3b (numbers as published;
read from the copy in the PyPI package skyfield 1.55, data/nutation.npz, by
tools/make_nutation_series.py).  Coefficients in units of 0.1 micro-arcsecond, rates
in 0.1 micro-arcsecond per Julian century.

LUNI_SOLAR, one term a line: the multiples of l, l', F, D, Omega; then in longitude
the sine coefficient, its rate and the cosine coefficient; then in obliquity the
cosine coefficient, its rate and the sine coefficient.
PLANETARY, one term a line: the multiples of l, F, D, Omega, the mean longitudes of
Mercury, Venus, the Earth, Mars, Jupiter, Saturn, Uranus, Neptune and the general
precession in longitude p_A; then the sine and cosine coefficients in longitude, and
the sine and cosine coefficients in obliquity.
"""

'''


def main():
    import skyfield

    data = np.load(os.path.join(os.path.dirname(skyfield.__file__), "data", "nutation.npz"))
    luni = np.hstack([data["nals_t"], data["lunisolar_longitude_coefficients"],
                      data["lunisolar_obliquity_coefficients"]])
    multiples = data["napl_t"]
    assert not multiples[:, 1].any()  # l' takes no part in the planetary terms
    planetary = np.hstack([multiples[:, [0] + list(range(2, 14))],
                           data["nutation_coefficients_longitude"],
                           data["nutation_coefficients_obliquity"]])
    for table in (luni, planetary):
        assert np.array_equal(table, np.round(table))  # whole units, as published
    with open(OUT, "w", encoding="utf-8") as out:
        out.write(HEADER)
        for name, table in (("LUNI_SOLAR", luni), ("PLANETARY", planetary)):
            out.write(f'{name} = """\\\n')
            for row in table.astype(np.int64):
                out.write(" ".join(str(v) for v in row) + "\n")
            out.write('"""\n\n')
    print(f"wrote {OUT}: {len(luni)} luni-solar and {len(planetary)} planetary terms")


if __name__ == "__main__":
    main()
