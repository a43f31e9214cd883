//! The Look-back on the page ("How the plan did"): its control above the Item board with the
//! counts over every item, and the open item's periods since, one by one, beside its Stock
//! plan.
//!
//! Kept apart from: computing (every figure is the board's row, made in the worker by
//! `lookback::look_back`), the rules of its words and counts (board.rs: the cell, the counts,
//! the line above the board, the CSV) and the board itself (board_panel.rs).

use leptos::prelude::*;
use morrowcast_engine::lookback::{LookBack, Outcome, StockCheck, MOST_PERIODS_SHOWN};

use super::board::{
    look_back_cell, look_back_counts, look_back_csv, look_back_summary, outcome_words, units,
};
use super::browser;
use super::export::file_name;
use super::state::{BoardState, IntakeState};
use crate::worker::BoardRow;

/// The Look-back's control and, while one is asked for, its counts over every item: the plan
/// of some periods ago against what sold since.
#[component]
pub fn LookBackTools() -> impl IntoView {
    let board = expect_context::<BoardState>();
    let intake = expect_context::<IntakeState>();
    let words = Memo::new(move |_| intake.report.with(|r| r.frequency.period_words()));
    // The text of a refused entry, shown until the next one; otherwise the field shows the
    // Look-back's periods (a work opened may set them).
    let refused = RwSignal::new(None::<String>);
    let problem = RwSignal::new(None::<String>);
    let set = move |typed: String| {
        refused.set(Some(typed.clone()));
        // An emptied field turns the Look-back off, as 0 does.
        let text = typed.trim();
        match if text.is_empty() {
            Ok(0)
        } else {
            text.parse::<usize>()
        } {
            Ok(n) if n <= MOST_PERIODS_SHOWN => {
                problem.set(None);
                refused.set(None);
                board.look_back.set(n);
            }
            _ => {
                let (_, many) = words.get_untracked();
                let still = match board.look_back.get_untracked() {
                    0 => String::new(),
                    n => format!(" The Look-back shown is still of {n} {many}."),
                };
                problem.set(Some(format!(
                    "Look back a whole number of {many} from 0 (off) to {MOST_PERIODS_SHOWN}; found \"{text}\".{still}"
                )));
            }
        }
    };
    let save = move |_| {
        let csv = board.rows.with(|rows| {
            let all: Vec<&BoardRow> = rows.iter().flatten().collect();
            look_back_csv(&all)
        });
        let name = file_name("all-items", "look-back", &browser::today(), "csv");
        browser::download_text(&name, "text/csv", &csv);
    };
    let summary = move || {
        let back = board.look_back.get();
        (back > 0).then(|| {
            let counts = board.rows.with(|rows| look_back_counts(rows));
            look_back_summary(&counts, back, words.get())
        })
    };
    view! {
        <div class="look-back-tools">
            <div class="field inline">
                <label for="board-look-back">"How the plan did: look back"</label>
                <input id="board-look-back" type="number" min="0" max=MOST_PERIODS_SHOWN.to_string() step="1"
                    inputmode="numeric" aria-describedby="board-look-back-help"
                    aria-invalid=move || if problem.with(Option::is_some) { "true" } else { "false" }
                    prop:value=move || refused.get().unwrap_or_else(|| board.look_back.get().to_string())
                    on:change=move |ev| set(event_target_value(&ev))/>
                <span class="unit">{move || words.get().1}</span>
                <span id="board-look-back-help" class="hint">"0 = off. When on, each item's plan of then is set against what sold since (every item is planned twice, so the board takes longer)."</span>
            </div>
            {move || problem.get().map(|p| view! { <p class="problem" role="alert">{p}</p> })}
            {move || summary().map(|s| view! { <p class="look-back-summary" id="board-look-back-summary" role="status">{s}</p> })}
            <Show when=move || { board.look_back.get() > 0 }>
                <button type="button" id="export-look-back" on:click=save
                    disabled=move || { board.planned.get() < board.total.get() || board.blocked.with(Option::is_some) }>
                    "Save the Look-back (CSV)"
                </button>
            </Show>
        </div>
    }
}

