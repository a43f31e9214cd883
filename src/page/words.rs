//! Plain words for the page: the intake report, rejected cells, the bias sentence and the
//! verdicts of the Pattern view.
//!
//! Kept apart from: computing anything. Every sentence is made from the engine's report and plan;
//! counts of signs are the only arithmetic here. Error sign (as the engine and the page state it):
//! e = F - D, forecast minus demand; a positive error is an over-forecast.

use morrowcast_engine::backtest::{Candidate, COMBINATION_ANCHORS};
use morrowcast_engine::intake::{list_in_words, IntakeReport, Layout, RowError};
use morrowcast_engine::methods::MethodKind;
use morrowcast_engine::patterns::{
    DemandClass, DemandVerdict, SeasonSource, SeasonVerdict, TrendDirection, TrendVerdict,
};
use morrowcast_engine::plan::LedgerEntry;

use crate::chart::round_for_people;

/// What Intake understood from `text`, one plain sentence per fact.
pub fn intake_lines(text: &str, report: &IntakeReport) -> Vec<String> {
    if text.trim().is_empty() {
        return vec![
            "Nothing read yet: paste a table, open or drop a file, or load the demo.".into(),
        ];
    }
    let mut lines = Vec::new();
    let layout = match report.layout {
        Layout::Single => "one item in a single column of values",
        Layout::Wide => "one column per item",
        Layout::Long => "one row per item and period",
        Layout::Across => "one row per item (or per item and year), periods across the top",
    };
    lines.push(format!(
        "Columns separated by {}, decimals written with a {}; layout: {layout}.",
        match report.delimiter.as_str() {
            "tab" => "tabs".to_string(),
            other => format!("{other}s"),
        },
        report.decimal.as_str()
    ));
    let freq = match report.frequency.as_str() {
        "none" => "plain positions with no calendar dates".to_string(),
        other => format!("{other} periods"),
    };
    match &report.date_format {
        Some(f) => lines.push(format!("Periods read as {freq}, written as {f}.")),
        None => lines.push(format!("Periods read as {freq}.")),
    }
    let n = report.items.len();
    if n > 0 {
        // A file of thousands of items would fill the column with names: the first few
        // are named, the item chooser and the board hold the rest.
        let names: Vec<String> = report.items.iter().map(|i| i.name.clone()).collect();
        // Each item's history, from its first figure to its last (empty cells outside it
        // are left out, as the notes say).
        let longest = report
            .items
            .iter()
            .filter_map(|i| Some(i.first_value()?.steps_to(i.last_value()?) + 1))
            .max()
            .unwrap_or(0);
        lines.push(format!(
            "{n} item{} ({}), up to {longest} periods each.",
            if n == 1 { "" } else { "s" },
            list_in_words(&names)
        ));
    }
    if report.gaps_filled > 0 {
        lines.push(format!(
            "{} found; they are filled by straight-line interpolation and named in the notes.",
            counted(report.gaps_filled, "missing period", "missing periods")
        ));
    }
    lines.extend(report.warnings.iter().map(|w| as_sentence(w)));
    if !report.errors.is_empty() {
        lines.push(format!(
            "{} found; the list below says where. Fix the text in the box and it is read again.",
            counted(report.errors.len(), "problem", "problems")
        ));
    }
    lines
}

/// An engine note as a sentence of its own on the page: its first letter raised (the engine
/// writes notes to follow "note: " on the command line, so most start in lower case).
pub fn as_sentence(note: &str) -> String {
    let mut chars = note.chars();
    match chars.next() {
        Some(first) => first.to_uppercase().chain(chars).collect(),
        None => String::new(),
    }
}

/// Said above a forecast made while Intake found problems (a cell, a row or a line it could not
/// read): what could not be read is left out until fixed.
/// "1 problem", "3 problems".
pub fn counted(n: usize, one: &str, many: &str) -> String {
    format!("{n} {}", if n == 1 { one } else { many })
}

pub fn unread_cells_note(count: usize) -> String {
    let problems = if count == 1 {
        "1 problem".to_string()
    } else {
        format!("{count} problems")
    };
    format!(
        "{problems} in this table (listed under Intake). Until fixed, the forecast leaves out what \
         could not be read (a value that could not be read counts as a missing period, filled by \
         straight-line interpolation), so it may change."
    )
}

/// Said above the open item's forecast when its data ends before the file's last period
/// (`why`: the engine's words, `order::ends_early`): the forecast starts at its own end.
pub fn ends_early_note(why: &str) -> String {
    format!("This forecast does not start after the file's end: {why}.")
}

