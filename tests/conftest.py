"""Shared by every test: the tests run the engine as the product runs it.

One thread of linear algebra, set before numpy loads (as ``strutscope serve``, ``solve`` and ``batch`` do,
``app.workers.one_thread_here``). With several OpenBLAS threads the same solve can round differently in its
last bits: on the oldest numpy the lower bounds allow (1.26.0), the command line's utilisation of the demo
was 0.5304798111388515 and the same solve in a multi-threaded test process 0.5304798111388509 (measured
2026-12-03), which failed the tests that compare the command line with ``engine.solve`` exactly. A value
already in the environment is kept.
"""

from __future__ import annotations

import os
import sys

#: Whether numpy was loaded before this file (then the setting below would come too late).
NUMPY_LOADED_FIRST = "numpy" in sys.modules

for _name in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_name, "1")
