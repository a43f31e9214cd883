//! The Item board's part of the page's state: the file's stock settings as typed, the stock
//! table, the board's per-item changes, and the rows the worker pool sends back for every item
//! of the file (planned again whenever any of these, the Intake or the plan settings change).
//!
//! Kept apart from: the one-item detail (plan.rs, its own worker), the board's rules (sorting,
//! filtering, the order plan: board.rs) and how rows are shown (board_panel.rs).

use std::collections::BTreeMap;

use leptos::prelude::*;
use morrowcast_engine::intake::{read_stock_table_text, StockTable};
use morrowcast_engine::stock::{StockFieldError, StockText};

use super::super::board::{ItemChange, BATCH};
use super::super::browser;
use super::super::pool::{Pool, BOARD_TICKETS};
use super::{IntakeState, PlanState};
use crate::worker::{parse_fault, BoardAsk, BoardItem, BoardRow};

/// How often arrived rows are put on the board (milliseconds; our choice: often enough to see
/// the board fill, rarely enough that re-sorting a file of thousands stays a small share of
/// the main thread).
const FLUSH_MS: u64 = 200;

/// The column of a choice to read the stock table by (`BoardState::table_read_by`) where it
/// was made of the table `text`: an edited or new table is read by full names again.
pub(super) fn read_by_for(choice: &Option<(String, String)>, text: &str) -> Option<String> {
    choice
        .as_ref()
        .filter(|(_, chosen_for)| chosen_for == text)
        .map(|(column, _)| column.clone())
}

/// The board's signals; `Copy`, handed around by context.
#[derive(Clone, Copy)]
pub struct BoardState {
    /// The file's stock settings as typed, and what is wrong with them.
    pub stock_form: RwSignal<StockText>,
    pub stock_errors: Memo<Vec<StockFieldError>>,
    /// The stock table's text (empty: none given), and its reading.
    pub table_text: RwSignal<String>,
    pub table: Memo<Option<StockTable>>,
    /// The history's item column the person chose to read the stock rows by alone (the
    /// table's `could_read_by`), with the table text it was chosen for: an edited or new
    /// table is read by full names again. `None`: by the history's full names.
    pub table_read_by: RwSignal<Option<(String, String)>>,
    /// Where the stock table came from (a file name, "pasted text", "none given").
    pub table_source: RwSignal<String>,
    /// The board's own changes per item name.
    pub changes: RwSignal<BTreeMap<String, ItemChange>>,
    /// Periods the Look-back looks back over (0: no Look-back; it plans every item twice).
    pub look_back: RwSignal<usize>,
    /// One place per item of the file, filled as rows come.
    pub rows: RwSignal<Vec<Option<BoardRow>>>,
    /// Items with a row, of `total`.
    pub planned: RwSignal<usize>,
    pub total: RwSignal<usize>,
    /// Why the board has nothing to show (no workers, Intake's errors, bad stock settings).
    pub blocked: RwSignal<Option<String>>,
    /// Milliseconds from the start of the last run to its last row.
    pub took_ms: RwSignal<Option<f64>>,
    /// The board's workers.
    pub workers: RwSignal<usize>,
    /// The workers' time on the current run's batches, summed (milliseconds).
    pub worker_ms: RwSignal<f64>,
}