/// Said above forecasts and stock figures when the file's last period looks unfinished
/// (Intake's warning says why): they count it as a whole period. `can_leave_out`: the page
/// offers a button that does it; otherwise the file must be edited.
pub fn unfinished_last_note(last: &str, can_leave_out: bool) -> String {
    let what_to_do = if can_leave_out {
        "leave it out until it is over"
    } else {
        "take it out of the file until it is over"
    };
    format!(
        "The last period, {last}, looks unfinished: it is far below the periods before it (the \
         Intake report says more). If the data was taken before it ended, {what_to_do}: the \
         forecasts and stock figures count it as a whole period, so they come out too low. If \
         it really was this quiet, ignore this."
    )
}

/// Said where the unfinished-period notice stood once the period is left out.
pub fn left_out_note(period: &str) -> String {
    format!("{period} is left out of the Intake text; the figures go without it.")
}

/// Said beside "use it anyway" when the season test turned down a candidate season. With few
/// full seasons the test's threshold is high (it grows with the autocorrelation at the shorter
/// lags, so a clear season can still fall short of it).
pub fn rejected_season_hint(m: usize, full_seasons: usize) -> String {
    if full_seasons < 2 {
        return format!(
            "A {m}-period season cannot be tried yet: a seasonal method needs at least two full \
             seasons of history, and this item has {full_seasons}. "
        );
    }
    if full_seasons <= 4 {
        format!(
            "The {m}-period season was not accepted; with only {full_seasons} full seasons the test \
             is strict. If this item sells by season, try it and compare the holdout scores. "
        )
    } else {
        format!("The {m}-period season was not accepted. ")
    }
}

/// Why the plan's own choice is the combination (empty for a single method).
pub fn combination_choice(chosen: &Candidate) -> String {
    match chosen {
        Candidate::Combination(members) => {
            let anchors: Vec<&str> = members
                .iter()
                .filter(|m| COMBINATION_ANCHORS.contains(m))
                .map(|m| m.label())
                .collect();
            let by_aicc = members.contains(&MethodKind::SmoothingByAicc);
            let others = members.len() - anchors.len() - usize::from(by_aicc);
            let which = if anchors.is_empty() && !by_aicc {
                format!("the {} best methods", members.len())
            } else {
                let mut named = anchors;
                if by_aicc {
                    named.push("the exponential smoothing model with the lowest AICc");
                }
                let last = if others > 0 {
                    "the best of the others"
                } else {
                    named.pop().unwrap_or_default()
                };
                format!("{} methods: {} and {last}", members.len(), named.join(", "))
            };
            format!(
                " The forecast uses the combination, the plain mean of {which}: on the M3 \
                 competition data that was more accurate than the single best (README, \
                 Benchmarks)."
            )
        }
        Candidate::Method(_) => String::new(),
    }
}

/// One rejected cell: "Row 5, column "units": found "12x": <what to do>".
pub fn row_error_line(e: &RowError) -> String {
    let column = if e.column.is_empty() {
        String::new()
    } else {
        format!(", column \"{}\"", e.column)
    };
    format!("Row {}{column}: found \"{}\". {}", e.row, e.text, e.message)
}

/// The sentence under the Error ledger that says what the bias means, e.g. "The forecast ran
/// under demand in 9 of 12 periods; summed over the holdout it was 34 units too low."
pub fn bias_sentence(ledger: &[LedgerEntry], unit: &str) -> String {
    let n = ledger.len();
    if n == 0 {
        return "No holdout periods, so there is no bias to report.".into();
    }
    let under = ledger.iter().filter(|e| e.row.error < 0.0).count();
    let over = ledger.iter().filter(|e| e.row.error > 0.0).count();
    let bias = ledger.last().map(|e| e.row.bias).unwrap_or(0.0);
    let runs = match (under, over) {
        (u, 0) => format!("under demand in {u} of {n} periods"),
        (0, o) => format!("over demand in {o} of {n} periods"),
        (u, o) if u >= o => format!("under demand in {u} of {n} periods and over it in {o}"),
        (u, o) => format!("over demand in {o} of {n} periods and under it in {u}"),
    };
    let total = if bias < 0.0 {
        format!(
            "summed over the holdout it was {} {unit} too low",
            round_for_people(-bias)
        )
    } else if bias > 0.0 {
        format!(
            "summed over the holdout it was {} {unit} too high",
            round_for_people(bias)
        )
    } else {
        "summed over the holdout the errors cancel out".to_string()
    };
    format!("The forecast ran {runs}; {total}.")
}

