"""The docstrings' examples run (they are the package's documentation)."""

import doctest

import ebullio


def test_docstring_examples():
    result = doctest.testmod(ebullio, optionflags=doctest.ELLIPSIS)
    assert result.attempted >= 10
    assert result.failed == 0
