"""Brightness of minor planets and comets: the IAU H, G and H, G1, G2 phase functions
and a comet's total magnitude law."""

import numpy as np


def hg_magnitude(h, g, r, delta, phase_angle_deg):
    """The IAU H, G system (Bowell et al. 1989, adopted by IAU Commission 20 in 1985):
    V = H + 5 log10(r delta) - 2.5 log10((1 - G) phi1 + G phi2), each phi_i a blend
    W phi_iS + (1 - W) phi_iL of a small-angle term phi_iS = 1 - C_i sin a / (0.119 +
    1.341 sin a - 0.754 sin^2 a) and phi_iL = exp(-A_i tan(a/2)^B_i), W = exp(-90.56
    tan^2(a/2)); A = 3.332, 1.862, B = 0.631, 1.218, C = 0.986, 0.238 (the published
    constants)."""
    a = np.radians(np.asarray(phase_angle_deg, float))
    t = np.tan(a / 2.0)
    sa = np.sin(a)
    w = np.exp(-90.56 * t * t)
    small = sa / (0.119 + 1.341 * sa - 0.754 * sa * sa)
    phi1 = w * (1.0 - 0.986 * small) + (1.0 - w) * np.exp(-3.332 * t ** 0.631)
    phi2 = w * (1.0 - 0.238 * small) + (1.0 - w) * np.exp(-1.862 * t ** 1.218)
    return h + 5.0 * np.log10(r * delta) - 2.5 * np.log10((1.0 - g) * phi1 + g * phi2)


def comet_magnitude(m1, k1, r, delta):
    """A comet's total magnitude m1 = M1 + 5 log10 delta + K1 log10 r (common practice)."""
    return m1 + 5.0 * np.log10(delta) + k1 * np.log10(r)


# ---- H, G1, G2 (Muinonen et al. 2010, adopted by IAU Commission 15 in 2012) -------------
# The basis functions: cubic splines through published nodes (phase angle in degrees,
# value) with the published end slopes (per radian), from Muinonen et al. (2010), Table 1;
# phi1 and phi2 are straight lines below 7.5 degrees, phi3 is zero beyond 30 degrees.

_PHI1 = ((7.5, 30.0, 60.0, 90.0, 120.0, 150.0),
         (7.5e-1, 3.3486016e-1, 1.3410560e-1, 5.1104756e-2, 2.1465687e-2, 3.6396989e-3),
         (-1.9098593, -9.1328612e-2))
_PHI2 = ((7.5, 30.0, 60.0, 90.0, 120.0, 150.0),
         (9.25e-1, 6.2884169e-1, 3.1755495e-1, 1.2716367e-1, 2.2373903e-2, 1.6505689e-4),
         (-5.7295780e-1, -8.6573138e-8))
_PHI3 = ((0.0, 0.3, 1.0, 2.0, 4.0, 8.0, 12.0, 20.0, 30.0),
         (1.0, 8.3381185e-1, 5.7735424e-1, 4.2144772e-1, 2.3174230e-1, 1.0348178e-1,
          6.1733473e-2, 1.6107006e-2, 0.0),
         (-1.0630097, 0.0))


def _clamped_spline(nodes):
    """(x, y, second derivatives) of the cubic spline through the nodes with the given
    first derivatives at both ends (x in radians)."""
    x = np.radians(np.array(nodes[0]))
    y = np.array(nodes[1])
    d0, dn = nodes[2]
    n = x.size
    h = np.diff(x)
    a = np.zeros((n, n))
    b = np.zeros(n)
    a[0, 0], a[0, 1] = 2 * h[0], h[0]
    b[0] = 6 * ((y[1] - y[0]) / h[0] - d0)
    a[-1, -2], a[-1, -1] = h[-1], 2 * h[-1]
    b[-1] = 6 * (dn - (y[-1] - y[-2]) / h[-1])
    for k in range(1, n - 1):
        a[k, k - 1], a[k, k], a[k, k + 1] = h[k - 1], 2 * (h[k - 1] + h[k]), h[k]
        b[k] = 6 * ((y[k + 1] - y[k]) / h[k] - (y[k] - y[k - 1]) / h[k - 1])
    return x, y, np.linalg.solve(a, b)


def _spline_at(spline, t):
    x, y, m = spline
    k = np.clip(np.searchsorted(x, t) - 1, 0, x.size - 2)
    h = x[k + 1] - x[k]
    u, w = (x[k + 1] - t) / h, (t - x[k]) / h
    return (u * y[k] + w * y[k + 1]
            + ((u ** 3 - u) * m[k] + (w ** 3 - w) * m[k + 1]) * h * h / 6.0)


_S1, _S2, _S3 = (_clamped_spline(p) for p in (_PHI1, _PHI2, _PHI3))


def hg1g2_basis(phase_angle_deg):
    """(phi1, phi2, phi3) at phase angles in degrees (0 to 150)."""
    a = np.radians(np.asarray(phase_angle_deg, float))
    low = a < np.radians(7.5)
    phi1 = np.where(low, 1.0 - 6.0 * a / np.pi, _spline_at(_S1, a))
    phi2 = np.where(low, 1.0 - 9.0 * a / (5.0 * np.pi), _spline_at(_S2, a))
    phi3 = np.where(a < np.radians(30.0), _spline_at(_S3, a), 0.0)
    return np.maximum(phi1, 0.0), np.maximum(phi2, 0.0), np.maximum(phi3, 0.0)


def hg1g2_magnitude(h, g1, g2, r, delta, phase_angle_deg):
    """V = H + 5 log10(r delta) - 2.5 log10(G1 phi1 + G2 phi2 + (1 - G1 - G2) phi3)."""
    phi1, phi2, phi3 = hg1g2_basis(phase_angle_deg)
    return h + 5.0 * np.log10(r * delta) - 2.5 * np.log10(
        g1 * phi1 + g2 * phi2 + (1.0 - g1 - g2) * phi3)
