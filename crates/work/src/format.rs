//! The work file's JSON, versions 1 to 3 (2 = 1 and `look_back`, 3 = 2 and
//! `stock_table_read_by`, each written only when a work has it): every name of the format is in this file (README, "Work file format", documents it).
//! The share link carries the same JSON.
//!
//! Kept apart from: the link's packing (link.rs) and the engine's own types, which are never
//! written as JSON: each is converted here to and from the format's plain fields, so changing
//! an engine type cannot change the format unnoticed.
//!
//! Reading is strict: a field this version does not know is refused rather than dropped,
//! and a value a field does not take names the field.

use std::collections::BTreeMap;

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::BandMethod;
use morrowcast_engine::lookback::MOST_PERIODS_SHOWN;
use morrowcast_engine::settings::{Choice, SeasonChoice, SettingsText};
use morrowcast_engine::sorting;
use morrowcast_engine::stock::{read_lead_time, StockText, Target, TargetKind};
use serde::{Deserialize, Serialize};

use crate::{ItemChange, SourcedText, Work, WorkError, WORK_VERSION};

/// The key that marks a work file (its value is the format's version).
const VERSION_KEY: &str = "morrowcast_work";

#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct WorkJson {
    morrowcast_work: u64,
    history: TextJson,
    settings: SettingsJson,
    stock: StockJson,
    stock_table: Option<TextJson>,
    #[serde(deserialize_with = "names_once")]
    item_changes: BTreeMap<String, ChangeJson>,
    open_item: Option<String>,
    /// Version 2: the Look-back's periods; left out when 0.
    #[serde(default, skip_serializing_if = "is_off")]
    look_back: usize,
    /// Version 3: the history's item column the stock table's rows are read by alone, as
    /// the person chose; left out when none.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    stock_table_read_by: Option<String>,
}

fn is_off(periods: &usize) -> bool {
    *periods == 0
}

/// The version a work is written in: the first that holds all it carries.
fn version_for(work: &Work) -> u64 {
    if work.stock_read_by.is_some() {
        3
    } else if work.look_back > 0 {
        2
    } else {
        1
    }
}

#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct TextJson {
    source: String,
    text: String,
}

/// The plan settings as typed ("auto" or a number as text), the choices by key.
#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct SettingsJson {
    horizon: String,
    holdout: String,
    season: String,
    level: String,
    tracking_limit: String,
    origins: String,
    band: String,
    rank_by: String,
    method: String,
}

/// The Stock plan's settings as typed.
#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct StockJson {
    lead_time: String,
    lead_time_sd: String,
    review_period: String,
    target_kind: String,
    target: String,
    order_quantity: String,
}

/// One item's own settings; a field left out keeps the file's.
#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct ChangeJson {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    lead_time: Option<usize>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    target: Option<TargetJson>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    season: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    method: Option<String>,
}

/// A service target as `morrowcast stock --json` writes it: a kind and a fraction.
#[derive(Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
struct TargetJson {
    kind: String,
    value: f64,
}

const CYCLE_SERVICE: &str = "cycle_service_level";
const FILL_RATE: &str = "fill_rate";

fn choice_key(choice: &Choice) -> String {
    match choice {
        Choice::Auto => "auto".into(),
        Choice::Best => "best".into(),
        Choice::Named(key) => key.clone(),
    }
}

fn season_text(season: SeasonChoice) -> String {
    match season {
        SeasonChoice::Auto => "auto".into(),
        SeasonChoice::Fixed(1) => "none".into(),
        SeasonChoice::Fixed(m) => m.to_string(),
    }
}

fn target_json(target: Target) -> TargetJson {
    match target {
        Target::CycleService(value) => TargetJson {
            kind: CYCLE_SERVICE.into(),
            value,
        },
        Target::FillRate(value) => TargetJson {
            kind: FILL_RATE.into(),
            value,
        },
    }
}

fn text_json(t: &SourcedText) -> TextJson {
    TextJson {
        source: t.source.clone(),
        text: t.text.clone(),
    }
}

