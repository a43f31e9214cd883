"""Outside reference for the share link's packing (crates/work/src/link.rs): Python's own zlib
(RFC 1950/1951, zlib 1.2.13 under Python 3.11.7) and base64 (RFC 4648 section 5, url-safe
alphabet), not our code.

Writes tests/fixtures/work/python-link.txt: the work file tests/fixtures/work/work-v1.json,
as compact JSON, packed by Python (zlib level 9, base64url without padding) into a link. The
test tests/work.rs checks that Morrowcast opens it to the same work as the file.

Given a link made by Morrowcast (argument 1, e.g. from `morrowcast link
tests/fixtures/work/work-v1.json`), also unpacks it with Python and checks that it carries
the same JSON as the file.

Run from the repository root: python3 scripts/work_reference.py [LINK]
"""
import base64
import json
import sys
import zlib

FILE = "tests/fixtures/work/work-v1.json"
OUT = "tests/fixtures/work/python-link.txt"

with open(FILE, encoding="utf-8") as f:
    work = json.load(f)

compact = json.dumps(work, separators=(",", ":"), ensure_ascii=False).encode("utf-8")
packed = base64.urlsafe_b64encode(zlib.compress(compact, 9)).decode("ascii").rstrip("=")
with open(OUT, "w", encoding="ascii") as f:
    f.write("http://127.0.0.1:8080/#w1." + packed + "\n")
print(f"wrote {OUT}: {len(packed) + 4} characters of fragment from {len(compact)} bytes of JSON")

if len(sys.argv) > 1:
    link = sys.argv[1].strip()
    data = link.split("#", 1)[1]
    assert data.startswith("w1."), data[:10]
    data = data[3:]
    raw = zlib.decompress(base64.urlsafe_b64decode(data + "=" * (-len(data) % 4)))
    ours = json.loads(raw.decode("utf-8"))
    assert ours == work, "Morrowcast's link carries different JSON from the file"
    print("Morrowcast's link unpacked by Python's zlib and base64: the same JSON as the file")
