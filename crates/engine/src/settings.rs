//! Plan settings: the one place their limits are decided and checked.
//!
//! Kept apart from: how a front end gathers them (the command line's flags, the page's form)
//! and from planning ([`crate::plan`] reads validated settings only). Raw and validated
//! settings are different types: [`SettingsText`] holds what a person typed, [`PlanSettings`]
//! can only be made through the checks here, so the command line and the page accept and
//! refuse exactly the same values, with the same words.
//!
//! Limits (our choices; each refusal names the setting, the value found and the range):
//! - horizon: automatic, or 1 to [`MAX_HORIZON`] periods (a year of daily periods; a longer
//!   look ahead than a year of days, or 30 years of months, is not a forecast a planner acts on,
//!   and the work and memory of a plan grow with it);
//! - holdout: automatic, or 1 to [`MAX_HOLDOUT`] periods (the plan also needs three periods
//!   of training before it, checked against the history when planning);
//! - season length: automatic, or 1 (no season) to [`MAX_SEASON`] periods;
//! - band level: [`Level::MIN_PERCENT`] to [`Level::MAX_PERCENT`] percent;
//! - tracking limit: [`MIN_TRACKING_LIMIT`] to [`MAX_TRACKING_LIMIT`] (4 is common practice;
//!   below 1 every holdout period would be marked, and |bias / MAD| cannot exceed the number of
//!   holdout periods);
//! - rolling origins: 1 to [`MAX_ORIGINS`] (each origin refits every candidate method).

use std::fmt;

use crate::accuracy::DEFAULT_TRACKING_LIMIT;
use crate::backtest::RankBy;
use crate::bands::{BandMethod, Level};
use crate::methods::MethodKind;

/// Longest horizon a plan forecasts (periods).
pub const MAX_HORIZON: usize = 366;
/// Longest holdout (periods).
pub const MAX_HOLDOUT: usize = 366;
/// Longest season length (periods).
pub const MAX_SEASON: usize = 366;
/// Most rolling origins of the backtest.
pub const MAX_ORIGINS: usize = 24;
/// Default number of rolling origins (Tashman 2000 on pooling several origins; 3 scored best
/// on the M3 data, README).
pub const DEFAULT_ORIGINS: usize = 3;
/// Smallest tracking-signal limit.
pub const MIN_TRACKING_LIMIT: f64 = 1.0;
/// Largest tracking-signal limit.
pub const MAX_TRACKING_LIMIT: f64 = 20.0;

/// Which candidate becomes the forecast.
#[derive(Clone, Debug, PartialEq, Eq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Choice {
    /// The equal-weight combination of up to [`crate::backtest::COMBINATION_SIZE`] single
    /// methods: the two Theta models ([`crate::backtest::COMBINATION_ANCHORS`]), the exponential
    /// smoothing model with the lowest AICc and, with a season, the best-ranked others (the
    /// best single method when fewer than two could be scored). On
    /// the M3 data always combining beat picking the top-ranked candidate (README, Benchmarks):
    /// a holdout of one season is too short to tell close methods apart, and averaging hedges
    /// the pick.
    #[default]
    Auto,
    /// Whatever ranks first, single method or combination.
    Best,
    /// A named candidate: a method key, or "combination".
    Named(String),
}

impl Choice {
    /// Parses "auto", "best", "combination" or a method key.
    pub fn from_key(key: &str) -> Option<Choice> {
        match key {
            "auto" => Some(Choice::Auto),
            "best" => Some(Choice::Best),
            "combination" => Some(Choice::Named(key.to_string())),
            other => MethodKind::from_key(other).map(|k| Choice::Named(k.key().to_string())),
        }
    }
}

/// Season length choice.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum SeasonChoice {
    #[default]
    /// Detected from the history (a calendar candidate or an autocorrelation peak).
    Auto,
    /// A user-given season length (1 = no season); always wins over detection.
    Fixed(usize),
}

