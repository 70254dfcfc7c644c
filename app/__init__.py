"""strutscope's user-facing layer: the ``strutscope`` command line (and, in a later release, the page).

The mechanics live in :mod:`engine`; this package only reads cases, calls the engine and shows its results.
"""
