//! Support for the browser end-to-end tests: a static file server for dist/ on 127.0.0.1 and a
//! small WebDriver client for chromedriver, both over std TCP.
//!
//! The tests of pasting, dropping and exporting against the command line, of faults, and the
//! recompute measurement, live here too (submodules of the browser_e2e test binary).
//!
//! Kept apart from: the demo tests' assertions (tests/browser_e2e.rs). Hand-written instead of the
//! fantoccini crate: its tokio/hyper/TLS tree costs minutes of build on 2 shared cores, and the
//! handful of WebDriver commands used here are plain JSON over HTTP/1.1.

pub mod page;
pub mod serve;
pub mod webdriver;

mod access;
mod engine_match;
mod faults;
mod progress;
mod recompute;