impl SeasonChoice {
    /// Reads "auto", "none" or a whole number as typed (its range is checked by
    /// [`PlanSettings::with_season`]).
    pub fn from_text(text: &str) -> Result<SeasonChoice, SettingError> {
        season_choice(text)
    }
}

/// A setting with limits.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Setting {
    /// Periods to forecast.
    Horizon,
    /// Periods held back to score the methods.
    Holdout,
    /// Season length.
    Season,
    /// Band level.
    Level,
    /// Tracking-signal limit.
    TrackingLimit,
    /// Rolling origins of the backtest.
    Origins,
}

impl Setting {
    /// The setting's name in messages.
    pub fn name(self) -> &'static str {
        match self {
            Setting::Horizon => "horizon",
            Setting::Holdout => "holdout",
            Setting::Season => "season length",
            Setting::Level => "band level",
            Setting::TrackingLimit => "tracking limit",
            Setting::Origins => "number of rolling origins",
        }
    }

    /// What may be given, in words.
    pub fn allowed(self) -> String {
        match self {
            Setting::Horizon => {
                format!("auto, or a whole number of periods from 1 to {MAX_HORIZON}")
            }
            Setting::Holdout => {
                format!("auto, or a whole number of periods from 1 to {MAX_HOLDOUT}")
            }
            Setting::Season => format!(
                "auto, none, or a whole number of periods from 1 (no season) to {MAX_SEASON}"
            ),
            Setting::Level => format!(
                "a percent from {} to {}",
                Level::MIN_PERCENT,
                Level::MAX_PERCENT
            ),
            Setting::TrackingLimit => format!(
                "a number from {MIN_TRACKING_LIMIT} to {MAX_TRACKING_LIMIT} (4 is common practice)"
            ),
            Setting::Origins => format!("a whole number from 1 to {MAX_ORIGINS}"),
        }
    }
}

/// A refused setting: which, the text or value found, and what is allowed.
#[derive(Clone, Debug, PartialEq)]
pub struct SettingError {
    /// The setting refused.
    pub setting: Setting,
    /// The value as given.
    pub found: String,
}

impl fmt::Display for SettingError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "the {} \"{}\" cannot be used: give {}",
            self.setting.name(),
            self.found,
            self.setting.allowed()
        )
    }
}

impl std::error::Error for SettingError {}

/// Settings of one plan, checked. Defaults: horizon from the calendar, automatic season,
/// holdout = last full season, 95 % horizon-aware band, ranked by MASE, tracking limit 4,
/// 3 rolling origins, every applicable method, the automatic choice.
///
/// Made only through [`PlanSettings::default`], the `with_*` checks and
/// [`PlanSettings::from_text`]; it crosses the worker boundary as its parts and is checked
/// again on arrival.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(try_from = "SettingsParts"))]
pub struct PlanSettings {
    horizon: Option<usize>,
    season: SeasonChoice,
    holdout: Option<usize>,
    level: Level,
    band: BandMethod,
    rank_by: RankBy,
    tracking_limit: f64,
    origins: usize,
    methods: Option<Vec<MethodKind>>,
    combine: bool,
    choice: Choice,
}

impl Default for PlanSettings {
    fn default() -> Self {
        PlanSettings {
            horizon: None,
            season: SeasonChoice::Auto,
            holdout: None,
            level: Level::default(),
            band: BandMethod::default(),
            rank_by: RankBy::default(),
            tracking_limit: DEFAULT_TRACKING_LIMIT,
            origins: DEFAULT_ORIGINS,
            methods: None,
            combine: true,
            choice: Choice::Auto,
        }
    }
}

/// A whole number within `1..=max`, or the error naming `setting` and `found`.
fn count_within(setting: Setting, value: u64, max: usize) -> Result<usize, SettingError> {
    usize::try_from(value)
        .ok()
        .filter(|v| (1..=max).contains(v))
        .ok_or(SettingError {
            setting,
            found: value.to_string(),
        })
}

