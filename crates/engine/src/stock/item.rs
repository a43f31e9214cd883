//! One item's Stock plan: the settings, checked once for the command line and the page alike,
//! and the glue from a plan to its figures.
//!
//! Kept apart from: the arithmetic ([`super::normal`], [`super::empirical`]) and forecasting
//! (the plan is taken as made; [`StockSettings::protection_periods`] tells a caller how far
//! ahead it must forecast at least, [`protection_periods_of`] how far once the plan knows its
//! shut periods).

use crate::bands::root_mean_square;
use crate::intake::StockRow;
use crate::plan::ItemPlan;

use super::normal::figures;
use super::{
    check_quantity, empirical_figures, totals_needed, Figures, IntervalDemand, Review, Spread,
    StockError, Target,
};

/// The longest lead time or review period accepted, in periods (the plan's horizon limit).
pub const MAX_PERIODS: usize = crate::settings::MAX_HORIZON;

/// Stock settings for one item, checked: lead time L in whole periods (0 to [`MAX_PERIODS`]),
/// its standard deviation, the review period R (none: continuous review), the service target,
/// and for continuous review the order quantity Q (none: the expected demand over
/// max(L, 1) periods, our default).
#[derive(Clone, Debug, PartialEq)]
pub struct StockSettings {
    lead_time: usize,
    lead_time_sd: f64,
    review_period: Option<usize>,
    target: Target,
    order_quantity: Option<f64>,
    position: Option<Position>,
    order_multiple: Option<f64>,
    minimum_order: Option<f64>,
}

/// Units on hand and on order, for the suggested order.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Position {
    /// On hand (negative: backorders).
    pub on_hand: f64,
    /// Ordered, not yet received.
    pub on_order: f64,
}

pub(super) fn check_periods(
    what: &'static str,
    value: usize,
    least: usize,
) -> Result<usize, StockError> {
    if (least..=MAX_PERIODS).contains(&value) {
        Ok(value)
    } else {
        Err(StockError::BadQuantity {
            what,
            value: value as f64,
            needs: if least == 0 {
                "a whole number of periods from 0 to 366"
            } else {
                "a whole number of periods from 1 to 366"
            },
        })
    }
}

impl StockSettings {
    /// Lead time L (0 to 366 periods), review period R (1 to 366; `None`: continuous review)
    /// and the service target.
    pub fn new(
        lead_time: usize,
        review_period: Option<usize>,
        target: Target,
    ) -> Result<StockSettings, StockError> {
        let lead_time = check_periods("lead time", lead_time, 0)?;
        let review_period = review_period
            .map(|r| check_periods("review period", r, 1))
            .transpose()?;
        Ok(StockSettings {
            lead_time,
            lead_time_sd: 0.0,
            review_period,
            target,
            order_quantity: None,
            position: None,
            order_multiple: None,
            minimum_order: None,
        })
    }

    /// These settings with what an item's row of the stock table gives instead: its lead
    /// time, spread, review period (which makes the policy periodic), target and order
    /// quantity override the file's; on hand, on order, order multiple and minimum order are
    /// the item's own. The row's values were checked when the table was read; they are
    /// checked again here, so a row built by other code cannot slip past.
    pub fn for_row(&self, row: &StockRow) -> Result<StockSettings, StockError> {
        let target = match row.target {
            Some(Target::CycleService(v)) => Target::cycle_service(v)?,
            Some(Target::FillRate(v)) => Target::fill_rate(v)?,
            None => self.target,
        };
        let mut s = StockSettings::new(
            row.lead_time.unwrap_or(self.lead_time),
            row.review_period.or(self.review_period),
            target,
        )?;
        s = s.with_lead_time_sd(row.lead_time_sd.unwrap_or(self.lead_time_sd))?;
        if s.review_period.is_none() {
            if let Some(q) = row.order_quantity.or(self.order_quantity) {
                s = s.with_order_quantity(q)?;
            }
        }
        if let Some(on_hand) = row.on_hand {
            let on_order = row.on_order.unwrap_or(0.0);
            let finite = |what, v: f64| {
                if v.is_finite() {
                    Ok(v)
                } else {
                    Err(StockError::BadQuantity {
                        what,
                        value: v,
                        needs: "a finite number",
                    })
                }
            };
            s.position = Some(Position {
                on_hand: finite("on hand", on_hand)?,
                on_order: check_quantity("on order", on_order, false)?,
            });
        }
        if let Some(m) = row.order_multiple {
            s.order_multiple = Some(check_quantity("order multiple", m, true)?);
        }
        if let Some(m) = row.minimum_order {
            s.minimum_order = Some(check_quantity("minimum order", m, false)?);
        }
        Ok(s)
    }

