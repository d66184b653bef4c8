"""``shaftcheck verify``: the exact-solution suite (issue 5). Registered here so the command exists."""
from __future__ import annotations


def register(sub) -> None:
    p = sub.add_parser("verify", help="run the exact-solution verification suite")
    p.add_argument("--out", default=None, help="folder for verify.json")
    p.set_defaults(func=run)


def run(args) -> int:
    from fem.errors import InputError  # noqa: PLC0415

    raise InputError("verify", None, "the verification suite is not built yet")
