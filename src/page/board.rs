//! The Item board's rules, apart from the DOM: its columns, how rows sort and filter, the
//! batches items are sent to the workers in, and the order plan as CSV.
//!
//! Kept apart from: showing (board_panel.rs) and computing (every figure comes from the
//! worker's rows, src/worker/board.rs). Pure and tested natively.

use std::cmp::Ordering;

use morrowcast_engine::alerts::AlertKind;
use morrowcast_engine::calendar::Period;
use morrowcast_engine::lookback::{LookBack, LookBackTally, Outcome, StockCheck};
use morrowcast_engine::sorting;
use morrowcast_engine::stock::Target;

use crate::worker::{BoardFigures, BoardRow};

/// Items per batch sent to a worker (our choice: about 30 ms of work for 60-month items, so
/// rows and progress arrive several times a second and a changed setting stops old work soon).
pub const BATCH: usize = 8;

/// Rows drawn at first, and added by each "show more" (our choice, measured: drawing the first
/// 200 rows of a 1,000-item board held the page about 100 ms; sorting and filtering cover
/// every row).
pub const ROWS_SHOWN: usize = 100;

/// What the board changes for one item (the same rule the command line applies to a work's
/// item changes, so it lives with the work).
pub use morrowcast_work::ItemChange;

/// What a column sorts by.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum SortKey {
    /// The file's order.
    File,
    Name,
    DemandClass,
    Season,
    Trend,
    Method,
    Mase,
    Bias,
    Tracking,
    History,
    Next,
    DemandOver,
    SafetyStock,
    Level,
    Order,
    Alerts,
    /// The Look-back's column (shown only while one is asked for): periods outside the band,
    /// and a stock level that fell short counted as one more.
    LookBack,
}

/// A column of the board: its heading, its sort key, whether it holds numbers.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Column {
    pub key: SortKey,
    pub title: &'static str,
    pub numeric: bool,
}

const fn col(key: SortKey, title: &'static str, numeric: bool) -> Column {
    Column {
        key,
        title,
        numeric,
    }
}

/// The board's columns, left to right (the item's name comes first, outside this list): what
/// to order and why to look first, then the figures behind it, then the forecast's make-up.
pub const COLUMNS: [Column; 14] = [
    col(SortKey::Order, "Order today", true),
    col(SortKey::Alerts, "Alerts", true),
    col(SortKey::Next, "Next period (band)", true),
    col(SortKey::DemandOver, "Demand over protection", true),
    col(SortKey::SafetyStock, "Safety stock", true),
    col(SortKey::Level, "Reorder point / order-up-to", true),
    col(SortKey::DemandClass, "Demand", false),
    col(SortKey::Season, "Season", true),
    col(SortKey::Trend, "Trend", false),
    col(SortKey::Method, "Method", false),
    col(SortKey::Mase, "MASE", true),
    // The holdout's, as the Error ledger's: the Bias alert reads the one-step forecasts of
    // the latest periods instead, and says so.
    col(SortKey::Bias, "Bias (holdout)", true),
    col(SortKey::Tracking, "Tracking signal (holdout)", true),
    col(SortKey::History, "History", true),
];

/// The columns that show stock figures, in the order of [`COLUMNS`] (a row without stock
/// figures says why in one cell across them).
pub const STOCK_COLUMNS: [SortKey; 3] = [SortKey::DemandOver, SortKey::SafetyStock, SortKey::Level];

fn number(f: &BoardFigures, key: SortKey) -> Option<f64> {
    match key {
        SortKey::Season => Some(f.season.unwrap_or(1) as f64),
        SortKey::Mase => f.mase,
        SortKey::Bias => Some(f.bias),
        // By how far beyond zero: the worst first when descending.
        SortKey::Tracking => f.tracking_signal.map(f64::abs),
        SortKey::History => Some(f.history as f64),
        SortKey::Next => Some(f.next),
        SortKey::DemandOver => f.stock.as_ref().ok().map(|s| s.demand_over_protection),
        SortKey::SafetyStock => f.stock.as_ref().ok().map(|s| s.safety_stock),
        SortKey::Level => f.stock.as_ref().ok().map(|s| s.level_units),
        SortKey::Order => f.stock.as_ref().ok().and_then(|s| s.suggested_order),
        SortKey::Alerts => Some(f.alerts.len() as f64),
        _ => None,
    }
    .filter(|v| v.is_finite())
}

