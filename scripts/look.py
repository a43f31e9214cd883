"""Opens a page in headless Chromium in real time, as a user would, and saves a screenshot.

Run: python3 scripts/look.py URL OUT.png [SECONDS] [XPATH]
  URL      the page, e.g. a share link made by
           `morrowcast link FILE --page file:///<checkout>/dist/morrowcast.html`
  SECONDS  how long to let the page work before the picture (default 15)
  XPATH    an element to scroll to first, e.g. "//h2[contains(., 'Pattern view')]"

Why: a screenshot taken in Chromium's virtual time (--virtual-time-budget) runs the page's
clock ahead of its worker, so the 15 s watchdog fires before a forecast arrives. This drives
/usr/bin/chromedriver (Debian's chromium-driver, installed by scripts/tools.sh) over the W3C
WebDriver protocol with the standard library only. Not used by the tests.
"""
import base64
import json
import subprocess
import sys
import time
import urllib.request

PORT = 9517


def call(method, path, body=None):
    request = urllib.request.Request(
        f"http://127.0.0.1:{PORT}{path}",
        method=method,
        data=json.dumps(body).encode() if body is not None else None,
        headers={"Content-Type": "application/json"},
    )
    return json.loads(urllib.request.urlopen(request).read())["value"]


def main():
    if len(sys.argv) < 3:
        sys.exit(__doc__)
    url, out = sys.argv[1], sys.argv[2]
    wait = float(sys.argv[3]) if len(sys.argv) > 3 else 15.0
    driver = subprocess.Popen(
        ["/usr/bin/chromedriver", f"--port={PORT}"],
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
    )
    try:
        time.sleep(1.5)
        args = ["--headless", "--no-sandbox", "--disable-gpu", "--window-size=1366,900",
                "--hide-scrollbars"]
        session = call("POST", "/session",
                       {"capabilities": {"alwaysMatch": {"goog:chromeOptions": {"args": args}}}})
        sid = session["sessionId"]
        call("POST", f"/session/{sid}/url", {"url": url})
        time.sleep(wait)
        if len(sys.argv) > 4:
            script = ("var e = document.evaluate(arguments[0], document, null, 9, null)"
                      ".singleNodeValue; if (e) e.scrollIntoView(); return !!e;")
            found = call("POST", f"/session/{sid}/execute/sync",
                         {"script": script, "args": [sys.argv[4]]})
            print("element found" if found else "element not found", file=sys.stderr)
            time.sleep(1)
        with open(out, "wb") as f:
            f.write(base64.b64decode(call("GET", f"/session/{sid}/screenshot")))
        call("DELETE", f"/session/{sid}")
    finally:
        driver.terminate()
    print(out)


if __name__ == "__main__":
    main()
