//! Any text in every numeric setting: accepted settings are within their limits, and every
//! refusal names its setting and the text found.

#![no_main]

use libfuzzer_sys::fuzz_target;
use morrowcast_engine::settings::{PlanSettings, SeasonChoice, SettingsText};
use morrowcast_engine::settings::{MAX_HOLDOUT, MAX_HORIZON, MAX_ORIGINS, MAX_SEASON};

fuzz_target!(|data: &[u8]| {
    let text = String::from_utf8_lossy(data);
    let mut fields = text.split('\u{1f}').map(str::to_string);
    let mut next = || fields.next().unwrap_or_default();
    let typed = SettingsText {
        horizon: next(),
        holdout: next(),
        season: next(),
        level: next(),
        tracking_limit: next(),
        origins: next(),
        ..SettingsText::default()
    };
    match PlanSettings::from_text(&typed) {
        Ok(s) => {
            assert!(s.horizon().is_none_or(|h| (1..=MAX_HORIZON).contains(&h)));
            assert!(s.holdout().is_none_or(|k| (1..=MAX_HOLDOUT).contains(&k)));
            if let SeasonChoice::Fixed(m) = s.season() {
                assert!((1..=MAX_SEASON).contains(&m));
            }
            assert!((1..=MAX_ORIGINS).contains(&s.origins()));
            assert!(s.tracking_limit().is_finite() && s.level().percent().is_finite());
        }
        Err(errors) => {
            for e in errors {
                let message = e.to_string();
                assert!(message.contains(e.setting.name()), "{message}");
            }
        }
    }
});
