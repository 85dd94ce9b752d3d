"""Warnings and exceptions that frostline raises on purpose."""


class FrostlineWarning(UserWarning):
    """Base class of frostline's own warnings (the test suite turns them into errors)."""


class RegionTooLargeError(ValueError):
    """A region whose working memory would exceed the configured limit.

    The message names the estimate and the limit; set the environment variable
    ``FROSTLINE_MEMORY_LIMIT`` (bytes) to allow more.
    """