fn text(row: &BoardRow, key: SortKey) -> String {
    let Ok(f) = &row.figures else {
        return String::new();
    };
    match key {
        SortKey::DemandClass => f.demand_class.clone(),
        SortKey::Trend => f.trend.clone(),
        SortKey::Method => f.method.clone(),
        _ => String::new(),
    }
}

/// Sorts rows by `key`; rows with no value for it (and items without figures) go last in
/// either direction, and ties keep the file's order.
pub fn sort_rows(rows: &mut [&BoardRow], key: SortKey, descending: bool) {
    let by_file = |a: &BoardRow, b: &BoardRow| a.index.cmp(&b.index);
    sorting::sort_by(rows, |a, b| {
        // Items without figures go last whatever the column (but by name they sort as names,
        // and by the Look-back as their Look-back: it stands without today's figures).
        let failed_last = b.figures.is_ok().cmp(&a.figures.is_ok());
        let misses = |r: &BoardRow| match &r.look_back {
            Some(Ok(l)) => Some(look_back_misses(l)),
            _ => None,
        };
        let primary = match key {
            SortKey::File => Ordering::Equal,
            SortKey::Name => {
                let o = a.name.to_lowercase().cmp(&b.name.to_lowercase());
                if descending {
                    o.reverse()
                } else {
                    o
                }
            }
            SortKey::LookBack => match (misses(a), misses(b)) {
                (Some(x), Some(y)) if descending => y.cmp(&x),
                (Some(x), Some(y)) => x.cmp(&y),
                (Some(_), None) => Ordering::Less,
                (None, Some(_)) => Ordering::Greater,
                (None, None) => Ordering::Equal,
            },
            _ if failed_last != Ordering::Equal => failed_last,
            SortKey::DemandClass | SortKey::Trend | SortKey::Method => {
                let o = text(a, key).cmp(&text(b, key));
                if descending {
                    o.reverse()
                } else {
                    o
                }
            }
            _ => {
                let na = a.figures.as_ref().ok().and_then(|f| number(f, key));
                let nb = b.figures.as_ref().ok().and_then(|f| number(f, key));
                match (na, nb) {
                    (Some(x), Some(y)) => {
                        let o = x.total_cmp(&y);
                        if descending {
                            o.reverse()
                        } else {
                            o
                        }
                    }
                    (Some(_), None) => Ordering::Less,
                    (None, Some(_)) => Ordering::Greater,
                    (None, None) => Ordering::Equal,
                }
            }
        };
        primary.then_with(|| by_file(a, b))
    });
}

/// What the board is filtered by.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Filter {
    /// Text found (case aside) in the item's name or method.
    pub text: String,
    /// Only items with this alert; "any alert" is [`AlertFilter::Any`].
    pub alert: AlertFilter,
}

/// The alert part of a [`Filter`].
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum AlertFilter {
    #[default]
    All,
    /// Items with at least one alert, or without stock figures.
    Any,
    /// Items without stock figures (their history could not be planned, or is too short
    /// for the figures' spread).
    Failed,
    Kind(AlertKind),
    /// Items whose stock level of then fell short in the Look-back.
    ShortStock,
    /// Items whose holdout tracking signal (the board's column) is beyond its limit: no alert
    /// repeats it, so "items with an alert" leaves them out (a review missed a large order's
    /// item so).
    TrackingBeyond,
}

impl AlertFilter {
    /// The select's value for it.
    pub fn key(self) -> &'static str {
        match self {
            AlertFilter::All => "all",
            AlertFilter::Any => "any",
            AlertFilter::Failed => "failed",
            AlertFilter::Kind(k) => k.key(),
            AlertFilter::ShortStock => "short-stock",
            AlertFilter::TrackingBeyond => "tracking-beyond",
        }
    }

    /// The filter a select's value stands for.
    pub fn from_key(key: &str) -> AlertFilter {
        match key {
            "any" => AlertFilter::Any,
            "failed" => AlertFilter::Failed,
            "short-stock" => AlertFilter::ShortStock,
            "tracking-beyond" => AlertFilter::TrackingBeyond,
            _ => AlertKind::ALL
                .into_iter()
                .find(|k| k.key() == key)
                .map_or(AlertFilter::All, AlertFilter::Kind),
        }
    }
}

