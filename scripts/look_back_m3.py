#!/usr/bin/env python3
"""The Look-back held out on the M3 monthly data: each of the 1,428 series cut to its training
part plus the first 3 held-out months, then `morrowcast look-back --periods 3` (the plan made on
the training part alone, set against those 3 months). Prints the file's counts: how often the
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
    lines = ["item,month,units"]
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
            lines.append(f"{r['id']},{year}-{month},{r['value']}")
    with tempfile.NamedTemporaryFile("w", suffix=".csv", delete=False) as t:
        t.write("\n".join(lines) + "\n")
    try:
        args = [binary, "look-back", t.name, "--periods", str(HELD), "--json"] + extra
        out = subprocess.run(args, capture_output=True, text=True, check=True)
    finally:
        os.unlink(t.name)
    found = json.loads(out.stdout)
    print(" ".join(args[1:2] + args[3:]))
    print(json.dumps(found["tally"], indent=2))
    print("failed:", len(found["failed"]))


if __name__ == "__main__":
    main()
