//! The page: one page that does the whole job (Intake, settings, Look-ahead, Backtest ranking,
//! Error ledger, Pattern view).
//!
//! Kept apart from: the engine's computation (the page reads Intake itself; every plan is made
//! in the worker, src/worker) and the charts (src/chart). The pure parts (settings checking, words, exports, chart data) build and
//! are tested natively; the components and browser glue build for wasm32 only.

pub mod board;
pub mod export;
pub mod model;
pub mod settings;
pub mod words;

#[cfg(target_arch = "wasm32")]
mod board_panel;
#[cfg(target_arch = "wasm32")]
mod browser;
#[cfg(target_arch = "wasm32")]
mod courier;
#[cfg(all(test, target_arch = "wasm32"))]
mod in_browser;
#[cfg(target_arch = "wasm32")]
mod keep;
#[cfg(target_arch = "wasm32")]
mod look_back;
#[cfg(target_arch = "wasm32")]
mod panels;
#[cfg(target_arch = "wasm32")]
mod pool;
#[cfg(target_arch = "wasm32")]
mod reader;
#[cfg(target_arch = "wasm32")]
mod results;
#[cfg(target_arch = "wasm32")]
mod share;
#[cfg(target_arch = "wasm32")]
mod shell;
#[cfg(target_arch = "wasm32")]
mod state;
#[cfg(target_arch = "wasm32")]
mod unfinished;

/// Installs the panic hook and mounts the page.
#[cfg(target_arch = "wasm32")]
pub fn start() {
    browser::install_panic_hook();
    leptos::mount::mount_to_body(shell::App);
    if browser::drill().as_deref() == Some("page-fault") {
        // After the page has drawn, as a real fault would come.
        leptos::prelude::set_timeout(
            || panic!("fault drill: a deliberate fault to check that the page reports it"),
            std::time::Duration::from_millis(300),
        );
    }
}
