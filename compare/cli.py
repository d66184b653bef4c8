"""The command line: ``shaftcheck <command> ...``. One entry point, one small module per command.

Exit codes: 0 success, 2 bad input (one line on stderr naming the field and value), 3 the requested
accuracy was not reached within the limits, a self-check failed, a linear solve did not converge or a
limit stopped the run (the last two: one line on stderr, nothing written), 1 a verification check failed.
"""
from __future__ import annotations

import argparse
import sys

from fem.errors import InputError, LimitError, SolveError

from . import __version__

EXIT_OK, EXIT_FAILED, EXIT_INPUT, EXIT_ACCURACY = 0, 1, 2, 3


class _Parser(argparse.ArgumentParser):
    def error(self, message):  # argparse's own errors: one line, exit 2
        raise InputError("command line", None, message)


def build_parser() -> argparse.ArgumentParser:
    from . import cmd_run, cmd_verify  # noqa: PLC0415

    p = _Parser(prog="shaftcheck", description="FE cross-check of shaft sections against the hand formulas.")
    p.add_argument("--version", action="version", version=f"shaftcheck {__version__}")
    sub = p.add_subparsers(dest="command", parser_class=_Parser)
    for mod in (cmd_run, cmd_verify):
        mod.register(sub)
    return p


def main(argv: list[str] | None = None) -> int:
    from classic._validity import OutOfRangeError  # noqa: PLC0415

    try:
        parser = build_parser()
        args = parser.parse_args(argv)
        if not getattr(args, "command", None):
            parser.print_help(sys.stderr)
            return EXIT_INPUT
        return int(args.func(args))
    except (InputError, OutOfRangeError) as exc:
        print(f"shaftcheck: error: {exc}", file=sys.stderr)
        return EXIT_INPUT
    except SolveError as exc:
        print(f"shaftcheck: solve failed: {exc}", file=sys.stderr)
        return EXIT_ACCURACY
    except LimitError as exc:
        print(f"shaftcheck: stopped: {exc}", file=sys.stderr)
        return EXIT_ACCURACY
    except KeyboardInterrupt:  # pragma: no cover
        print("shaftcheck: interrupted", file=sys.stderr)
        return 130


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
