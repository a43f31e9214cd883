//! A minimal W3C WebDriver client for chromedriver: sessions, navigation, scripts, screenshots,
//! the browser's console log and DevTools commands (chromedriver's own extensions); and for
//! geckodriver (Firefox), the W3C commands alone.
//! The session and the driver are closed on drop, also when an assertion panics, so no Chromium
//! is left running.

use std::io::{Read, Write};
use std::net::{TcpListener, TcpStream};
use std::process::{Child, Command, Stdio};
use std::time::{Duration, Instant};

use serde_json::{json, Value};

/// Chromium switches that worked headless as root on this machine kind (TOOLCHAIN.md).
const CHROMIUM_ARGS: [&str; 9] = [
    "--headless=new",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-dev-shm-usage",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
];

fn free_port() -> u16 {
    TcpListener::bind("127.0.0.1:0")
        .unwrap()
        .local_addr()
        .unwrap()
        .port()
}

/// One HTTP/1.1 exchange with `Connection: close`; returns the JSON body.
fn http(port: u16, method: &str, path: &str, body: Option<&Value>) -> Result<Value, String> {
    let mut stream = TcpStream::connect(("127.0.0.1", port)).map_err(|e| e.to_string())?;
    stream.set_read_timeout(Some(Duration::from_secs(120))).ok();
    let payload = body.map(|b| b.to_string()).unwrap_or_default();
    let request = format!(
        "{method} {path} HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\nContent-Type: application/json\r\nContent-Length: {}\r\nConnection: close\r\n\r\n{payload}",
        payload.len()
    );
    stream
        .write_all(request.as_bytes())
        .map_err(|e| e.to_string())?;
    // chromedriver keeps the connection open despite `Connection: close`: read the headers,
    // then exactly Content-Length bytes (or up to the last chunk), never to the end.
    let mut raw = Vec::new();
    let mut buf = [0u8; 65536];
    let header_end = loop {
        let n = stream.read(&mut buf).map_err(|e| e.to_string())?;
        if n == 0 {
            return Err("connection closed before the headers".into());
        }
        raw.extend_from_slice(&buf[..n]);
        if let Some(i) = raw.windows(4).position(|w| w == b"\r\n\r\n") {
            break i + 4;
        }
    };
    let head = String::from_utf8_lossy(&raw[..header_end]).to_ascii_lowercase();
    let length = head
        .lines()
        .find_map(|l| l.strip_prefix("content-length:"))
        .and_then(|v| v.trim().parse::<usize>().ok());
    let chunked = head.contains("transfer-encoding: chunked");
    loop {
        let body = &raw[header_end..];
        let done = match length {
            Some(n) => body.len() >= n,
            None => chunked && body.windows(5).any(|w| w == b"0\r\n\r\n"),
        };
        if done {
            break;
        }
        let n = stream.read(&mut buf).map_err(|e| e.to_string())?;
        if n == 0 {
            break;
        }
        raw.extend_from_slice(&buf[..n]);
    }
    let text = String::from_utf8_lossy(&raw[header_end..]).into_owned();
    let body = if chunked { dechunk(&text) } else { text };
    serde_json::from_str(&body).map_err(|e| format!("{e}: {body}"))
}

fn dechunk(mut s: &str) -> String {
    let mut out = String::new();
    while let Some((size, rest)) = s.split_once("\r\n") {
        let n = usize::from_str_radix(size.trim(), 16).unwrap_or(0);
        if n == 0 || rest.len() < n {
            break;
        }
        out.push_str(&rest[..n]);
        s = rest[n..].trim_start_matches("\r\n");
    }
    out
}

/// A chromedriver process with one browser session.
pub struct Browser {
    driver: Child,
    port: u16,
    session: String,
    profile: std::path::PathBuf,
    /// Whether the profile outlives the browser (a restart test opens it again).
    keep_profile: bool,
}

