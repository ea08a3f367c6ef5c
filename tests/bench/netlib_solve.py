#!/usr/bin/env python3
"""Benchmark of `plumb solve` on the Netlib LPs: solve, check each certificate, compare with the
exact optima (exact-optima.csv: T. Koch, "The final NETLIB-LP results", Oper. Res. Letters 32,
2004) and, where none is listed, the published ones, and write the results into docs/benchmarks.md.

    tests/bench/netlib_solve.py [SHARED] [--plumb BIN] [--time-limit S] [--only a,b] [--output FILE]

SHARED is the shared data folder (holding netlib/) or the netlib folder itself; by default
../shared beside the repository.  Each instance runs as its own `plumb solve --json` process with
--time-limit S; the certificate it writes is then checked by `plumb check`.  Timings come from the
"stats" object of solve's JSON and the wall clock of the solve process; peak memory is plumb's
own high-water mark from its stats (ru_maxrss from wait4 for a run that printed none).
reference-float-seconds.csv beside the models gives the wall seconds of a good floating-point
dual simplex with presolve on each instance, measured on this kind of machine: the ratio is
plumb's wall seconds over those, per instance and in total.  The floor of an instance is the wall
time of its `plumb check` process, which reads the model and the certificate and checks it: a
certified solve cannot take less than reading plus checking.  The table
goes between the result markers of the output file (the rest of the file is kept); without
markers the section is put after the file's first paragraph.

Python 3 standard library only.  Figures, not a test: nothing here passes or fails.
"""

import argparse
import csv
import datetime
import json
import os
import re
import statistics
import subprocess
import sys
import tempfile
import threading
import time
from fractions import Fraction
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
BEGIN = "<!-- netlib_solve.py results: begin -->"
END = "<!-- netlib_solve.py results: end -->"

# Exit statuses of plumb (README): what each means for a solve.
EXIT_WORDS = {0: "optimal", 10: "infeasible", 11: "unbounded", 3: "stopped", 1: "bad input", 4: "rejected"}

# Extra seconds a solve may take beyond its own --time-limit before the script kills it (reading
# the model and writing output fall outside plumb's limit).
KILL_GRACE_SECONDS = 60


def argument_parser(description, folder_help, time_limit):
    """The options both Netlib benchmarks take."""
    parser = argparse.ArgumentParser(description=description)
    parser.add_argument("shared", nargs="?", default=str(REPO.parent / "shared"), help=folder_help)
    parser.add_argument("--plumb", default=str(REPO / "build" / "plumb"), help="the plumb binary (default build/plumb)")
    parser.add_argument("--time-limit", type=float, default=time_limit,
                        help=f"seconds per instance (default {time_limit:g})")
    parser.add_argument("--only", default="", help="comma-separated instance names (default: all)")
    parser.add_argument("--output", default=str(REPO / "docs" / "benchmarks.md"),
                        help="markdown file to update (default docs/benchmarks.md); '-' prints the section")
    return parser


def parse_arguments():
    return argument_parser(__doc__.split("\n\n")[0],
                           "shared data folder holding netlib/, or the netlib folder (default ../shared)", 60).parse_args()


def selected_models(folder, only):
    """The folder's models, sorted, or those named in `only` (comma-separated)."""
    models = sorted(folder.glob("*.mps.gz"))
    if only:
        wanted = set(only.split(","))
        models = [m for m in models if m.name[: -len(".mps.gz")] in wanted]
    return models


def netlib_folder(shared):
    folder = Path(shared)
    if (folder / "netlib" / "published.csv").is_file():
        return folder / "netlib"
    if (folder / "published.csv").is_file():
        return folder
    sys.exit(f"netlib_solve.py: no published.csv in {folder} or {folder / 'netlib'}")


def published_optima(folder):
    """instance -> published optimum text ("" when none is published), in the file's order."""
    with open(folder / "published.csv", newline="") as table:
        return {row["instance"]: row["published_optimum"].strip() for row in csv.DictReader(table)}


def exact_optima(folder):
    """instance -> (exact optimum rounded, its significant digits), from exact-optima.csv if present."""
    path = folder / "exact-optima.csv"
    if not path.is_file():
        return {}
    with open(path, newline="") as table:
        return {row["instance"]: (row["exact_optimum_rounded"].strip(), int(row["digits"]))
                for row in csv.DictReader(table)}


def significant_digit_unit(value, digits):
    """The place value of the last of `digits` significant digits of a nonzero value."""
    exponent = 0
    magnitude = abs(value)
    while magnitude >= Fraction(10) ** (exponent + 1):
        exponent += 1
    while magnitude < Fraction(10) ** exponent:
        exponent -= 1
    return Fraction(10) ** (exponent - digits + 1)