/// The open item's Look-back, period by period (shown while the board has one for it).
#[component]
pub fn ItemLookBack() -> impl IntoView {
    let board = expect_context::<BoardState>();
    let intake = expect_context::<IntakeState>();
    let found = Memo::new(move |_| {
        let i = intake.item.get();
        board.rows.with(|rows| match rows.get(i) {
            Some(Some(BoardRow {
                look_back: Some(l), ..
            })) => Some(l.clone()),
            _ => None,
        })
    });
    move || {
        found.get().map(|l| match l {
            Err(why) => view! {
                <section class="panel item-look-back" id="item-look-back" aria-labelledby="item-look-back-title">
                    <h2 id="item-look-back-title">"How the plan did"</h2>
                    <p class="lead problem">{format!("No Look-back for this item: {why}.")}</p>
                </section>
            }
            .into_any(),
            Ok(l) => item_look_back(&l).into_any(),
        })
    }
}

fn item_look_back(l: &LookBack) -> impl IntoView {
    let extended = l.extended() > 0;
    let (one, many) = l.made_after.frequency().period_words();
    let stock = match &l.stock {
        StockCheck::Checked {
            periods,
            periodic,
            level,
            demand,
            expected,
            whole_units,
            ..
        } => Some(format!(
            "{} of then {}{}: the demand over the {} after the plan was {} (expected {}).",
            if *periodic {
                "Order-up-to level"
            } else {
                "Reorder point"
            },
            units(*level),
            if *whole_units && level.fract() != 0.0 {
                format!(" (stocked as {:.0}, whole units)", level.ceil())
            } else {
                String::new()
            },
            if *periods == 1 {
                one.to_string()
            } else {
                format!("{periods} {many}")
            },
            units(*demand),
            units(*expected)
        )),
        _ => None,
    };
    view! {
        <section class="panel item-look-back" id="item-look-back" aria-labelledby="item-look-back-title">
            <h2 id="item-look-back-title">{format!("How the plan did: the plan made after {}", l.made_after)}</h2>
            <p class="lead">{look_back_cell(l)}</p>
            <p class="hint">{format!("Method then: {}. Band: {}%.", l.method, l.level.percent())}</p>
            {stock.map(|s| view! { <p>{s}</p> })}
            <div class="table-wrap">
                <table class="look-back-table" id="item-look-back-table">
                    <caption class="visually-hidden">"Each period since the plan: its forecast and band then, and what sold"</caption>
                    <thead><tr>
                        <th scope="col">"Period"</th>
                        <th scope="col" class="num">"Forecast"</th>
                        <th scope="col" class="num">"Band"</th>
                        <th scope="col" class="num">"Sold"</th>
                        <th scope="col" class="num">"Error"</th>
                        <th scope="col">"Outcome"</th>
                    </tr></thead>
                    <tbody>
                        {l.steps.iter().map(|s| {
                            let outcome = s.outcome();
                            let word = outcome_words(outcome);
                            let missed = matches!(outcome, Outcome::Below | Outcome::Above);
                            view! { <tr>
                                <th scope="row">{format!("{}{}", s.period, if s.extended { " *" } else { "" })}</th>
                                <td class="num">{units(s.band.value)}</td>
                                <td class="num">{format!("{}–{}", units(s.band.low), units(s.band.high))}</td>
                                <td class="num">{s.actual.map_or("–".to_string(), units)}</td>
                                <td class="num">{s.error().map_or("–".to_string(), units)}</td>
                                <td class:missed=missed>{word}</td>
                            </tr> }
                        }).collect_view()}
                    </tbody>
                </table>
            </div>
            {extended.then(|| view! { <p class="hint">"* Beyond the plan's horizon: forecast by the same plan made with a longer one."</p> })}
        </section>
    }
}