/// The season verdict in words.
pub fn season_words(v: &SeasonVerdict) -> String {
    let base = match (v.length, v.source) {
        (Some(m), SeasonSource::User) => format!("Season length {m}, as you set it."),
        (None, SeasonSource::User) => "No season, as you set it.".into(),
        (Some(m), _) => format!("Season length {m}, detected."),
        (None, _) => "No season detected.".into(),
    };
    let reason = v.reason.trim();
    if reason.is_empty() {
        base
    } else if reason.ends_with(['.', '!', '?']) {
        format!("{base} {reason}")
    } else {
        format!("{base} {reason}.")
    }
}

/// The trend verdict in words, with its evidence (Mann-Kendall S, z and p).
pub fn trend_words(v: &TrendVerdict) -> String {
    let what = match v.direction {
        TrendDirection::Up => "Demand trends up",
        TrendDirection::Down => "Demand trends down",
        TrendDirection::None => "No clear trend",
    };
    format!(
        "{what} (Mann-Kendall S = {}, z = {:.2}, p = {:.3}; significance level {}).",
        round_for_people(v.s),
        v.z,
        v.p_value,
        v.significance
    )
}

/// The demand class in words, with ADI and CV² and the cut-offs of Syntetos, Boylan & Croston
/// (2005): ADI 1.32, CV² 0.49; the periods of shut places left out, when there are any.
pub fn demand_words(v: &DemandVerdict) -> String {
    let what = match v.class {
        DemandClass::Smooth => "Smooth demand: regular, not very variable",
        DemandClass::Erratic => "Erratic demand: regular but highly variable",
        DemandClass::Intermittent => "Intermittent demand: many periods without sales",
        DemandClass::Lumpy => "Lumpy demand: many periods without sales, and variable sizes",
    };
    let shut = match v.shut_periods {
        0 => String::new(),
        n => format!(
            " {n} periods at places of the season that (almost) never sell while the others \
             do, a business shut then, are left out and forecast as 0."
        ),
    };
    format!(
        "{what} (average interval between demands {:.2}, cut-off 1.32; CV² of sizes {:.2}, cut-off 0.49).{shut}",
        v.adi, v.cv2
    )
}

/// What the page says about a share link of `length` characters: whether mail programs or
/// browsers may cut it (the limits are the work crate's), and whether a work file is the
/// better way to hand the work over.
pub fn link_length_advice(length: usize) -> (String, Option<&'static str>) {
    use morrowcast_work::{LINK_KEPT_BY_BROWSERS, LINK_KEPT_BY_MAIL};
    let size = format!("{} characters", group_thousands(length));
    let advice = if length > LINK_KEPT_BY_BROWSERS {
        Some(
            "This link is too long to hand over safely: browsers and chat programs may cut it. \
             Save a work file instead and hand over the file.",
        )
    } else if length > LINK_KEPT_BY_MAIL {
        Some("Mail programs may cut links longer than about 2,000 characters: if it arrives cut, it will not open (nothing half-opened); send the work file then.")
    } else {
        None
    };
    (size, advice)
}

