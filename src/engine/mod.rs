//! The numerical engine: everything Morrowcast computes, from raw text to ranked, checked forecasts.
//!
//! Kept apart from: files, terminals, JSON and the DOM. The engine takes text and numbers and
//! returns typed values; front ends decide how to read input and how to show results. Its
//! result types derive serde's traits so the browser's worker can carry them (src/worker.rs);
//! the engine itself never serialises.
//!
//! Data flows one way: [`intake`] turns text into [`series::Series`]; [`patterns`] describes a
//! series; [`methods`] fit and forecast; [`accuracy`] scores forecasts against demand;
//! [`bands`] turns errors into prediction intervals; [`backtest`] ranks methods on a holdout;
//! [`plan`] glues these into one forecast per item.

pub mod accuracy;
pub mod backtest;
pub mod bands;
pub mod calendar;
pub mod demo;
pub mod intake;
pub mod methods;
pub mod patterns;
pub mod plan;
pub mod series;