def last_digit_unit(text):
    """The place value of the last digit of a published decimal: '5.5018458883E+03' -> 1e-7."""
    match = re.fullmatch(r"[+-]?(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?", text)
    if not match:
        raise ValueError(f"published value {text!r} is not a decimal")
    fraction_digits = len(match.group(2) or "")
    exponent = int(match.group(3) or 0)
    return Fraction(10) ** (exponent - fraction_digits)


def reference_seconds(folder):
    """instance -> a good floating-point solver's wall seconds (reference-float-seconds.csv), or {}."""
    path = folder / "reference-float-seconds.csv"
    if not path.is_file():
        return {}
    with open(path, newline="") as table:
        return {row["instance"]: float(row["wall_seconds"]) for row in csv.DictReader(table)}


def ratio(result, references):
    """plumb's wall seconds over the reference's, or None when the reference lists no time."""
    reference = references.get(result["instance"])
    return result["total_seconds"] / reference if reference else None


def run_measured(command, stdout_path, stderr_path, kill_after):
    """Runs command with output to files; returns (exit status, wall seconds, peak MiB).  Waits in a
    blocking wait4, with a timer to kill the run at its deadline: a polling loop had rounded every time
    up to its 20 ms tick, a third of the time of the smallest instances."""
    with open(stdout_path, "wb") as out, open(stderr_path, "wb") as err:
        start = time.monotonic()
        process = subprocess.Popen(command, stdout=out, stderr=err, stdin=subprocess.DEVNULL)
        killer = threading.Timer(kill_after, process.kill)
        killer.start()
        try:
            _, status, usage = os.wait4(process.pid, 0)
        finally:
            killer.cancel()
        seconds = time.monotonic() - start
    process.returncode = os.waitstatus_to_exitcode(status)
    return process.returncode, seconds, usage.ru_maxrss / 1024  # ru_maxrss is in KiB on Linux


def run_command(plumb, command_name, model, scratch, time_limit, extra=()):
    """Runs `plumb COMMAND MODEL --json --quiet --time-limit S --certificate FILE [EXTRA...]`, measured; returns
    (instance name, certificate path, stdout path, stderr path, exit status, wall seconds, peak MiB)."""
    name = model.name[: -len(".mps.gz")]
    certificate = scratch / f"{name}.certificate.json"
    stdout_path, stderr_path = scratch / f"{name}.out.json", scratch / f"{name}.err"
    command = [plumb, command_name, str(model), "--json", "--quiet", "--time-limit", f"{time_limit:g}",
               "--certificate", str(certificate), *extra]
    code, seconds, peak = run_measured(command, stdout_path, stderr_path, time_limit + KILL_GRACE_SECONDS)
    return name, certificate, stdout_path, stderr_path, code, seconds, peak


def solve_instance(plumb, model, scratch, time_limit):
    name, certificate, stdout_path, stderr_path, code, seconds, peak = run_command(
        plumb, "solve", model, scratch, time_limit)
    result = {"instance": name, "exit": code, "total_seconds": seconds, "peak_mib": peak,
              "status": EXIT_WORDS.get(code, "killed" if code < 0 else f"exit {code}"), "certified": False}
    if code in (0, 10, 11):
        answer = json.loads(stdout_path.read_text())
        result["status"] = answer["status"]
        result["stats"] = answer.get("stats", {})
        # plumb's own high-water mark; ru_maxrss also counts this script's memory copied by fork.
        result["peak_mib"] = result["stats"].get("peak_memory_mib", peak)
        if "objective" in answer:
            result["objective"] = Fraction(answer["objective"]["fraction"])
            result["objective_decimal"] = ("~" if answer["objective"]["rounded"] else "") + answer["objective"]["decimal"]
            result["constant"] = Fraction(answer["objective_constant"]["fraction"])
        check_started = time.monotonic()
        check = subprocess.run([plumb, "check", str(model), str(certificate), "--json"],
                               capture_output=True, text=True, stdin=subprocess.DEVNULL)
        result["check_seconds"] = time.monotonic() - check_started
        result["certified"] = check.returncode == 0 and json.loads(check.stdout).get("valid") is True
    else:
        result["message"] = stderr_path.read_text(errors="replace").strip().splitlines()[-1:]
        if code == 3 and stdout_path.stat().st_size:  # stopped at its limit: the figures so far
            result["stats"] = json.loads(stdout_path.read_text()).get("stats", {})
            result["peak_mib"] = result["stats"].get("peak_memory_mib", peak)
    for path in (certificate, stdout_path, stderr_path):
        path.unlink(missing_ok=True)
    return result