/// Whether `needle` stands in `text` where a word starts (at the start, or after a character
/// that is not a letter or digit).
fn at_a_word_start(text: &str, needle: &str) -> bool {
    text.match_indices(needle).any(|(at, _)| {
        text[..at]
            .chars()
            .next_back()
            .is_none_or(|c| !c.is_alphanumeric())
    })
}

impl Filter {
    /// Whether a row passes.
    pub fn passes(&self, row: &BoardRow) -> bool {
        let needle = self.text.trim().to_lowercase();
        // A method by the start of a word of its name, as the row shows it or in full:
        // anywhere inside a word, "hose" found "chosen" in every AICc row (a review).
        let text_ok = needle.is_empty()
            || row.name.to_lowercase().contains(&needle)
            || row.figures.as_ref().is_ok_and(|f| {
                [&f.method, &f.method_short]
                    .iter()
                    .any(|m| at_a_word_start(&m.to_lowercase(), &needle))
            });
        let alert_ok = match (self.alert, &row.figures) {
            (AlertFilter::All, _) => true,
            (AlertFilter::Any, Ok(f)) => !f.alerts.is_empty() || f.stock.is_err(),
            (AlertFilter::Any | AlertFilter::Failed, Err(_)) => true,
            (AlertFilter::Failed, Ok(f)) => f.stock.is_err(),
            (AlertFilter::Kind(k), Ok(f)) => f.alerts.iter().any(|a| a.kind == k),
            (AlertFilter::Kind(_), Err(_)) => false,
            (AlertFilter::TrackingBeyond, Ok(f)) => f.tracking_beyond,
            (AlertFilter::TrackingBeyond, Err(_)) => false,
            (AlertFilter::ShortStock, _) => matches!(
                &row.look_back,
                Some(Ok(l)) if l.stock.covered() == Some(false)
            ),
        };
        text_ok && alert_ok
    }
}

/// The order plan as CSV: one row per item in the file's order, with every figure of its row
/// (column names as `morrowcast stock --json`'s; numbers in Rust's shortest round-trip form,
/// fractions as fractions; empty where a figure does not apply), its alerts' reasons, and for
/// an item without figures the reason in `problem`. `changed` says whether an item carries
/// the board's own changes.
pub fn order_plan_csv(rows: &[&BoardRow], changed: impl Fn(&str) -> bool) -> String {
    let mut w = csv::Writer::from_writer(Vec::new());
    let _ = w.write_record(ORDER_PLAN_COLUMNS);
    let num = |v: f64| v.to_string();
    let opt = |v: Option<f64>| v.map(|v| v.to_string()).unwrap_or_default();
    for row in rows {
        let changed = if changed(&row.name) { "yes" } else { "" };
        let mut record = vec![String::new(); ORDER_PLAN_COLUMNS.len()];
        let mut set = |column: &str, value: String| {
            let i = ORDER_PLAN_COLUMNS.iter().position(|c| *c == column);
            debug_assert!(i.is_some(), "no order plan column {column}");
            if let Some(i) = i {
                record[i] = value;
            }
        };
        set("name", row.name.clone());
        set("changed_on_board", changed.into());
        match &row.figures {
            Ok(f) => {
                set("next_forecast", num(f.next));
                set("next_low", num(f.next_lower));
                set("next_high", num(f.next_upper));
                set("band_level", num(f.level));
                set("method", f.method.clone());
                set("demand_class", f.demand_class.clone());
                set(
                    "season_length",
                    f.season.map(|s| s.to_string()).unwrap_or_default(),
                );
                set("trend", f.trend.clone());
                set("holdout_mase", opt(f.mase));
                set("holdout_bias", num(f.bias));
                set("tracking_signal", opt(f.tracking_signal));
                set("history_periods", f.history.to_string());
                let kinds: Vec<&str> = f.alerts.iter().map(|a| a.kind.key()).collect();
                set("alerts", kinds.join(" "));
                let reasons: Vec<&str> = f.alerts.iter().map(|a| a.reason.as_str()).collect();
                set("alert_reasons", reasons.join(" | "));
                match &f.stock {
                    Ok(s) => {
                        let (kind, value) = match s.target {
                            Target::CycleService(v) => ("cycle_service_level", v),
                            Target::FillRate(v) => ("fill_rate", v),
                        };
                        set(
                            "policy",
                            if s.periodic { "periodic" } else { "continuous" }.into(),
                        );
                        set("lead_time", s.lead_time.to_string());
                        set(
                            "review_period",
                            s.review_period.map(|r| r.to_string()).unwrap_or_default(),
                        );
                        set("protection_periods", s.protection_periods.to_string());
                        set("distribution", s.distribution.clone());
                        set("demand_over_protection", num(s.demand_over_protection));
                        set("sd_over_protection", num(s.sd_over_protection));
                        set("target_kind", kind.into());
                        set("target", num(value));
                        set("safety_stock", num(s.safety_stock));
                        let level = if s.periodic {
                            "order_up_to"
                        } else {
                            "reorder_point"
                        };
                        set(level, num(s.level_units));
                        set("on_hand", opt(s.on_hand));
                        set("on_order", opt(s.on_order));
                        set("suggested_order", opt(s.suggested_order));
                        set("cycle_service_level", num(s.cycle_service_level));
                        set("fill_rate", num(s.fill_rate));
                        set("notes", s.notes.join(" | "));
                    }
                    Err(none) => {
                        set("on_hand", opt(none.on_hand));
                        set("on_order", opt(none.on_order));
                        set("problem", none.why.clone());
                    }
                }
            }
            Err(problem) => set("problem", problem.clone()),
        }
        let _ = w.write_record(record);
    }
    w.into_inner()
        .map(|b| String::from_utf8_lossy(&b).into_owned())
        .unwrap_or_default()
}

