//! One item's own settings over the file's: lead time, service target, season length and
//! method, as the Item board's "For this item only" sets them and a work carries them.
//!
//! Kept apart from: the limits (the engine's settings and stock constructors hold them; this
//! only applies checked values) and any form or file (format.rs writes and reads them).

use morrowcast_engine::intake::StockRow;
use morrowcast_engine::settings::{Choice, PlanSettings, SeasonChoice};
use morrowcast_engine::stock::Target;

/// What one item changes over its stock-table row and the file's settings: each part `None`
/// leaves the file's (or the row's) value.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct ItemChange {
    pub lead_time: Option<usize>,
    pub target: Option<Target>,
    pub season: Option<SeasonChoice>,
    pub method: Option<Choice>,
}

impl ItemChange {
    /// Whether it changes anything.
    pub fn is_empty(&self) -> bool {
        *self == ItemChange::default()
    }

    /// The item's stock-table row (or a bare one) with this change's lead time and target.
    pub fn apply(&self, name: &str, row: Option<&StockRow>) -> Option<StockRow> {
        if self.lead_time.is_none() && self.target.is_none() {
            return row.cloned();
        }
        let mut r = row.cloned().unwrap_or_else(|| StockRow {
            item: name.to_string(),
            ..StockRow::default()
        });
        r.lead_time = self.lead_time.or(r.lead_time);
        r.target = self.target.or(r.target);
        Some(r)
    }

    /// The file's plan settings with this change's season and method; `None` when it changes
    /// neither (the item plans with the file's). A season the settings refuse leaves the
    /// file's season: [`ItemChange::check_season`] checks it before it is kept.
    pub fn plan_settings(&self, file: &PlanSettings) -> Option<PlanSettings> {
        if self.season.is_none() && self.method.is_none() {
            return None;
        }
        let mut s = file.clone();
        if let Some(season) = self.season {
            s = s.clone().with_season(season).unwrap_or(s);
        }
        if let Some(method) = &self.method {
            s = s.with_choice(method.clone());
        }
        Some(s)
    }

    /// A season as typed for one item ("auto", "none" or a length), checked with the file's
    /// limits; `Ok(None)` for an empty field (the file's season).
    pub fn check_season(text: &str) -> Result<Option<SeasonChoice>, String> {
        if text.trim().is_empty() {
            return Ok(None);
        }
        SeasonChoice::from_text(text)
            .and_then(|s| PlanSettings::default().with_season(s).map(|_| s))
            .map(Some)
            .map_err(|e| e.to_string())
    }
}
