//! The Stock plan's settings for a whole file as a person types them (text in a form), and
//! their one conversion into checked [`StockSettings`].
//!
//! Kept apart from: the limits themselves (the constructors of [`StockSettings`] and
//! [`Target`] hold them; this only reads numbers out of text) and any form (the page shows the
//! fields and the messages).

use super::item::{check_periods, service_fraction, StockSettings};
use super::{StockError, Target};

/// Which service target the file's Stock plan aims at.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum TargetKind {
    /// Cycle service level: the chance of no stock-out in a cycle.
    #[default]
    CycleService,
    /// Fill rate: the share of demand served from stock.
    FillRate,
}

/// The file's stock settings as typed. Empty optional fields mean "not given".
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct StockText {
    /// Lead time in whole periods.
    pub lead_time: String,
    /// The lead time's standard deviation in periods (empty: 0).
    pub lead_time_sd: String,
    /// Review period in whole periods (empty: continuous review).
    pub review_period: String,
    /// Cycle service level or fill rate.
    pub target_kind: TargetKind,
    /// The target as a fraction (0.95) or a percent (95).
    pub target: String,
    /// Order quantity for continuous review (empty: the demand over the lead time).
    pub order_quantity: String,
}

impl Default for StockText {
    /// Lead time 1 period, continuous review, 95 % cycle service level (the command line's
    /// defaults too).
    fn default() -> StockText {
        StockText {
            lead_time: "1".into(),
            lead_time_sd: String::new(),
            review_period: String::new(),
            target_kind: TargetKind::CycleService,
            target: "95".into(),
            order_quantity: String::new(),
        }
    }
}

/// A field of [`StockText`].
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum StockField {
    /// [`StockText::lead_time`].
    LeadTime,
    /// [`StockText::lead_time_sd`].
    LeadTimeSd,
    /// [`StockText::review_period`].
    ReviewPeriod,
    /// [`StockText::target`].
    Target,
    /// [`StockText::order_quantity`].
    OrderQuantity,
}

/// A field that did not pass, with what to do.
#[derive(Clone, Debug, PartialEq)]
pub struct StockFieldError {
    /// Which field.
    pub field: StockField,
    /// What is wrong and what it takes.
    pub message: String,
}

fn error(field: StockField, message: impl Into<String>) -> StockFieldError {
    StockFieldError {
        field,
        message: message.into(),
    }
}

fn whole(field: StockField, what: &str, text: &str) -> Result<usize, StockFieldError> {
    text.trim().parse::<usize>().map_err(|_| {
        error(
            field,
            format!(
                "{what} takes a whole number of periods; found \"{}\"",
                text.trim()
            ),
        )
    })
}

fn number(field: StockField, what: &str, text: &str) -> Result<f64, StockFieldError> {
    text.trim()
        .parse::<f64>()
        .ok()
        .filter(|v| v.is_finite())
        .ok_or_else(|| {
            error(
                field,
                format!("{what} takes a number; found \"{}\"", text.trim()),
            )
        })
}

fn given(text: &str) -> Option<&str> {
    Some(text.trim()).filter(|t| !t.is_empty())
}

impl TargetKind {
    /// A target of this kind as typed: a fraction (0.95) or a percent (95), strictly between
    /// 0 and 1 once read.
    pub fn read(self, text: &str) -> Result<Target, StockError> {
        match self {
            TargetKind::CycleService => {
                service_fraction("cycle service level", text).and_then(Target::cycle_service)
            }
            TargetKind::FillRate => service_fraction("fill rate", text).and_then(Target::fill_rate),
        }
    }
}

/// A lead time as typed: a whole number of periods within the limits of [`StockSettings`].
pub fn read_lead_time(text: &str) -> Result<usize, StockFieldError> {
    let lead = whole(StockField::LeadTime, "lead time", text)?;
    check_periods("lead time", lead, 0).map_err(|e| error(StockField::LeadTime, e.to_string()))
}

impl StockText {
    /// The checked settings, or every field that did not pass.
    pub fn check(&self) -> Result<StockSettings, Vec<StockFieldError>> {
        let lead_time = read_lead_time(&self.lead_time);
        let review = given(&self.review_period)
            .map(|r| whole(StockField::ReviewPeriod, "review period", r))
            .transpose();
        let target = self
            .target_kind
            .read(&self.target)
            .map_err(|e| error(StockField::Target, e.to_string()));
        let sd = given(&self.lead_time_sd).map_or(Ok(0.0), |s| {
            number(StockField::LeadTimeSd, "lead-time spread", s)
        });
        let quantity = given(&self.order_quantity)
            .map(|q| number(StockField::OrderQuantity, "order quantity", q))
            .transpose();
        let (Ok(lead_time), Ok(review), Ok(target), Ok(sd), Ok(quantity)) =
            (&lead_time, &review, &target, &sd, &quantity)
        else {
            let mut errors = Vec::new();
            errors.extend(lead_time.err());
            errors.extend(review.err());
            errors.extend(target.err());
            errors.extend(sd.err());
            errors.extend(quantity.err());
            return Err(errors);
        };
        let (lead_time, review, target, sd, quantity) =
            (*lead_time, *review, *target, *sd, *quantity);
        let mut settings = StockSettings::new(lead_time, review, target).map_err(|e| {
            let field = match e {
                StockError::BadQuantity {
                    what: "review period",
                    ..
                } => StockField::ReviewPeriod,
                _ => StockField::LeadTime,
            };
            vec![error(field, e.to_string())]
        })?;
        settings = settings
            .with_lead_time_sd(sd)
            .map_err(|e| vec![error(StockField::LeadTimeSd, e.to_string())])?;
        if let Some(q) = quantity {
            if review.is_some() {
                return Err(vec![error(
                    StockField::OrderQuantity,
                    "an order quantity is for continuous review: leave the review period empty",
                )]);
            }
            settings = settings
                .with_order_quantity(q)
                .map_err(|e| vec![error(StockField::OrderQuantity, e.to_string())])?;
        }
        Ok(settings)
    }
}