/// The order plan's columns.
pub const ORDER_PLAN_COLUMNS: [&str; 35] = [
    "name",
    "policy",
    "lead_time",
    "review_period",
    "protection_periods",
    "distribution",
    "demand_over_protection",
    "sd_over_protection",
    "target_kind",
    "target",
    "safety_stock",
    "reorder_point",
    "order_up_to",
    "on_hand",
    "on_order",
    "suggested_order",
    "cycle_service_level",
    "fill_rate",
    "next_forecast",
    "next_low",
    "next_high",
    "band_level",
    "method",
    "demand_class",
    "season_length",
    "trend",
    "holdout_mase",
    "holdout_bias",
    "tracking_signal",
    "history_periods",
    "alerts",
    "alert_reasons",
    "notes",
    "changed_on_board",
    "problem",
];

/// The Look-back column's heading (numeric: it sorts by its misses, the most first; its
/// words are left-aligned all the same).
pub const LOOK_BACK_COLUMN: Column = col(SortKey::LookBack, "Look-back", true);

/// How often an item's plan of then missed: periods outside the band, plus one when the stock
/// level fell short (what the Look-back column sorts by).
pub fn look_back_misses(l: &LookBack) -> usize {
    let known = l.known().count();
    known - l.within() + usize::from(l.stock.covered() == Some(false))
}

/// `n` things in words, singular for one: ("1 month", "3 days", "2 gaps").
pub fn how_many(n: usize, (one, many): (&str, &str)) -> String {
    if n == 1 {
        format!("1 {one}")
    } else {
        format!("{n} {many}")
    }
}

/// `n` periods in the file's own words ("1 month", "3 days").
fn count(l: &LookBack, n: usize) -> String {
    l.made_after.frequency().periods(n)
}

