//! Morrowcast's engine: everything Morrowcast computes, from raw text to ranked, checked
//! forecasts, in pure Rust.
//!
//! Kept apart from: files, terminals, JSON and the DOM. The engine takes text and numbers and
//! returns typed values; front ends (the command line in crates/cli, the browser app at the top
//! of the workspace) decide how to read input and how to show results. With the `serde` feature
//! its result types derive serde's traits so the browser's worker can carry them; the engine
//! itself never serialises.
//!
//! Data flows one way: [`intake`] turns text into [`series::Series`]; [`patterns`] describes a
//! series; [`methods`] fit and forecast; [`accuracy`] scores forecasts against demand;
//! [`bands`] turns errors into prediction intervals; [`backtest`] ranks methods on a holdout;
//! [`plan`] glues these into one forecast per item, under [`settings::PlanSettings`] (the one place
//! settings are checked).
//!
//! The API a caller needs is: [`intake::read`] (text to items and a report),
//! [`intake::Item::series`] (an item to a validated series), [`settings::PlanSettings`] and
//! [`plan::plan_item`] (a series to an [`plan::ItemPlan`]), [`order::plan_order`] (with its Stock
//! plan and alerts), [`lookback::look_back`] (the plan of some periods ago against what sold
//! since), and the result types those hold.
//! The method internals are public only with the `internals` feature, which the project's
//! reference tests turn on.

#![warn(missing_docs)]

/// Declares modules that are public with the `internals` feature (the project's reference tests
/// turn it on) and private to the engine without it (visible to its other parts, as the season
/// test uses the decomposition's detrending): pieces a caller of the engine never needs.
macro_rules! internal_modules {
    ($($name:ident),* $(,)?) => {
        $(
            // Internals are not the API: the documentation rule covers what callers use.
            #[cfg(feature = "internals")]
            #[allow(missing_docs)]
            pub mod $name;
            #[cfg(not(feature = "internals"))]
            pub(crate) mod $name;
        )*
    };
}
pub(crate) use internal_modules;

pub mod accuracy;
pub mod alerts;
pub mod backtest;
pub mod bands;
pub mod calendar;
pub mod demo;
pub mod intake;
pub mod lookback;
pub mod methods;
pub mod order;
pub mod patterns;
pub mod plan;
pub mod series;
pub mod settings;
pub mod sorting;
pub mod stock;
