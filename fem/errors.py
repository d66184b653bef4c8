"""The one error type for bad input anywhere in the tool: it names the field and the value."""


class InputError(ValueError):
    """Bad input. ``str()`` is the one line the command line prints: ``field = value: reason``."""

    def __init__(self, field: str, value, reason: str):
        self.field, self.value, self.reason = field, value, reason
        super().__init__(f"{field} = {value!r}: {reason}" if value is not None else f"{field}: {reason}")


class SolveError(RuntimeError):
    """A linear solve that did not reach its residual tolerance (never used silently). ``str()`` is
    the one line the command line prints; the exit code is 3 (no trustworthy result)."""


class LimitError(RuntimeError):
    """A limit of the case (analysis.max_seconds, analysis.max_dofs) stopped the run before it had a
    result it can stand behind. ``str()`` is the one line the command line prints; exit code 3."""
