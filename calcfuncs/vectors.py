"""Small vector helpers over arrays of 3-vectors (..., 3) and matrices (..., 3, 3).

The one home of these few lines, so that no module spells them again.
"""

import numpy as np


def apply(matrices, vectors):
    """M v for each row: rotations (..., 3, 3) or one (3, 3), vectors (..., 3)."""
    return np.einsum("...ij,...j->...i", matrices, vectors)


def apply_transposed(matrices, vectors):
    """M^T v for each row: back from a rotated system to the original axes.  One matrix
    (3, 3) for every row is applied element by element, each component's three products
    summed in the order of the axes, as a single cell's steps on floats sum them
    (ephemeris.heliocentric_floats): a row of a column and its cell alone agree to the
    bit by construction, and a column of 100,000 rows is turned in a third of einsum's
    time (measured 2026-12-05)."""
    if np.ndim(matrices) != 2:
        return np.einsum("...ji,...j->...i", matrices, vectors)
    (a, b, c), (d, e, f), (g, h, k) = np.asarray(matrices, dtype=float).tolist()
    vectors = np.asarray(vectors, dtype=float)
    if vectors.size == 3:  # one row: on floats
        x, y, z = vectors.reshape(3).tolist()
        return np.array([a * x + d * y + g * z, b * x + e * y + h * z,
                         c * x + f * y + k * z]).reshape(vectors.shape)
    x, y, z = vectors[..., 0], vectors[..., 1], vectors[..., 2]
    out = np.empty(vectors.shape)
    out[..., 0] = a * x + d * y + g * z
    out[..., 1] = b * x + e * y + h * z
    out[..., 2] = c * x + f * y + k * z
    return out


def compose(m_to, m_from):
    """M_to M_from^T: the rotation from the system of ``m_from`` to that of ``m_to``."""
    return np.einsum("...ij,...kj->...ik", m_to, m_from)


def norm(vectors):
    # numpy.linalg.norm's own sum for an axis, without its checks (a third of its cost
    # on the one row of a cell).
    return np.sqrt(np.add.reduce(vectors * vectors, axis=-1))


def unit(vectors):
    return vectors / norm(vectors)[..., None]


def dot(a, b):
    return np.sum(a * b, axis=-1)


def angle_between(a, b):
    """Angle in radians between vectors (any lengths): atan2 of |a x b| and a . b,
    accurate at every angle, unlike acos of the dot product."""
    return np.arctan2(norm(np.cross(a, b)), dot(a, b))