/// The work as JSON; `pretty` for the file (a person may read it), compact for a link.
pub fn to_json(work: &Work, pretty: bool) -> String {
    let s = &work.settings;
    let k = &work.stock;
    let json = WorkJson {
        morrowcast_work: version_for(work),
        history: text_json(&work.history),
        settings: SettingsJson {
            horizon: s.horizon.clone(),
            holdout: s.holdout.clone(),
            season: s.season.clone(),
            level: s.level.clone(),
            tracking_limit: s.tracking_limit.clone(),
            origins: s.origins.clone(),
            band: s.band.key().into(),
            rank_by: s.rank_by.key().into(),
            method: choice_key(&s.choice),
        },
        stock: StockJson {
            lead_time: k.lead_time.clone(),
            lead_time_sd: k.lead_time_sd.clone(),
            review_period: k.review_period.clone(),
            target_kind: match k.target_kind {
                TargetKind::CycleService => CYCLE_SERVICE,
                TargetKind::FillRate => FILL_RATE,
            }
            .into(),
            target: k.target.clone(),
            order_quantity: k.order_quantity.clone(),
        },
        stock_table: work.stock_table.as_ref().map(text_json),
        item_changes: sorting::map_of(work.changes.iter().filter(|(_, c)| !c.is_empty()).map(
            |(name, c)| {
                let change = ChangeJson {
                    lead_time: c.lead_time,
                    target: c.target.map(target_json),
                    season: c.season.map(season_text),
                    method: c.method.as_ref().map(choice_key),
                };
                (name.clone(), change)
            },
        )),
        open_item: work.open_item.clone(),
        look_back: work.look_back,
        stock_table_read_by: work.stock_read_by.clone(),
    };
    let written = if pretty {
        serde_json::to_string_pretty(&json)
    } else {
        serde_json::to_string(&json)
    };
    // Plain strings, numbers and maps with string keys: serde_json cannot fail on them.
    written.unwrap_or_default()
}

/// Whether `text` is a work file: a JSON object with the version key.
pub fn looks_like_work_file(text: &str) -> bool {
    let t = text.trim_start_matches('\u{feff}').trim_start();
    t.starts_with('{') && t.contains(&format!("\"{VERSION_KEY}\""))
}

/// Where serde_json stopped, in words.
fn where_in(e: &serde_json::Error) -> String {
    format!("line {}, column {}", e.line(), e.column())
}

fn unreadable(detail: impl Into<String>) -> WorkError {
    WorkError::Unreadable {
        detail: detail.into(),
    }
}

/// The version alone, read before the rest so that a newer work is named as such rather
/// than refused for the fields this version does not know (the others are skipped here).
#[derive(Deserialize)]
struct VersionJson {
    morrowcast_work: Option<serde_json::Value>,
}

/// The item changes by name, each name once: a map would keep the last of two unsaid.
fn names_once<'de, D>(reader: D) -> Result<BTreeMap<String, ChangeJson>, D::Error>
where
    D: serde::Deserializer<'de>,
{
    struct Names;
    impl<'de> serde::de::Visitor<'de> for Names {
        type Value = BTreeMap<String, ChangeJson>;
        fn expecting(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
            f.write_str("an object of item settings by item name")
        }
        fn visit_map<A: serde::de::MapAccess<'de>>(
            self,
            mut map: A,
        ) -> Result<Self::Value, A::Error> {
            let mut names = BTreeMap::new();
            while let Some(name) = map.next_key::<String>()? {
                if names.contains_key(&name) {
                    return Err(serde::de::Error::custom(format!(
                        "item_changes names \"{name}\" twice"
                    )));
                }
                let change = map.next_value()?;
                names.insert(name, change);
            }
            Ok(names)
        }
    }
    reader.deserialize_map(Names)
}

