"""The command line's bad-input contract under hostile values, over every subcommand.

The contract (README, "Command line"): bad input exits with status 2 and
one line on stderr naming the field; never a traceback. Each case takes a
valid command (check, curve, design, report, batch), gives one of its flags
a hostile value (NaN, inf, negative, huge, empty, other scripts' digits,
control characters, 100 kB strings, bytes that are not UTF-8, as argv
brings them: lone surrogates, PEP 383) and runs `engine.cli.main` in
process. Then either

- status 2, exactly one line on stderr, no traceback, and the line names
  the flag; or
- status 0, and the output equals the engine's API called with the value
  read the plain way (`float(text)` for a number): the reference is the
  public API, so a value the CLI read differently, dropped or moved to
  another field is caught.

A handful of cases run as real processes with bytes in argv. Sizes:
tests/fuzz/support.py.
"""

from __future__ import annotations

import contextlib
import io
import json
import math
import os
import random
import re
import shutil
import subprocess
import sys
import time
from pathlib import Path

import pytest

import engine
from engine.cli import main

from fuzz.support import Account, seed, shown, size

DEMO = Path(__file__).resolve().parent.parent / "data" / "harbourline_schedule.csv"

SECTION = {"units": "us", "fc": "4000", "fy": "60000", "b": "12", "d": "21.5", "as": "3.16"}
BASES = {
    "check": dict(SECTION, mu="180"),
    "curve": dict(SECTION, points="20"),
    "report": dict(SECTION, mu="180", out="sheet.html", date="2025-03-14",
                   project="Harbourline Depot", mark="B-101", engineer="A. Checker"),
    "design": {"units": "us", "fc": "4000", "fy": "60000", "b": "14", "h": "24", "mu": "190"},
    "batch": {"IN.csv": "schedule.csv", "out": "results.csv"},
}
SECTION_FLAGS = ("units", "fc", "fy", "b", "d", "as", "layer", "asc", "dc", "h", "bf", "hf",
                 "dt", "es", "spiral", "json")
FLAGS = {
    "check": SECTION_FLAGS + ("mu",),
    "curve": SECTION_FLAGS + ("points",),
    "report": SECTION_FLAGS + ("mu", "out", "project", "mark", "engineer", "date", "link-base"),
    "design": ("units", "fc", "fy", "b", "h", "mu", "cover", "stirrup", "agg", "layers",
               "layer-gap", "exposure", "bars", "fs", "es", "span", "support", "order",
               "waive-as-min", "json"),
    "batch": ("IN.csv", "out", "json"),
}
SWITCHES = ("json", "spiral", "waive-as-min")  # flags that take no value
# A flag that needs a partner gets a valid one, so the error is about the flag under test.
PARTNERS = {"asc": {"dc": "2.5"}, "dc": {"asc": "1.2"}, "bf": {"hf": "4"}, "hf": {"bf": "48"},
            "span": {"support": "simple"}, "support": {"span": "240"}}
NUMBER_FLAGS = {"fc": "fc", "fy": "fy", "b": "b", "d": "d", "as": "As", "asc": "asc", "dc": "dc",
                "h": "h", "bf": "bf", "hf": "hf", "dt": "dt", "es": "es", "mu": "Mu",
                "cover": "cover", "agg": "agg", "layer-gap": "layer_gap", "fs": "fs",
                "span": "span"}

HOSTILE = [
    "nan", "NaN", "-nan", "inf", "-inf", "Infinity", "1e309", "-1", "-0", "0", "0.0", "-4000",
    "1e308", "1e-320", "5e-324", "9" * 400, "", " ", "\t", "abc", "1,5", "3,16", "4_000",
    "\u0664\u0660\u0660\u0660", "\uff14\uff10\uff10\uff10", "1e5x", "0x10", "\u202e12", "12\n13",
    "\r", "=1+1", "+cmd|' /C calc'!A0", "@SUM(1)", "<script>alert(1)</script>", "\x00", "1\x00",
    os.fsdecode(b"\xff12"), os.fsdecode(b"B-1 \xe9"), "A" * 100_000, "1" * 99_999 + "x",
    "-", "@", "#99", "#3", "#18", "10", "57", "3@", "@5", "1@2@3", "nan@5", "2@inf", "-5@3",
    "1.58@21.5", "us", "SI", "km", "yes", "true", "1", "2", "3", "1.5", "100001", "2025-02-30",
    "14/03/2025", "2025-03-14", "simple", "cantilever", "exposed", "#6,#7", ",,", "#6,,#7",
    "http://localhost:8000/", "javascript:alert(1)", "https://example.invalid/" + "a" * 5000,
    ".", "..", "/", "no/such/folder/x", "\ud800", "\U0001F600", "\u00a0", "0" * 5000 + "1",
]


