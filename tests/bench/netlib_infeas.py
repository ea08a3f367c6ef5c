#!/usr/bin/env python3
"""Benchmark of `plumb solve` on the infeasible Netlib LPs: solve, check each Farkas certificate,
compare the time with a floating-point solver's reference, and write the results into
docs/benchmarks.md.

    tests/bench/netlib_infeas.py [SHARED] [--plumb BIN] [--time-limit S] [--only a,b] [--output FILE]

SHARED is the shared data folder (holding netlib-infeas/) or the netlib-infeas folder itself; by
default ../shared beside the repository.  Each instance runs as its own `plumb solve --json`
process (tests/bench/netlib_solve.py runs it and checks the certificate with `plumb check`); an
instance counts as proven when it exits with the infeasible status and `plumb check` accepts its
certificate.  reference-float-seconds.csv beside the models gives the wall seconds a good
floating-point solver takes to declare each one infeasible on this machine; the ratio is plumb's
wall seconds over those.

Python 3 standard library only.  Figures, not a test: nothing here passes or fails.
"""

import datetime
import os
import statistics
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
import netlib_solve  # noqa: E402  (the solve-and-check runner and the section writer)

REPO = netlib_solve.REPO
BEGIN = "<!-- netlib_infeas.py results: begin -->"
END = "<!-- netlib_infeas.py results: end -->"


def parse_arguments():
    parser = netlib_solve.argument_parser(
        __doc__.split("\n\n")[0], "shared data folder holding netlib-infeas/, or that folder (default ../shared)", 120)
    return parser.parse_args()


def infeas_folder(shared):
    folder = Path(shared)
    for candidate in (folder / "netlib-infeas", folder):
        if (candidate / "reference-float-seconds.csv").is_file():
            return candidate
    sys.exit(f"netlib_infeas.py: no reference-float-seconds.csv in {folder} or {folder / 'netlib-infeas'}")


def proven(result):
    return result["status"] == "infeasible" and result["certified"]


def table_row(result, references):
    stats = result.get("stats", {})
    reference = references.get(result["instance"])
    notes = []
    if stats.get("correction_rounds"):
        notes.append(f"{stats['correction_rounds']} correction round(s), {stats.get('correction_iterations', 0)} float iterations")
    if stats.get("zero_cost_search"):
        notes.append("zero-cost search")
    if stats.get("fell_back"):
        notes.append(netlib_solve.fell_back_note(stats))
    if result.get("message"):
        notes.append(result["message"][0].removeprefix("plumb: ").split(";")[0])
    value = netlib_solve.ratio(result, references)
    cells = [result["instance"], result["status"], "yes" if result["certified"] else "no",
             netlib_solve.seconds_text(stats.get("float_seconds")), netlib_solve.seconds_text(stats.get("certify_seconds")),
             netlib_solve.seconds_text(result["total_seconds"]), str(stats.get("float_iterations", "")),
             str(stats.get("exact_iterations", "")), f"{result['peak_mib']:.0f}",
             "" if reference is None else f"{reference:.3f}", "" if value is None else f"{value:.1f}", "; ".join(notes)]
    return "| " + " | ".join(cell.replace("|", "/") for cell in cells) + " |"


def summary_line(results, references):
    total = sum(r["total_seconds"] for r in results)
    slowest = max(results, key=lambda r: r["total_seconds"], default=None)
    ratios = [value for value in (netlib_solve.ratio(r, references) for r in results) if value is not None]
    median_seconds = statistics.median(r["total_seconds"] for r in results) if results else 0
    peak = max((r["peak_mib"] for r in results), default=0)
    slowest_text = f"{slowest['total_seconds']:.2f} s ({slowest['instance']})" if slowest else "n/a"
    ratio_text = f"{statistics.median(ratios):.1f}" if ratios else "n/a"
    return (f"proven {sum(proven(r) for r in results)}/{len(results)}, total {total:.1f} s, slowest {slowest_text}, "
            f"median {median_seconds:.2f} s, median ratio to reference {ratio_text}, "
            f"exact pivots {sum(r.get('stats', {}).get('exact_iterations', 0) for r in results)}, peak {peak:.0f} MiB")


def section(results, references, time_limit, started, revision, load_before, load_after):
    header = ["instance", "status", "certified", "float s", "certify s", "total s", "float iterations",
              "exact pivots", "peak MiB", "reference s", "ratio", "notes"]
    lines = [BEGIN, "",
             f"### {started:%Y-%m-%d %H:%M} UTC, revision {revision}, limit {time_limit:g} s per instance", "",
             f"Load average {load_before:.1f} at the start and {load_after:.1f} at the end "
             f"({os.cpu_count()} cores).", "",
             "| " + " | ".join(header) + " |", "|" + "|".join("---" for _ in header) + "|"]
    lines += [table_row(r, references) for r in results]
    lines += ["", summary_line(results, references), "", END]
    return "\n".join(lines)


def main():
    options = parse_arguments()
    folder = infeas_folder(options.shared)
    references = netlib_solve.reference_seconds(folder)
    models = netlib_solve.selected_models(folder, options.only)
    started = datetime.datetime.now(datetime.timezone.utc)
    revision = netlib_solve.git_revision()
    load_before = os.getloadavg()[0]
    results = []
    with tempfile.TemporaryDirectory(prefix="plumb-infeas-bench-") as scratch:
        for model in models:
            result = netlib_solve.solve_instance(options.plumb, model, Path(scratch), options.time_limit)
            results.append(result)
            stats = result.get("stats", {})
            print(f"{result['instance']:10} {result['status']:10} certified={'yes' if result['certified'] else 'no ':3} "
                  f"total {result['total_seconds']:7.2f} s  float {stats.get('float_seconds', 0):7.2f} s  "
                  f"certify {stats.get('certify_seconds', 0):7.2f} s  exact pivots {stats.get('exact_iterations', 0):6}",
                  file=sys.stderr, flush=True)
    text = section(results, references, options.time_limit, started, revision, load_before, os.getloadavg()[0])
    netlib_solve.write_section(options.output, text, BEGIN, END)
    print(summary_line(results, references))


if __name__ == "__main__":
    main()
