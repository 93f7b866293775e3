"""Error messages: a long value is quoted shortened, once, where messages are built (issue 10 item 8)."""

from __future__ import annotations

import io
from contextlib import redirect_stderr, redirect_stdout

import pytest

from engine.cli import main
from engine.section.errors import QUOTE_LIMIT, InputError, quoted


def test_a_short_value_is_quoted_whole():
    assert quoted("4,000") == "'4,000'"
    assert quoted(-4000.0) == "-4000.0"
    assert quoted("a\nb") == "'a\\nb'"  # escaped: a message stays one line


def test_a_long_value_shows_its_start_and_its_length():
    text = "9" * 102_400
    assert quoted(text) == repr("9" * QUOTE_LIMIT) + "… (102,400 characters)"
    message = str(InputError("fc", text, "a number in (0, 30,000] psi"))
    assert message.startswith("fc: '9999") and "102,400 characters" in message
    assert len(message) < 150


@pytest.mark.parametrize("command", ["check", "curve", "report", "design"])
def test_a_100_kb_flag_value_is_a_short_one_line_message(command, tmp_path):
    # The case: a 100 kB --fc came back as a 100,066-character message.
    flags = ["--units", "us", "--fc", "4" * 99_999 + "x", "--fy", "60000", "--b", "12"]
    flags += {"check": ["--d", "21.5", "--as", "3.16"], "curve": ["--d", "21.5", "--as", "3.16"],
              "report": ["--d", "21.5", "--as", "3.16", "--out", str(tmp_path / "s.html")],
              "design": ["--h", "24", "--mu", "190"]}[command]
    err = io.StringIO()
    with redirect_stdout(io.StringIO()), redirect_stderr(err):
        assert main([command, *flags]) == 2
    assert err.getvalue().count("\n") == 1 and "fc:" in err.getvalue()
    assert len(err.getvalue()) < 250 and "100,000 characters" in err.getvalue()