def agreement(result, published, exact=None):
    """'yes, N exact digits' or 'no' against exact-optima.csv when it lists the instance, else 'yes
    (published)' or 'no' against published.csv, else '' (nothing to compare).  Both leave the
    objective constant out; agreement is within half a unit of the last digit given."""
    if "objective" not in result:
        return ""
    value = result["objective"] - result["constant"]
    if exact:
        listed, digits = exact
        unit = significant_digit_unit(Fraction(listed), digits) if Fraction(listed) else Fraction(10) ** -digits
        return f"yes, {digits} exact digits" if abs(value - Fraction(listed)) * 2 <= unit else "no"
    if not published:
        return ""
    return "yes (published)" if abs(value - Fraction(published)) * 2 <= last_digit_unit(published) else "no"


def seconds_text(value):
    return "" if value is None else f"{value:.4f}"


def fell_back_note(stats):
    """The note of a solve whose float search failed (the exact engine took over from its basis)."""
    return (f"float search failed ({stats.get('float_note', '')}); "
            f"exact engine from its basis {stats.get('certify_seconds', 0):.3f} s")


def table_row(result, published, exact, references):
    stats = result.get("stats", {})
    notes = []
    if stats.get("correction_rounds"):
        rounds = stats["correction_rounds"]
        notes.append(f"{rounds} correction round{'s' if rounds > 1 else ''} ({stats.get('correction_iterations', 0)} float iterations)")
    if stats.get("exact_iterations") and not stats.get("fell_back"):
        notes.append("exact repair pivots")
    elif stats.get("repaired") and not stats.get("correction_rounds"):
        notes.append("repaired")
    if stats.get("fell_back"):
        notes.append(fell_back_note(stats))
    if result.get("constant"):
        notes.append(f"compared without the objective constant {float(result['constant']):.12g}")
    if result["status"] == "killed":
        notes.append(f"did not stop at its time limit; killed after {result['total_seconds']:.0f} s")
    elif result.get("message"):
        notes.append(result["message"][0].removeprefix("plumb: ").split(";")[0])
    iterations = ""
    if stats:
        iterations = f"{stats.get('float_iterations', 0)} + {stats.get('exact_iterations', 0)}"
    cells = [result["instance"], result["status"], "yes" if result["certified"] else "no",
             result.get("objective_decimal", ""), published or "(none)", agreement(result, published, exact),
             seconds_text(stats.get("float_seconds")), seconds_text(stats.get("certify_seconds")),
             seconds_text(result["total_seconds"]), iterations, f"{result['peak_mib']:.0f}",
             seconds_text(result.get("check_seconds")), seconds_text(references.get(result["instance"])),
             ratio_text(ratio(result, references)), "; ".join(notes)]
    return "| " + " | ".join(cell.replace("|", "/") for cell in cells) + " |"


def ratio_text(value):
    return "" if value is None else f"{value:.1f}"


def over_reference_bound(result, references):
    """True when the instance took more than 3 times its reference plus 0.05 s (issue 16's bound)."""
    reference = references.get(result["instance"])
    return reference is not None and result["total_seconds"] > 3 * reference + 0.05


def slowest_table(results, references, count=10):
    """The `count` slowest instances: plumb's seconds, the reference's, the floor (plumb check)."""
    header = ["instance", "plumb s", "reference s", "ratio", "floor s (plumb check)", "plumb / floor"]
    lines = ["| " + " | ".join(header) + " |", "|" + "|".join("---" for _ in header) + "|"]
    for r in sorted(results, key=lambda r: r["total_seconds"], reverse=True)[:count]:
        floor = r.get("check_seconds")
        cells = [r["instance"], seconds_text(r["total_seconds"]), seconds_text(references.get(r["instance"])),
                 ratio_text(ratio(r, references)), seconds_text(floor),
                 ratio_text(r["total_seconds"] / floor if floor else None)]
        lines.append("| " + " | ".join(cells) + " |")
    return lines


def summary_line(results, references):
    certified = sum(r["certified"] for r in results)
    total = sum(r["total_seconds"] for r in results)
    # Over the certified instances whose float search found a basis (not those that fell back).
    ratios = [r["stats"]["certify_seconds"] / r["stats"]["float_seconds"] for r in results
              if r["certified"] and r.get("stats", {}).get("float_seconds", 0) > 0 and "certify_seconds" in r["stats"]
              and not r["stats"].get("fell_back")]
    ratio = f"{statistics.median(ratios):.2f}" if ratios else "n/a"
    peak = max((r["peak_mib"] for r in results), default=0)
    compared = [r for r in results if r["instance"] in references]
    reference_total = sum(references[r["instance"]] for r in compared)
    plumb_compared = sum(r["total_seconds"] for r in compared)
    total_ratio = f"{plumb_compared / reference_total:.2f}" if reference_total else "n/a"
    over = sum(over_reference_bound(r, references) for r in results)
    floor = sum(r.get("check_seconds", 0) for r in results)
    return (f"certified {certified}/{len(results)}, total {total:.1f} s, reference {reference_total:.1f} s, "
            f"ratio {total_ratio}, over 3x reference + 0.05 s: {over}, floor (plumb check) {floor:.1f} s, "
            f"median certify/float {ratio}, peak {peak:.0f} MiB")