/// The Look-back column's cell: what sold against the forecast and band of then, and whether
/// the stock level held over its protection interval.
pub fn look_back_cell(l: &LookBack) -> String {
    let (forecast, sold) = l.totals();
    let known = l.known().count();
    let (gaps, shut) = l.left_out();
    let mut left_out = Vec::new();
    if gaps > 0 {
        left_out.push(how_many(gaps, ("gap", "gaps")));
    }
    if shut > 0 {
        left_out.push(format!("{shut} shut"));
    }
    if l.after_data() > 0 {
        left_out.push(format!("{} after its data ends", count(l, l.after_data())));
    }
    let left_out = if left_out.is_empty() {
        String::new()
    } else {
        format!(" ({} left out)", left_out.join(", "))
    };
    // How far the forecast was off, against what sold (none where nothing sold).
    let off = if sold > 0.0 && (forecast - sold).abs() >= 0.005 * sold {
        let pct = 100.0 * (forecast - sold) / sold;
        format!(
            " ({:.0}% {})",
            pct.abs(),
            if pct > 0.0 { "high" } else { "low" }
        )
    } else {
        String::new()
    };
    let sales = match (l.steps.as_slice(), known) {
        ([step], 1) => format!(
            "sold {}, forecast {}{off}, band {}–{}: {}",
            units(sold),
            units(forecast),
            units(step.band.low),
            units(step.band.high),
            outcome_words(step.outcome())
        ),
        (_, 0) if gaps == 0 && l.after_data() == 0 => "shut since".to_string(),
        (_, 0) => format!("no sales known since{left_out}"),
        (_, _) => format!(
            "sold {}, forecast {}{off} over {}{left_out}; {} of {known} within the band",
            units(sold),
            units(forecast),
            count(l, known),
            l.within(),
        ),
    };
    let sales = match l.extended() {
        0 => sales,
        n => format!("{sales} ({n} beyond the plan's horizon)"),
    };
    let stock = match &l.stock {
        StockCheck::Checked { periods, .. } => {
            let over = if *periods == known && known == l.steps.len() {
                String::new()
            } else {
                let (one, _) = l.made_after.frequency().period_words();
                match periods {
                    1 => format!(" over the first {one}"),
                    _ => format!(" over the first {}", count(l, *periods)),
                }
            };
            match l.stock.shortfall() {
                Some(short) if short > 0.0 => {
                    format!("stock level short by {}{over}", units(short))
                }
                _ => format!(
                    "stock level held{over}, {} to spare",
                    units(l.stock.spare().unwrap_or(0.0))
                ),
            }
        }
        StockCheck::TooSoon { periods, passed } => format!(
            "stock level not judged yet: {passed} of its {} have passed",
            count(l, *periods)
        ),
        StockCheck::NoInterval => "no lead time to judge".into(),
        StockCheck::Gap { .. } => "stock level not judged (a gap)".into(),
        StockCheck::AfterData { .. } => "stock level not judged (its data ends)".into(),
        StockCheck::NoFigures(_) => "no Stock plan then".into(),
    };
    format!("{sales}; {stock}")
}

/// What a period since came to, as the page words it.
pub fn outcome_words(outcome: Outcome) -> &'static str {
    match outcome {
        Outcome::Within => "within",
        Outcome::Below => "below the band",
        Outcome::Above => "above the band",
        Outcome::Shut => "shut",
        Outcome::Gap => "gap",
        Outcome::Ended => "after its data ends",
    }
}

/// Units as the board shows them: whole from 100 up or when whole, else one decimal.
pub fn units(v: f64) -> String {
    if !v.is_finite() {
        "–".into()
    } else if v.abs() >= 100.0 || v.fract() == 0.0 {
        format!("{v:.0}")
    } else {
        format!("{v:.1}")
    }
}

/// The Look-back of every row that has one, counted, with what the line above the board says
/// besides: the latest period a plan of then saw, and the shortest protection interval still
/// to pass where no stock level could be judged yet.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct LookBackCounts {
    pub tally: LookBackTally,
    pub made_after: Option<Period>,
    pub shortest_pending: Option<usize>,
    /// Items that could not be looked back on (their cell says why).
    pub without: usize,
}

/// Counts every row's Look-back.
pub fn look_back_counts(rows: &[Option<BoardRow>]) -> LookBackCounts {
    let mut counts = LookBackCounts::default();
    for row in rows.iter().flatten() {
        if let Some(Err(_)) = &row.look_back {
            counts.without += 1;
        }
        if let Some(Ok(l)) = &row.look_back {
            counts.tally.add(l);
            counts.made_after = counts.made_after.max(Some(l.made_after));
            if let StockCheck::TooSoon { periods, .. } = l.stock {
                counts.shortest_pending =
                    Some(counts.shortest_pending.map_or(periods, |p| p.min(periods)));
            }
        }
    }
    counts
}