impl PlanSettings {
    /// Periods to forecast; `None`: automatic (the calendar's season length, else 6).
    pub fn with_horizon(mut self, horizon: Option<u64>) -> Result<Self, SettingError> {
        self.horizon = horizon
            .map(|h| count_within(Setting::Horizon, h, MAX_HORIZON))
            .transpose()?;
        Ok(self)
    }

    /// Holdout length; `None`: automatic ([`crate::backtest::default_holdout`]).
    pub fn with_holdout(mut self, holdout: Option<u64>) -> Result<Self, SettingError> {
        self.holdout = holdout
            .map(|k| count_within(Setting::Holdout, k, MAX_HOLDOUT))
            .transpose()?;
        Ok(self)
    }

    /// Season length: automatic, or fixed (1 = no season).
    pub fn with_season(mut self, season: SeasonChoice) -> Result<Self, SettingError> {
        self.season = match season {
            SeasonChoice::Auto => SeasonChoice::Auto,
            SeasonChoice::Fixed(m) => {
                SeasonChoice::Fixed(count_within(Setting::Season, m as u64, MAX_SEASON)?)
            }
        };
        Ok(self)
    }

    /// Band level in percent.
    pub fn with_level(mut self, percent: f64) -> Result<Self, SettingError> {
        self.level = Level::new(percent).map_err(|_| SettingError {
            setting: Setting::Level,
            found: format_number(percent),
        })?;
        Ok(self)
    }

    /// Tracking-signal limit: holdout periods with |tracking signal| above it are marked.
    pub fn with_tracking_limit(mut self, limit: f64) -> Result<Self, SettingError> {
        if !(MIN_TRACKING_LIMIT..=MAX_TRACKING_LIMIT).contains(&limit) {
            return Err(SettingError {
                setting: Setting::TrackingLimit,
                found: format_number(limit),
            });
        }
        self.tracking_limit = limit;
        Ok(self)
    }

    /// Rolling origins of the backtest.
    pub fn with_origins(mut self, origins: u64) -> Result<Self, SettingError> {
        self.origins = count_within(Setting::Origins, origins, MAX_ORIGINS)?;
        Ok(self)
    }

    /// How the band is worked out.
    pub fn with_band(mut self, band: BandMethod) -> Self {
        self.band = band;
        self
    }

    /// The measure that orders the Backtest ranking.
    pub fn with_rank_by(mut self, rank_by: RankBy) -> Self {
        self.rank_by = rank_by;
        self
    }

    /// Which candidate becomes the forecast.
    pub fn with_choice(mut self, choice: Choice) -> Self {
        self.choice = choice;
        self
    }

    /// The methods to try (`None`: every method that applies) and whether to add the
    /// combination candidate.
    pub fn with_methods(mut self, methods: Option<Vec<MethodKind>>, combine: bool) -> Self {
        self.methods = methods;
        self.combine = combine;
        self
    }

    /// The settings a person typed, checked: every refused setting is returned, in the order
    /// of [`SettingsText`]'s fields.
    pub fn from_text(text: &SettingsText) -> Result<PlanSettings, Vec<SettingError>> {
        let mut errors = Vec::new();
        let mut s = PlanSettings::default()
            .with_band(text.band)
            .with_rank_by(text.rank_by)
            .with_choice(text.choice.clone());
        // Each refusal reports the text as typed (a number too large to read included).
        let mut apply =
            |typed: &str, result: Result<PlanSettings, SettingError>, s: &mut PlanSettings| {
                match result {
                    Ok(next) => *s = next,
                    Err(e) => errors.push(SettingError {
                        found: typed.trim().to_string(),
                        ..e
                    }),
                }
            };
        let horizon = auto_or_whole(Setting::Horizon, &text.horizon);
        apply(
            &text.horizon,
            horizon.and_then(|h| s.clone().with_horizon(h)),
            &mut s,
        );
        let holdout = auto_or_whole(Setting::Holdout, &text.holdout);
        apply(
            &text.holdout,
            holdout.and_then(|k| s.clone().with_holdout(k)),
            &mut s,
        );
        let season = season_choice(&text.season);
        apply(
            &text.season,
            season.and_then(|m| s.clone().with_season(m)),
            &mut s,
        );
        let level = decimal(Setting::Level, &text.level);
        apply(
            &text.level,
            level.and_then(|p| s.clone().with_level(p)),
            &mut s,
        );
        let limit = decimal(Setting::TrackingLimit, &text.tracking_limit);
        apply(
            &text.tracking_limit,
            limit.and_then(|l| s.clone().with_tracking_limit(l)),
            &mut s,
        );
        let origins = auto_or_whole(Setting::Origins, &text.origins)
            .map(|r| r.unwrap_or(DEFAULT_ORIGINS as u64));
        apply(
            &text.origins,
            origins.and_then(|r| s.clone().with_origins(r)),
            &mut s,
        );
        if errors.is_empty() {
            Ok(s)
        } else {
            Err(errors)
        }
    }

