//! Argument parsing for the command line (by hand: four subcommands and a few flags do not
//! justify a parser dependency in the build).

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::{BandMethod, Level};
use morrowcast_engine::plan::{Choice, PlanSettings, SeasonChoice};

pub const USAGE: &str = "\
usage:
  morrowcast inspect FILE [--json]
  morrowcast forecast FILE [--item NAME] [--horizon H] [--season auto|N] [--holdout K]
                      [--level P] [--rank-by mape|rmse|bias|mase] [--band mad|horizon]
                      [--tracking-limit L] [--origins R] [--method auto|best|NAME] [--json]
  morrowcast demo            print the demo data (Fernhollow Garden Supply) as CSV
FILE may be - for standard input. Errors are forecast minus demand (positive = over-forecast).";

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

fn number<T: std::str::FromStr>(flag: &str, text: &str, what: &str) -> Result<T, String> {
    text.parse()
        .map_err(|_| format!("{flag} takes {what}; found \"{text}\""))
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
                    s => file = Some(s.to_string()),
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
    let mut settings = PlanSettings::default();
    let mut i = 0;
    while i < rest.len() {
        let flag = rest[i].as_str();
        let value = || {
            rest.get(i + 1)
                .map(String::as_str)
                .ok_or(format!("{flag} needs a value"))
        };
        match flag {
            "--json" => {
                json = true;
                i += 1;
                continue;
            }
            "--item" => {
                let name = value()?.to_string();
                if items.contains(&name) {
                    return Err(format!(
                        "--item {} is given twice: name each item once",
                        crate::table::quoted(&name)
                    ));
                }
                items.push(name);
            }
            "--horizon" => {
                let h: usize = number(flag, value()?, "a whole number of periods, 1 or more")?;
                if h == 0 {
                    return Err("--horizon takes 1 or more periods; found \"0\"".into());
                }
                settings.horizon = Some(h);
            }
            "--season" => {
                let v = value()?;
                settings.season = if v == "auto" {
                    SeasonChoice::Auto
                } else {
                    SeasonChoice::Fixed(number(flag, v, "auto or a whole number (1 = no season)")?)
                };
            }
            "--holdout" => {
                let k: usize = number(flag, value()?, "a whole number of periods, 1 or more")?;
                if k == 0 {
                    return Err("--holdout takes 1 or more periods; found \"0\"".into());
                }
                settings.holdout = Some(k);
            }
            "--level" => {
                let v = value()?;
                let p: f64 = number(
                    flag,
                    v.trim_end_matches('%'),
                    "a percentage from 50 to 99.9",
                )?;
                settings.level = Level::new(p).map_err(|e| e.to_string())?;
            }
            "--rank-by" => {
                let v = value()?;
                settings.rank_by = RankBy::from_key(v).ok_or(format!(
                    "--rank-by takes mape, rmse, bias or mase; found \"{v}\""
                ))?;
            }
            "--band" => {
                let v = value()?;
                settings.band = BandMethod::from_key(v)
                    .ok_or(format!("--band takes mad or horizon; found \"{v}\""))?;
            }
            "--tracking-limit" => {
                let l: f64 = number(flag, value()?, "a positive number")?;
                if !(l > 0.0 && l.is_finite()) {
                    return Err("--tracking-limit takes a positive number".into());
                }
                settings.tracking_limit = l;
            }
            "--method" => {
                let v = value()?;
                settings.choice = Choice::from_key(v).ok_or(format!(
                    "--method takes auto, best, combination or a method name such as theta or holt_winters_multiplicative; found \"{v}\""
                ))?;
            }
            "--origins" => {
                let r: usize = number(flag, value()?, "a whole number, 1 or more")?;
                settings.origins = r.max(1);
            }
            s if s.starts_with("--") => return Err(format!("forecast does not know {s}")),
            s => {
                file = Some(s.to_string());
                i += 1;
                continue;
            }
        }
        i += 2;
    }
    let file = file.ok_or("forecast needs a FILE (or - for standard input)")?;
    Ok(ForecastArgs {
        file,
        items,
        json,
        settings,
    })
}
