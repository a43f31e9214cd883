//! Morrowcast: demand forecasting for small businesses and planners.
//!
//! The crate has two layers. [`engine`] is the whole computation (intake, patterns, methods,
//! backtest, bands) in pure Rust with no I/O and no browser types. [`wire`] is the one place that
//! turns engine results into JSON; front ends (the command line, later the browser worker) call
//! the engine and serialise through it.

pub mod engine;
pub mod wire;
