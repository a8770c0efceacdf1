#!/usr/bin/python3
"""Every command's --help lists every option the command accepts.

The list is derived from the code, so this test cannot go stale: the
commands are those `plumb --help` prints (main.c's dispatch table), each
checked to have its src/cli/cmd_<name>.c; the candidate options are every
string literal in src/cli/*.c spelt like an option ("--alt", "-o"). For
each command, each candidate is tried on the command line: unless plumb
answers "unknown option", the command accepts it, and then it must have a
line of its own in the "Options:" list of `plumb COMMAND --help`. The other
way round, every option the list names must be accepted. --help itself
must go to standard output with status 0 (README.md "Common options"), and no
line of plumb --help or of any command's --help is wider than 80
characters (80 columns: the classic terminal width, VT100 /
ECMA-48 default line; common practice, no source). The help of -o names
exactly the file-name extensions that set the command's format, as the
command itself takes or refuses them.
Usage: help.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import glob
import os
import re
import subprocess
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
import plumbcli  # noqa: E402
from plumbcli import ROOT, check, finish  # noqa: E402


_runs = {}


def plumb(*args):
    """plumbcli.plumb, once per command line: nothing here changes between two
    runs of the same arguments (no input, no file written), so a repeated
    question (an option both a candidate and listed) is answered by the same
    run's output instead of a second start of plumb."""
    if args not in _runs:
        _runs[args] = plumbcli.plumb(*args, stdin=subprocess.DEVNULL, timeout=60)
    return _runs[args]


# The commands, from `plumb --help` ("  NAME   one-line help" under "Commands:").
rc, out, err = plumb("--help")
check(rc == 0 and out.startswith("Usage: plumb"), "plumb --help: usage on stdout, status 0")
commands = re.findall(r"^  ([a-z]+) +\S", out.split("Commands:", 1)[-1].split("\n\n")[0], re.M)
sources = sorted(os.path.basename(p)[4:-2] for p in glob.glob(os.path.join(ROOT, "src/cli/cmd_*.c")))
check(commands and sorted(commands) == sources,
      f"plumb --help lists the commands of src/cli/cmd_*.c: {commands} vs {sources}")

# Candidate options: every option-like string literal of the command line's code.
candidates = set()
for path in glob.glob(os.path.join(ROOT, "src/cli/*.c")):
    with open(path, encoding="utf-8") as f:
        candidates |= set(re.findall(r'"(--?[a-z][a-z-]*)"', f.read()))
check({"--set", "--format", "-o", "--help"} <= candidates,
      f"the option literals were found in src/cli ({sorted(candidates)})")


def listed(help_text):
    """Options named at the start of a line of the Options: list."""
    section = help_text.split("\nOptions:\n", 1)
    if len(section) < 2:
        return set()
    names = set()
    for line in section[1].splitlines():
        m = re.match(r"^  (-[a-z]), (--[a-z][a-z-]*)\b", line) or re.match(r"^  (--[a-z][a-z-]*)\b", line)
        if m:
            names |= set(m.groups())
    return names


def accepted(cmd, opt):
    rc, out, err = plumb(cmd, opt)
    return "unknown option" not in err


for cmd in commands:
    rc, out, err = plumb(cmd, "--help")
    check(rc == 0 and out.startswith(f"Usage: plumb {cmd}") and err == "",
          f"{cmd} --help: usage on stdout, status 0 (got {rc}, {err.strip()!r})")
    names = listed(out)
    check(bool(names), f"{cmd} --help has an Options: list")
    for opt in sorted(candidates):
        if accepted(cmd, opt):
            check(opt in names, f"{cmd} accepts {opt} but its --help does not list it")
    for opt in sorted(names):
        check(accepted(cmd, opt), f"{cmd} --help lists {opt}, which {cmd} refuses")

# -o's help names every extension that sets the format, and only those
# (zone's once said ".json, .csv or .txt" though -o d.geojson writes
# GeoJSON: a help that leaves one out hides it). Which a command takes is asked of the command itself: a name it
# refuses is answered "-o NAME names ..." before anything is read or
# written (the profile named does not exist; the directory neither).
def o_help(help_text):
    """The help of -o, its continuation lines joined."""
    lines = help_text.split("\nOptions:\n", 1)[-1].splitlines()
    for k, line in enumerate(lines):
        if line.startswith("  -o, --output"):
            more = lines[k + 1:]
            end = next((n for n, l in enumerate(more) if not l.startswith(" " * 10)), len(more))
            return " ".join([line] + more[:end])
    return ""


missing = os.path.join(ROOT, "no-such-dir-help", "none.yaml")
for cmd in commands:
    rc, out, err = plumb(cmd, "--help")
    if "--format" not in listed(out) or "-o" not in listed(out):
        continue
    text = o_help(out)
    for ext in ("txt", "json", "csv", "geojson"):
        name = os.path.join(ROOT, "no-such-dir-help", "x." + ext)
        rc, o2, e2 = plumb(cmd, missing, "-o", name)
        takes = f"-o {name} names" not in e2
        check(takes == bool(re.search(r"\." + ext + r"\b", text)),
              f"{cmd}: -o x.{ext} {'sets' if takes else 'is refused as'} the format, "
              f"but -o's help {'does not name' if takes else 'names'} .{ext}: {text!r}")
    check("sets the" in text, f"{cmd}: -o's help says a name sets the format: {text!r}")

# Every --help fits an 80-column terminal, counted in characters (not
# bytes: "ft·lbf" is six wide).
WIDTH = 80
for cmd in [None] + commands:
    rc, out, err = plumb(*([cmd] if cmd else []), "--help")
    wide = [l for l in out.splitlines() if len(l) > WIDTH]
    check(rc == 0 and out and not wide,
          f"plumb {cmd + ' ' if cmd else ''}--help fits {WIDTH} columns: "
          f"{len(wide)} wider lines {[(len(l), l) for l in wide[:3]]}")
check(len(commands) >= 7, f"the width check covered every command: {commands}")

# One spelling of the foot-pound-force, as every report writes it: ft·lbf
# (NIST SP 811 (2008), 6.1.4: a product of units with a centred dot),
# never "ft-lbf" or "ft lbf" in a help's prose (typed values may take any).
for cmd in [None] + commands:
    rc, out, err = plumb(*([cmd] if cmd else []), "--help")
    prose = re.sub(r'"[^"]*"', "", out)  # an example value as typed may be spelt any way
    check(rc == 0 and not re.search(r"ft[- ]lbf", prose),
          f"plumb {cmd or ''} --help spells ft·lbf: {re.findall(r'.*ft[- ]lbf.*', prose)[:2]}")

# The options that were once missing from these commands' help, by name.
for cmd, opts in [("sweep", ["--vary"]), ("limit", ["--find", "--energy-max", "--speed-max", "--drift-max"])]:
    rc, out, err = plumb(cmd, "--help")
    for opt in opts:
        check(opt in listed(out), f"{cmd} --help lists {opt}")

finish()
