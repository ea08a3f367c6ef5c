#!/usr/bin/env python3
"""Scaling benchmark of `plumb solve`: how the time per float iteration grows with the model.

    tests/bench/scaling.py [--plumb BIN] [--largest ROWS] [--time-limit S] [--keep DIR]

The family (invented scenario and data, fixed seed): a plant makes P products over T = 20 periods
on M = 10 machine groups.  Per product and period: make (units made), keep (units held in store
at the period's end) and buy (units bought in from outside at a premium, so every instance is
feasible); a balance row keep[t-1] + make + buy - keep[t] = demand per product and period links
the periods through storage, and a capacity row per machine group and period limits the hours
(each product needs hours on three groups).  Rows = T (P + M), columns = 3 P T: about 2.3 columns
per row, like the planning models users bring.  Sizes double from about 2 000 rows to at least
130 000 (--largest sets the last).

Per size: rows, columns, nonzeros, float iterations, float seconds, microseconds per iteration,
certification seconds, whole solve seconds (wall, reading included), peak memory and whether the
certificate was proven.  The summary line compares microseconds per iteration at the largest
size with those at a size 16 times smaller (the target of the speed work: at most 2 times).

Python 3 standard library only.  Figures, not a test: nothing here passes or fails.
"""

import argparse
import json
import random
import subprocess
import sys
import tempfile
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
PERIODS = 20
MACHINES = 10
SEED = 20261203


def write_model(path, products):
    """Writes one instance as free MPS (names without spaces, one or two entries a line)."""
    rng = random.Random(SEED + products)
    hours = []  # per product: [(machine, hours per unit)]
    for _ in range(products):
        groups = rng.sample(range(MACHINES), 3)
        hours.append([(g, rng.randint(5, 20) / 10) for g in groups])
    demand = [[rng.randint(0, 60) + (30 if t % 4 == 3 else 0) for t in range(PERIODS)] for _ in range(products)]
    load = [0.0] * MACHINES
    for p in range(products):
        average = sum(demand[p]) / PERIODS
        for g, h in hours[p]:
            load[g] += h * average
    capacity = [[round(load[g] * rng.uniform(0.85, 1.05)) for _ in range(PERIODS)] for g in range(MACHINES)]
    make_cost = [rng.randint(20, 80) for _ in range(products)]

    lines = ["NAME SCALING", "ROWS", " N COST"]
    lines += [f" E B{p}_{t}" for p in range(products) for t in range(PERIODS)]
    lines += [f" L C{g}_{t}" for g in range(MACHINES) for t in range(PERIODS)]
    lines.append("COLUMNS")
    for p in range(products):
        for t in range(PERIODS):
            lines.append(f" M{p}_{t} COST {make_cost[p]} B{p}_{t} 1")
            for g, h in hours[p]:
                lines.append(f" M{p}_{t} C{g}_{t} {h}")
            lines.append(f" K{p}_{t} COST 2 B{p}_{t} -1")
            if t + 1 < PERIODS:
                lines.append(f" K{p}_{t} B{p}_{t + 1} 1")
            lines.append(f" U{p}_{t} COST {make_cost[p] * 3} B{p}_{t} 1")
    lines.append("RHS")
    for p in range(products):
        for t in range(PERIODS):
            if demand[p][t]:
                lines.append(f" RHS B{p}_{t} {demand[p][t]}")
    for g in range(MACHINES):
        for t in range(PERIODS):
            lines.append(f" RHS C{g}_{t} {capacity[g][t]}")
    lines.append("ENDATA")
    path.write_text("\n".join(lines) + "\n")


def solve(plumb, path, limit):
    start = time.monotonic()
    try:
        done = subprocess.run([plumb, "solve", str(path), "--json", "--quiet"], capture_output=True, text=True,
                              stdin=subprocess.DEVNULL, timeout=limit)
    except subprocess.TimeoutExpired:
        return None, time.monotonic() - start
    wall = time.monotonic() - start
    if done.returncode != 0:
        return None, wall
    return json.loads(done.stdout), wall


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--plumb", default=str(REPO / "build" / "plumb"))
    parser.add_argument("--largest", type=int, default=131072, help="rows of the last size (default 131072)")
    parser.add_argument("--time-limit", type=float, default=600)
    parser.add_argument("--keep", help="write the instances into this folder and keep them")
    args = parser.parse_args()

    folder = Path(args.keep) if args.keep else Path(tempfile.mkdtemp(prefix="plumb-scaling-"))
    folder.mkdir(parents=True, exist_ok=True)
    sizes = []
    rows = 2048
    while rows <= args.largest:
        sizes.append(rows)
        rows *= 2
    print(f"{'rows':>7} {'columns':>7} {'nonzeros':>8} {'float it':>8} {'float s':>8} {'us/it':>7} "
          f"{'certify s':>9} {'solve s':>8} {'peak MiB':>8}  status", flush=True)
    per_iteration = {}
    for target in sizes:
        products = target // PERIODS - MACHINES
        path = folder / f"scaling-{target}.mps"
        write_model(path, products)
        result, wall = solve(args.plumb, path, args.time_limit)
        rows, columns = PERIODS * (products + MACHINES), 3 * products * PERIODS
        nonzeros = products * PERIODS * 7 - products
        if result is None:
            print(f"{rows:7} {columns:7} {nonzeros:8}  failed or stopped after {wall:.1f} s", flush=True)
            continue
        stats = result["stats"]
        iterations = stats["float_iterations"]
        micro = 1e6 * stats["float_seconds"] / iterations if iterations else float("nan")
        per_iteration[target] = micro
        proven = result["proven"]
        print(f"{rows:7} {columns:7} {nonzeros:8} {iterations:8} {stats['float_seconds']:8.2f} {micro:7.1f} "
              f"{stats['certify_seconds']:9.2f} {wall:8.2f} {stats['peak_memory_mib']:8.0f}  "
              f"{result['status']}{'' if proven else ' (not certified)'}", flush=True)
        if not args.keep:
            path.unlink()
    measured = sorted(per_iteration)
    if measured and measured[-1] // 16 in per_iteration:
        largest, smaller = measured[-1], measured[-1] // 16
        print(f"microseconds per float iteration: {per_iteration[largest]:.1f} at {largest} rows against "
              f"{per_iteration[smaller]:.1f} at {smaller} rows, ratio {per_iteration[largest] / per_iteration[smaller]:.2f}")
    else:
        print("microseconds per float iteration: too few sizes measured for the 16-fold comparison")


if __name__ == "__main__":
    sys.exit(main())
