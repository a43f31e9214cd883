//! The browser app's entry point: mounts the page (wasm) or says how to build it (native).
//!
//! Kept apart from: everything it mounts (the library of this package, src/lib.rs).

#[cfg(target_arch = "wasm32")]
fn main() {
    morrowcast_app::page::start();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!(
        "morrowcast-app is the browser app: build and serve it with `bash scripts/start.sh` (trunk, wasm32)"
    );
    std::process::exit(2);
}