    /// The lead time's standard deviation in periods (0 or more).
    pub fn with_lead_time_sd(mut self, sd: f64) -> Result<StockSettings, StockError> {
        self.lead_time_sd = check_quantity("lead-time standard deviation", sd, false)?;
        Ok(self)
    }

    /// The order quantity Q of continuous review (above 0).
    pub fn with_order_quantity(mut self, quantity: f64) -> Result<StockSettings, StockError> {
        self.order_quantity = Some(check_quantity("order quantity", quantity, true)?);
        Ok(self)
    }

    /// L.
    pub fn lead_time(&self) -> usize {
        self.lead_time
    }
    /// The lead time's standard deviation.
    pub fn lead_time_sd(&self) -> f64 {
        self.lead_time_sd
    }
    /// R, or `None` for continuous review.
    pub fn review_period(&self) -> Option<usize> {
        self.review_period
    }
    /// The service target.
    pub fn target(&self) -> Target {
        self.target
    }
    /// P = L, or R + L under periodic review: how far ahead the plan must forecast at least
    /// (shut periods can lengthen it: [`protection_periods_of`]).
    pub fn protection_periods(&self) -> usize {
        self.lead_time + self.review_period.unwrap_or(0)
    }
}

/// Reads a service target written as a fraction (0.95) or a percent (95): a value below 1 is a
/// fraction, above 1 a percent; the result must lie from 0.5 to below 1.
pub fn service_fraction(what: &'static str, text: &str) -> Result<f64, StockError> {
    let value: f64 = text
        .trim()
        .trim_end_matches('%')
        .trim()
        .parse()
        .map_err(|_| StockError::NotANumber {
            what,
            text: text.to_string(),
        })?;
    service_fraction_of(what, value)
}

/// [`service_fraction`] for a number already read (by the stock table, with its decimal mark).
/// A target below 50 % is refused: it asks for less stock than the demand expected over the
/// protection interval, never what a typed target means (common practice puts service
/// targets from about 80 % up); and 1 is refused, which could be 1 % or 100 %.
pub fn service_fraction_of(what: &'static str, value: f64) -> Result<f64, StockError> {
    let fraction = if value >= 1.0 { value / 100.0 } else { value };
    if value != 1.0 && (0.5..1.0).contains(&fraction) {
        Ok(fraction)
    } else {
        Err(StockError::TargetOutOfRange { what, value })
    }
}

/// Which model of the demand over the protection interval the figures rest on.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Distribution {
    /// Normal, mean and spread from the plan ([`super::normal`]).
    Normal,
    /// The rolling origins' totals themselves ([`super::empirical`]), for intermittent and
    /// lumpy demand.
    Empirical,
}

impl Distribution {
    /// Stable machine name ("normal", "empirical").
    pub fn key(self) -> &'static str {
        match self {
            Distribution::Normal => "normal",
            Distribution::Empirical => "empirical",
        }
    }
}

/// An item's Stock plan.
#[derive(Clone, Debug, PartialEq)]
pub struct StockPlan {
    /// The settings it was worked out with.
    pub settings: StockSettings,
    /// P in periods.
    pub protection_periods: usize,
    /// The model used.
    pub distribution: Distribution,
    /// Expected demand over P: the sum of the plan's forecasts.
    pub demand_over_protection: f64,
    /// The spread of that total's error (with the lead time's own spread when given).
    pub sd_over_protection: f64,
    /// The rolling-origin totals the spread rests on.
    pub origins_used: usize,
    /// The cycle demand the fill rate is measured against: Q, or the demand over R.
    pub cycle_demand: f64,
    /// The figures: safety stock, level, shortage, service.
    pub figures: Figures,
    /// Units on hand and on order, when the stock table gives them.
    pub position: Option<Position>,
    /// What to order today, when on hand is known (see [`suggested_order`]).
    pub suggested_order: Option<f64>,
    /// Plain-words notes: the model and why, what the spread rests on, a negative safety stock.
    pub notes: Vec<String>,
}

