"""InputError: one line, the field, the value as written, control characters escaped."""
import math

from fem.errors import InputError, escape_text, show_value


def test_one_line_with_field_value_and_unit():
    e = InputError("section.keyways[0].depth", 0.6, "reaches the shaft axis", unit="inch")
    assert str(e) == "section.keyways[0].depth = 0.6 inch: reaches the shaft axis"
    assert str(InputError("section.diameter", "0.6 in", "too big")) == 'section.diameter = "0.6 in": too big'
    assert str(InputError("section", None, "is missing")) == "section: is missing"


def test_control_characters_are_escaped_everywhere():
    e = InputError("case.\x1b[31mx", "a\x1b[2J\nb\u202e", "reason\x07\rmore")
    s = str(e)
    assert "\n" not in s and "\r" not in s and "\x1b" not in s and "\x07" not in s and "\u202e" not in s
    assert s == 'case.\\x1b[31mx = "a\\x1b[2J\\nb\\u202e": reason\\x07\\rmore'
    assert escape_text("plain ° text µm") == "plain ° text µm"


def test_odd_values_are_shown_short():
    deep = []
    node = deep
    for _ in range(5000):  # deeper than Python's recursion limit: repr() itself would fail
        node.append([])
        node = node[0]
    assert len(show_value(deep)) < 130
    assert show_value(list(range(1000))).endswith("...]")
    assert show_value(float("nan")) == "nan" and show_value(-math.inf) == "-inf" and show_value(True) == "true"
    assert "digits" in show_value(10**400)
    assert len(show_value("x" * 10_000)) <= 82
