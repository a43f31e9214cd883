//! The Stock plan: from a plan's forecast and the errors of its rolling origins to a safety
//! stock, a reorder point or order-up-to level, and the service that level gives; one item,
//! backorders.
//!
//! Kept apart from: forecasting (a plan brings the forecast path and its errors), reading
//! on-hand tables (Intake) and showing figures (the front ends). Every figure is an estimate
//! from past demand; the front ends say so. Layout: [`normal`] (the loss function and the
//! normal model), [`empirical`] (the model for intermittent and lumpy demand), [`item`] (the
//! settings, checked once, and the glue from a plan to its figures); the shared types here.
//!
//! Notation (per period: mean mu, error sd sigma; L lead time, R review period, both in
//! periods; P the protection interval):
//!
//! ```text
//! P = L (continuous review, reorder point s, order quantity Q)  or  R + L (periodic, order up to S)
//! G(k)  = phi(k) - k (1 - Phi(k)) = E[(Z - k)+]                  the standard normal loss
//! k     = Phi^-1(CSL)                                            for a cycle-service target
//! k     solves G(k) = (1 - beta) C / sigma_P                     for a fill-rate target beta
//! SS    = k sigma_P,   s = mu_L + SS,   S = mu_{R+L} + SS
//! ESC   = sigma_P G(k)                                           expected shortage per cycle
//! fill  = 1 - ESC / C,  C = Q (continuous) or the mean demand over R (periodic)
//! ```
//!
//! Sources: Chopra & Meindl, "Supply Chain Management", ch. 12 (safety stock, ESC, fill rate,
//! lead-time uncertainty); Silver, Pyke & Peterson (from memory) for the (R, S) forms; the exact
//! (s, Q) backorder term of Hadley & Whitin (1963, from memory) and Sobel's (R, S) form
//! (Johnson et al. 1995; Sobel 2004) as second fill-rate figures. The reference values the
//! tests compare with come from tests/fixtures/refs/stock (scipy 1.17.1, see its README).

mod empirical;
mod item;
mod normal;
mod text;

use std::fmt;

pub use empirical::{
    empirical_figures, scenarios_needed, totals_needed, Beyond, EmpiricalFigures, Spread,
};
pub use item::{
    counts_whole_units, demand_over, demand_scenarios, plan_stock, protection_periods_of,
    service_fraction, service_fraction_of, suggested_order, Distribution, Position, StockPlan,
    StockSettings, MAX_PERIODS,
};
pub use normal::{
    figures, inverse_normal_loss, normal_loss, sd_independent, sd_per_horizon,
    sd_variable_lead_time,
};
pub use text::{read_lead_time, StockField, StockFieldError, StockText, TargetKind};

/// Why stock figures cannot be worked out. Each message names the input and what it needs.
#[derive(Clone, Debug, PartialEq)]
pub enum StockError {
    /// A service target outside (0, 1) as a fraction, or as typed below 50 % or exactly 1.
    TargetOutOfRange {
        /// "cycle service level" or "fill rate".
        what: &'static str,
        /// The fraction given.
        value: f64,
    },
    /// A lead time, its spread, a review period or an order quantity that is negative, not a
    /// number, or zero where it must be positive.
    BadQuantity {
        /// The input's name.
        what: &'static str,
        /// The value given.
        value: f64,
        /// What it must be.
        needs: &'static str,
    },
    /// Text that is not a number.
    NotANumber {
        /// The input's name.
        what: &'static str,
        /// The text found.
        text: String,
    },
    /// Fewer than two rolling-origin errors to take a spread from.
    TooFewErrors {
        /// The errors there were.
        found: usize,
    },
    /// The plan does not reach over the protection interval, or too few of its rolling
    /// origins do.
    ShortPlan {
        /// The protection interval in periods.
        periods: usize,
        /// The periods the plan forecasts.
        horizon: usize,
    },
}

impl fmt::Display for StockError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            StockError::TargetOutOfRange { what, value } if *value == 1.0 => write!(
                f,
                "{what} target 1 could be 1 % or 100 % (which no stock reaches): give a percent \
                 such as 95 or a fraction such as 0.95"
            ),
            StockError::TargetOutOfRange { what, value } => write!(
                f,
                "{what} target {value} is outside 50 % to 100 % (100 excluded): give a percent \
                 such as 95 or a fraction such as 0.95"
            ),
            StockError::BadQuantity { what, value, needs } => {
                write!(f, "{what} {value} is not usable: it must be {needs}")
            }
            StockError::NotANumber { what, text } => write!(
                f,
                "{what} \"{text}\" is not a number: write a fraction such as 0.95 or a percent \
                 such as 95"
            ),
            StockError::TooFewErrors { found } => write!(
                f,
                "the spread of demand needs at least 2 rolling-origin errors; this item has \
                 {found} (its history is too short for its lead time)"
            ),
            StockError::ShortPlan { periods, horizon } if horizon < periods => write!(
                f,
                "the protection interval is {periods} periods but the plan forecasts only \
                 {horizon}: forecast at least {periods} periods ahead"
            ),
            StockError::ShortPlan { periods, .. } => write!(
                f,
                "fewer than 2 rolling origins in the history reach over the {periods}-period \
                 protection interval, so how far the forecast goes wrong over it cannot be \
                 measured yet (a new item, or a history short for this lead time): judge the \
                 order from the forecast and its band"
            ),
        }
    }
}

