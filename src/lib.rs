//! Morrowcast: demand forecasting for small businesses and planners.
//!
//! The crate has two layers. [`engine`] is the whole computation (intake, patterns, methods,
//! backtest, bands) in pure Rust with no I/O and no browser types. [`wire`] is the one place that
//! turns engine results into JSON, the command line's contract. [`worker`] is the browser's
//! Web Worker side: it carries engine values between the page and the worker (bincode, not a
//! contract) and computes plans there.

pub mod engine;
pub mod wire;
pub mod worker;
