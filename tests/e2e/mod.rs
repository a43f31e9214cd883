//! The browser app end to end: the release build in dist/ served on 127.0.0.1 and driven in
//! headless Chromium through WebDriver (chromedriver).
//!
//! Needs: `trunk build --release` (dist/), Debian's chromium and chromium-driver. Without dist/
//! the tests say so and pass without checking anything, unless MORROWCAST_REQUIRE_DIST is set
//! (scripts/test.sh sets it and builds dist/ first). Each run saves screenshots under
//! tests/screenshots/ (not committed) for review.
//!
//! Support: a static file server (serve.rs) and a small WebDriver client (webdriver.rs), both
//! over std TCP, and the page opened with its console watched (page.rs). Hand-written instead of
//! the fantoccini crate: its tokio/hyper/TLS tree costs minutes of build on 2 shared cores, and
//! the handful of WebDriver commands used here are plain JSON over HTTP/1.1.

pub mod page;
pub mod serve;
pub mod webdriver;

mod access;
mod board;
mod board_speed;
mod demo;
mod density;
mod engine_match;
mod faults;
mod firefox;
mod keep;
mod look_back;
mod pick;
mod progress;
mod recompute;
mod share;
mod single_file;
