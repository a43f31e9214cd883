//! The settings form: what the user typed, checked and turned into the engine's [`PlanSettings`].
//!
//! Kept apart from: the DOM (the page binds these strings to its controls) and the engine's own
//! defaults (an empty or "auto" field leaves the engine's default in place). Every rejected field
//! gets a message in plain words that names the field and what to type.

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::{BandMethod, Level};
use morrowcast_engine::plan::{PlanSettings, SeasonChoice};

/// Band levels offered as one-click choices (percent); any other level can be typed.
pub const LEVEL_CHOICES: [f64; 4] = [80.0, 90.0, 95.0, 99.0];

/// Largest horizon and holdout the form accepts (ten years of months; our choice, to keep a
/// recompute quick and the chart readable).
pub const MAX_PERIODS: usize = 120;

/// The form as typed. Numbers stay text until [`SettingsForm::to_settings`] checks them.
#[derive(Clone, Debug, PartialEq)]
pub struct SettingsForm {
    /// "auto" (or empty) or a number of periods.
    pub horizon: String,
    /// "auto" (or empty) or a number of periods.
    pub holdout: String,
    /// "auto" (or empty) or a season length (1 = no season).
    pub season: String,
    /// Band level in percent, 50 to 99.9.
    pub level: String,
    pub band: BandMethod,
    pub rank_by: RankBy,
    pub tracking_limit: String,
}

impl Default for SettingsForm {
    fn default() -> Self {
        let d = PlanSettings::default();
        SettingsForm {
            horizon: "auto".into(),
            holdout: "auto".into(),
            season: "auto".into(),
            level: format_number(d.level.percent()),
            band: d.band,
            rank_by: d.rank_by,
            tracking_limit: format_number(d.tracking_limit),
        }
    }
}

/// One rejected field.
#[derive(Clone, Debug, PartialEq)]
pub struct FieldError {
    /// The field's id on the page (the message is tied to it for screen readers).
    pub field: &'static str,
    pub message: String,
}

impl SettingsForm {
    /// The engine settings, or every field's error.
    pub fn to_settings(&self) -> Result<PlanSettings, Vec<FieldError>> {
        let mut errors = Vec::new();
        let mut s = PlanSettings::default();
        match auto_or_count(&self.horizon, 1, "The horizon") {
            Ok(v) => s.horizon = v,
            Err(m) => errors.push(FieldError {
                field: "horizon",
                message: m,
            }),
        }
        match auto_or_count(&self.holdout, 1, "The holdout length") {
            Ok(v) => s.holdout = v,
            Err(m) => errors.push(FieldError {
                field: "holdout",
                message: m,
            }),
        }
        match auto_or_count(&self.season, 1, "The season length") {
            Ok(None) => s.season = SeasonChoice::Auto,
            Ok(Some(m)) => s.season = SeasonChoice::Fixed(m),
            Err(m) => errors.push(FieldError {
                field: "season",
                message: m,
            }),
        }
        match parse_number(&self.level).map(Level::new) {
            Some(Ok(level)) => s.level = level,
            Some(Err(e)) => errors.push(FieldError {
                field: "level",
                message: capitalise(&e.to_string()),
            }),
            None => errors.push(FieldError {
                field: "level",
                message: format!(
                    "The band level \"{}\" is not a number: type a percent such as 95",
                    self.level.trim()
                ),
            }),
        }
        s.band = self.band;
        s.rank_by = self.rank_by;
        match parse_number(&self.tracking_limit) {
            Some(l) if l > 0.0 && l.is_finite() => s.tracking_limit = l,
            _ => errors.push(FieldError {
                field: "tracking-limit",
                message: format!(
                    "The tracking limit \"{}\" must be a positive number: 4 is common practice",
                    self.tracking_limit.trim()
                ),
            }),
        }
        if errors.is_empty() {
            Ok(s)
        } else {
            Err(errors)
        }
    }
}

/// "auto"/empty is `None`; otherwise a whole number from `min` to [`MAX_PERIODS`].
fn auto_or_count(text: &str, min: usize, what: &str) -> Result<Option<usize>, String> {
    let t = text.trim();
    if t.is_empty() || t.eq_ignore_ascii_case("auto") {
        return Ok(None);
    }
    match t.parse::<usize>() {
        Ok(v) if (min..=MAX_PERIODS).contains(&v) => Ok(Some(v)),
        _ => Err(format!(
            "{what} \"{t}\" is not usable: type auto or a whole number from {min} to {MAX_PERIODS}"
        )),
    }
}

/// A number typed with a dot or a decimal comma ("97,5").
fn parse_number(text: &str) -> Option<f64> {
    text.trim()
        .trim_end_matches('%')
        .trim()
        .replace(',', ".")
        .parse()
        .ok()
}

fn format_number(v: f64) -> String {
    let s = format!("{v}");
    s.strip_suffix(".0").map(str::to_string).unwrap_or(s)
}

fn capitalise(s: &str) -> String {
    let mut c = s.chars();
    match c.next() {
        Some(f) => f.to_uppercase().chain(c).collect(),
        None => String::new(),
    }
}

/// Ranking metrics in the order the form offers them, with their names for people.
pub const RANK_CHOICES: [(RankBy, &str); 4] = [
    (RankBy::Mase, "MASE (scale-free; default)"),
    (RankBy::Mape, "MAPE (percent)"),
    (RankBy::Rmse, "RMSE (units)"),
    (RankBy::Bias, "bias (closest to zero)"),
];

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn defaults_give_the_engine_defaults() {
        assert_eq!(
            SettingsForm::default().to_settings(),
            Ok(PlanSettings::default())
        );
    }

    #[test]
    fn typed_values_are_used() {
        let form = SettingsForm {
            horizon: "18".into(),
            holdout: " 6 ".into(),
            season: "1".into(),
            level: "97,5 %".into(),
            band: BandMethod::MadRule,
            rank_by: RankBy::Rmse,
            tracking_limit: "3.5".into(),
        };
        let s = form.to_settings().unwrap();
        assert_eq!(s.horizon, Some(18));
        assert_eq!(s.holdout, Some(6));
        assert_eq!(s.season, SeasonChoice::Fixed(1));
        assert_eq!(s.level.percent(), 97.5);
        assert_eq!(s.band, BandMethod::MadRule);
        assert_eq!(s.rank_by, RankBy::Rmse);
        assert_eq!(s.tracking_limit, 3.5);
    }

    #[test]
    fn every_bad_field_is_named_with_what_to_type() {
        let form = SettingsForm {
            horizon: "0".into(),
            holdout: "many".into(),
            season: "-2".into(),
            level: "120".into(),
            tracking_limit: "0".into(),
            ..SettingsForm::default()
        };
        let errors = form.to_settings().unwrap_err();
        let fields: Vec<&str> = errors.iter().map(|e| e.field).collect();
        assert_eq!(
            fields,
            ["horizon", "holdout", "season", "level", "tracking-limit"]
        );
        assert!(
            errors[0].message.contains("from 1 to 120"),
            "{}",
            errors[0].message
        );
        assert!(
            errors[3].message.starts_with("Band level 120 %"),
            "{}",
            errors[3].message
        );
        let words = SettingsForm {
            level: "ninety".into(),
            ..SettingsForm::default()
        };
        assert!(words.to_settings().unwrap_err()[0]
            .message
            .contains("not a number"));
    }
}
