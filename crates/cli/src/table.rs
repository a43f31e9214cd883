//! Readable text output: the intake report and one item's plan as aligned tables.

use std::fmt::Write;

use morrowcast_engine::alerts::Alert;
use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::intake::IntakeReport;
use morrowcast_engine::lookback::{LookBack, LookBackTally, Outcome, StockCheck};
use morrowcast_engine::plan::ItemPlan;
use morrowcast_engine::stock;

/// Text from the input made safe for a terminal: control characters (escape sequences, bells,
/// carriage returns, line breaks inside a quoted cell) and the characters that reorder
/// displayed text (bidirectional overrides and isolates) are shown as escapes such as `\u{1b}`,
/// so a name in a file cannot move the cursor, recolour the terminal or hide other text.
pub fn clean(text: &str) -> String {
    let mut s = String::with_capacity(text.len());
    for c in text.chars() {
        let reorders = matches!(c, '\u{202a}'..='\u{202e}' | '\u{2066}'..='\u{2069}');
        if c.is_control() || reorders {
            s.push_str(&format!("\\u{{{:x}}}", u32::from(c)));
        } else {
            s.push(c);
        }
    }
    s
}

/// A name from the input in quotes, made safe for a terminal.
pub fn quoted(name: &str) -> String {
    format!("\"{}\"", clean(name))
}

/// Shortens a label to `width` characters, marking the cut with "...".
fn fit_width(label: &str, width: usize) -> String {
    if label.chars().count() <= width {
        label.to_string()
    } else {
        let kept: String = label.chars().take(width.saturating_sub(3)).collect();
        format!("{kept}...")
    }
}

fn opt(v: Option<f64>, decimals: usize) -> String {
    v.map_or_else(|| "n/a".to_string(), |x| format!("{x:.decimals$}"))
}

/// The intake report in plain words.
pub fn intake_report(r: &IntakeReport) -> String {
    let mut s = String::new();
    let _ = writeln!(
        s,
        "delimiter: {}   decimal mark: {}   layout: {}   frequency: {}",
        r.delimiter.as_str(),
        r.decimal.as_str(),
        r.layout.as_str(),
        r.frequency.as_str()
    );
    if let Some(d) = &r.date_format {
        let _ = writeln!(s, "periods read as: {d}");
    }
    let _ = writeln!(
        s,
        "items: {}   gaps filled: {}",
        r.items.len(),
        r.gaps_filled
    );
    // Each item's history: from its first value to its last (empty cells outside it are
    // left out, as a warning says).
    for item in &r.items {
        let (Some(first), Some(last)) = (item.first_value(), item.last_value()) else {
            continue;
        };
        let periods = first.steps_to(last) + 1;
        let _ = writeln!(
            s,
            "  {}: {periods} period{}, {} to {}",
            clean(&item.name),
            if periods == 1 { "" } else { "s" },
            first,
            last
        );
    }
    for w in &r.warnings {
        let _ = writeln!(s, "warning: {}", clean(w));
    }
    for e in &r.errors {
        let _ = writeln!(
            s,
            "error: row {}, column {}, found {}: {}",
            e.row,
            quoted(&e.column),
            quoted(&e.text),
            clean(&e.message)
        );
    }
    s
}

