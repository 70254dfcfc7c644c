"""The test process runs linear algebra on one thread, as the product does (tests/conftest.py)."""

from __future__ import annotations

import os

from app import workers
from tests import conftest


def test_the_tests_use_the_products_thread_settings():
    for name in workers._THREAD_VARIABLES:
        assert os.environ.get(name) == "1", name
    assert not conftest.NUMPY_LOADED_FIRST  # set before numpy loads, or it has no effect
