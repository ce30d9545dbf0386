"""Small vector helpers over arrays of 3-vectors (..., 3) and matrices (..., 3, 3).

The one home of these few lines, so that no module spells them again.
"""

import numpy as np


def apply(matrices, vectors):
    """M v for each row: rotations (..., 3, 3) or one (3, 3), vectors (..., 3)."""
    return np.einsum("...ij,...j->...i", matrices, vectors)


def apply_transposed(matrices, vectors):
    """M^T v for each row: back from a rotated system to the original axes."""
    return np.einsum("...ji,...j->...i", matrices, vectors)


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
