//! Argument parsing for the command line (by hand: four subcommands and a few flags do not
//! justify a parser dependency in the build).
//!
//! Kept apart from: the settings' limits and their messages (the engine's
//! [`morrowcast_engine::settings`] decides them for the page and the command line alike). A
//! flag given twice is refused rather than one value silently kept; only `--item` repeats.

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::BandMethod;
use morrowcast_engine::settings::{Choice, PlanSettings, Setting, SettingsText};

/// The help text; the limits come from the engine's settings, where they are decided.
pub fn usage() -> String {
    format!(
        "\
usage:
  morrowcast inspect FILE [--json]
  morrowcast forecast FILE [--item NAME]... [--horizon auto|H] [--season auto|none|N]
                      [--holdout auto|K] [--level P] [--rank-by mape|rmse|bias|mase]
                      [--band mad|horizon] [--tracking-limit L] [--origins R]
                      [--method auto|best|NAME] [--json]
  morrowcast demo            print the demo data (Fernhollow Garden Supply) as CSV
FILE may be - for standard input. --item may be repeated (each item named is planned; without
it, every item). Limits: horizon {}; holdout {}; season {}; level {}; tracking limit {};
origins {}. Errors are forecast minus demand (positive = over-forecast).",
        Setting::Horizon.allowed(),
        Setting::Holdout.allowed(),
        Setting::Season.allowed(),
        Setting::Level.allowed(),
        Setting::TrackingLimit.allowed(),
        Setting::Origins.allowed(),
    )
}

pub enum Command {
    Help,
    Demo,
    Inspect { file: String, json: bool },
    Forecast(ForecastArgs),
}

pub struct ForecastArgs {
    pub file: String,
    /// Items to plan, in the order given; empty: every item of the file.
    pub items: Vec<String>,
    pub json: bool,
    pub settings: PlanSettings,
}

pub fn parse(argv: &[String]) -> Result<Command, String> {
    let Some(sub) = argv.first() else {
        return Ok(Command::Help);
    };
    let rest = &argv[1..];
    match sub.as_str() {
        "help" | "--help" | "-h" => Ok(Command::Help),
        "demo" => Ok(Command::Demo),
        "inspect" => {
            let mut file = None;
            let mut json = false;
            for a in rest {
                match a.as_str() {
                    "--json" => json = true,
                    s if s.starts_with("--") => return Err(format!("inspect does not know {s}")),
                    s => {
                        if let Some(earlier) = &file {
                            return Err(format!(
                                "inspect takes one FILE; found \"{earlier}\" and \"{s}\""
                            ));
                        }
                        file = Some(s.to_string());
                    }
                }
            }
            let file = file.ok_or("inspect needs a FILE (or - for standard input)")?;
            Ok(Command::Inspect { file, json })
        }
        "forecast" => parse_forecast(rest).map(Command::Forecast),
        other => Err(format!("unknown command \"{other}\"")),
    }
}

fn parse_forecast(rest: &[String]) -> Result<ForecastArgs, String> {
    let mut file = None;
    let mut items: Vec<String> = Vec::new();
    let mut json = false;
    let mut text = SettingsText::default();
    let mut seen: Vec<&str> = Vec::new();
    let mut i = 0;
    while i < rest.len() {
        let flag = rest[i].as_str();
        if flag == "--json" {
            json = true;
            i += 1;
            continue;
        }
        if !flag.starts_with("--") || flag == "-" {
            if let Some(earlier) = &file {
                return Err(format!(
                    "forecast takes one FILE; found \"{earlier}\" and \"{flag}\""
                ));
            }
            file = Some(flag.to_string());
            i += 1;
            continue;
        }
        let value = rest
            .get(i + 1)
            .map(String::as_str)
            .ok_or(format!("{flag} needs a value"))?;
        // A flag given twice would silently keep one of the two values; only --item repeats.
        if flag != "--item" {
            if seen.contains(&flag) {
                return Err(format!("{flag} is given twice: give it once"));
            }
            seen.push(flag);
        }
        match flag {
            "--item" => {
                if items.iter().any(|n| n == value) {
                    return Err(format!(
                        "--item {} is given twice: name each item once",
                        crate::table::quoted(value)
                    ));
                }
                items.push(value.to_string());
            }
            "--horizon" => text.horizon = value.into(),
            "--season" => text.season = value.into(),
            "--holdout" => text.holdout = value.into(),
            "--level" => text.level = value.into(),
            "--tracking-limit" => text.tracking_limit = value.into(),
            "--origins" => text.origins = value.into(),
            "--rank-by" => {
                text.rank_by = RankBy::from_key(value).ok_or(format!(
                    "--rank-by takes mape, rmse, bias or mase; found \"{value}\""
                ))?;
            }
            "--band" => {
                text.band = BandMethod::from_key(value)
                    .ok_or(format!("--band takes mad or horizon; found \"{value}\""))?;
            }
            "--method" => {
                text.choice = Choice::from_key(value).ok_or(format!(
                    "--method takes auto, best, combination or a method name such as theta or holt_winters_multiplicative; found \"{value}\""
                ))?;
            }
            s => return Err(format!("forecast does not know {s}")),
        }
        i += 2;
    }
    let file = file.ok_or("forecast needs a FILE (or - for standard input)")?;
    let settings = PlanSettings::from_text(&text).map_err(|errors| {
        errors
            .iter()
            .map(|e| e.to_string())
            .collect::<Vec<_>>()
            .join("; ")
    })?;
    Ok(ForecastArgs {
        file,
        items,
        json,
        settings,
    })
}