    /// Periods to forecast; `None`: automatic.
    pub fn horizon(&self) -> Option<usize> {
        self.horizon
    }
    /// Holdout length; `None`: automatic.
    pub fn holdout(&self) -> Option<usize> {
        self.holdout
    }
    /// Season length choice.
    pub fn season(&self) -> SeasonChoice {
        self.season
    }
    /// Band level.
    pub fn level(&self) -> Level {
        self.level
    }
    /// How the band is worked out.
    pub fn band(&self) -> BandMethod {
        self.band
    }
    /// The measure that orders the ranking.
    pub fn rank_by(&self) -> RankBy {
        self.rank_by
    }
    /// Tracking-signal limit.
    pub fn tracking_limit(&self) -> f64 {
        self.tracking_limit
    }
    /// Rolling origins of the backtest.
    pub fn origins(&self) -> usize {
        self.origins
    }
    /// Methods to try; `None`: every method that applies.
    pub fn methods(&self) -> Option<&[MethodKind]> {
        self.methods.as_deref()
    }
    /// Whether the combination candidate is added.
    pub fn combine(&self) -> bool {
        self.combine
    }
    /// Which candidate forecasts.
    pub fn choice(&self) -> &Choice {
        &self.choice
    }
}

/// The settings as a person gave them: the numeric settings as typed ("auto" or empty for
/// the automatic value), the choices as the engine's own values. [`PlanSettings::from_text`]
/// checks them.
#[derive(Clone, Debug, PartialEq)]
pub struct SettingsText {
    /// "auto", "" or a whole number of periods.
    pub horizon: String,
    /// "auto", "" or a whole number of periods.
    pub holdout: String,
    /// "auto", "", "none" or a whole number of periods (1 = no season).
    pub season: String,
    /// A percent such as "95", "97.5", "97,5" or "95%".
    pub level: String,
    /// A number such as "4" or "3.5".
    pub tracking_limit: String,
    /// "auto", "" or a whole number.
    pub origins: String,
    /// How the band is worked out.
    pub band: BandMethod,
    /// The measure that orders the ranking.
    pub rank_by: RankBy,
    /// Which candidate forecasts.
    pub choice: Choice,
}

impl Default for SettingsText {
    fn default() -> Self {
        let d = PlanSettings::default();
        SettingsText {
            horizon: "auto".into(),
            holdout: "auto".into(),
            season: "auto".into(),
            level: format_number(d.level.percent()),
            tracking_limit: format_number(d.tracking_limit),
            origins: d.origins.to_string(),
            band: d.band,
            rank_by: d.rank_by,
            choice: d.choice,
        }
    }
}

fn is_auto(text: &str) -> bool {
    text.is_empty() || text.eq_ignore_ascii_case("auto")
}

