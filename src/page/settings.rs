//! The settings form: what the user typed, kept as the engine's [`SettingsText`] and checked
//! by the engine's [`PlanSettings::from_text`], the one place the limits live (the command line
//! uses it too). This module only ties each refusal to its field on the page and offers the
//! one-click choices.
//!
//! Kept apart from: the DOM (the page binds these strings to its controls) and the limits
//! themselves (crates/engine/src/settings.rs).

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::settings::{PlanSettings, Setting, SettingsText};

/// Band levels offered as one-click choices (percent); any other level can be typed.
pub const LEVEL_CHOICES: [f64; 4] = [80.0, 90.0, 95.0, 99.0];

/// One rejected field.
#[derive(Clone, Debug, PartialEq)]
pub struct FieldError {
    /// The field's id on the page (the message is tied to it for screen readers).
    pub field: &'static str,
    pub message: String,
}

/// The id of a setting's field on the page.
pub fn field_id(setting: Setting) -> &'static str {
    match setting {
        Setting::Horizon => "horizon",
        Setting::Holdout => "holdout",
        Setting::Season => "season",
        Setting::Level => "level",
        Setting::TrackingLimit => "tracking-limit",
        Setting::Origins => "origins",
    }
}

/// The engine settings for the form, or every field's error in words for the page.
pub fn to_settings(form: &SettingsText) -> Result<PlanSettings, Vec<FieldError>> {
    PlanSettings::from_text(form).map_err(|errors| {
        errors
            .iter()
            .map(|e| FieldError {
                field: field_id(e.setting),
                message: capitalise(&e.to_string()),
            })
            .collect()
    })
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
    use morrowcast_engine::bands::BandMethod;
    use morrowcast_engine::settings::SeasonChoice;

    #[test]
    fn defaults_give_the_engine_defaults() {
        assert_eq!(
            to_settings(&SettingsText::default()),
            Ok(PlanSettings::default())
        );
    }

    #[test]
    fn typed_values_are_used() {
        let form = SettingsText {
            horizon: "18".into(),
            holdout: " 6 ".into(),
            season: "1".into(),
            level: "97,5 %".into(),
            band: BandMethod::MadRule,
            rank_by: RankBy::Rmse,
            tracking_limit: "3.5".into(),
            ..SettingsText::default()
        };
        let s = to_settings(&form).unwrap();
        assert_eq!(s.horizon(), Some(18));
        assert_eq!(s.holdout(), Some(6));
        assert_eq!(s.season(), SeasonChoice::Fixed(1));
        assert_eq!(s.level().percent(), 97.5);
        assert_eq!(s.band(), BandMethod::MadRule);
        assert_eq!(s.rank_by(), RankBy::Rmse);
        assert_eq!(s.tracking_limit(), 3.5);
    }

    #[test]
    fn every_bad_field_is_tied_to_its_field_with_what_to_type() {
        let form = SettingsText {
            horizon: "0".into(),
            holdout: "many".into(),
            season: "-2".into(),
            level: "120".into(),
            tracking_limit: "0".into(),
            ..SettingsText::default()
        };
        let errors = to_settings(&form).unwrap_err();
        let fields: Vec<&str> = errors.iter().map(|e| e.field).collect();
        assert_eq!(
            fields,
            ["horizon", "holdout", "season", "level", "tracking-limit"]
        );
        assert_eq!(
            errors[0].message,
            "The horizon \"0\" cannot be used: give auto, or a whole number of periods from 1 to 366"
        );
        assert!(
            errors[3].message.starts_with("The band level \"120\""),
            "{}",
            errors[3].message
        );
    }
}