impl std::error::Error for StockError {}

/// 1 - ESC / C, the traditional fill rate, floored at 0: where the shortage per cycle exceeds
/// the demand per cycle (an order quantity small against the spread) the formula goes below
/// 0, which no fill rate can; the Stock plan says so in a note.
pub fn traditional_fill_rate(expected_shortage: f64, cycle_demand: f64) -> f64 {
    (1.0 - expected_shortage / cycle_demand).max(0.0)
}

pub(crate) fn check_fraction(what: &'static str, value: f64) -> Result<f64, StockError> {
    if value > 0.0 && value < 1.0 {
        Ok(value)
    } else {
        Err(StockError::TargetOutOfRange { what, value })
    }
}

pub(crate) fn check_quantity(
    what: &'static str,
    value: f64,
    positive: bool,
) -> Result<f64, StockError> {
    let ok = value.is_finite() && if positive { value > 0.0 } else { value >= 0.0 };
    if ok {
        Ok(value)
    } else {
        Err(StockError::BadQuantity {
            what,
            value,
            needs: if positive {
                "a number above 0"
            } else {
                "a number of 0 or more"
            },
        })
    }
}

/// What the level is set to protect.
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Target {
    /// The chance of no stock-out in a replenishment cycle (CSL), a fraction in (0, 1).
    CycleService(f64),
    /// The share of demand served from stock (fill rate), a fraction in (0, 1).
    FillRate(f64),
}

impl Target {
    /// A cycle-service target, checked to lie in (0, 1).
    pub fn cycle_service(fraction: f64) -> Result<Target, StockError> {
        check_fraction("cycle service level", fraction).map(Target::CycleService)
    }

    /// A fill-rate target, checked to lie in (0, 1).
    pub fn fill_rate(fraction: f64) -> Result<Target, StockError> {
        check_fraction("fill rate", fraction).map(Target::FillRate)
    }
}

/// How often stock is reviewed, with what that policy needs.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Review {
    /// Continuous review: order `order_quantity` (Q) when the stock position reaches the
    /// reorder point s. Protects over the lead time.
    Continuous {
        /// Q, the quantity ordered each time (the fill rate's cycle demand).
        order_quantity: f64,
    },
    /// Periodic review every `every` periods (R), ordering up to the level S. Protects over
    /// R + L.
    Periodic {
        /// R in periods.
        every: f64,
    },
}

impl Review {
    /// Continuous review with order quantity Q > 0.
    pub fn continuous(order_quantity: f64) -> Result<Review, StockError> {
        check_quantity("order quantity", order_quantity, true)
            .map(|order_quantity| Review::Continuous { order_quantity })
    }

    /// Periodic review every R > 0 periods.
    pub fn periodic(every: f64) -> Result<Review, StockError> {
        check_quantity("review period", every, true).map(|every| Review::Periodic { every })
    }

    /// The protection interval P for lead time L: L, or R + L.
    pub fn protection_periods(self, lead_time: f64) -> f64 {
        match self {
            Review::Continuous { .. } => lead_time,
            Review::Periodic { every } => every + lead_time,
        }
    }
}

/// Demand over an interval: its expected total and the standard deviation of that total's
/// forecast error.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct IntervalDemand {
    mean: f64,
    sd: f64,
}

impl IntervalDemand {
    /// Checks that both are finite and the spread is not negative.
    pub fn new(mean: f64, sd: f64) -> Result<IntervalDemand, StockError> {
        if !mean.is_finite() {
            return Err(StockError::BadQuantity {
                what: "demand over the interval",
                value: mean,
                needs: "a finite number",
            });
        }
        let sd = check_quantity("spread of demand over the interval", sd, false)?;
        Ok(IntervalDemand { mean, sd })
    }
    /// The expected total.
    pub fn mean(self) -> f64 {
        self.mean
    }
    /// The standard deviation of its error.
    pub fn sd(self) -> f64 {
        self.sd
    }
}

/// The stock figures of one item under one policy and target.
#[derive(Clone, Debug, PartialEq)]
pub struct Figures {
    /// k, the safety stock in standard deviations of the protection-interval error; `None`
    /// when that spread is 0 (no safety stock is needed and k is undefined).
    pub safety_factor: Option<f64>,
    /// k sigma_P (negative when a fill-rate target is met below the expected demand).
    pub safety_stock: f64,
    /// The reorder point s (continuous review) or order-up-to level S (periodic review):
    /// expected demand over the protection interval plus the safety stock.
    pub level: f64,
    /// sigma_P G(k).
    pub expected_shortage: f64,
    /// Phi(k): the chance a cycle ends without a stock-out.
    pub cycle_service_level: f64,
    /// 1 - ESC / C (the traditional form).
    pub fill_rate: f64,
    /// The same without the shortage already backordered before the cycle began: Hadley &
    /// Whitin's exact (s, Q) term, or Sobel's (R, S) form with the lead-time demand `lead`.
    pub fill_rate_exact: f64,
}