/// What to order today, from the stock position IP = on hand + on order:
///
/// ```text
/// periodic review, level S:      max(0, S - IP)
/// continuous review, level s:    0 while IP > s; else n Q with n the fewest whole orders that
///                                lift IP above s, n = floor((s - IP) / Q) + 1   ((s, nQ) policy)
/// ```
///
/// then, when above 0, rounded up to a whole multiple of `multiple`, raised to `minimum`, and
/// (when the history counts whole units and no multiple is given) rounded up to a whole unit.
/// Common practice; rounding up never lowers the service the level was set for.
pub fn suggested_order(
    review: Review,
    level: f64,
    position: Position,
    multiple: Option<f64>,
    minimum: Option<f64>,
    whole_units: bool,
) -> f64 {
    let inventory_position = position.on_hand + position.on_order;
    let mut order = match review {
        Review::Periodic { .. } => (level - inventory_position).max(0.0),
        Review::Continuous { order_quantity } if inventory_position <= level => {
            order_quantity * (((level - inventory_position) / order_quantity).floor() + 1.0)
        }
        Review::Continuous { .. } => 0.0,
    };
    if order > 0.0 {
        match multiple {
            Some(m) => order = (order / m).ceil() * m,
            None if whole_units => order = order.ceil(),
            None => {}
        }
        if let Some(least) = minimum {
            order = order.max(least);
        }
    }
    order
}

/// Demand over the next `periods` periods of a plan: the sum of its forecasts (not the mean
/// times the periods: the path carries trend and season) and, as its spread, the root mean
/// square of the errors of that sum at the plan's rolling origins. Covariances between the
/// steps are therefore in it, as they are in the total the stock must cover (the sum of the
/// per-step variances would leave them out: tests/fixtures/refs/stock/README.md, trap 6).
/// Returns the demand and how many origin totals the spread rests on; `None` when the plan's
/// forecast is shorter than `periods` or fewer than two origins reach that far.
pub fn demand_over(plan: &ItemPlan, periods: usize) -> Option<(IntervalDemand, usize)> {
    if periods == 0 || plan.forecast.len() < periods {
        return None;
    }
    let Some(totals) = origin_totals(plan, periods) else {
        // Every period of the window is shut: nothing is sold, nothing can go wrong.
        return IntervalDemand::new(0.0, 0.0).ok().map(|d| (d, 0));
    };
    if totals.len() < 2 {
        return None;
    }
    IntervalDemand::new(forecast_total(plan, 0, periods), root_mean_square(&totals))
        .ok()
        .map(|d| (d, totals.len()))
}

/// The empirical model's demand scenarios over the next `periods` periods: today's expected
/// total minus each rolling origin's error of its total, floored at zero where the history
/// never goes below it (empty when every period of the window is shut).
pub fn demand_scenarios(plan: &ItemPlan, periods: usize) -> Vec<f64> {
    let mean = forecast_total(plan, 0, periods.min(plan.forecast.len()));
    let non_negative = plan.history.iter().all(|v| *v >= 0.0);
    origin_totals(plan, periods)
        .unwrap_or_default()
        .iter()
        .map(|e| mean - e)
        .map(|d| if non_negative { d.max(0.0) } else { d })
        .collect()
}

/// The errors of the total over the next `periods` periods at the plan's rolling origins:
/// over as many open periods as the window holds where the plan has shut places (their
/// forecasts are 0 and they sell nothing; [`crate::patterns::shut_places`]), so that a window
/// of shut days does not take the spread of days that sell (a review found a kiosk shut in
/// January and February given a spread of 24 over those two months). `None` when every
/// period of the window is shut.
fn origin_totals(plan: &ItemPlan, periods: usize) -> Option<Vec<f64>> {
    let n = plan.history.len();
    let open = (n..n + periods)
        .filter(|t| !plan.demand.is_shut(*t))
        .count();
    (open > 0).then(|| {
        plan.origin_errors
            .open_totals(open, |t| plan.demand.is_shut(t))
    })
}

/// The sum of the plan's forecasts for steps from + 1 ..= to.
fn forecast_total(plan: &ItemPlan, from: usize, to: usize) -> f64 {
    plan.forecast[from..to].iter().map(|f| f.band.value).sum()
}