/// One item's plan: patterns, Backtest ranking, forecast with band, Error ledger.
pub fn plan(p: &ItemPlan) -> String {
    let mut s = String::new();
    let _ = writeln!(s, "\n== {} ==", clean(&p.name));
    let _ = writeln!(
        s,
        "season length: {} ({})",
        p.season.length.unwrap_or(1),
        p.season.reason
    );
    let _ = writeln!(
        s,
        "trend: {} (Mann-Kendall z {:.2}, p {:.4})",
        p.trend.direction.as_str(),
        p.trend.z,
        p.trend.p_value
    );
    let _ = writeln!(
        s,
        "demand class: {} (ADI {:.2}, CV² {:.2})",
        p.demand.class.as_str(),
        p.demand.adi,
        p.demand.cv2
    );
    for n in &p.notes {
        let _ = writeln!(s, "note: {}", clean(n));
    }
    let _ = writeln!(
        s,
        "\nBacktest ranking by {} ({} origin{}, holdout {} periods)",
        p.backtest.rank_by.key(),
        p.backtest.origins_used,
        if p.backtest.origins_used == 1 {
            ""
        } else {
            "s"
        },
        p.backtest.holdout_demand.len()
    );
    let _ = writeln!(
        s,
        "  {:<44} {:>9} {:>11} {:>11} {:>7}",
        "method", "MAPE %", "RMSE", "bias", "MASE"
    );
    for r in &p.backtest.ranking {
        let _ = writeln!(
            s,
            "  {:<44} {:>9} {:>11.2} {:>11.2} {:>7}",
            fit_width(&r.candidate.label(), 44),
            opt(r.measures.mape, 2),
            r.measures.rmse,
            r.measures.bias,
            opt(r.measures.mase, 3)
        );
    }
    let _ = writeln!(s, "\nchosen: {}", p.chosen.label());
    let _ = writeln!(
        s,
        "forecast with {}% band ({}):",
        p.level.percent(),
        p.band.key()
    );
    let _ = writeln!(
        s,
        "  {:<10} {:>11} {:>11} {:>11}",
        "period", "value", "low", "high"
    );
    for f in &p.forecast {
        let _ = writeln!(
            s,
            "  {:<10} {:>11.2} {:>11.2} {:>11.2}",
            f.period.to_string(),
            f.band.value,
            f.band.low,
            f.band.high
        );
    }
    let _ = writeln!(s, "\nError ledger (error = forecast - demand):");
    let _ = writeln!(
        s,
        "  {:<10} {:>9} {:>9} {:>9} {:>8} {:>9} {:>8} {:>9} {:>7}",
        "period", "demand", "forecast", "error", "pct %", "MAD", "MAPE %", "bias", "TS"
    );
    for e in &p.ledger {
        let r = &e.row;
        let mark = if r.out_of_limits { " !" } else { "" };
        let _ = writeln!(
            s,
            "  {:<10} {:>9.2} {:>9.2} {:>9.2} {:>8} {:>9.2} {:>8} {:>9.2} {:>7}{mark}",
            e.period.to_string(),
            r.demand,
            r.forecast,
            r.error,
            opt(r.pct_error, 1),
            r.mad,
            opt(r.mape, 1),
            r.bias,
            opt(r.tracking_signal, 2)
        );
    }
    s
}

/// What `stock` prints before its items: the policy and target, and that the figures are
/// estimates.
pub fn stock_header(
    settings: &stock::StockSettings,
    with_table: bool,
    frequency: Frequency,
) -> String {
    let policy = match settings.review_period() {
        None => "continuous review (reorder point)".to_string(),
        Some(r) => format!(
            "periodic review every {} (order-up-to level)",
            frequency.periods(r)
        ),
    };
    let target = match settings.target() {
        stock::Target::CycleService(p) => format!("cycle service level {:.1} %", 100.0 * p),
        stock::Target::FillRate(p) => format!("fill rate {:.1} %", 100.0 * p),
    };
    let mut s = String::new();
    let _ = writeln!(
        s,
        "Stock plan: {policy}; lead time {}{}; target {target}.",
        frequency.periods(settings.lead_time()),
        if settings.lead_time_sd() > 0.0 {
            format!(" (standard deviation {})", settings.lead_time_sd())
        } else {
            String::new()
        }
    );
    let _ = writeln!(
        s,
        "These are estimates from past demand. Your own policies, supplier terms and judgement \
         decide the order.{}",
        if with_table {
            " Rows of the stock table override these settings for their item."
        } else {
            " On hand and on order are not known (give --stock TABLE), so no order is suggested."
        }
    );
    s
}

