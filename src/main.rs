//! The browser app's entry point: mounts the page (wasm) or says how to build it (native).
//!
//! Kept apart from: everything it mounts. The page lives in [`app`], the charts in [`chart`].

// Natively only the pure parts build (and are tested); nothing calls them outside the tests.
#[cfg_attr(not(target_arch = "wasm32"), allow(dead_code, unused_imports))]
mod app;
#[cfg_attr(not(target_arch = "wasm32"), allow(dead_code, unused_imports))]
mod chart;

#[cfg(target_arch = "wasm32")]
fn main() {
    app::start();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!(
        "morrowcast-app is the browser app: build and serve it with `bash scripts/start.sh` (trunk, wasm32)"
    );
    std::process::exit(2);
}
