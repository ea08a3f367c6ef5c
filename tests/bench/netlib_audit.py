#!/usr/bin/env python3
"""Benchmark of `plumb audit` on the Netlib LPs: for each model, `plumb solve --json` gives the
exact optimum and duals; the optimum rounded to 6 significant digits is the plan another solver
might hand over, and the duals rounded to 6 digits are its duals.  Then three runs are timed:

  solve       plumb solve MODEL                         (the reference time)
  audit       plumb audit MODEL PLAN                    (findings, warm-started optimum, gap)
  bound       plumb audit MODEL PLAN --duals D --no-solve  (findings and the safe bound alone)

    tests/bench/netlib_audit.py [SHARED] [--plumb BIN] [--time-limit S] [--only a,b]

Wall times are of whole processes (reading the model included); the safe bound's own time is the
"seconds"/"dual_bound" figure of audit's JSON.  Ends with one summary line:
  audit N/91 in A s against solve S s; safe bound alone <= 0.1 s on K/M (all but the largest five), max B s

Python 3 standard library only.  Figures, not a test: nothing here passes or fails.
"""

import argparse
import json
import subprocess
import sys
import tempfile
import time
from fractions import Fraction
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]


def rounded(fraction_text, digits=6):
    value = Fraction(fraction_text)
    return f"{float(value):.{digits - 1}e}" if value != 0 else "0"


def timed(command, limit):
    start = time.monotonic()
    try:
        done = subprocess.run(command, capture_output=True, text=True, stdin=subprocess.DEVNULL, timeout=limit)
    except subprocess.TimeoutExpired:
        return None, time.monotonic() - start
    return done, time.monotonic() - start


def main():
    sys.set_int_max_str_digits(0)  # exact fractions of tens of thousands of digits (pilot87)
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("shared", nargs="?", default=str(REPO.parent / "shared"))
    parser.add_argument("--plumb", default=str(REPO / "build" / "plumb"))
    parser.add_argument("--time-limit", type=float, default=120)
    parser.add_argument("--only", default="")
    args = parser.parse_args()
    folder = Path(args.shared)
    folder = folder / "netlib" if (folder / "netlib").is_dir() else folder
    models = sorted(folder.glob("*.mps.gz"), key=lambda p: p.stat().st_size)
    if args.only:
        wanted = set(args.only.split(","))
        models = [m for m in models if m.name.split(".")[0] in wanted]
    largest_five = {m.name for m in models[-5:]} if not args.only else set()
    solve_total = audit_total = 0.0
    audited = 0
    bounds = []  # (name, seconds) for all but the largest five
    print(f"{'model':10} {'solve s':>9} {'audit s':>9} {'bound s':>9} {'exit':>4}  verdict / gap", flush=True)
    with tempfile.TemporaryDirectory() as scratch:
        for model in models:
            name = model.name.split(".")[0]
            solved, solve_seconds = timed([args.plumb, "solve", str(model), "--json", "--quiet"], args.time_limit)
            if solved is None or solved.returncode != 0:
                print(f"{name:10} solve failed or timed out", flush=True)
                continue
            result = json.loads(solved.stdout)
            plan = Path(scratch) / f"{name}.plan.csv"
            plan.write_text("name,value\n" + "".join(f"{e['name']},{rounded(e['fraction'])}\n" for e in result["x"]))
            duals = Path(scratch) / f"{name}.duals.csv"
            duals.write_text("".join(f"{e['name']},{rounded(e['fraction'])}\n" for e in result["y"]) or "name,value\n")
            audit, audit_seconds = timed([args.plumb, "audit", str(model), str(plan), "--json"], args.time_limit)
            bound, _ = timed([args.plumb, "audit", str(model), str(plan), "--duals", str(duals), "--no-solve", "--json"],
                             args.time_limit)
            solve_total += solve_seconds
            if audit is None or audit.returncode not in (0, 5, 6):
                print(f"{name:10} {solve_seconds:9.2f} audit failed: {audit and audit.returncode}", flush=True)
                continue
            audited += 1
            audit_total += audit_seconds
            report = json.loads(audit.stdout)
            bound_seconds = float("nan")
            if bound is not None and bound.returncode in (0, 5, 6) and result["y"]:
                bound_seconds = json.loads(bound.stdout)["seconds"]["dual_bound"]
            if model.name not in largest_five:
                bounds.append((name, bound_seconds))
            gap = report.get("gap", {}).get("relative")
            gap_text = f"gap {float(Fraction(gap)):.2e}" if gap is not None else "no gap"
            print(f"{name:10} {solve_seconds:9.2f} {audit_seconds:9.2f} {bound_seconds:9.4f} {audit.returncode:4}  "
                  f"{report['verdict']}, {len(report['findings'])} misses, {gap_text}", flush=True)
    fast = sum(1 for _, s in bounds if s <= 0.1)
    slowest = max((s for _, s in bounds if s == s), default=0.0)
    print(f"audit {audited}/{len(models)} in {audit_total:.1f} s against solve {solve_total:.1f} s; "
          f"safe bound alone <= 0.1 s on {fast}/{len(bounds)} (all but the largest five), max {slowest:.3f} s")


if __name__ == "__main__":
    sys.exit(main())
