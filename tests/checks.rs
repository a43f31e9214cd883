//! Every integration test of the workspace, in one test binary: the engine checked against
//! outside sources and on constructed cases, the command line's contract, and the browser app
//! end to end in headless Chromium.
//!
//! Kept apart from: the unit tests beside the code (each crate's own `#[cfg(test)]` modules).
//! One binary, so fixtures, tolerances and builders live once, in [`support`], and a change
//! builds one test program instead of many.

// Native only: the rule that sorts go through morrowcast_engine::sorting (clippy.toml) keeps
// the wasm small and does not bind the tests.
#![allow(clippy::disallowed_methods)]

mod support;

mod alerts;
mod bands;
mod board;
mod cli;
mod cli_stock;
mod e2e;
mod intake;
mod intermittent_choice;
mod lookback;
mod methods;
mod order;
mod patterns;
mod plan;
mod properties;
mod smoothing;
mod stock;
mod work;
