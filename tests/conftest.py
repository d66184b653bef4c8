import os
import sys

import pytest

sys.path.insert(0, os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


@pytest.fixture
def run_cli(tmp_path, capsys):
    """Run the command line in-process; return (exit code, stdout, stderr)."""
    from compare.cli import main

    def _run(*argv):
        code = main(list(argv))
        out = capsys.readouterr()
        return code, out.out, out.err

    return _run