impl BoardState {
    /// The board for `intake`'s file, with the file's plan settings from `plan` and the
    /// per-item `changes` (shared with the detail's plan state, so both plan an item alike).
    pub fn new(
        intake: IntakeState,
        plan: PlanState,
        changes: RwSignal<BTreeMap<String, ItemChange>>,
    ) -> BoardState {
        let stock_form = RwSignal::new(StockText::default());
        let stock_errors =
            Memo::new(move |_| stock_form.with(|f| f.check().err().unwrap_or_default()));
        let table_text = RwSignal::new(String::new());
        let table_read_by = RwSignal::new(None::<(String, String)>);
        let table = Memo::new(move |_| {
            table_text.with(|t| {
                let read_by = table_read_by.with(|c| read_by_for(c, t));
                (!t.trim().is_empty()).then(|| {
                    intake
                        .report
                        .with(|r| read_stock_table_text(t, r, read_by.as_deref()))
                })
            })
        });
        let table_source = RwSignal::new(super::NO_TABLE.to_string());
        let rows = RwSignal::new(Vec::<Option<BoardRow>>::new());
        let planned = RwSignal::new(0usize);
        let total = RwSignal::new(0usize);
        let blocked = RwSignal::new(None::<String>);
        let took_ms = RwSignal::new(None::<f64>);
        let workers = RwSignal::new(0usize);
        let worker_ms = RwSignal::new(0.0f64);
        let look_back = RwSignal::new(0usize);
        let ticket = StoredValue::new(BOARD_TICKETS);
        let started = StoredValue::new(0.0f64);
        let pending = StoredValue::new(Vec::<BoardRow>::new());
        let flush_due = StoredValue::new(false);
        let flush = move || {
            browser::measured("morrowcast:board-flush", || {
                flush_due.set_value(false);
                let arrived = std::mem::take(&mut *pending.write_value());
                if arrived.is_empty() {
                    return;
                }
                let mut added = 0;
                rows.update(|rows| {
                    for row in arrived {
                        if let Some(place) = rows.get_mut(row.index) {
                            added += usize::from(place.is_none());
                            *place = Some(row);
                        }
                    }
                });
                planned.update(|p| *p += added);
                if planned.get_untracked() == total.get_untracked() {
                    took_ms.set(Some(browser::now_ms() - started.get_value()));
                    browser::end_measure("morrowcast:board");
                }
            })
        };
        let pool = Pool::start(move |t, arrived, ms| {
            if t != ticket.get_value() {
                return;
            }
            worker_ms.update(|w| *w += ms);
            pending.write_value().extend(arrived);
            if !flush_due.get_value() {
                flush_due.set_value(true);
                set_timeout(flush, std::time::Duration::from_millis(FLUSH_MS));
            }
        });
        match &pool {
            Ok(p) => {
                workers.set(p.size());
                let p = p.clone();
                // A board worker's fault: its items are shown with the message, and the pool
                // starts fresh workers (the detail's worker is plan.rs's concern).
                let listener = window_event_listener(leptos::ev::error, move |e| {
                    let message = e.message();
                    if let Some((t, detail)) = parse_fault(&message) {
                        if t >= BOARD_TICKETS {
                            e.prevent_default();
                            p.fault(&format!(
                                "the computation stopped on a fault ({}); change a setting to try again",
                                detail.trim()
                            ));
                        }
                    }
                });
                std::mem::forget(listener);
            }
            Err(why) => blocked.set(Some(why.words().to_string())),
        }
        // The open item's detail goes first: the board's workers start once its first plan is
        // in, and its next batches wait while the detail is planned again (syncs the pool,
        // outside the page, with the detail's state).
        if let Ok(p) = &pool {
            let p = p.clone();
            Effect::new(move |_| p.hold(plan.busy.get() || plan.plan.with(Option::is_none)));
        }
        // Syncs the pool (outside the page) with everything a row depends on.
        Effect::new(move |_| {
            browser::measured("morrowcast:board-send", || {
                let settings = plan.settings.get();
                let stock_ok = stock_errors.with(Vec::is_empty);
                let stock = stock_form.get();
                let look_back = look_back.get();
                let Ok(pool) = &pool else {
                    return;
                };
                let next = ticket.get_value() + 1;
                ticket.set_value(next);
                pending.write_value().clear();
                took_ms.set(None);
                worker_ms.set(0.0);
                let mut batches = Vec::new();
                let mut failed = Vec::new();
                let mut why_not = None;
                intake.report.with(|report| {
                    total.set(report.items.len());
                    if report.has_errors() {
                        why_not = Some(
                        "Intake could not read every cell of the history: no figures are shown \
                         until the rows it lists are fixed"
                            .to_string(),
                    );
                        return;
                    }
                    if !stock_ok {
                        why_not =
                            Some("The stock settings need fixing first (see Stock plan).".into());
                        return;
                    }
                    let given = table.with(|t| t.as_ref().map(|t| t.errors.is_empty()));
                    if given == Some(false) {
                        why_not = Some(
                        "The stock table has cells that could not be read: no figures are shown \
                         until they are fixed (see Stock plan)"
                            .to_string(),
                    );
                        return;
                    }
                    let mut items = Vec::new();
                    changes.with(|changes| {
                        table.with(|t| {
                            for (index, item) in report.items.iter().enumerate() {
                                let row = t.as_ref().and_then(|t| t.row(&item.name));
                                let change = changes.get(&item.name);
                                let row = match change {
                                    Some(c) => c.apply(&item.name, row),
                                    None => row.cloned(),
                                };
                                match item.series() {
                                    Ok(series) => items.push(BoardItem {
                                        index,
                                        series,
                                        settings: change.and_then(|c| c.plan_settings(&settings)),
                                        row,
                                    }),
                                    Err(e) => failed.push(BoardRow {
                                        index,
                                        run: next,
                                        name: item.name.clone(),
                                        figures: Err(e.to_string()),
                                        look_back: (look_back > 0).then(|| Err(e.to_string())),
                                    }),
                                }
                            }
                        })
                    });
                    let table_given = given.is_some();
                    let file_end = report.last_period();
                    // Taken from the front in one pass (splitting the rest off each time
                    // copied it: quadratic, 4 s for 10,000 items).
                    let mut items = items.into_iter().peekable();
                    while items.peek().is_some() {
                        batches.push(BoardAsk {
                            ticket: next,
                            settings: settings.clone(),
                            stock: stock.clone(),
                            table_given,
                            look_back,
                            file_end,
                            items: items.by_ref().take(BATCH).collect(),
                        });
                    }
                });
                blocked.set(why_not.clone());
                let n = total.get_untracked();
                if why_not.is_some() {
                    rows.set(vec![None; n]);
                    planned.set(0);
                    pool.run(Vec::new());
                    return;
                }
                let mut fresh = vec![None; n];
                let failed_count = failed.len();
                for row in failed {
                    let i = row.index;
                    fresh[i] = Some(row);
                }
                rows.set(fresh);
                planned.set(failed_count);
                started.set_value(browser::now_ms());
                browser::start_measure("morrowcast:board");
                pool.run(batches);
            })
        });
        BoardState {
            stock_form,
            stock_errors,
            table_text,
            table,
            table_read_by,
            changes,
            look_back,
            table_source,
            rows,
            planned,
            total,
            blocked,
            took_ms,
            workers,
            worker_ms,
        }
    }
}