def git_revision():
    try:
        revision = subprocess.run(["git", "-C", str(REPO), "rev-parse", "--short", "HEAD"], capture_output=True,
                                  text=True, check=True).stdout.strip()
        dirty = subprocess.run(["git", "-C", str(REPO), "status", "--porcelain", "--untracked-files=no"],
                               capture_output=True, text=True).stdout.strip()
        return revision + (" with local changes" if dirty else "")
    except (OSError, subprocess.CalledProcessError):
        return "unknown revision"


def section(results, optima, exact, references, time_limit, started, revision, load_before, load_after):
    header = ["instance", "status", "certified", "objective (exact, decimal)", "published", "agrees",
              "float s", "certify s", "total s", "iterations float + exact", "peak MiB", "floor s",
              "reference s", "ratio", "notes"]
    lines = [BEGIN, "",
             f"### {started:%Y-%m-%d %H:%M} UTC, revision {revision}, limit {time_limit:g} s per instance", "",
             f"Load average {load_before:.1f} at the start and {load_after:.1f} at the end "
             f"({os.cpu_count()} cores).", "",
             "| " + " | ".join(header) + " |", "|" + "|".join("---" for _ in header) + "|"]
    lines += [table_row(r, optima.get(r["instance"], ""), exact.get(r["instance"]), references) for r in results]
    differing = [r for r in results
                 if agreement(r, optima.get(r["instance"], ""), exact.get(r["instance"])) == "no"]
    if differing:
        lines += ["", "Certified value and reference optimum differ (the exact optimum where exact-optima.csv "
                      "lists one, else the published one; both leave out the objective constant):", ""]
        for r in differing:
            value = r["objective"] - r["constant"]
            reference = exact[r["instance"]][0] if r["instance"] in exact else optima[r["instance"]]
            relative = abs(value - Fraction(reference)) / abs(Fraction(reference)) if Fraction(reference) else abs(value)
            lines.append(f"- {r['instance']}: certified {r['objective_decimal']}"
                         + (f" ({float(value):.11g} without the constant)" if r["constant"] else "")
                         + f", reference {reference}, relative difference {float(relative):.2g}")
    lines += ["", "The ten slowest, against the reference and the floor (reading and checking):", ""]
    lines += slowest_table(results, references)
    lines += ["", summary_line(results, references), "", END]
    return "\n".join(lines)


def write_section(output, text, begin=BEGIN, end=END):
    """Puts text (which starts with `begin` and ends with `end`) in place of the marked section."""
    if output == "-":
        print(text)
        return
    path = Path(output)
    document = path.read_text() if path.exists() else "# Benchmarks\n"
    if begin in document and end in document:
        head, rest = document.split(begin, 1)
        document = head + text + rest.split(end, 1)[1]
    else:  # after the title and first paragraph
        parts = document.split("\n\n", 2)
        document = "\n\n".join(parts[:2] + [text] + parts[2:])
    path.write_text(document)


def main():
    # Exact objectives run to thousands of digits (dfl001's fraction has over 7000).
    if hasattr(sys, "set_int_max_str_digits"):
        sys.set_int_max_str_digits(0)
    options = parse_arguments()
    folder = netlib_folder(options.shared)
    optima = published_optima(folder)
    exact = exact_optima(folder)
    references = reference_seconds(folder)
    models = selected_models(folder, options.only)
    started = datetime.datetime.now(datetime.timezone.utc)
    revision = git_revision()  # of the tree as the run starts
    load_before = os.getloadavg()[0]
    results = []
    with tempfile.TemporaryDirectory(prefix="plumb-netlib-bench-") as scratch:
        for model in models:
            result = solve_instance(options.plumb, model, Path(scratch), options.time_limit)
            results.append(result)
            stats = result.get("stats", {})
            print(f"{result['instance']:10} {result['status']:10} certified={'yes' if result['certified'] else 'no ':3} "
                  f"total {result['total_seconds']:7.2f} s  float {stats.get('float_seconds', 0):7.2f} s  "
                  f"certify {stats.get('certify_seconds', 0):7.2f} s  peak {result['peak_mib']:5.0f} MiB",
                  file=sys.stderr, flush=True)
    write_section(options.output, section(results, optima, exact, references, options.time_limit, started, revision,
                                          load_before, os.getloadavg()[0]))
    print(summary_line(results, references))


if __name__ == "__main__":
    main()