/// Shut periods the protection interval reaches over (days or months of the plan's shut
/// places, without demand in almost every season and forecast as 0;
/// [`crate::patterns::shut_places`]): no one orders while shut, and stock does not fall then
/// either, so the next order is placed when the business opens again. Under continuous review
/// with a lead time, the run right after now; under periodic review, the run the next review
/// falls in (the close of period R; a review at the close of an open period is held, as
/// today's is), which moves that review to the close of the first open period after it.
/// Left out, a shop shut on Sundays got, on a Saturday with a lead time of one day, the
/// Sunday's demand (0) to cover, a reorder point near 0 and an order quantity of 1, while an
/// order placed on reopening arrives after that day's sales. Our choice, said in a note.
fn shut_ahead(plan: &ItemPlan, settings: &StockSettings) -> usize {
    let n = plan.history.len();
    match settings.review_period {
        None if settings.lead_time == 0 => 0,
        None => plan.demand.shut_run_from(n),
        // The next review, at the close of period R, moves when that period is shut.
        Some(r) => plan.demand.shut_run_from(n + r - 1),
    }
}

/// Whether the item's history counts whole units (every value read whole, gaps aside:
/// [`ItemPlan::whole_units`]): an order is then
/// rounded up to a whole unit ([`suggested_order`]), so the stock it brings reaches the level
/// rounded up.
pub fn counts_whole_units(plan: &ItemPlan) -> bool {
    plan.whole_units
}

/// P for this plan: [`StockSettings::protection_periods`] and the shut periods it reaches
/// over ([`shut_ahead`]); the plan must forecast this far.
pub fn protection_periods_of(plan: &ItemPlan, settings: &StockSettings) -> usize {
    settings.protection_periods() + shut_ahead(plan, settings)
}