/// The work a JSON text holds, checked. Read from the text itself (not through a JSON value,
/// whose objects keep the last of two equal keys unsaid): a field or item given twice is
/// refused.
pub fn from_json(text: &str) -> Result<Work, WorkError> {
    let probe: VersionJson = serde_json::from_str(text).map_err(|e| match e.classify() {
        serde_json::error::Category::Data => unreadable(format!(
            "it is not an object with one \"{VERSION_KEY}\" version ({})",
            where_in(&e)
        )),
        _ => unreadable(format!("not JSON: {e}")),
    })?;
    let version = probe
        .morrowcast_work
        .ok_or_else(|| unreadable(format!("it has no \"{VERSION_KEY}\" version")))?
        .as_u64()
        .filter(|v| *v >= 1)
        .ok_or_else(|| unreadable(format!("its \"{VERSION_KEY}\" is not a version number")))?;
    if version > WORK_VERSION {
        return Err(WorkError::Newer { version });
    }
    let json: WorkJson = serde_json::from_str(text).map_err(|e| unreadable(e.to_string()))?;
    if json.look_back > 0 && version < 2 {
        return Err(unreadable(format!(
            "look_back is a field of version 2, and this work says version {version}"
        )));
    }
    if json.stock_table_read_by.is_some() && version < 3 {
        return Err(unreadable(format!(
            "stock_table_read_by is a field of version 3, and this work says version {version}"
        )));
    }
    if json
        .stock_table_read_by
        .as_deref()
        .is_some_and(|c| c.trim().is_empty() || c.trim().eq_ignore_ascii_case("none"))
    {
        return Err(unreadable(
            "stock_table_read_by names a column of the history's item names; found none",
        ));
    }
    if json.stock_table_read_by.is_some() && json.stock_table.is_none() {
        return Err(unreadable(
            "stock_table_read_by says how to read a stock table, and this work has none",
        ));
    }
    if json.look_back > MOST_PERIODS_SHOWN {
        return Err(unreadable(format!(
            "look_back takes 0 to {MOST_PERIODS_SHOWN} periods; found {}",
            json.look_back
        )));
    }
    let s = json.settings;
    let keyed = |field: &str, found: &str, takes: &str| {
        unreadable(format!("settings.{field} takes {takes}; found \"{found}\""))
    };
    let settings = SettingsText {
        horizon: s.horizon,
        holdout: s.holdout,
        season: s.season,
        level: s.level,
        tracking_limit: s.tracking_limit,
        origins: s.origins,
        band: BandMethod::from_key(&s.band)
            .ok_or_else(|| keyed("band", &s.band, "mad or horizon"))?,
        rank_by: RankBy::from_key(&s.rank_by)
            .ok_or_else(|| keyed("rank_by", &s.rank_by, "mape, rmse, bias or mase"))?,
        choice: Choice::from_key(&s.method).ok_or_else(|| {
            keyed(
                "method",
                &s.method,
                "auto, best, combination or a method key",
            )
        })?,
    };
    let k = json.stock;
    let stock = StockText {
        lead_time: k.lead_time,
        lead_time_sd: k.lead_time_sd,
        review_period: k.review_period,
        target_kind: match k.target_kind.as_str() {
            CYCLE_SERVICE => TargetKind::CycleService,
            FILL_RATE => TargetKind::FillRate,
            other => {
                return Err(unreadable(format!(
                    "stock.target_kind takes {CYCLE_SERVICE} or {FILL_RATE}; found \"{other}\""
                )))
            }
        },
        target: k.target,
        order_quantity: k.order_quantity,
    };
    let mut changes = BTreeMap::new();
    for (item, c) in json.item_changes {
        let bad = |field: &'static str, detail: String| WorkError::BadChange {
            item: item.clone(),
            field,
            detail,
        };
        let lead_time = c
            .lead_time
            .map(|l| read_lead_time(&l.to_string()).map_err(|e| bad("lead time", e.message)))
            .transpose()?;
        let target = c
            .target
            .map(|t| match t.kind.as_str() {
                CYCLE_SERVICE => Target::cycle_service(t.value).map_err(|e| e.to_string()),
                FILL_RATE => Target::fill_rate(t.value).map_err(|e| e.to_string()),
                other => Err(format!(
                    "a target kind is {CYCLE_SERVICE} or {FILL_RATE}; found \"{other}\""
                )),
            })
            .transpose()
            .map_err(|e| bad("service target", e))?;
        let season = match c.season {
            Some(text) => ItemChange::check_season(&text)
                .map_err(|e| bad("season length", e))?
                .ok_or_else(|| bad("season length", "it is empty".into()))
                .map(Some)?,
            None => None,
        };
        let method = c
            .method
            .map(|m| {
                Choice::from_key(&m)
                    .ok_or_else(|| bad("method", format!("\"{m}\" is not a method key")))
            })
            .transpose()?;
        let change = ItemChange {
            lead_time,
            target,
            season,
            method,
        };
        if !change.is_empty() {
            changes.insert(item, change);
        }
    }
    let back = |t: TextJson| SourcedText {
        text: t.text,
        source: t.source,
    };
    Ok(Work {
        history: back(json.history),
        settings,
        stock,
        stock_table: json.stock_table.map(back),
        changes,
        open_item: json.open_item,
        look_back: json.look_back,
        stock_read_by: json.stock_table_read_by,
    })
}
