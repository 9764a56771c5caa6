"""The error sizing raises on input it cannot use: names the quantity, not a case-file key
(the case layer maps quantities to keys)."""

from ..errors import InputError


class SizingInputError(InputError):
    """A sizing input out of range or missing: ``quantity`` names it, ``message`` says what is valid."""
