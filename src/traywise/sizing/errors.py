"""The error sizing raises on input it cannot use: names the quantity, not a case-file key
(the case layer maps quantities to keys)."""

from ..errors import TraywiseError


class SizingInputError(TraywiseError, ValueError):
    """A sizing input out of range or missing: ``quantity`` names it, ``message`` says what is valid."""

    def __init__(self, quantity, message):
        self.quantity = quantity
        self.message = message
        super().__init__(f"{quantity}: {message}")
