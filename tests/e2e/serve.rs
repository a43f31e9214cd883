//! A static file server for the built app (dist/) on 127.0.0.1, recording every requested path
//! so a test can assert that the page asked for nothing but its own files.

use std::io::{BufRead, BufReader, Write};
use std::net::{TcpListener, TcpStream};
use std::path::{Path, PathBuf};
use std::sync::{Arc, Mutex};
use std::thread;

/// A running server; it stops with the test process.
pub struct StaticServer {
    pub origin: String,
    pub requests: Arc<Mutex<Vec<String>>>,
}

fn content_type(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()) {
        Some("html") => "text/html; charset=utf-8",
        Some("js") => "text/javascript",
        Some("wasm") => "application/wasm",
        Some("css") => "text/css",
        Some("svg") => "image/svg+xml",
        Some("png") => "image/png",
        _ => "application/octet-stream",
    }
}

fn handle(mut stream: TcpStream, root: &Path, log: &Mutex<Vec<String>>) {
    let mut reader = BufReader::new(match stream.try_clone() {
        Ok(s) => s,
        Err(_) => return,
    });
    let mut request_line = String::new();
    if reader.read_line(&mut request_line).is_err() {
        return;
    }
    // Drain the headers.
    let mut line = String::new();
    while reader.read_line(&mut line).map(|n| n > 2).unwrap_or(false) {
        line.clear();
    }
    let path = request_line
        .split_whitespace()
        .nth(1)
        .unwrap_or("/")
        .to_string();
    log.lock().unwrap().push(path.clone());
    let clean = path
        .split(['?', '#'])
        .next()
        .unwrap_or("/")
        .trim_start_matches('/');
    let file: PathBuf = if clean.is_empty() {
        root.join("index.html")
    } else {
        root.join(clean)
    };
    let inside = !clean.split('/').any(|p| p == "..");
    let (status, body, kind) = match std::fs::read(&file) {
        Ok(b) if inside => ("200 OK", b, content_type(&file)),
        _ => ("404 Not Found", b"not found".to_vec(), "text/plain"),
    };
    let head = format!(
        "HTTP/1.1 {status}\r\nContent-Type: {kind}\r\nContent-Length: {}\r\nConnection: close\r\nCache-Control: no-store\r\n\r\n",
        body.len()
    );
    let _ = stream.write_all(head.as_bytes());
    let _ = stream.write_all(&body);
}

impl StaticServer {
    /// Serves `root` on a free port of 127.0.0.1.
    pub fn start(root: &Path) -> StaticServer {
        let listener = TcpListener::bind("127.0.0.1:0").expect("bind 127.0.0.1");
        let origin = format!("http://{}", listener.local_addr().unwrap());
        let requests = Arc::new(Mutex::new(Vec::new()));
        let log = requests.clone();
        let root = root.to_path_buf();
        thread::spawn(move || {
            for stream in listener.incoming().flatten() {
                let (root, log) = (root.clone(), log.clone());
                thread::spawn(move || handle(stream, &root, &log));
            }
        });
        StaticServer { origin, requests }
    }
}
