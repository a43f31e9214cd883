#!/usr/bin/env python3
"""The Look-back held out on the M3 monthly data: each of the 1,428 series cut to its training
part plus the first 3 held-out months, then `morrowcast look-back --periods 3` (the plan made on
the training part alone, set against those 3 months), on one file per end date (the Look-back
counts back from a file's last period). Prints the file's counts: how often the
bands held, and how often the reorder point covered the demand over the lead time.

Usage: python3 scripts/look_back_m3.py BINARY [extra look-back options]
(BINARY: a built command line, e.g. target/release/morrowcast.) Python's standard library only.
A measurement, not a test. M3 data: tests/fixtures/m3/README.md. Undated series (years written
1, 2, ...) are given the years 2001, 2002, ... (the methods do not read the calendar's year).
"""
import collections
import csv
import json
import os
import subprocess
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
M3 = os.path.join(HERE, "..", "tests", "fixtures", "m3", "m3.csv")
HELD = 3


def main():
    if len(sys.argv) < 2:
        sys.exit(__doc__)
    binary, extra = sys.argv[1], sys.argv[2:]
    held = collections.Counter()
    # Series by the period they end at: the Look-back counts back from a file's last period,
    # and the M3 series end at different dates, so each end date gets a file of its own.
    files = collections.defaultdict(list)
    with open(M3, newline="") as f:
        for r in csv.DictReader(f):
            if r["subset"] != "MONTHLY":
                continue
            if r["part"] == "test":
                held[r["id"]] += 1
                if held[r["id"]] > HELD:
                    continue
            year, month = r["period"].split("-")
            if int(year) < 1000:
                year = str(2000 + int(year))
            files[r["id"]].append(f"{r['id']},{year}-{month},{r['value']}")
    by_end = collections.defaultdict(list)
    for rows in files.values():
        by_end[rows[-1].split(",")[1]].extend(rows)
    keys = ["items", "periods", "within", "stock_checked", "covered"]
    tally = dict.fromkeys(keys, 0)
    promised = 0.0
    failed = 0
    for rows in by_end.values():
        with tempfile.NamedTemporaryFile("w", suffix=".csv", delete=False) as t:
            t.write("item,month,units\n" + "\n".join(rows) + "\n")
        try:
            args = [binary, "look-back", t.name, "--periods", str(HELD), "--json"] + extra
            out = subprocess.run(args, capture_output=True, text=True)
        finally:
            os.unlink(t.name)
        found = json.loads(out.stdout)
        for k in keys:
            tally[k] += found["tally"][k]
        promised += (found["tally"]["promised_cycle_service"] or 0) * found["tally"]["stock_checked"]
        failed += len(found["failed"])
    print(" ".join(["look-back", "--periods", str(HELD)] + extra), f"({len(by_end)} files by end date)")
    tally["within_share"] = tally["within"] / tally["periods"]
    tally["covered_share"] = tally["covered"] / tally["stock_checked"]
    tally["promised_cycle_service"] = promised / tally["stock_checked"]
    print(json.dumps(tally, indent=2))
    print("failed:", failed)


if __name__ == "__main__":
    main()
