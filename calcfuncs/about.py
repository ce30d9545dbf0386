"""What computed a sheet: versions of the add-in and of the libraries under it."""

import erfa
import numpy as np

from . import __version__


def version_text():
    return np.array(
        [f"Eclipsheet {__version__}; ERFA {erfa.version.erfa_version}; numpy {np.__version__}"],
        dtype=object,
    )