/// The line above the board while a Look-back of `back` periods is shown; `words` the file's
/// names for one period and several ("month", "months").
pub fn look_back_summary(c: &LookBackCounts, back: usize, words: (&str, &str)) -> String {
    let n = |k: usize| how_many(k, words);
    let many = words.1;
    let share = |x: Option<f64>| x.map_or("–".to_string(), |v| format!("{:.1}%", 100.0 * v));
    let t = &c.tally;
    let when = match c.made_after {
        Some(p) => format!("The plan made after {p} ({} ago)", n(back)),
        None => format!("The plan of {} ago", n(back)),
    };
    if t.items == 0 && c.without == 0 {
        // Nothing counted yet: the board is still planning (no "0 of 0").
        return format!("{when} is set against what sold since as the board plans each item.");
    }
    let mut words = format!(
        "{when}, set against what sold since, for {} items: {} of {} {many} within their band \
         ({}).",
        t.items,
        t.within,
        t.periods,
        share(t.within_share())
    );
    if t.stock_checked > 0 {
        words.push_str(&format!(
            " The stock level of then covered the demand over its protection interval for {} of \
             {} items ({}; the levels were set for {} on average).",
            t.covered,
            t.stock_checked,
            share(t.covered_share()),
            share(t.promised())
        ));
        if t.covered < t.stock_checked {
            words.push_str(
                " Items whose stock level fell short are marked in the Look-back column.",
            );
        }
    } else if let Some(p) = c.shortest_pending {
        words.push_str(&format!(
            " No stock level can be judged yet: look back over at least the protection interval \
             ({} for the shortest).",
            n(p)
        ));
    }
    if c.without > 0 {
        words.push_str(&format!(
            " {} could not be looked back on and {} not counted (the Look-back column says why).",
            how_many(c.without, ("item", "items")),
            if c.without == 1 { "is" } else { "are" }
        ));
    }
    words
}

/// The Look-back's columns in its CSV (names as `morrowcast look-back --json`'s where it has
/// them).
pub const LOOK_BACK_COLUMNS: [&str; 21] = [
    "name",
    "made_after",
    "method",
    "level",
    "periods",
    "counted",
    "within",
    "forecast_total",
    "sold_total",
    "gaps",
    "shut",
    "after_data",
    "extended",
    "stock_check",
    "protection_periods",
    "reorder_point",
    "order_up_to",
    "demand",
    "shortfall",
    "promised_cycle_service",
    "problem",
];

/// The Look-back as CSV: one row per item in the file's order (the rows given), its counts and
/// totals over the periods since, and its stock check; an item without one has the reason in
/// `problem`. Numbers in Rust's shortest round-trip form, empty where a figure does not apply.
pub fn look_back_csv(rows: &[&BoardRow]) -> String {
    let mut w = csv::Writer::from_writer(Vec::new());
    let _ = w.write_record(LOOK_BACK_COLUMNS);
    let opt = |v: Option<f64>| v.map(|v| v.to_string()).unwrap_or_default();
    for row in rows {
        let found = match &row.look_back {
            Some(l) => l.as_ref().map_err(Clone::clone),
            None => continue,
        };
        let mut r = vec![String::new(); LOOK_BACK_COLUMNS.len()];
        // Each cell by its column's name, so a column added cannot shift the others.
        let mut set = |column: &str, value: String| {
            if let Some(k) = LOOK_BACK_COLUMNS.iter().position(|c| *c == column) {
                r[k] = value;
            }
        };
        set("name", row.name.clone());
        match found {
            Ok(l) => {
                let (forecast, sold) = l.totals();
                let (gaps, shut) = l.left_out();
                set("made_after", l.made_after.to_string());
                set("method", l.method.clone());
                set("level", l.level.percent().to_string());
                set("periods", l.steps.len().to_string());
                set("counted", l.known().count().to_string());
                set("within", l.within().to_string());
                set("forecast_total", forecast.to_string());
                set("sold_total", sold.to_string());
                set("gaps", gaps.to_string());
                set("shut", shut.to_string());
                set("after_data", l.after_data().to_string());
                set("extended", l.extended().to_string());
                match &l.stock {
                    StockCheck::Checked {
                        periodic,
                        level,
                        demand,
                        promised,
                        ..
                    } => {
                        let kind = if *periodic {
                            "order_up_to"
                        } else {
                            "reorder_point"
                        };
                        set(kind, level.to_string());
                        set("demand", demand.to_string());
                        set("promised_cycle_service", promised.to_string());
                    }
                    StockCheck::NoFigures(why) => set("problem", why.clone()),
                    StockCheck::TooSoon { .. }
                    | StockCheck::NoInterval
                    | StockCheck::Gap { .. }
                    | StockCheck::AfterData { .. } => {}
                }
                set("stock_check", l.stock.key().into());
                set(
                    "protection_periods",
                    l.stock
                        .protection_periods()
                        .map(|p| p.to_string())
                        .unwrap_or_default(),
                );
                set("shortfall", opt(l.stock.shortfall()));
            }
            Err(problem) => set("problem", problem),
        }
        let _ = w.write_record(&r);
    }
    String::from_utf8(w.into_inner().unwrap_or_default()).unwrap_or_default()
}