impl Browser {
    /// Starts `driver` (chromedriver or geckodriver) on a free port and waits until it
    /// answers. The browser's profile is `profile`, kept when the browser closes (so a later
    /// browser finds what this one stored); `None`: a fresh one, removed on close.
    fn launch(driver: &str, profile: Option<std::path::PathBuf>) -> Browser {
        let port = free_port();
        let child = Command::new(driver)
            .arg(format!("--port={port}"))
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .unwrap_or_else(|e| panic!("start {driver}: {e}"));
        let keep_profile = profile.is_some();
        let profile =
            profile.unwrap_or_else(|| std::env::temp_dir().join(format!("morrowcast-e2e-{port}")));
        // Built before anything can fail, so its Drop stops the driver in every case.
        let browser = Browser {
            driver: child,
            port,
            session: String::new(),
            profile,
            keep_profile,
        };
        let deadline = Instant::now() + Duration::from_secs(20);
        while http(port, "GET", "/status", None).is_err() {
            assert!(Instant::now() < deadline, "{driver} did not start");
            std::thread::sleep(Duration::from_millis(100));
        }
        browser
    }

    /// Opens the session `capabilities` describe.
    fn open_session(&mut self, capabilities: Value) {
        let caps = json!({ "capabilities": { "alwaysMatch": capabilities } });
        let reply = http(self.port, "POST", "/session", Some(&caps)).expect("new session");
        self.session = reply["value"]["sessionId"]
            .as_str()
            .unwrap_or_else(|| panic!("no session: {reply}"))
            .to_string();
    }

    /// Starts chromedriver on a free port and opens a headless Chromium session with a window of
    /// `window` CSS pixels at `device_scale` device pixels per CSS pixel (2 is a HiDPI screen),
    /// its profile in `profile` (see [`Browser::launch`]).
    pub fn start_in(
        chromedriver: &str,
        chromium: &str,
        window: (u32, u32),
        device_scale: f64,
        profile: Option<std::path::PathBuf>,
    ) -> Browser {
        let mut browser = Browser::launch(chromedriver, profile);
        let mut args: Vec<String> = CHROMIUM_ARGS.iter().map(|s| s.to_string()).collect();
        args.push(format!("--user-data-dir={}", browser.profile.display()));
        args.push(format!("--window-size={},{}", window.0, window.1));
        args.push(format!("--force-device-scale-factor={device_scale}"));
        // Every console message of the page is kept, so a test can fail on any error in it.
        browser.open_session(json!({
            "browserName": "chrome",
            "goog:chromeOptions": {"binary": chromium, "args": args},
            "goog:loggingPrefs": {"browser": "ALL"}
        }));
        browser
    }

    /// Starts geckodriver on a free port and opens a headless Firefox session (only the W3C
    /// commands work there: no console log, no DevTools; geckodriver makes its own profile).
    pub fn start_firefox(geckodriver: &str, firefox: &str, window: (u32, u32)) -> Browser {
        let mut browser = Browser::launch(geckodriver, None);
        browser.open_session(json!({
            "browserName": "firefox",
            "moz:firefoxOptions": {
                "binary": firefox,
                "args": ["-headless", "-width", window.0.to_string(), "-height", window.1.to_string()]
            }
        }));
        browser
    }

    fn command(&self, method: &str, path: &str, body: Option<Value>) -> Value {
        self.try_command(method, path, body)
            .unwrap_or_else(|e| panic!("WebDriver {path}: {e}"))
    }

    /// [`Browser::command`] that reports a failure instead of panicking (for use while a test
    /// is already panicking, where a second panic would abort the run).
    fn try_command(&self, method: &str, path: &str, body: Option<Value>) -> Result<Value, String> {
        let url = format!("/session/{}{path}", self.session);
        let reply = http(self.port, method, &url, body.as_ref())?;
        if reply["value"].get("error").is_some() {
            return Err(reply["value"].to_string());
        }
        Ok(reply["value"].clone())
    }

    /// Runs a Chrome DevTools Protocol command (chromedriver's `goog/cdp/execute`).
    pub fn devtools(&self, cmd: &str, params: Value) -> Value {
        self.command(
            "POST",
            "/goog/cdp/execute",
            Some(json!({ "cmd": cmd, "params": params })),
        )
    }

    /// The browser's console messages since the last call (chromedriver's log endpoint; each
    /// entry has `level`, `message`, `source`, `timestamp`).
    pub fn try_console_log(&self) -> Result<Vec<Value>, String> {
        let entries = self.try_command("POST", "/se/log", Some(json!({ "type": "browser" })))?;
        Ok(entries.as_array().cloned().unwrap_or_default())
    }

    /// [`Browser::js`] that reports a failure instead of panicking.
    pub fn try_js(&self, script: &str) -> Result<Value, String> {
        self.try_command(
            "POST",
            "/execute/sync",
            Some(json!({ "script": script, "args": [] })),
        )
    }

