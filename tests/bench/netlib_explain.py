#!/usr/bin/env python3
"""Benchmark of `plumb explain` on the infeasible Netlib LPs: find and certify an irreducible
infeasible subsystem of each, check each certificate again with `plumb check`, and write the
results into docs/benchmarks.md.

    tests/bench/netlib_explain.py [SHARED] [--plumb BIN] [--time-limit S] [--only a,b] [--output FILE]

SHARED is the shared data folder (holding netlib-infeas/) or that folder itself; by default
../shared beside the repository.  Each instance runs as its own `plumb explain --json` process; it
runs with `--ways-out 0`: the IIS search and its proof are measured, not the ways out (one exact
LP per member, docs/explaining.md).  It counts as proven when it exits with the infeasible status (10) and `plumb check --expect
infeasible_subsystem` accepts its certificate.  Per instance: the IIS's row sides and bounds, the
hard entries it uses, the sub-solves, float and exact seconds, wall seconds and peak memory.
Summary: `proven N/27, total T s, median members M`.

Python 3 standard library only.  Figures, not a test: nothing here passes or fails.
"""

import datetime
import json
import os
import statistics
import subprocess
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
import netlib_infeas  # noqa: E402  (the folder lookup)
import netlib_solve  # noqa: E402  (the measured runner and the section writer)

BEGIN = "<!-- netlib_explain.py results: begin -->"
END = "<!-- netlib_explain.py results: end -->"
EXIT_WORDS = {0: "feasible", 10: "infeasible", 3: "stopped", 1: "bad input", 4: "rejected"}


def explain_instance(plumb, model, scratch, time_limit):
    name, certificate, stdout_path, stderr_path, code, seconds, peak = netlib_solve.run_command(
        plumb, "explain", model, scratch, time_limit, ("--ways-out", "0"))
    result = {"instance": name, "exit": code, "total_seconds": seconds, "peak_mib": peak,
              "status": EXIT_WORDS.get(code, "killed" if code < 0 else f"exit {code}"), "certified": False}
    if code in (0, 10):
        answer = json.loads(stdout_path.read_text())
        result["status"] = answer["status"]
        result["sizes"] = answer["sizes"]
        result["search"] = answer["search"]
        result["peak_mib"] = answer["search"].get("peak_memory_mib", peak)
        check = subprocess.run([plumb, "check", str(model), str(certificate), "--expect", "infeasible_subsystem"],
                               capture_output=True, text=True, stdin=subprocess.DEVNULL)
        result["certified"] = check.returncode == 0
    else:
        result["message"] = stderr_path.read_text(errors="replace").strip().splitlines()[-1:]
    for path in (certificate, stdout_path, stderr_path):
        path.unlink(missing_ok=True)
    return result


def proven(result):
    return result["status"] == "infeasible_subsystem" and result["certified"]


def table_row(result):
    sizes, search = result.get("sizes", {}), result.get("search", {})
    orders = "; ".join(f"{o['order']}: {o['members']}" for o in search.get("orders", []))
    note = result["message"][0].removeprefix("plumb: ")[:90] if result.get("message") else ""
    cells = [result["instance"], result["status"], "yes" if result["certified"] else "no",
             str(sizes.get("row_sides", "")), str(sizes.get("bounds", "")), str(sizes.get("first_support", "")),
             orders, str(search.get("sub_solves", "")), netlib_solve.seconds_text(search.get("float_seconds")),
             netlib_solve.seconds_text(search.get("exact_seconds")), netlib_solve.seconds_text(result["total_seconds"]),
             f"{result['peak_mib']:.0f}", note]
    return "| " + " | ".join(cell.replace("|", "/") for cell in cells) + " |"


def summary_line(results):
    total = sum(r["total_seconds"] for r in results)
    members = [r["sizes"]["members"] for r in results if proven(r)]
    median = f"{statistics.median(members):g}" if members else "n/a"
    return f"proven {sum(proven(r) for r in results)}/{len(results)}, total {total:.1f} s, median members {median}"


def section(results, time_limit, started, revision, load_before, load_after):
    header = ["instance", "status", "certified", "IIS rows", "IIS bounds", "first support", "members per order",
              "sub-solves", "float s", "exact s", "total s", "peak MiB", "notes"]
    slowest = max(results, key=lambda r: r["total_seconds"], default=None)
    lines = [BEGIN, "",
             f"### {started:%Y-%m-%d %H:%M} UTC, revision {revision}, limit {time_limit:g} s per instance", "",
             f"Load average {load_before:.1f} at the start and {load_after:.1f} at the end "
             f"({os.cpu_count()} cores)."
             + (f" Slowest: {slowest['instance']}, {slowest['total_seconds']:.2f} s." if slowest else ""), "",
             "| " + " | ".join(header) + " |", "|" + "|".join("---" for _ in header) + "|"]
    lines += [table_row(r) for r in results]
    lines += ["", summary_line(results), "", END]
    return "\n".join(lines)


def main():
    parser = netlib_solve.argument_parser(
        __doc__.split("\n\n")[0], "shared data folder holding netlib-infeas/, or that folder (default ../shared)", 60)
    options = parser.parse_args()
    folder = netlib_infeas.infeas_folder(options.shared)
    models = netlib_solve.selected_models(folder, options.only)
    started = datetime.datetime.now(datetime.timezone.utc)
    revision = netlib_solve.git_revision()
    load_before = os.getloadavg()[0]
    results = []
    with tempfile.TemporaryDirectory(prefix="plumb-explain-bench-") as scratch:
        for model in models:
            result = explain_instance(options.plumb, model, Path(scratch), options.time_limit)
            results.append(result)
            sizes, search = result.get("sizes", {}), result.get("search", {})
            print(f"{result['instance']:10} {result['status']:20} certified={'yes' if result['certified'] else 'no ':3} "
                  f"rows {sizes.get('row_sides', '-'):>4} bounds {sizes.get('bounds', '-'):>4} "
                  f"sub-solves {search.get('sub_solves', '-'):>5} total {result['total_seconds']:7.2f} s",
                  file=sys.stderr, flush=True)
    text = section(results, options.time_limit, started, revision, load_before, os.getloadavg()[0])
    netlib_solve.write_section(options.output, text, BEGIN, END)
    print(summary_line(results))


if __name__ == "__main__":
    main()