/// 12345 as "12,345".
fn group_thousands(n: usize) -> String {
    let digits = n.to_string();
    let mut out = String::new();
    for (i, c) in digits.chars().enumerate() {
        if i > 0 && (digits.len() - i) % 3 == 0 {
            out.push(',');
        }
        out.push(c);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use morrowcast_engine::accuracy::ledger;
    use morrowcast_engine::calendar::Period;

    #[test]
    fn long_links_are_said_to_be_at_risk() {
        let check = |length: usize, size: &str, advice: Option<&str>| {
            let (s, a) = link_length_advice(length);
            assert_eq!(s, size);
            assert_eq!(a.map(|a| a.split(':').next().unwrap()), advice);
        };
        check(950, "950 characters", None);
        check(2_000, "2,000 characters", None);
        check(
            2_001,
            "2,001 characters",
            Some("Mail programs may cut links longer than about 2,000 characters"),
        );
        check(
            32_000,
            "32,000 characters",
            Some("Mail programs may cut links longer than about 2,000 characters"),
        );
        check(
            1_234_567,
            "1,234,567 characters",
            Some("This link is too long to hand over safely"),
        );
    }

    fn entries(forecast: &[f64], demand: &[f64]) -> Vec<LedgerEntry> {
        ledger(forecast, demand, 4.0)
            .into_iter()
            .enumerate()
            .map(|(i, row)| LedgerEntry {
                period: Period::month(2025, i as u32 + 1),
                row,
            })
            .collect()
    }

    // Sign convention of the glossary: e = F - D, so F < D is an under-forecast.
    #[test]
    fn bias_sentence_counts_under_and_over_forecasts() {
        let e = entries(&[8.0, 9.0, 12.0, 7.0], &[10.0, 10.0, 10.0, 10.0]);
        assert_eq!(
            bias_sentence(&e, "units"),
            "The forecast ran under demand in 3 of 4 periods and over it in 1; summed over the holdout it was 4 units too low."
        );
        let e = entries(&[11.0, 12.0], &[10.0, 10.0]);
        assert_eq!(
            bias_sentence(&e, "units"),
            "The forecast ran over demand in 2 of 2 periods; summed over the holdout it was 3 units too high."
        );
        assert!(bias_sentence(&[], "units").starts_with("No holdout"));
    }

    #[test]
    fn the_combination_choice_is_explained_and_a_single_method_is_not() {
        use morrowcast_engine::methods::MethodKind;
        let combo =
            Candidate::Combination(vec![MethodKind::Naive, MethodKind::Ses, MethodKind::Holt]);
        assert!(combination_choice(&combo).contains("plain mean of the 3 best methods"));
        let anchored = Candidate::Combination(vec![
            MethodKind::DynamicOptimisedTheta,
            MethodKind::Theta,
            MethodKind::Ses,
            MethodKind::Holt,
        ]);
        assert!(combination_choice(&anchored).contains(
            "plain mean of 4 methods: Dynamic optimised Theta, Theta and the best of the others"
        ));
        let with_aicc = Candidate::Combination(vec![
            MethodKind::DynamicOptimisedTheta,
            MethodKind::Theta,
            MethodKind::SmoothingByAicc,
        ]);
        assert!(combination_choice(&with_aicc).contains(
            "plain mean of 3 methods: Dynamic optimised Theta, Theta and the exponential \
             smoothing model with the lowest AICc:"
        ));
        assert_eq!(
            combination_choice(&Candidate::Method(MethodKind::Theta)),
            ""
        );
    }

    #[test]
    fn a_rejected_season_on_a_short_history_invites_a_try() {
        assert!(rejected_season_hint(12, 3).contains("only 3 full seasons"));
        assert!(!rejected_season_hint(12, 6).contains("full seasons"));
        assert!(rejected_season_hint(12, 0).contains("cannot be tried yet"));
        assert!(rejected_season_hint(12, 1).contains("this item has 1"));
    }

    #[test]
    fn unread_cells_are_counted_in_words() {
        assert!(unread_cells_note(1).starts_with("1 problem in this table"));
        assert!(unread_cells_note(3).starts_with("3 problems in this table"));
    }

    #[test]
    fn row_errors_name_row_column_and_text() {
        let e = RowError {
            row: 5,
            column: "units".into(),
            text: "12x".into(),
            message: "Type a number.".into(),
        };
        assert_eq!(
            row_error_line(&e),
            "Row 5, column \"units\": found \"12x\". Type a number."
        );
    }

    #[test]
    fn many_items_are_named_up_to_eight() {
        let names: Vec<String> = (1..=10).map(|i| format!("Pot {i}")).collect();
        let mut text = format!("month,{}\n", names.join(","));
        for m in 1..=6 {
            text.push_str(&format!("2024-{m:02}{}\n", ",5".repeat(names.len())));
        }
        let r = morrowcast_engine::intake::read(&text);
        let lines = intake_lines(&text, &r);
        assert!(
            lines.iter().any(|l| l.starts_with(
                "10 items (Pot 1, Pot 2, Pot 3, Pot 4, Pot 5, Pot 6, Pot 7, Pot 8 and 2 more), up to 6"
            )),
            "{lines:?}"
        );
    }

    #[test]
    fn notes_read_as_sentences() {
        assert_eq!(as_sentence("the season test"), "The season test");
        assert_eq!(
            as_sentence("Holt-Winters additive"),
            "Holt-Winters additive"
        );
        assert_eq!(as_sentence("étang"), "Étang");
        assert_eq!(as_sentence(""), "");
    }

    #[test]
    fn empty_report_invites_input() {
        let r = morrowcast_engine::intake::read(" \n");
        let lines = intake_lines(" \n", &r);
        assert_eq!(lines.len(), 1);
        assert!(lines[0].starts_with("Nothing read yet"));
    }
}
