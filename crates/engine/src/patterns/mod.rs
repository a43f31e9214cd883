//! Patterns: season length, trend and demand class of one series, each with its evidence and a
//! one-sentence reason a planner can read.
//!
//! Kept apart from: forecasting methods (they receive the accepted season length from the
//! caller) and from I/O. Each verdict is computed from plain values so it can be checked
//! against outside references on its own:
//! - [`acf`]: sample autocorrelation (Box-Jenkins estimator);
//! - [`season`]: season-length candidate, the M4 benchmark seasonality test and the seasonal
//!   strength;
//! - [`trend`]: the Mann-Kendall trend test;
//! - [`demand_class`]: the Syntetos-Boylan-Croston demand classes.

crate::internal_modules!(acf, demand_class, season, trend);

pub use acf::autocorrelation;
pub use demand_class::{
    classify_demand, classify_open_demand, forecast_at_shut_places, shut_places, DemandClass,
    DemandVerdict, ADI_CUTOFF, CV2_CUTOFF,
};
pub use season::{
    autocorrelation_peak, detect_season, season_test, seasonal_strength, SeasonSource, SeasonTest,
    SeasonVerdict, MIN_FULL_SEASONS, SEASON_TEST_CRITICAL_VALUE, STRENGTH_NEEDS_SEASONS,
    STRONG_SEASON,
};
pub use trend::{mann_kendall, TrendDirection, TrendVerdict, TREND_SIGNIFICANCE};

#[cfg(test)]
mod season_tests;