/// Works out an item's Stock plan from its plan, which must forecast at least
/// [`protection_periods_of`] periods ahead.
pub fn plan_stock(plan: &ItemPlan, settings: &StockSettings) -> Result<StockPlan, StockError> {
    let lead = settings.lead_time;
    let shut = shut_ahead(plan, settings);
    let periods = settings.protection_periods() + shut;
    let horizon = plan.forecast.len();
    if horizon < periods {
        return Err(StockError::ShortPlan { periods, horizon });
    }
    let mut notes = Vec::new();
    if shut > 0 {
        let (when, what) = match settings.review_period {
            None => ("right after now", "the reorder point"),
            Some(_) => ("where the next review falls", "the order-up-to level"),
        };
        notes.push(format!(
            "{} {when} had no demand in almost every season (a business shut then, forecast as \
             0): taking it that no order is placed while shut, {what} covers {} and the \
             periods until an order placed on reopening arrives, {periods} periods in all; if \
             orders go out on those days too, that is more than needed",
            if shut == 1 {
                "the period"
            } else {
                "the periods"
            },
            if shut == 1 { "it" } else { "them" }
        ));
    }
    let sparse = plan.demand.class.is_sparse();
    // With nothing to protect (P = 0) there are no totals to draw from: the normal model's
    // figures with no spread (a level of 0) serve every class.
    let distribution = if sparse && periods > 0 {
        Distribution::Empirical
    } else {
        Distribution::Normal
    };
    // P = 0: continuous review with no lead time, nothing to protect.
    let (protection, origins_used) = if periods == 0 {
        (IntervalDemand::new(0.0, 0.0)?, 0)
    } else {
        demand_over(plan, periods).ok_or(StockError::ShortPlan { periods, horizon })?
    };
    let per_period = if periods > 0 {
        protection.mean() / periods as f64
    } else {
        0.0
    };
    // sqrt(sigma^2 + mu^2 s_L^2): the lead time's spread on top of the forecast's (Chopra &
    // Meindl ch. 12, from memory, with the forecast's total error for P sigma^2); the same for
    // the lead time alone under periodic review.
    let with_lead_time_spread = |d: IntervalDemand| {
        let sd = (d.sd().powi(2) + (per_period * settings.lead_time_sd).powi(2)).sqrt();
        IntervalDemand::new(d.mean(), sd)
    };
    // The origins' own spread, before the lead time's: the empirical model's tail uses it.
    let origins_sd = protection.sd();
    let protection = with_lead_time_spread(protection)?;
    let (review, cycle_demand) = match settings.review_period {
        None => {
            let q = settings.order_quantity.unwrap_or_else(|| {
                // At least one open period's demand, whatever the lead time.
                let steps = lead.max(1) + plan.demand.shut_run_from(plan.history.len());
                forecast_total(plan, 0, steps.min(horizon)).max(1.0)
            });
            (Review::continuous(q)?, q)
        }
        Some(r) => (
            Review::periodic(r as f64)?,
            forecast_total(plan, lead, lead + r + shut).max(f64::MIN_POSITIVE),
        ),
    };
    let figures = match distribution {
        Distribution::Normal => {
            let lead_demand = match review {
                Review::Continuous { .. } => protection,
                Review::Periodic { .. } if lead == 0 => IntervalDemand::new(0.0, 0.0)?,
                Review::Periodic { .. } => {
                    let (d, _) = demand_over(plan, lead).ok_or(StockError::ShortPlan {
                        periods: lead,
                        horizon,
                    })?;
                    with_lead_time_spread(d)?
                }
            };
            figures(
                protection,
                lead_demand,
                review,
                cycle_demand,
                settings.target,
            )?
        }
        Distribution::Empirical => {
            let scenarios = demand_scenarios(plan, periods);
            notes.push(format!(
                "{} demand: the figures come from the {} rolling-origin totals themselves, not \
                 the normal model",
                plan.demand.class.as_str(),
                scenarios.len()
            ));
            if settings.lead_time_sd > 0.0 {
                notes.push(
                    "the lead time's spread is not applied to the empirical model".to_string(),
                );
            }
            if let Some(season) = plan.season.length {
                // A review found a Nov-Dec item planned in January given 59 to cover a month
                // that sells nothing, and one planned in September 43 against a coming 115.
                notes.push(format!(
                    "its demand follows a season of {season} periods, which these totals do \
                     not: they pool every time of year, so the level runs high in its quiet \
                     periods and can fall short before its busy ones; weigh the order against \
                     the season (the Look-ahead and the Pattern view show it)"
                ));
            }
            let spread = Spread {
                mean: protection.mean(),
                sd: origins_sd,
                whole_units: counts_whole_units(plan),
                periods,
            };
            let empirical = empirical_figures(spread, &scenarios, cycle_demand, settings.target)?;
            if let (Some(beyond), Target::CycleService(p)) = (empirical.beyond, settings.target) {
                let over = if periods > 1 {
                    format!(
                        " over {periods} periods, as neighbouring totals share all but one \
                         period"
                    )
                } else {
                    String::new()
                };
                // Targets are read to a tenth of a percent at most.
                let target = (1000.0 * p).round() / 10.0;
                notes.push(format!(
                    "{} past demand totals over the protection interval are too few to support \
                     a {target} % cycle service level (that needs {}{over}): the level comes \
                     from a {} distribution of the same mean and spread, and is at least the \
                     largest past total",
                    scenarios.len(),
                    totals_needed(p, periods),
                    beyond.name()
                ));
            }
            empirical.figures
        }
    };
    if figures.expected_shortage > cycle_demand {
        notes.push(format!(
            "the shortage per cycle ({:.2}) is more than the demand per cycle ({:.2}): the \
             traditional fill rate, 1 - shortage / demand per cycle, would go below 0 and is \
             shown as 0 %; ordering more at a time raises it",
            figures.expected_shortage, cycle_demand
        ));
    }
    if origins_used > 0 && origins_used < 10 {
        notes.push(format!(
            "the spread rests on only {origins_used} rolling-origin totals: treat the safety \
             stock as rough"
        ));
    }
    if figures.safety_stock < 0.0 {
        notes.push(match settings.target {
            Target::FillRate(_) => "the fill-rate target is met below the expected demand: the \
                 safety stock is negative, as the target allows"
                .to_string(),
            // Only the empirical model gets here: most past totals over P fell short of their
            // forecast, the demand coming in rare large lumps.
            Target::CycleService(_) => "the cycle service target is met below the expected \
                 demand: in most past periods like these the demand stayed below the forecast, \
                 coming in rare large lumps, so the safety stock is negative; if a lump is due \
                 (a season's peak the past totals did not reach), the level is too low"
                .to_string(),
        });
    }
    let whole_units = counts_whole_units(plan);
    let suggested = settings.position.map(|position| {
        suggested_order(
            review,
            figures.level,
            position,
            settings.order_multiple,
            settings.minimum_order,
            whole_units,
        )
    });
    Ok(StockPlan {
        position: settings.position,
        suggested_order: suggested,
        settings: settings.clone(),
        protection_periods: periods,
        distribution,
        demand_over_protection: protection.mean(),
        sd_over_protection: protection.sd(),
        origins_used,
        cycle_demand,
        figures,
        notes,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn service_targets_read_as_fraction_or_percent() {
        let check = |text: &str, want: Result<f64, ()>| {
            let got = service_fraction("cycle service level", text).map_err(|_| ());
            assert_eq!(got, want, "{text}");
        };
        check("0.95", Ok(0.95));
        check("95", Ok(0.95));
        check("95%", Ok(0.95));
        check(" 97.5 ", Ok(0.975));
        check("1", Err(()));
        check("50", Ok(0.5));
        check("0.5", Ok(0.5));
        check("49", Err(()));
        check("0.3", Err(()));
        check("100", Err(()));
        check("0", Err(()));
        check("-5", Err(()));
        check("ninety", Err(()));
    }

    /// (review, level, on hand, on order, multiple, minimum, whole units) -> order.
    fn check_order(
        review: Review,
        level: f64,
        (on_hand, on_order): (f64, f64),
        (multiple, minimum, whole): (Option<f64>, Option<f64>, bool),
        want: f64,
    ) {
        let got = suggested_order(
            review,
            level,
            Position { on_hand, on_order },
            multiple,
            minimum,
            whole,
        );
        assert!(
            (got - want).abs() < 1e-9,
            "{review:?} {level}: {got} vs {want}"
        );
    }

    #[test]
    fn suggested_orders_by_hand() {
        let periodic = Review::Periodic { every: 1.0 };
        let q40 = Review::Continuous {
            order_quantity: 40.0,
        };
        // S 100, position 30 + 20: 50; whole units; multiples of 12 -> 60; minimum 70 -> 70.
        check_order(periodic, 100.0, (30.0, 20.0), (None, None, true), 50.0);
        check_order(periodic, 100.4, (30.0, 20.0), (None, None, true), 51.0);
        check_order(periodic, 100.4, (30.0, 20.0), (None, None, false), 50.4);
        check_order(
            periodic,
            100.0,
            (30.0, 20.0),
            (Some(12.0), None, true),
            60.0,
        );
        check_order(
            periodic,
            100.0,
            (30.0, 20.0),
            (Some(12.0), Some(70.0), true),
            70.0,
        );
        // Above S: nothing, whatever the minimum.
        check_order(periodic, 100.0, (90.0, 20.0), (None, Some(70.0), true), 0.0);
        // (s, nQ): s 100, Q 40. Position 101: nothing; 100: one Q; 50: two; -30: four.
        check_order(q40, 100.0, (101.0, 0.0), (None, None, true), 0.0);
        check_order(q40, 100.0, (100.0, 0.0), (None, None, true), 40.0);
        check_order(q40, 100.0, (30.0, 20.0), (None, None, true), 80.0);
        check_order(q40, 100.0, (-30.0, 0.0), (None, None, true), 160.0);
    }

    #[test]
    fn a_row_overrides_the_file_settings() {
        let file = StockSettings::new(1, None, Target::cycle_service(0.95).unwrap()).unwrap();
        let row = StockRow {
            item: "A".into(),
            on_hand: Some(12.0),
            lead_time: Some(3),
            review_period: Some(2),
            order_multiple: Some(6.0),
            ..StockRow::default()
        };
        let s = file.for_row(&row).unwrap();
        assert_eq!(s.protection_periods(), 5);
        assert_eq!(
            s.position,
            Some(Position {
                on_hand: 12.0,
                on_order: 0.0
            })
        );
        assert_eq!(s.order_multiple, Some(6.0));
        assert_eq!(s.target(), Target::CycleService(0.95));
        let bad = StockRow {
            on_order: Some(-1.0),
            ..row
        };
        assert!(file.for_row(&bad).is_err());
    }

    #[test]
    fn settings_are_checked() {
        let t = Target::cycle_service(0.95).unwrap();
        assert!(StockSettings::new(0, None, t).is_ok());
        assert!(StockSettings::new(367, None, t).is_err());
        assert!(StockSettings::new(2, Some(0), t).is_err());
        assert_eq!(
            StockSettings::new(2, Some(4), t)
                .unwrap()
                .protection_periods(),
            6
        );
        assert!(StockSettings::new(2, None, t)
            .unwrap()
            .with_lead_time_sd(-1.0)
            .is_err());
        assert!(StockSettings::new(2, None, t)
            .unwrap()
            .with_order_quantity(0.0)
            .is_err());
    }
}
