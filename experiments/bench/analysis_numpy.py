#!/usr/bin/env python3
"""The comparison for bench:analysis: a vectorised numpy script computing what
`npm run analyze -- FILE.csv --json` computes per sequence and per cell with the default options
(actual start, misfire rule, plane geometry, no flags), written as a careful analyst would write
it with numpy alone: the numeric columns read by numpy's C reader (np.loadtxt), the two text
columns with one pass of Python's str.split over the lines, then everything in whole-array
operations (np.unique, np.bincount), no Python loop per movement or per sequence.

Measures (ISO 9241-411; Soukoreff & MacKenzie 2004; see docs/analysis.md): per movement
a = |T - S|, dx = (P - T)·(T - S)/a, distance = a + dx; misfire when distance < A/2 or
|P - T| > 2W; per sequence Ae = mean(distance), SDx = sample SD of dx, We = 4.133·SDx,
IDe = log2(Ae/We + 1), MT = mean time, TP = IDe/MT; cells are the mean of a participant's
sequence values per condition. Sequences with fewer than 2 kept movements or a non-finite TP are
left out, as the CLI leaves them out.

usage: python3 experiments/bench/analysis_numpy.py FILE.csv [--json OUT.json]
Prints one line: movements, sequences, cells, misfires. With --json, writes the sequences and
cells (the same keys as the CLI's JSON) so the bench can compare the two outputs.
"""
import json
import sys

import numpy as np

NUMERIC = ["block", "sequence", "amplitude", "width", "to_x", "to_y", "start_x", "start_y", "end_x", "end_y", "time_ms", "hit"]


def read_table(path):
    with open(path, "r", encoding="utf-8") as f:
        header = f.readline().strip().split(",")
        text = f.read()
    col = {name: i for i, name in enumerate(header)}
    numeric = np.loadtxt(path, delimiter=",", skiprows=1, usecols=[col[c] for c in NUMERIC], dtype=np.float64, ndmin=2)
    # participant and condition: the first two fields of every line (no quoting in the bench's table)
    lines = text.splitlines()
    pi, ci = col["participant"], col["condition"]
    fields = [line.split(",", max(pi, ci) + 1) for line in lines]
    participant = np.array([f[pi] for f in fields])
    condition = np.array([f[ci] for f in fields])
    return participant, condition, {name: numeric[:, i] for i, name in enumerate(NUMERIC)}


def analyse(participant, condition, c):
    # per movement
    ux = c["to_x"] - c["start_x"]
    uy = c["to_y"] - c["start_y"]
    a = np.hypot(ux, uy)
    ex = c["end_x"] - c["to_x"]
    ey = c["end_y"] - c["to_y"]
    dx = (ex * ux + ey * uy) / a
    distance = a + dx
    misfire = (distance < c["amplitude"] / 2) | (np.hypot(ex, ey) > 2 * c["width"])
    keep = ~misfire

    # sequences: participant × condition × block × sequence
    p_names, p_code = np.unique(participant, return_inverse=True)
    c_names, c_code = np.unique(condition, return_inverse=True)
    block = c["block"].astype(np.int64)
    seq_no = c["sequence"].astype(np.int64)
    key = ((p_code.astype(np.int64) * len(c_names) + c_code) * (block.max() + 1) + block) * (seq_no.max() + 1) + seq_no
    seq_keys, seq = np.unique(key, return_inverse=True)
    s = len(seq_keys)
    w = keep.astype(np.float64)
    n = np.bincount(seq, weights=w, minlength=s)
    errors = np.bincount(seq, weights=w * (c["hit"] == 0), minlength=s)
    with np.errstate(divide="ignore", invalid="ignore"):
        mean_dx = np.bincount(seq, weights=w * dx, minlength=s) / n
        ae = np.bincount(seq, weights=w * distance, minlength=s) / n
        ss = np.bincount(seq, weights=w * (dx - mean_dx[seq]) ** 2, minlength=s)
        sdx = np.sqrt(ss / (n - 1))
        we = 4.133 * sdx
        ide = np.log2(ae / we + 1)
        mt = np.bincount(seq, weights=w * c["time_ms"], minlength=s) / n
        tp = ide / (mt / 1000)
        error_rate = errors / n
    ok = (n >= 2) & np.isfinite(ide) & np.isfinite(tp) & (mt > 0)

    # the first row of each sequence gives its labels
    first = np.zeros(s, dtype=np.int64)
    first[seq[::-1]] = np.arange(len(seq))[::-1]
    sp, sc = p_code[first], c_code[first]

    # cells: mean of the participant's sequence values per condition
    cell_key = sp[ok] * len(c_names) + sc[ok]
    cell_keys, cell = np.unique(cell_key, return_inverse=True)
    count = np.bincount(cell, minlength=len(cell_keys))
    cells = {name: np.bincount(cell, weights=v[ok], minlength=len(cell_keys)) / count for name, v in (("tp", tp), ("mt", mt), ("errorRate", error_rate), ("we", we), ("ide", ide))}
    return {
        "names": (p_names, c_names),
        "sequences": {"participant": sp[ok], "condition": sc[ok], "block": block[first][ok], "sequence": seq_no[first][ok], "amplitude": c["amplitude"][first][ok], "width": c["width"][first][ok], "n": n[ok], "errorRate": error_rate[ok], "ae": ae[ok], "sdx": sdx[ok], "we": we[ok], "ide": ide[ok], "mt": mt[ok], "tp": tp[ok]},
        "cells": {"participant": cell_keys // len(c_names), "condition": cell_keys % len(c_names), **cells},
        "misfires": int(misfire.sum()),
    }


def main(argv):
    if len(argv) not in (1, 3) or (len(argv) == 3 and argv[1] != "--json"):
        sys.stderr.write("usage: analysis_numpy.py FILE.csv [--json OUT.json]\n")
        return 2
    participant, condition, columns = read_table(argv[0])
    r = analyse(participant, condition, columns)
    print(f"{len(participant)} movements, {len(r['sequences']['tp'])} sequences, {len(r['cells']['tp'])} cells, {r['misfires']} misfires")
    if len(argv) == 3:
        p_names, c_names = r["names"]

        def rows(table):
            keys = list(table)
            out = []
            for i in range(len(table["tp"])):
                row = {}
                for k in keys:
                    v = table[k][i]
                    row[k] = str(p_names[v]) if k == "participant" else str(c_names[v]) if k == "condition" else float(v)
                out.append(row)
            return out

        with open(argv[2], "w", encoding="utf-8") as f:
            json.dump({"excluded": r["misfires"], "sequences": rows(r["sequences"]), "cells": rows(r["cells"])}, f)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
