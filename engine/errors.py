"""Errors raised by the engine."""

__all__ = ["CaseError"]


class CaseError(ValueError):
    """A case that cannot be analysed: a bad value, an unknown key or an unstable support set.

    The message names the field path, the value received and what is allowed, for example
    ``loads[2].x: 7.5 m lies outside the member (0 to 6 m)``.
    """
