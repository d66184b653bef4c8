"""The one error type for bad input anywhere in the tool: it names the field and the value."""
from __future__ import annotations

import math
import reprlib

#: Characters never printed raw: C0 and C1 controls (ANSI escapes start with ESC), the line and
#: paragraph separators, and the bidirectional overrides and isolates that can reorder a line.
_UNSAFE = {*range(0x00, 0x20), *range(0x7F, 0xA0), 0x2028, 0x2029, *range(0x202A, 0x202F), *range(0x2066, 0x206A),
           0x200E, 0x200F, 0x061C, 0xFEFF}


def escape_text(text: str) -> str:
    """``text`` with every control character written as a visible escape (``\\x1b``, ``\\u202e``),
    so text from a user's file cannot move the cursor, colour the terminal or fake a new line."""
    if not any(ord(ch) in _UNSAFE for ch in text):
        return text
    out = []
    for ch in text:
        o = ord(ch)
        if o in _UNSAFE:
            out.append({0x09: "\\t", 0x0A: "\\n", 0x0D: "\\r"}.get(o) or (f"\\x{o:02x}" if o < 0x100 else f"\\u{o:04x}"))
        else:
            out.append(ch)
    return "".join(out)


_repr = reprlib.Repr()
_repr.maxlevel, _repr.maxlist, _repr.maxdict, _repr.maxstring, _repr.maxother = 3, 6, 6, 60, 60


def show_value(value) -> str:
    """A value as the user wrote it, short, on one line: strings in double quotes, numbers as
    written, long or deeply nested lists and tables cut short."""
    if isinstance(value, str):
        s = escape_text(value)
        s = s if len(s) <= 80 else s[:77] + "..."
        return '"' + s.replace('"', '\\"') + '"'
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float) and not math.isfinite(value):
        return "nan" if math.isnan(value) else ("inf" if value > 0 else "-inf")
    if isinstance(value, int) and abs(value) > 10**30:
        return "a whole number of %d digits" % len(str(abs(value)))
    try:
        s = _repr.repr(value)
    except Exception:  # noqa: BLE001 - a value that cannot even be shown is still named by its field
        s = f"<{type(value).__name__}>"
    return escape_text(s if len(s) <= 120 else s[:117] + "...")


class InputError(ValueError):
    """Bad input. ``str()`` is the one line the command line prints: ``field = value: reason``.

    ``value`` is echoed as the user wrote it; ``unit``, when given, follows a plain number (the unit
    it took from the case's unit system). Control characters in any part are escaped."""

    def __init__(self, field: str, value, reason: str, unit: str | None = None):
        self.field, self.value, self.reason, self.unit = field, value, reason, unit
        head = escape_text(str(field))
        if value is not None:
            head += f" = {show_value(value)}" + (f" {unit}" if unit and not isinstance(value, str) else "")
        super().__init__(f"{head}: {escape_text(str(reason))}")


class SolveError(RuntimeError):
    """A linear solve that did not reach its residual tolerance (never used silently). ``str()`` is
    the one line the command line prints; the exit code is 3 (no trustworthy result)."""


class LimitError(RuntimeError):
    """A limit of the case (analysis.max_seconds, analysis.max_dofs) stopped the run before it had a
    result it can stand behind. ``str()`` is the one line the command line prints; exit code 3."""
