//! Argument parsing for the command line (by hand: four subcommands and a few flags do not
//! justify a parser dependency in the build).
//!
//! Kept apart from: the settings' limits and their messages (the engine's
//! [`morrowcast_engine::settings`] decides them for the page and the command line alike). A
//! flag given twice is refused rather than one value silently kept; only `--item` repeats.

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::BandMethod;
use morrowcast_engine::settings::{Choice, PlanSettings, Setting, SettingsText};
use morrowcast_engine::stock;

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
  morrowcast stock FILE [--stock TABLE] [--item NAME]... [--lead-time L] [--lead-time-sd S] [--review R]
                   [--service P | --fill-rate P] [--order-quantity Q] [forecast options] [--json]
  morrowcast demo            print the demo data (Fernhollow Garden Supply) as CSV
FILE may be - for standard input. --item may be repeated (each item named is planned; without
it, every item). Limits: horizon {}; holdout {}; season {}; level {}; tracking limit {};
origins {}. Errors are forecast minus demand (positive = over-forecast).
stock: lead time L and review period R in whole periods (L default 1; without --review,
continuous review); --service (cycle service level, default 95) and --fill-rate take a fraction
(0.95) or a percent (95). --stock TABLE: a table with a header and a row per item: item, on
hand, on order, and optionally lead time, lead time sd, review, service, fill rate, order
quantity, order multiple, minimum order (each overrides the options for its item). Stock figures
are estimates from past demand: your own policies, supplier terms and judgement decide the order.",
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
    Stock(StockArgs),
}

pub struct StockArgs {
    pub file: String,
    /// Items to plan, in the order given; empty: every item of the file.
    pub items: Vec<String>,
    pub json: bool,
    pub settings: PlanSettings,
    pub stock: stock::StockSettings,
    /// The stock table's file (`-`: standard input), when given.
    pub table: Option<String>,
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
        "stock" => parse_stock(rest).map(Command::Stock),
        other => Err(format!("unknown command \"{other}\"")),
    }
}

fn parse_forecast(rest: &[String]) -> Result<ForecastArgs, String> {
    let parsed = parse_item_command("forecast", rest, &mut |_, _| Ok(false))?;
    Ok(ForecastArgs {
        file: parsed.file,
        items: parsed.items,
        json: parsed.json,
        settings: parsed.settings,
    })
}

fn parse_stock(rest: &[String]) -> Result<StockArgs, String> {
    let mut lead_time = "1".to_string();
    let mut lead_time_sd = None;
    let mut review = None;
    let mut service = None;
    let mut fill_rate = None;
    let mut order_quantity = None;
    let mut table = None;
    let parsed = parse_item_command("stock", rest, &mut |flag, value| {
        let slot = match flag {
            "--lead-time" => {
                lead_time = value.to_string();
                return Ok(true);
            }
            "--lead-time-sd" => &mut lead_time_sd,
            "--review" => &mut review,
            "--service" => &mut service,
            "--fill-rate" => &mut fill_rate,
            "--order-quantity" => &mut order_quantity,
            "--stock" => &mut table,
            _ => return Ok(false),
        };
        *slot = Some(value.to_string());
        Ok(true)
    })?;
    let whole = |flag: &str, text: &str| -> Result<usize, String> {
        text.trim()
            .parse::<usize>()
            .map_err(|_| format!("{flag} takes a whole number of periods; found \"{text}\""))
    };
    let number = |flag: &str, text: &str| -> Result<f64, String> {
        text.trim()
            .parse::<f64>()
            .map_err(|_| format!("{flag} takes a number; found \"{text}\""))
    };
    let target = match (service, fill_rate) {
        (Some(_), Some(_)) => {
            return Err("give --service or --fill-rate, not both".to_string());
        }
        (None, Some(text)) => stock::service_fraction("fill rate", &text)
            .and_then(stock::Target::fill_rate)
            .map_err(|e| format!("--fill-rate: {e}"))?,
        (service, None) => {
            stock::service_fraction("cycle service level", service.as_deref().unwrap_or("0.95"))
                .and_then(stock::Target::cycle_service)
                .map_err(|e| format!("--service: {e}"))?
        }
    };
    let review = review.map(|r| whole("--review", &r)).transpose()?;
    let mut stock = stock::StockSettings::new(whole("--lead-time", &lead_time)?, review, target)
        .map_err(|e| e.to_string())?;
    if let Some(sd) = lead_time_sd {
        stock = stock
            .with_lead_time_sd(number("--lead-time-sd", &sd)?)
            .map_err(|e| e.to_string())?;
    }
    if let Some(q) = order_quantity {
        if review.is_some() {
            return Err("--order-quantity is for continuous review: leave out --review".into());
        }
        stock = stock
            .with_order_quantity(number("--order-quantity", &q)?)
            .map_err(|e| e.to_string())?;
    }
    let periods = stock.protection_periods();
    if let Some(h) = parsed.settings.horizon() {
        if h < periods {
            return Err(format!(
                "--horizon {h} is shorter than the protection interval of {periods} periods \
                 (lead time plus review period): give at least {periods}, or leave it automatic"
            ));
        }
    }
    Ok(StockArgs {
        file: parsed.file,
        items: parsed.items,
        json: parsed.json,
        settings: parsed.settings,
        stock,
        table,
    })
}

/// What the item commands share.
struct ItemCommand {
    file: String,
    items: Vec<String>,
    json: bool,
    settings: PlanSettings,
}

/// Parses FILE, --item, --json and the plan's settings of `command`; `extra` is offered every
/// other flag with its value first and says whether it took it.
fn parse_item_command(
    command: &str,
    rest: &[String],
    extra: &mut dyn FnMut(&str, &str) -> Result<bool, String>,
) -> Result<ItemCommand, String> {
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
                    "{command} takes one FILE; found \"{earlier}\" and \"{flag}\""
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
            s => {
                if !extra(s, value)? {
                    return Err(format!("{command} does not know {s}"));
                }
            }
        }
        i += 2;
    }
    let file = file.ok_or(format!("{command} needs a FILE (or - for standard input)"))?;
    let settings = PlanSettings::from_text(&text).map_err(|errors| {
        errors
            .iter()
            .map(|e| e.to_string())
            .collect::<Vec<_>>()
            .join("; ")
    })?;
    Ok(ItemCommand {
        file,
        items,
        json,
        settings,
    })
}