/// A rejected stock table: every error with its row, column and text.
pub fn stock_table_errors(t: &morrowcast_engine::intake::StockTable) -> String {
    let mut s = String::new();
    for e in &t.errors {
        let _ = writeln!(
            s,
            "morrowcast: stock table, row {}{}{}: {}",
            e.row,
            if e.column.is_empty() {
                String::new()
            } else {
                format!(", column {}", quoted(&e.column))
            },
            if e.text.is_empty() {
                String::new()
            } else {
                format!(", found {}", quoted(&e.text))
            },
            clean(&e.message)
        );
    }
    s
}

/// One item's Stock plan in a few lines.
pub fn stock(p: &ItemPlan, st: &stock::StockPlan, alerts: &[Alert]) -> String {
    let f = &st.figures;
    let level_name = match st.settings.review_period() {
        None => "reorder point",
        Some(_) => "order-up-to level",
    };
    let frequency = p.frequency();
    let mut s = String::new();
    let _ = writeln!(s, "\n== {} ==", clean(&p.name));
    let _ = writeln!(
        s,
        "demand over {}{}: {:.1} (spread {:.1}, {} model, from {} rolling origins)",
        frequency.periods(st.protection_periods),
        match st.settings.review_period() {
            Some(r) => format!(" (lead time {} and review {r})", st.settings.lead_time()),
            None => format!(" (lead time {})", st.settings.lead_time()),
        },
        st.demand_over_protection,
        st.sd_over_protection,
        st.distribution.key(),
        st.origins_used
    );
    let _ = writeln!(
        s,
        "safety stock {:.1}{}; {level_name} {:.1}",
        f.safety_stock,
        f.safety_factor
            .map_or(String::new(), |k| format!(" (k = {k:.3})")),
        f.level
    );
    let _ = writeln!(
        s,
        "expected: cycle service level {:.1} %, fill rate {:.2} % (shortage per cycle {:.2})",
        100.0 * f.cycle_service_level,
        100.0 * f.fill_rate,
        f.expected_shortage
    );
    if let (Some(p), Some(order)) = (st.position, st.suggested_order) {
        let _ = writeln!(
            s,
            "on hand {}, on order {}: suggested order today {}",
            p.on_hand,
            p.on_order,
            // Whole units as they are; otherwise to a tenth (the JSON keeps every digit).
            if order.fract() == 0.0 {
                format!("{order:.0}")
            } else {
                format!("{order:.1}")
            }
        );
    }
    for a in alerts {
        let _ = writeln!(s, "alert ({}): {}", a.kind.key(), clean(&a.reason));
    }
    for n in &st.notes {
        let _ = writeln!(s, "note: {}", clean(n));
    }
    s
}

/// What `look-back` says before its items.
pub fn look_back_header(periods: usize) -> String {
    format!(
        "Look-back: the plan of {periods} period(s) ago (the history without its last {periods} \
         period(s), the same settings) against what sold since. Errors are forecast minus sold.\n\
         These are estimates from past demand. Your own policies, supplier terms and judgement \
         decide the order.\n"
    )
}

