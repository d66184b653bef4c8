"""The one error type for bad input anywhere in the tool: it names the field and the value."""


class InputError(ValueError):
    """Bad input. ``str()`` is the one line the command line prints: ``field = value: reason``."""

    def __init__(self, field: str, value, reason: str):
        self.field, self.value, self.reason = field, value, reason
        super().__init__(f"{field} = {value!r}: {reason}" if value is not None else f"{field}: {reason}")
