"""The command line: ``shaftcheck <command> ...``. One entry point, one small module per command.

Exit codes: 0 success, 2 bad input (one line on stderr naming the field and value), 3 the requested
accuracy was not reached within the limits, a 3-D segment model is too short for its feature
(compare/checks/segment_far_field.py), a self-check failed, a linear solve did not converge or a
limit stopped the run (the last two: one line on stderr, nothing written), 1 a verification check failed,
130 / 143 interrupted by SIGINT / SIGTERM (one line on stderr; see compare/cli/interrupt.py), 4 no verdict
(a sharp re-entrant corner leaves the stress unbounded; compare/checks/findings.py).
"""
from __future__ import annotations

import argparse
import gc
import sys

from classic._validity import OutOfRangeError
from fem.errors import InputError, LimitError, SolveError

from .._version import __version__
from . import cmd_run, cmd_sweep, cmd_verify
from .interrupt import Interrupted, install_handlers

EXIT_OK, EXIT_FAILED, EXIT_INPUT, EXIT_ACCURACY = 0, 1, 2, 3


class _Parser(argparse.ArgumentParser):
    def error(self, message):  # argparse's own errors: one line, exit 2
        raise InputError("command line", None, message)


def build_parser() -> argparse.ArgumentParser:
    p = _Parser(prog="shaftcheck", description="FE cross-check of shaft sections against the hand formulas.")
    p.add_argument("--version", action="version", version=f"shaftcheck {__version__}")
    sub = p.add_subparsers(dest="command", parser_class=_Parser)
    for mod in (cmd_run, cmd_verify, cmd_sweep):
        mod.register(sub)
    return p


def main(argv: list[str] | None = None) -> int:
    restore_handlers = install_handlers()
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
    except Interrupted as exc:
        print(f"shaftcheck: interrupted by {exc.name}; no partial output was left", file=sys.stderr)
        return exc.exit_code
    except KeyboardInterrupt:  # Ctrl+C where the handlers could not be installed (not the main thread)
        print("shaftcheck: interrupted by SIGINT; no partial output was left", file=sys.stderr)
        return 130
    finally:
        restore_handlers()
        if argv is None:  # the program's own command line (the script, python -m): the process ends now,
            gc.freeze()  # and its exit need not walk every object for cycles (nothing is left to free)


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