/// "auto"/empty is `None`; otherwise a whole number (digits only).
fn auto_or_whole(setting: Setting, text: &str) -> Result<Option<u64>, SettingError> {
    let t = text.trim();
    if is_auto(t) {
        return Ok(None);
    }
    let digits = t.strip_prefix('+').unwrap_or(t);
    if !digits.is_empty() && digits.bytes().all(|b| b.is_ascii_digit()) {
        // Beyond u64: out of range like any value above the limit.
        return Ok(Some(digits.parse().unwrap_or(u64::MAX)));
    }
    Err(SettingError {
        setting,
        found: t.to_string(),
    })
}

fn season_choice(text: &str) -> Result<SeasonChoice, SettingError> {
    let t = text.trim();
    if t.eq_ignore_ascii_case("none") {
        return Ok(SeasonChoice::Fixed(1));
    }
    match auto_or_whole(Setting::Season, t)? {
        None => Ok(SeasonChoice::Auto),
        // A value beyond usize is refused by the range check that follows.
        Some(m) => Ok(SeasonChoice::Fixed(
            usize::try_from(m).unwrap_or(usize::MAX),
        )),
    }
}

/// A decimal number typed with a dot or a decimal comma ("97,5"), optionally ending in "%".
fn decimal(setting: Setting, text: &str) -> Result<f64, SettingError> {
    let t = text.trim();
    let number = t.trim_end_matches('%').trim();
    let plain = number
        .bytes()
        .all(|b| b.is_ascii_digit() || b == b'.' || b == b',');
    let dotted = number.replacen(',', ".", 1);
    match dotted.parse::<f64>() {
        Ok(v) if plain && !number.is_empty() && v.is_finite() => Ok(v),
        _ => Err(SettingError {
            setting,
            found: t.to_string(),
        }),
    }
}

/// A number as people write it: no trailing ".0".
fn format_number(v: f64) -> String {
    let s = format!("{v}");
    s.strip_suffix(".0").map(str::to_string).unwrap_or(s)
}

/// A plan settings as it crosses the worker boundary, before the checks run again.
#[cfg(feature = "serde")]
#[derive(serde::Deserialize)]
struct SettingsParts {
    horizon: Option<usize>,
    season: SeasonChoice,
    holdout: Option<usize>,
    level: Level,
    band: BandMethod,
    rank_by: RankBy,
    tracking_limit: f64,
    origins: usize,
    methods: Option<Vec<MethodKind>>,
    combine: bool,
    choice: Choice,
}