def hostile_value(rng: random.Random) -> str:
    """One hostile value: from the list, random bytes as argv brings them, or random text."""
    pick = rng.random()
    if pick < 0.6:
        return rng.choice(HOSTILE)
    if pick < 0.75:
        return os.fsdecode(bytes(rng.randrange(256) for _ in range(rng.randrange(1, 12))))
    if pick < 0.9:
        return "".join(chr(rng.choice((rng.randrange(32, 127), rng.randrange(0x80, 0x3000),
                                       rng.randrange(0, 32), rng.randrange(0xDC80, 0xDD00))))
                       for _ in range(rng.randrange(0, 16)))
    number = rng.choice((rng.uniform(-1e6, 1e6), rng.uniform(0, 50), 10 ** rng.uniform(-30, 30)))
    return rng.choice((repr(number), f"{number:.3g}", f"{number:,.2f}", str(int(number))))


def argv_of(command: str, flags: dict[str, str], switches: set[str]) -> list[str]:
    argv = [command]
    for flag, value in flags.items():
        if flag == "IN.csv":
            argv.append(value)
        elif isinstance(value, list):
            argv += [f"--{flag}={item}" for item in value]
        else:
            argv.append(f"--{flag}={value}")
    argv += [f"--{switch}" for switch in sorted(switches)]
    return argv


def names_the_flag(line: str, flag: str, value: str) -> bool:
    """Whether the error line names `flag` (as on the command line or as the field)."""
    lowered = line.lower()
    if flag == "IN.csv":  # the file is named by its path
        return "schedule" in lowered or "in.csv" in lowered or value[:30].lower() in lowered or \
            repr(value[:30])[1:-1].lower() in lowered
    names = {flag, flag.replace("-", "_"), NUMBER_FLAGS.get(flag, flag).lower()}
    return any(re.search(rf"(^|[\s:(,])(--)?{re.escape(name)}( area| depth)?[:\s=]", lowered)
               for name in names)


def run_main(argv: list[str]) -> tuple[int, str, str, str]:
    """Status, stdout, stderr and any traceback of `main(argv)` in this process."""
    out, err = io.StringIO(), io.StringIO()
    trace = ""
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            status = main(argv)
        except SystemExit as stop:  # argparse's own exit, status 2 for a usage error
            status = stop.code if isinstance(stop.code, int) else 1
        except BaseException as error:  # noqa: BLE001 - the very thing this test looks for
            status, trace = -1, f"{type(error).__name__}: {error}"
    return status, out.getvalue(), err.getvalue(), trace


def reference(command: str, flags: dict[str, str], switches: set[str]) -> dict:
    """The engine API's answer for the same inputs read the plain way; raises if it refuses."""
    def number(flag):
        return None if flag not in flags else float(flags[flag])

    if command == "design":
        layers = flags.get("layers")
        return engine.design_section(
            units=flags["units"], **{NUMBER_FLAGS[f]: number(f) for f in
                                     ("fc", "fy", "b", "h", "mu", "cover", "agg", "layer-gap",
                                      "fs", "es", "span")},
            stirrup=flags.get("stirrup"), bars=flags.get("bars"), support=flags.get("support"),
            exposure=flags.get("exposure", "not-exposed"),
            order=flags.get("order", "practical"), waive_as_min="waive-as-min" in switches,
            layers=2 if layers is None else (int(layers) if layers.strip() in ("1", "2")
                                             else layers)).to_dict()
    inputs = {"units": flags["units"], "spiral": "spiral" in switches,
              **{NUMBER_FLAGS[f]: number(f) for f in
                 ("fc", "fy", "b", "d", "as", "dt", "es", "h", "bf", "hf", "asc", "dc")}}
    layers = flags.get("layer", [])
    layers = [layers] if isinstance(layers, str) else layers
    inputs["layers"] = [tuple(float(part) for part in text.split("@")) for text in layers]
    if any(len(pair) != 2 for pair in inputs["layers"]):
        raise ValueError("not AREA@DEPTH")
    if command == "curve":
        points = int(flags["points"])
        if not 2 <= points <= 100_000:
            raise ValueError("points")
        return engine.capacity_curve(**inputs, points=points).to_dict()
    return engine.check(**inputs, Mu=number("mu")).to_dict()


