//! Argument parsing for the command line (by hand: four subcommands and a few flags do not
//! justify a parser dependency in the build).
//!
//! Kept apart from: the settings' limits and their messages (the engine's
//! [`morrowcast_engine::settings`] decides them for the page and the command line alike). A
//! flag with a value given twice is refused rather than one value silently kept; only `--item`
//! repeats (the flags without a value, `--json` and `--leave-out-unfinished`, may stand twice).

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::BandMethod;
use morrowcast_engine::lookback::MOST_PERIODS_SHOWN;
use morrowcast_engine::settings::{Choice, PlanSettings, Setting, SettingsText};
use morrowcast_engine::stock::{self, StockText, TargetKind};

/// The help text; the limits come from the engine's settings, where they are decided.
pub fn usage() -> String {
    format!(
        "\
usage:
  morrowcast inspect FILE [--sheet NAME] [--json] [--leave-out-unfinished]
  morrowcast forecast FILE [--sheet NAME] [--item NAME]... [--horizon auto|H] [--season auto|none|N]
                      [--holdout auto|K] [--level P] [--rank-by mape|rmse|bias|mase]
                      [--band mad|horizon] [--tracking-limit L] [--origins R]
                      [--method auto|best|NAME] [--leave-out-unfinished] [--json]
  morrowcast stock FILE [--stock TABLE [--stock-sheet NAME] [--stock-by COLUMN|none]] [--item NAME]... [--lead-time L] [--lead-time-sd S|none]
                   [--review R|none] [--service P | --fill-rate P] [--order-quantity Q|none]
                   [forecast options] [--json]
  morrowcast look-back FILE [--periods N] [stock options] [forecast options] [--json]
  morrowcast link FILE [--item NAME] [--page ADDRESS] [--look-back N] [stock options] [forecast options]
  morrowcast work FILE [--item NAME] [--look-back N] [stock options] [forecast options]
  morrowcast demo            print the demo data (Fernhollow Garden Supply) as CSV
FILE may be - for standard input, a workbook (.xlsx, .xlsm, .ods: its fullest sheet, or the one
--sheet NAME names), a work file, or a share link (or its fragment, #w1...): a
work brings its data, settings, stock inputs and item changes; options given replace its own.
link prints a share link (the page's ADDRESS, default http://127.0.0.1:8080/, then a fragment
carrying the data: whoever has the link has the data); work prints a work file. --item NAME
there names the item the page opens. --item may be repeated (each item named is planned; without
it, every item). --leave-out-unfinished: when the last period looks unfinished (data taken before
it ended), its rows are left out of the history first, as the page's button does; refused where
the rest would read differently. Limits: horizon {}; holdout {}; season {}; level {}; tracking limit {};
origins {}. Errors are forecast minus demand (positive = over-forecast).
stock: lead time L and review period R in whole periods (L default 1; without --review,
continuous review; none leaves it, --lead-time-sd or --order-quantity out, a work's own too); --service (cycle service level, default 95) and --fill-rate take a fraction
(0.95) or a percent (95). --stock TABLE: a table with a header and a row per item: item, on
hand, on order, and optionally lead time, lead time sd, review, service, fill rate, order
quantity, order multiple, minimum order (each overrides the options for its item); of a workbook,
the sheet naming on hand, or the one --stock-sheet NAME names. --stock-by COLUMN: where the
history joins columns into its items' names and COLUMN (a code) names each item once, a stock
row naming an item by it alone is read as that item (said; none: not, a work's own too). Stock figures
are estimates from past demand: your own policies, supplier terms and judgement decide the order.
look-back: the plan of N periods ago (default a work's own Look-back, else 1; the history without
its last N periods, the same settings) against what sold since: each period's forecast and band, and whether the reorder point
(or order-up-to level) covered the demand over its protection interval once that has passed.",
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
    Inspect {
        file: String,
        /// `--sheet NAME`: the workbook's sheet to read.
        sheet: Option<String>,
        json: bool,
        /// `--leave-out-unfinished`: the last period left out where it looks unfinished.
        leave_out: bool,
    },
    Forecast(ForecastArgs),
    Stock(StockArgs),
    LookBack(LookBackArgs),
    /// `link` (a share link) or `work` (a work file).
    Link(LinkArgs),
}

/// What `link` and `work` write.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Written {
    Link,
    WorkFile,
}

pub struct LookBackArgs {
    /// Periods to look back over (`None`: a work's own Look-back, else 1).
    pub periods: Option<usize>,
    /// FILE, the items, the settings and stock inputs.
    pub stock: StockArgs,
}

pub struct LinkArgs {
    pub written: Written,
    /// `--look-back N`: the Look-back the page shows (0: none); `None` keeps a work's own.
    pub look_back: Option<usize>,
    /// The page's address the link starts with.
    pub page: String,
    /// FILE, the settings and stock inputs, and the item to open (at most one in `items`).
    pub stock: StockArgs,
}

/// The flag that leaves out a last period that looks unfinished (every command reading a
/// history takes it).
pub const LEAVE_OUT: &str = "--leave-out-unfinished";

/// The address `link` writes when no --page is given: the one `scripts/start.sh` serves.
pub const DEFAULT_PAGE: &str = "http://127.0.0.1:8080/";

/// The plan settings as typed on the command line and which of them were given: over a work
/// (FILE a share link or work file) only the given ones replace the work's own.
pub struct TypedSettings {
    pub text: SettingsText,
    given: Vec<String>,
}

impl TypedSettings {
    /// `work`'s settings with the ones given on the command line in their place.
    pub fn over(&self, work: &SettingsText) -> SettingsText {
        let mut out = work.clone();
        for flag in &self.given {
            let t = &self.text;
            match flag.as_str() {
                "--horizon" => out.horizon = t.horizon.clone(),
                "--season" => out.season = t.season.clone(),
                "--holdout" => out.holdout = t.holdout.clone(),
                "--level" => out.level = t.level.clone(),
                "--tracking-limit" => out.tracking_limit = t.tracking_limit.clone(),
                "--origins" => out.origins = t.origins.clone(),
                "--rank-by" => out.rank_by = t.rank_by,
                "--band" => out.band = t.band,
                "--method" => out.choice = t.choice.clone(),
                _ => {}
            }
        }
        out
    }
}

/// The Stock plan's settings as typed on the command line and which were given (see
/// [`TypedSettings`]).
pub struct TypedStock {
    pub text: StockText,
    given: Vec<&'static str>,
}

impl TypedStock {
    /// `work`'s stock settings with the ones given on the command line in their place.
    pub fn over(&self, work: &StockText) -> StockText {
        let mut out = work.clone();
        for flag in &self.given {
            let t = &self.text;
            match *flag {
                "--lead-time" => out.lead_time = t.lead_time.clone(),
                "--lead-time-sd" => out.lead_time_sd = t.lead_time_sd.clone(),
                "--review" => out.review_period = t.review_period.clone(),
                "--service" | "--fill-rate" => {
                    out.target_kind = t.target_kind;
                    out.target = t.target.clone();
                }
                "--order-quantity" => out.order_quantity = t.order_quantity.clone(),
                _ => {}
            }
        }
        out
    }
}

pub struct StockArgs {
    pub file: String,
    /// `--sheet NAME`: FILE's sheet to read, FILE a workbook.
    pub sheet: Option<String>,
    /// Items to plan, in the order given; empty: every item of the file.
    pub items: Vec<String>,
    pub json: bool,
    /// `--leave-out-unfinished`.
    pub leave_out: bool,
    pub settings: PlanSettings,
    pub stock: stock::StockSettings,
    /// The stock table's file (`-`: standard input), when given.
    pub table: Option<String>,
    /// `--stock-sheet NAME`: the stock table's sheet to read, the table a workbook.
    pub table_sheet: Option<String>,
    /// `--stock-by COLUMN`: the history's item column to read the stock rows by alone;
    /// `Some(None)` for `none` (not, whatever a work says); `None` when not given.
    pub read_by: Option<Option<String>>,
    /// The settings as typed (for a work given as FILE).
    pub typed: TypedSettings,
    pub typed_stock: TypedStock,
}

pub struct ForecastArgs {
    pub file: String,
    /// `--sheet NAME`: FILE's sheet to read, FILE a workbook.
    pub sheet: Option<String>,
    /// Items to plan, in the order given; empty: every item of the file.
    pub items: Vec<String>,
    pub json: bool,
    /// `--leave-out-unfinished`.
    pub leave_out: bool,
    pub settings: PlanSettings,
    /// The settings as typed (for a work given as FILE).
    pub typed: TypedSettings,
}

pub fn parse(argv: &[String]) -> Result<Command, String> {
    let Some(sub) = argv.first() else {
        return Ok(Command::Help);
    };
    let rest = &argv[1..];
    // `morrowcast stock --help`: the help, not "--help needs a value".
    if rest.iter().any(|a| a == "--help" || a == "-h") {
        return Ok(Command::Help);
    }
    match sub.as_str() {
        "help" | "--help" | "-h" => Ok(Command::Help),
        "demo" => Ok(Command::Demo),
        "inspect" => {
            let mut file = None;
            let mut sheet = None;
            let mut json = false;
            let mut leave_out = false;
            let mut args = rest.iter();
            while let Some(a) = args.next() {
                match a.as_str() {
                    "--json" => json = true,
                    LEAVE_OUT => leave_out = true,
                    "--sheet" => {
                        let name = args.next().ok_or("--sheet needs a value")?;
                        if sheet.replace(name.to_string()).is_some() {
                            return Err("--sheet is given twice: give it once".to_string());
                        }
                    }
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
            Ok(Command::Inspect {
                file,
                sheet,
                json,
                leave_out,
            })
        }
        "forecast" => parse_forecast(rest).map(Command::Forecast),
        "stock" => parse_stock("stock", rest, &mut |_, _| Ok(false)).map(Command::Stock),
        "link" | "work" => parse_link(sub, rest).map(Command::Link),
        "look-back" => parse_look_back(rest).map(Command::LookBack),
        other => Err(format!("unknown command \"{other}\"")),
    }
}

fn parse_forecast(rest: &[String]) -> Result<ForecastArgs, String> {
    let parsed = parse_item_command("forecast", rest, &mut |_, _| Ok(false))?;
    Ok(ForecastArgs {
        file: parsed.file,
        sheet: parsed.sheet,
        items: parsed.items,
        json: parsed.json,
        leave_out: parsed.leave_out,
        settings: parsed.settings,
        typed: parsed.typed,
    })
}

fn parse_look_back(rest: &[String]) -> Result<LookBackArgs, String> {
    let mut periods = None;
    let stock = parse_stock("look-back", rest, &mut |flag, value| {
        if flag != "--periods" {
            return Ok(false);
        }
        periods = Some(
            value
                .trim()
                .parse::<usize>()
                .ok()
                .filter(|n| *n > 0)
                .ok_or(format!(
                    "--periods takes a whole number of periods, at least 1; found \"{value}\""
                ))?,
        );
        Ok(true)
    })?;
    Ok(LookBackArgs { periods, stock })
}

fn parse_link(command: &str, rest: &[String]) -> Result<LinkArgs, String> {
    let written = if command == "link" {
        Written::Link
    } else {
        Written::WorkFile
    };
    let mut page = None;
    let mut look_back = None;
    let stock = parse_stock(command, rest, &mut |flag, value| {
        if flag == "--page" && written == Written::Link {
            page = Some(value.to_string());
            return Ok(true);
        }
        if flag == "--look-back" {
            look_back = Some(
                value
                    .trim()
                    .parse::<usize>()
                    .ok()
                    .filter(|n| *n <= MOST_PERIODS_SHOWN)
                    .ok_or(format!(
                        "--look-back takes a whole number of periods from 0 (none) to \
                         {MOST_PERIODS_SHOWN}; found \"{value}\""
                    ))?,
            );
            return Ok(true);
        }
        Ok(false)
    })?;
    if stock.json {
        return Err(format!(
            "{command} does not take --json: it writes JSON of its own"
        ));
    }
    if stock.items.len() > 1 {
        return Err(format!(
            "{command} takes one --item: the item the page opens"
        ));
    }
    let page = page.unwrap_or_else(|| DEFAULT_PAGE.to_string());
    if page.contains('#') {
        return Err(format!(
            "--page takes the page's address without a fragment; found \"{page}\""
        ));
    }
    Ok(LinkArgs {
        written,
        look_back,
        page,
        stock,
    })
}

fn parse_stock(
    command: &str,
    rest: &[String],
    more: &mut dyn FnMut(&str, &str) -> Result<bool, String>,
) -> Result<StockArgs, String> {
    let mut lead_time = "1".to_string();
    let mut lead_time_sd = None;
    let mut review = None;
    let mut service = None;
    let mut fill_rate = None;
    let mut order_quantity = None;
    let mut table = None;
    let mut table_sheet = None;
    let mut read_by = None;
    let parsed = parse_item_command(command, rest, &mut |flag, value| {
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
            "--stock-sheet" => &mut table_sheet,
            "--stock-by" => &mut read_by,
            _ => return more(flag, value),
        };
        *slot = Some(value.to_string());
        Ok(true)
    })?;
    // `none` leaves an optional figure out, a work's own too (given, so it replaces it).
    let left_out = |v: Option<String>| v.filter(|t| !t.trim().eq_ignore_ascii_case("none"));
    let (lead_time_sd, review, order_quantity) = (
        left_out(lead_time_sd),
        left_out(review),
        left_out(order_quantity),
    );
    let typed_stock = TypedStock {
        text: StockText {
            lead_time: lead_time.clone(),
            lead_time_sd: lead_time_sd.clone().unwrap_or_default(),
            review_period: review.clone().unwrap_or_default(),
            target_kind: if fill_rate.is_some() {
                TargetKind::FillRate
            } else {
                TargetKind::CycleService
            },
            target: fill_rate
                .clone()
                .or_else(|| service.clone())
                .unwrap_or_else(|| "95".into()),
            order_quantity: order_quantity.clone().unwrap_or_default(),
        },
        given: parsed.given_stock.clone(),
    };
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
    check_horizon(&parsed.settings, &stock)?;
    if table_sheet.is_some() && table.is_none() {
        return Err(
            "--stock-sheet names a sheet of the stock table: give --stock TABLE too".into(),
        );
    }
    if read_by
        .as_deref()
        .is_some_and(|c: &str| c.trim().is_empty())
    {
        return Err("--stock-by takes a column of the history's item names, or none".into());
    }
    let read_by = read_by.map(|c| Some(c).filter(|c| !c.trim().eq_ignore_ascii_case("none")));
    Ok(StockArgs {
        file: parsed.file,
        sheet: parsed.sheet,
        table_sheet,
        read_by,
        items: parsed.items,
        json: parsed.json,
        leave_out: parsed.leave_out,
        settings: parsed.settings,
        stock,
        table,
        typed: parsed.typed,
        typed_stock,
    })
}

/// A fixed horizon must cover the Stock plan's protection interval.
pub fn check_horizon(settings: &PlanSettings, stock: &stock::StockSettings) -> Result<(), String> {
    let periods = stock.protection_periods();
    match settings.horizon() {
        Some(h) if h < periods => Err(format!(
            "--horizon {h} is shorter than the protection interval of {periods} periods \
             (lead time plus review period): give at least {periods}, or leave it automatic"
        )),
        _ => Ok(()),
    }
}

/// What the item commands share.
struct ItemCommand {
    file: String,
    sheet: Option<String>,
    items: Vec<String>,
    json: bool,
    leave_out: bool,
    settings: PlanSettings,
    typed: TypedSettings,
    /// The stock flags given (the rest of `seen`, for [`TypedStock`]).
    given_stock: Vec<&'static str>,
}

/// Parses FILE, --item, --json and the plan's settings of `command`; `extra` is offered every
/// other flag with its value first and says whether it took it.
fn parse_item_command(
    command: &str,
    rest: &[String],
    extra: &mut dyn FnMut(&str, &str) -> Result<bool, String>,
) -> Result<ItemCommand, String> {
    let mut file = None;
    let mut sheet = None;
    let mut items: Vec<String> = Vec::new();
    let mut json = false;
    let mut leave_out = false;
    let mut text = SettingsText::default();
    let mut seen: Vec<&str> = Vec::new();
    let mut i = 0;
    while i < rest.len() {
        let flag = rest[i].as_str();
        if flag == "--json" || flag == LEAVE_OUT {
            json |= flag == "--json";
            leave_out |= flag == LEAVE_OUT;
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
            "--sheet" => sheet = Some(value.to_string()),
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
    let given_stock = [
        "--lead-time",
        "--lead-time-sd",
        "--review",
        "--service",
        "--fill-rate",
        "--order-quantity",
    ]
    .into_iter()
    .filter(|f| seen.contains(f))
    .collect();
    Ok(ItemCommand {
        file,
        sheet,
        items,
        json,
        leave_out,
        settings,
        typed: TypedSettings {
            text,
            given: seen.iter().map(|f| f.to_string()).collect(),
        },
        given_stock,
    })
}