#[cfg(feature = "serde")]
impl TryFrom<SettingsParts> for PlanSettings {
    type Error = SettingError;
    fn try_from(p: SettingsParts) -> Result<PlanSettings, SettingError> {
        PlanSettings::default()
            .with_horizon(p.horizon.map(|h| h as u64))?
            .with_holdout(p.holdout.map(|k| k as u64))?
            .with_season(p.season)?
            .with_level(p.level.percent())?
            .with_tracking_limit(p.tracking_limit)?
            .with_origins(p.origins as u64)
            .map(|s| {
                s.with_band(p.band)
                    .with_rank_by(p.rank_by)
                    .with_methods(p.methods, p.combine)
                    .with_choice(p.choice)
            })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// One typed setting: `Ok(value as the settings hold it, in Debug form)` or the error's
    /// message.
    fn check(field: &str, typed: &str, expected: Result<&str, &str>) {
        let mut text = SettingsText::default();
        match field {
            "horizon" => text.horizon = typed.into(),
            "holdout" => text.holdout = typed.into(),
            "season" => text.season = typed.into(),
            "level" => text.level = typed.into(),
            "tracking limit" => text.tracking_limit = typed.into(),
            "origins" => text.origins = typed.into(),
            other => panic!("no field {other}"),
        }
        let got = PlanSettings::from_text(&text).map(|s| match field {
            "horizon" => format!("{:?}", s.horizon()),
            "holdout" => format!("{:?}", s.holdout()),
            "season" => format!("{:?}", s.season()),
            "level" => format!("{:?}", s.level().percent()),
            "tracking limit" => format!("{:?}", s.tracking_limit()),
            _ => format!("{:?}", s.origins()),
        });
        match (&got, expected) {
            (Ok(v), Ok(want)) => assert_eq!(v, want, "{field} {typed:?}"),
            (Err(e), Err(want)) => {
                assert_eq!(e.len(), 1, "{e:?}");
                assert_eq!(e[0].to_string(), want, "{field} {typed:?}");
            }
            _ => panic!("{field} {typed:?}: got {got:?}, want {expected:?}"),
        }
    }

    // Limits are our choices (module doc); the cases pin each edge and each kind of refusal.
    #[test]
    fn every_limit_and_refusal() {
        let h = "the horizon \"{}\" cannot be used: give auto, or a whole number of periods from 1 to 366";
        let horizon_err = |v: &str| h.replace("{}", v);
        check("horizon", "auto", Ok("None"));
        check("horizon", " ", Ok("None"));
        check("horizon", "12", Ok("Some(12)"));
        check("horizon", "366", Ok("Some(366)"));
        check("horizon", "367", Err(&horizon_err("367")));
        check("horizon", "0", Err(&horizon_err("0")));
        check("horizon", "4294967296", Err(&horizon_err("4294967296")));
        check(
            "horizon",
            "99999999999999999999999",
            Err(&horizon_err("99999999999999999999999")),
        );
        check("horizon", "1e3", Err(&horizon_err("1e3")));
        check("horizon", "-3", Err(&horizon_err("-3")));
        check("horizon", "12.0", Err(&horizon_err("12.0")));
        check("holdout", "6", Ok("Some(6)"));
        check("season", "none", Ok("Fixed(1)"));
        check("season", "1", Ok("Fixed(1)"));
        check("season", "auto", Ok("Auto"));
        check(
            "season",
            "0",
            Err("the season length \"0\" cannot be used: give auto, none, or a whole number of periods from 1 (no season) to 366"),
        );
        check("level", "97,5 %", Ok("97.5"));
        check("level", "99.9", Ok("99.9"));
        check(
            "level",
            "120",
            Err("the band level \"120\" cannot be used: give a percent from 50 to 99.9"),
        );
        check(
            "level",
            "ninety",
            Err("the band level \"ninety\" cannot be used: give a percent from 50 to 99.9"),
        );
        check(
            "level",
            "NaN",
            Err("the band level \"NaN\" cannot be used: give a percent from 50 to 99.9"),
        );
        check("tracking limit", "3.5", Ok("3.5"));
        check(
            "tracking limit",
            "0",
            Err("the tracking limit \"0\" cannot be used: give a number from 1 to 20 (4 is common practice)"),
        );
        check("tracking limit", "inf", Err("the tracking limit \"inf\" cannot be used: give a number from 1 to 20 (4 is common practice)"));
        check("origins", "auto", Ok("3"));
        check("origins", "24", Ok("24"));
        check(
            "origins",
            "0",
            Err("the number of rolling origins \"0\" cannot be used: give a whole number from 1 to 24"),
        );
        check(
            "origins",
            "99999999999",
            Err("the number of rolling origins \"99999999999\" cannot be used: give a whole number from 1 to 24"),
        );
    }

    #[test]
    fn defaults_read_back_as_defaults_and_every_error_is_returned() {
        assert_eq!(
            PlanSettings::from_text(&SettingsText::default()),
            Ok(PlanSettings::default())
        );
        let text = SettingsText {
            horizon: "0".into(),
            holdout: "many".into(),
            season: "-2".into(),
            level: "120".into(),
            tracking_limit: "0".into(),
            origins: "0".into(),
            ..SettingsText::default()
        };
        let fields: Vec<Setting> = PlanSettings::from_text(&text)
            .unwrap_err()
            .iter()
            .map(|e| e.setting)
            .collect();
        assert_eq!(
            fields,
            [
                Setting::Horizon,
                Setting::Holdout,
                Setting::Season,
                Setting::Level,
                Setting::TrackingLimit,
                Setting::Origins
            ]
        );
    }
}