def judge(command, flag, value, flags, switches, status, out, err, trace) -> str | None:
    """Why the outcome breaks the contract, or None."""
    if trace:
        return f"raised {trace[:300]}"
    if "Traceback" in err:
        return "traceback on stderr"
    if status == 2:
        if err.count("\n") != 1 or not err.endswith("\n"):
            return f"{err.count(chr(10))} lines on stderr: {shown(err, 300)}"
        if len(err) > 600:
            return f"a {len(err):,}-character message"
        if not names_the_flag(err, flag, value):
            return f"the message does not name --{flag}: {shown(err, 300)}"
        return None
    if status != 0:
        return f"exit status {status}: {shown(err, 300)}"
    # Accepted: the result must be the API's for the same value.
    if command == "batch":
        data = json.loads(out)
        return None if data["summary"]["rows"] == 13 else "batch lost rows"
    if flag in ("project", "mark", "engineer", "date", "out", "link-base") + SWITCHES:
        if flag == "date" and not re.fullmatch(r"\d{4}-\d{2}-\d{2}", value):
            return f"accepted the date {shown(value)}"
        return None
    try:
        expected = reference(command, flags, switches)
    except (ValueError, TypeError, OverflowError) as error:
        return f"exit 0, but the API refuses the same value ({type(error).__name__}: {error})"
    got = json.loads(out)
    if command == "report":
        got.pop("out"), got.pop("link")
    if json.dumps(got, sort_keys=True) != json.dumps(expected, sort_keys=True):
        return "exit 0 with a result other than the API's for the same value"
    return None


def one_case(rng: random.Random) -> tuple[str, list[str], str | None, float]:
    """One hostile call: its description, argv, why it broke the contract (or None), seconds."""
    command = rng.choice(sorted(FLAGS))
    flag = rng.choice(FLAGS[command])
    value = hostile_value(rng)
    flags = dict(BASES[command])
    switches = {"json"}
    if flag in SWITCHES:
        flags[flag] = value  # a switch given a value: argparse must refuse it in one line
        switches.discard(flag)
    else:
        flags.update(PARTNERS.get(flag, {}))
        flags[flag] = value
    argv = argv_of(command, flags, switches)
    start = time.perf_counter()
    status, out, err, trace = run_main(argv)
    seconds = time.perf_counter() - start
    why = judge(command, flag, value, flags, switches, status, out, err, trace)
    return f"{command} --{flag}={shown(value)}", argv, why, seconds


def test_every_subcommand_keeps_its_bad_input_contract(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    shutil.copy(DEMO, tmp_path / "schedule.csv")
    rng = random.Random(seed())
    account = Account("CLI contract (in process)")
    for case in range(size("CLI", 250)):
        description, argv, why, seconds = one_case(rng)
        account.timed(description, seconds)
        if why:
            account.fail(f"case {case} {description}", why)
        for path in tmp_path.iterdir():  # keep the folder small: hostile --out names pile up
            if path.name not in ("schedule.csv",) and path.is_file():
                path.unlink()
    print(account.report())
    assert not account.failures, account.report()


PROCESS_CASES = [
    pytest.param(["check", "--units", "us", b"--fc=\xff4000", "--fy", "60000", "--b", "12",
                  "--d", "21.5", "--as", "3.16"], "fc", id="check-fc-bytes"),
    pytest.param(["curve", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12",
                  "--d", "21.5", "--as", "3.16", "--points", "nan"], "points", id="curve-points"),
    pytest.param(["design", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "14",
                  "--h", "24", "--mu", "190", b"--stirrup=#\xff"], "stirrup", id="design-stirrup"),
    pytest.param(["report", "--units", "us", "--fc", "4000", "--fy", "60000", "--b", "12",
                  "--d", "21.5", "--as", "3.16", "--out", "s.html", b"--project=\xfe\xff"],
                 "project", id="report-project-bytes"),
    pytest.param(["batch", b"\xff.csv"], "csv", id="batch-file-name-bytes"),
    pytest.param(["batch", "schedule.csv", "--out", b"no/such/\xff/r.csv"], "out",
                 id="batch-out-missing-folder"),
    pytest.param(["check", "--units", "us", "--fc", "4" * 100_000 + "x", "--fy", "60000",
                  "--b", "12", "--d", "21.5", "--as", "3.16"], "fc", id="check-100-kB"),
]


@pytest.mark.parametrize("args, name", PROCESS_CASES[:max(1, size("CLI_PROCESSES", 7))])
def test_bad_input_as_a_user_gives_it(tmp_path, args, name):
    shutil.copy(DEMO, tmp_path / "schedule.csv")
    package_root = Path(engine.__file__).resolve().parent.parent
    env = dict(os.environ, PYTHONPATH=str(package_root))
    done = subprocess.run([sys.executable, "-m", "engine", *args], cwd=tmp_path, env=env,
                          capture_output=True, timeout=60)
    assert done.returncode == 2, done.stderr
    assert b"Traceback" not in done.stderr and done.stderr.count(b"\n") == 1, done.stderr
    assert name.encode() in done.stderr.lower() and len(done.stderr) < 400, done.stderr
    assert done.stdout == b""


def test_the_hostile_list_is_hostile():
    # Guards the fuzz itself: most listed values are not plain finite numbers.
    plain = [v for v in HOSTILE if re.fullmatch(r"[+-]?[0-9]+(\.[0-9]*)?([eE][+-]?[0-9]+)?", v)
             and math.isfinite(float(v))]
    assert len(plain) < len(HOSTILE) / 3