    /// Opens a new tab of the same browser and makes it the one commands go to; returns the
    /// tab it left (for [`Browser::close_tab`]). The new tab has no console watcher.
    pub fn new_tab(&self) -> String {
        let left = self.command("GET", "/window", None);
        let made = self.command("POST", "/window/new", Some(json!({ "type": "tab" })));
        let handle = made["handle"]
            .as_str()
            .expect("a new tab's handle")
            .to_string();
        self.command("POST", "/window", Some(json!({ "handle": handle })));
        left.as_str().expect("the tab's handle").to_string()
    }

    /// Closes the tab commands go to and goes back to `to`.
    pub fn close_tab(&self, to: &str) {
        self.command("DELETE", "/window", None);
        self.command("POST", "/window", Some(json!({ "handle": to })));
    }

    pub fn goto(&self, url: &str) {
        self.command("POST", "/url", Some(json!({ "url": url })));
    }

    /// Runs a script (its `return` value comes back as JSON).
    pub fn js(&self, script: &str) -> Value {
        self.js_args(script, json!([]))
    }

    /// Runs a script with `arguments[0..]` taken from the JSON array `args` (no quoting of
    /// text into the script).
    pub fn js_args(&self, script: &str, args: Value) -> Value {
        self.command(
            "POST",
            "/execute/sync",
            Some(json!({ "script": script, "args": args })),
        )
    }

    /// Polls a script until it returns a truthy value, or panics after `timeout`.
    pub fn wait_for(&self, what: &str, script: &str, timeout: Duration) -> Value {
        self.wait_for_args(what, script, json!([]), timeout)
    }

    /// [`Browser::wait_for`] with script arguments.
    pub fn wait_for_args(&self, what: &str, script: &str, args: Value, timeout: Duration) -> Value {
        let deadline = Instant::now() + timeout;
        loop {
            let v = self.js_args(script, args.clone());
            let truthy = match &v {
                Value::Null => false,
                Value::Bool(b) => *b,
                Value::Number(n) => n.as_f64().unwrap_or(0.0) != 0.0,
                Value::String(s) => !s.is_empty(),
                _ => true,
            };
            if truthy {
                return v;
            }
            if Instant::now() > deadline {
                let fault = self.js("const f = document.getElementById('fault-detail'); return f ? f.textContent : ''");
                let headline = self.js(
                    "const h = document.getElementById('headline'); return h ? h.textContent : ''",
                );
                panic!(
                    "timed out waiting for {what} (fault notice: {fault}; headline: {headline})"
                );
            }
            std::thread::sleep(Duration::from_millis(100));
        }
    }

    /// The page printed as PDF (A4 portrait, backgrounds on), as the browser's print does.
    pub fn print_pdf(&self) -> Vec<u8> {
        let b64 = self.command(
            "POST",
            "/print",
            Some(json!({ "background": true, "page": { "width": 21.0, "height": 29.7 } })),
        );
        decode_base64(b64.as_str().unwrap_or(""))
    }

    /// A PNG screenshot of the window.
    pub fn screenshot(&self) -> Vec<u8> {
        let b64 = self.command("GET", "/screenshot", None);
        decode_base64(b64.as_str().unwrap_or(""))
    }
}

impl Drop for Browser {
    fn drop(&mut self) {
        if !self.session.is_empty() {
            let _ = http(
                self.port,
                "DELETE",
                &format!("/session/{}", self.session),
                None,
            );
        }
        let _ = self.driver.kill();
        let _ = self.driver.wait();
        if !self.keep_profile {
            let _ = std::fs::remove_dir_all(&self.profile);
        }
    }
}

/// Standard base64 (RFC 4648) to bytes; other characters are skipped.
pub fn decode_base64(s: &str) -> Vec<u8> {
    let value = |c: u8| match c {
        b'A'..=b'Z' => Some(c - b'A'),
        b'a'..=b'z' => Some(c - b'a' + 26),
        b'0'..=b'9' => Some(c - b'0' + 52),
        b'+' => Some(62),
        b'/' => Some(63),
        _ => None,
    };
    let (mut out, mut acc, mut bits) = (Vec::new(), 0u32, 0u32);
    for v in s.bytes().filter_map(value) {
        acc = (acc << 6) | u32::from(v);
        bits += 6;
        if bits >= 8 {
            bits -= 8;
            out.push((acc >> bits) as u8);
            acc &= (1 << bits) - 1;
        }
    }
    out
}