/// One item's Look-back: each period since, then its stock check.
pub fn look_back(l: &LookBack) -> String {
    let mut s = String::new();
    let _ = writeln!(s, "\n== {} ==", clean(&l.name));
    let _ = writeln!(
        s,
        "plan made after {} ({}), {}% band",
        l.made_after,
        clean(&l.method),
        l.level.percent()
    );
    let _ = writeln!(
        s,
        "  {:<12} {:>13} {:>13} {:>13} {:>13} {:>13}  within",
        "period", "forecast", "low", "high", "sold", "error"
    );
    for step in &l.steps {
        let within = match step.outcome() {
            Outcome::Within => "yes",
            Outcome::Below => "no, below",
            Outcome::Above => "no, above",
            Outcome::Shut => "shut",
            Outcome::Gap => "-",
            Outcome::Ended => "- (after its data ends)",
        };
        let unknown = if step.ended { "none" } else { "gap" };
        let number = |v: Option<f64>| v.map_or(unknown.to_string(), |x| format!("{x:.2}"));
        let _ = writeln!(
            s,
            "  {:<12} {:>13.2} {:>13.2} {:>13.2} {:>13} {:>13}  {within}{}",
            step.period.to_string(),
            step.band.value,
            step.band.low,
            step.band.high,
            number(step.actual),
            number(step.error()),
            if step.extended { " (extended)" } else { "" }
        );
    }
    let (forecast, sold) = l.totals();
    let known = l.known().count();
    let (gaps, shut) = l.left_out();
    let mut left_out = Vec::new();
    if gaps > 0 {
        left_out.push(format!("{gaps} gap(s)"));
    }
    if shut > 0 {
        left_out.push(format!("{shut} shut period(s)"));
    }
    if l.after_data() > 0 {
        left_out.push(format!("{} period(s) after its data ends", l.after_data()));
    }
    let _ = writeln!(
        s,
        "total over the {known} period(s) with sales{}: forecast {forecast:.2}, sold {sold:.2} \
         (error {:.2}); {} of {known} within the band",
        if left_out.is_empty() {
            String::new()
        } else {
            format!(" ({} left out)", left_out.join(", "))
        },
        forecast - sold,
        l.within(),
    );
    if l.extended() > 0 {
        let _ = writeln!(
            s,
            "(extended): beyond the plan's horizon of {} period(s), forecast by the same plan \
             made with a longer one",
            l.steps.len() - l.extended()
        );
    }
    let _ = writeln!(s, "stock: {}", stock_check(&l.stock));
    s
}

/// The stock check in words.
fn stock_check(check: &StockCheck) -> String {
    match check {
        StockCheck::Checked {
            periods,
            periodic,
            level,
            expected,
            demand,
            promised,
            whole_units,
        } => {
            let name = if *periodic {
                "order-up-to level"
            } else {
                "reorder point"
            };
            let outcome = match check.shortfall() {
                Some(short) if short > 0.0 => format!("short by {short:.2}"),
                _ => "covered".to_string(),
            };
            format!(
                "{name} {level:.2}{} against a demand of {demand:.2} over the {periods} \
                 period(s) after the plan: {outcome} (expected {expected:.2}; set for a cycle \
                 service level of {:.1} %)",
                if *whole_units && level.fract() != 0.0 {
                    format!(" (stocked as {:.0}, whole units)", level.ceil())
                } else {
                    String::new()
                },
                100.0 * promised
            )
        }
        StockCheck::TooSoon { periods, passed } => format!(
            "not judged yet: the protection interval is {periods} period(s), {passed} passed \
             since the plan"
        ),
        StockCheck::NoInterval => {
            "nothing to judge: no lead time under continuous review".to_string()
        }
        StockCheck::Gap { periods } => {
            format!("not judged: a gap in the sales within the {periods} period(s) after the plan")
        }
        StockCheck::AfterData { periods } => {
            format!("not judged: the {periods} period(s) after the plan reach past the item's data")
        }
        StockCheck::NoFigures(why) => format!("no Stock plan then: {}", clean(why)),
    }
}

/// The file's Look-back in counts, after its items (`failed`: items without one, named on
/// standard error).
pub fn look_back_tally(t: &LookBackTally, failed: usize) -> String {
    let share = |x: Option<f64>| x.map_or("n/a".to_string(), |p| format!("{:.1} %", 100.0 * p));
    let mut s = format!(
        "\nLook-back over {} item(s): {} of {} period(s) within their band ({})",
        t.items,
        t.within,
        t.periods,
        share(t.within_share())
    );
    if t.stock_checked > 0 {
        let _ = write!(
            s,
            "; the stock level covered the demand over the protection interval for {} of {} \
             item(s) ({}; set for {} on average)",
            t.covered,
            t.stock_checked,
            share(t.covered_share()),
            share(t.promised())
        );
    }
    s.push_str(".\n");
    if failed > 0 {
        let _ = writeln!(
            s,
            "{failed} item(s) could not be looked back on and are not counted: see the messages \
             that follow."
        );
    }
    s
}
