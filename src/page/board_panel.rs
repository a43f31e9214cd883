//! The Item board on the page (every item of the file, one row each, sortable and filterable,
//! a row opening the item's detail), the Stock plan's settings and stock table, and the open
//! item's Stock plan with its own changes.
//!
//! Kept apart from: the board's rules (board.rs: columns, sorting, filtering, the order plan)
//! and the state (state/board.rs). Every figure shown is a worker's row; nothing is computed
//! here but its formatting.

use leptos::prelude::*;
use morrowcast_engine::alerts::AlertKind;
use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::settings::{Choice, SeasonChoice};
use morrowcast_engine::stock::{read_lead_time, StockField, StockText, Target, TargetKind};

use super::board::{
    how_many, look_back_cell, order_plan_csv, sort_rows, units, AlertFilter, Filter, ItemChange,
    SortKey, COLUMNS, LOOK_BACK_COLUMN, ROWS_SHOWN, STOCK_COLUMNS,
};
use super::browser;
use super::export::file_name;
use super::panels::{chosen_file, dropped_file, read_local_file, source_of, TextField};
use super::state::{BoardState, IntakeState, PlanState};
use super::words;
use crate::worker::reading::{BookWant, Refused};
use crate::worker::{BoardFigures, BoardRow, BoardStock};

fn percent(v: f64) -> String {
    format!("{:.1}%", v * 100.0)
}

/// What the page says about every stock figure it shows.
pub const ESTIMATES_WORDS: &str = "These stock figures are estimates worked out from past demand \
    and the Stock plan's settings (lead time, service target, stock table). They leave out supplier minimums and prices, shelf life, storage \
    room, promotions and anything the history does not show. Your own policies, your suppliers' \
    terms and your judgement decide what to order.";

/// A cell's text for a column.
fn cell(f: &BoardFigures, key: SortKey) -> String {
    match key {
        SortKey::DemandClass => f.demand_class.clone(),
        SortKey::Season => f.season.map_or("none".into(), |s| s.to_string()),
        SortKey::Trend => f.trend.clone(),
        SortKey::Method => f.method_short.clone(),
        SortKey::Mase => f.mase.map_or("–".into(), |m| format!("{m:.2}")),
        SortKey::Bias => units(f.bias),
        SortKey::Tracking => match f.tracking_signal {
            Some(t) if f.tracking_beyond => format!("{t:.1} beyond"),
            Some(t) => format!("{t:.1}"),
            None => "–".into(),
        },
        SortKey::History => f.history.to_string(),
        SortKey::Next => format!(
            "{} ({}–{})",
            units(f.next),
            units(f.next_lower),
            units(f.next_upper)
        ),
        SortKey::DemandOver | SortKey::SafetyStock | SortKey::Level | SortKey::Order => {
            match &f.stock {
                Ok(s) => stock_cell(s, key),
                // The row draws why in one cell across the stock columns.
                Err(_) if key == SortKey::Order => "no stock figures".into(),
                Err(_) => String::new(),
            }
        }
        SortKey::Alerts => f.alerts.len().to_string(),
        // The row's own, not the figures' (board rows draw it).
        SortKey::LookBack => String::new(),
        SortKey::File | SortKey::Name => String::new(),
    }
}

/// The cell of a stock column.
fn stock_cell(s: &BoardStock, key: SortKey) -> String {
    match key {
        SortKey::DemandOver => format!(
            "{} ± {} in {}",
            units(s.demand_over_protection),
            units(s.sd_over_protection),
            s.frequency.periods(s.protection_periods)
        ),
        SortKey::SafetyStock => units(s.safety_stock),
        SortKey::Level => format!(
            "{} {}",
            if s.periodic { "up to" } else { "at" },
            units(s.level_units)
        ),
        SortKey::Order => match (s.suggested_order, s.on_hand) {
            (Some(order), _) => units(order),
            (None, Some(_)) => "held back (notes)".into(),
            (None, None) => "needs on hand".into(),
        },
        _ => String::new(),
    }
}

/// An item's stock figures and notes, in its Stock plan.
fn stock_figures(f: &BoardStock) -> impl IntoView {
    let level = if f.periodic {
        "Order-up-to level"
    } else {
        "Reorder point"
    };
    let target = match f.target {
        Target::CycleService(v) => format!("cycle service level {}", percent(v)),
        Target::FillRate(v) => format!("fill rate {}", percent(v)),
    };
    view! {
        <dl class="figures" id="item-stock-figures">
            <dt>"Policy"</dt><dd>{if f.periodic { format!("review every {}, lead time {}", f.frequency.periods(f.review_period.unwrap_or(0)), f.frequency.periods(f.lead_time)) } else { format!("continuous review, lead time {}", f.frequency.periods(f.lead_time)) }}</dd>
            <dt>"Target"</dt><dd>{target}</dd>
            <dt>"Demand over protection"</dt><dd>{format!("{} in {} (spread {}, {} model)", units(f.demand_over_protection), f.frequency.periods(f.protection_periods), units(f.sd_over_protection), f.distribution)}</dd>
            <dt>"Safety stock"</dt><dd>{units(f.safety_stock)}</dd>
            <dt>{level}</dt><dd>{units(f.level_units)}</dd>
            <dt>"On hand, on order"</dt><dd>{match (f.on_hand, f.on_order) { (Some(h), Some(o)) => format!("{}, {}", units(h), units(o)), _ => "not given".into() }}</dd>
            <dt>"Order today"</dt><dd id="item-order-today">{match (f.suggested_order, f.on_hand) {
                (Some(order), _) => units(order),
                (None, Some(_)) => "none suggested: see the notes".into(),
                (None, None) => "none suggested: on hand unknown".into(),
            }}</dd>
            <dt>"Expected service"</dt><dd>{format!("cycle service level {}, fill rate {}", percent(f.cycle_service_level), percent(f.fill_rate))}</dd>
        </dl>
        <ul class="plain notes">{f.notes.iter().map(|n| view! { <li>{words::as_sentence(n)}</li> }).collect_view()}</ul>
    }
}

/// The Item board.
#[component]
pub fn ItemBoard() -> impl IntoView {
    let board = expect_context::<BoardState>();
    let intake = expect_context::<IntakeState>();
    let sort = RwSignal::new((SortKey::File, false));
    let filter = RwSignal::new(Filter::default());
    let shown_count = RwSignal::new(ROWS_SHOWN);
    // The rows in view, as (place in the file, run): filtered over the whole file, then
    // sorted. Places, not rows: nothing is cloned when rows arrive.
    let visible = Memo::new(move |_| {
        board.rows.with(|rows| {
            filter.with(|f| {
                let (key, descending) = sort.get();
                let mut kept: Vec<&BoardRow> =
                    rows.iter().flatten().filter(|r| f.passes(r)).collect();
                sort_rows(&mut kept, key, descending);
                kept.into_iter()
                    .map(|r| (r.index, r.run))
                    .collect::<Vec<_>>()
            })
        })
    });
    let export = move |_| {
        let csv = board.rows.with(|rows| {
            board.changes.with(|c| {
                let all: Vec<&BoardRow> = rows.iter().flatten().collect();
                order_plan_csv(&all, |name| c.contains_key(name))
            })
        });
        let name = file_name("all-items", "order-plan", &browser::today(), "csv");
        browser::download_text(&name, "text/csv", &csv);
    };
    let print = move |_| {
        if let Some(w) = web_sys::window() {
            let _ = w.print();
        }
    };
    let open = move |index: usize| {
        intake.item.set(index);
        // The detail comes in below the board: move there, and put the focus on it.
        if let Some(el) = web_sys::window()
            .and_then(|w| w.document())
            .and_then(|d| d.get_element_by_id("results"))
        {
            el.scroll_into_view();
            if let Ok(el) = wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(el) {
                let _ = el.focus();
            }
        }
    };
    let header = move |key: SortKey, title: &'static str, numeric: bool| {
        let aria = move || match sort.get() {
            (k, false) if k == key => "ascending",
            (k, true) if k == key => "descending",
            _ => "none",
        };
        view! {
            <th scope="col" class:num={numeric && key != SortKey::LookBack} aria-sort=aria>
                <button type="button" class="sort" on:click=move |_| sort.update(|s| {
                    *s = if s.0 == key { (key, !s.1) } else { (key, numeric) };
                })>
                    {title}
                    <span class="sort-mark" aria-hidden="true">{move || match aria() {
                        "ascending" => "▲", "descending" => "▼", _ => "",
                    }}</span>
                </button>
            </th>
        }
    };
    view! {
        <section class="panel board" id="item-board" aria-labelledby="board-title">
            <h2 id="board-title">"Item board"</h2>
            <p class="board-progress" id="board-progress" role="status" aria-live="polite" class:problem=move || board.blocked.with(Option::is_some)
                data-worker-ms=move || format!("{:.0}", board.worker_ms.get())>{move || {
                if let Some(why) = board.blocked.get() {
                    return why;
                }
                let (done, total) = (board.planned.get(), board.total.get());
                let took = board.took_ms.get().map(|ms| format!(" in {:.1} s", ms / 1000.0)).unwrap_or_default();
                if done < total {
                    format!("Planned {done} of {total} items…")
                } else {
                    format!("Planned all {total} items{took} on {} workers.", board.workers.get())
                }
            }}</p>
            <progress class="board-bar" aria-label="Items planned"
                max=move || board.total.get().max(1).to_string()
                value=move || board.planned.get().to_string()
                class:done=move || { board.planned.get() >= board.total.get() }></progress>
            <p class="estimates" id="board-estimates">{ESTIMATES_WORDS}</p>
            <super::unfinished::UnfinishedNotice id="board-unfinished-last"/>
            <StockRowsNotice/>
            <div class="board-tools">
                <div class="field inline">
                    <label for="board-filter">"Find items"</label>
                    <input id="board-filter" type="search" autocomplete="off"
                        placeholder="name or method"
                        prop:value=move || filter.with(|f| f.text.clone())
                        on:input=move |ev| { let v = event_target_value(&ev); filter.update(|f| f.text = v); shown_count.set(ROWS_SHOWN); }/>
                </div>
                <div class="field inline">
                    <label for="board-alert">"Show"</label>
                    <select id="board-alert" on:change=move |ev| {
                        let key = event_target_value(&ev);
                        filter.update(|f| f.alert = AlertFilter::from_key(&key));
                        shown_count.set(ROWS_SHOWN);
                    }>
                        <option value="all">"every item"</option>
                        <option value="any">"items with an alert"</option>
                        <option value="failed">"items without stock figures"</option>
                        {AlertKind::ALL.into_iter().map(|k| view! {
                            <option value=k.key()>{format!("alert: {}", k.title().to_lowercase())}</option>
                        }).collect_view()}
                        <option value="tracking-beyond">"tracking signal (holdout) beyond its limit"</option>
                        <option value="short-stock">"Look-back: stock level fell short"</option>
                    </select>
                </div>
                <button type="button" id="export-order-plan" on:click=export
                    disabled=move || { board.planned.get() < board.total.get() || board.blocked.with(Option::is_some) }>
                    "Save the order plan (CSV)"
                </button>
                <button type="button" id="print-board" on:click=print>"Print the board"</button>
            </div>
            <super::look_back::LookBackTools/>
            <p class="board-count" id="board-count">{move || {
                let n = visible.with(Vec::len);
                let of = board.rows.with(|r| r.iter().flatten().count());
                format!("Showing {} of {n} matching items ({of} planned).", n.min(shown_count.get()))
            }}</p>
            <div class="board-scroll" tabindex="0" role="region" aria-labelledby="board-title">
                <table class="board-table" id="board-table">
                    <thead>
                        <tr>
                            {header(SortKey::Name, "Item", false)}
                            // Asked for, the Look-back comes first: it is what the user came to see.
                            {move || (board.look_back.get() > 0).then(|| header(LOOK_BACK_COLUMN.key, LOOK_BACK_COLUMN.title, LOOK_BACK_COLUMN.numeric))}
                            {COLUMNS.iter().map(|c| header(c.key, c.title, c.numeric)).collect_view()}
                        </tr>
                    </thead>
                    <tbody>
                        <For
                            each=move || visible.with(|v| v.iter().take(shown_count.get()).copied().collect::<Vec<_>>())
                            key=|place| *place
                            children=move |(index, _run): (usize, u64)| {
                                let Some(row) = board.rows.with_untracked(|rows| rows.get(index).cloned().flatten()) else {
                                    return view! { <tr></tr> }.into_any();
                                };
                                let changed = board.changes.with_untracked(|c| c.contains_key(&row.name));
                                let chosen = move || intake.item.get() == index;
                                // Marked: a stock level that fell short (what an order rested on), or no Look-back.
                                let look_back = row.look_back.as_ref().map(|l| {
                                    let missed = l.as_ref().map_or(true, |l| l.stock.covered() == Some(false));
                                    let words = match l { Ok(l) => look_back_cell(l), Err(why) => why.clone() };
                                    view! { <td class="look-back" class:missed=missed>{words}</td> }.into_any()
                                });
                                view! {
                                    <tr class:chosen=chosen class:failed=row.figures.is_err() data-index=index.to_string()>
                                        <th scope="row">
                                            <button type="button" class="link open-item" on:click=move |_| open(index)
                                                aria-current=move || if chosen() { "true" } else { "false" }>
                                                {row.name.clone()}
                                            </button>
                                            {changed.then(|| view! { <span class="changed-mark" title="changed on the board">" (changed)"</span> })}
                                        </th>
                                        {match &row.figures {
                                            Ok(f) => look_back.into_iter().chain(COLUMNS.iter().filter_map(|c| {
                                                // Without stock figures, why stands in one cell across the stock columns.
                                                if let Err(why) = &f.stock {
                                                    match c.key {
                                                        SortKey::DemandOver => {
                                                            let span = STOCK_COLUMNS.len().to_string();
                                                            return Some(view! { <td class="problem" colspan=span><span class="why">{format!("No stock figures: {why}")}</span></td> }.into_any());
                                                        }
                                                        k if STOCK_COLUMNS.contains(&k) => return None,
                                                        _ => {}
                                                    }
                                                }
                                                let text = cell(f, c.key);
                                                let beyond = c.key == SortKey::Tracking && f.tracking_beyond;
                                                if c.key == SortKey::Alerts {
                                                    let titles: Vec<String> = f.alerts.iter().map(|a| a.kind.title().to_string()).collect();
                                                    let reasons: String = f.alerts.iter().map(|a| a.reason.clone()).collect::<Vec<_>>().join(" ");
                                                    let none = titles.is_empty();
                                                    Some(view! { <td class="alerts" class:none=none title=reasons>{if none { "none".to_string() } else { titles.join(", ") }}</td> }.into_any())
                                                } else {
                                                    let title = (c.key == SortKey::Method).then(|| f.method.clone());
                                                    Some(view! { <td class:num=c.numeric class:beyond=beyond title=title>{text}</td> }.into_any())
                                                }
                                            })).collect_view().into_any(),
                                            Err(e) => view! { {look_back}<td class="problem" colspan=COLUMNS.len().to_string()><span class="why">{format!("No stock figures: {e}")}</span></td> }.into_any(),
                                        }}
                                    </tr>
                                }.into_any()
                            }
                        />
                    </tbody>
                </table>
            </div>
            <Show when=move || { visible.with(Vec::len) > shown_count.get() }>
                <button type="button" id="board-more" on:click=move |_| shown_count.update(|n| *n += ROWS_SHOWN)>
                    {move || format!("Show {} more", (visible.with(Vec::len) - shown_count.get()).min(ROWS_SHOWN))}
                </button>
            </Show>
        </section>
    }
}

/// A text field of the stock settings.
#[component]
fn StockSetting(
    id: &'static str,
    field: StockField,
    label: &'static str,
    hint: &'static str,
    get: fn(&StockText) -> String,
    set: fn(&mut StockText, String),
) -> impl IntoView {
    let board = expect_context::<BoardState>();
    let intake = expect_context::<IntakeState>();
    // A figure in periods says what a period is in this history ("; here a period is a week").
    let counts_periods = matches!(
        field,
        StockField::LeadTime | StockField::LeadTimeSd | StockField::ReviewPeriod
    );
    let hint_after = Signal::derive(move || {
        intake.report.with(|r| match r.frequency {
            _ if !counts_periods => String::new(),
            Frequency::Undated => String::new(),
            f => format!("; here a period is a {}", f.period_words().0),
        })
    });
    let error = Signal::derive(move || {
        board.stock_errors.with(|e| {
            e.iter()
                .find(|e| e.field == field)
                .map(|e| e.message.clone())
        })
    });
    view! {
        <TextField id label hint error hint_after
            value=Signal::derive(move || board.stock_form.with(get))
            on_input=Callback::new(move |v| board.stock_form.update(|f| set(f, v)))/>
    }
}

/// The file's stock settings and the stock table.
#[component]
pub fn StockPanel() -> impl IntoView {
    let board = expect_context::<BoardState>();
    let kind_is = move |k: TargetKind| board.stock_form.with(|f| f.target_kind == k);
    let dragging = RwSignal::new(false);
    let table_source = board.table_source;
    let take = move |file: web_sys::File| {
        read_local_file(
            file,
            BookWant::StockTable,
            move |name| table_source.set(format!("{name} (reading the workbook\u{2026})")),
            move |read, name, _| match read {
                Ok(file) => {
                    table_source.set(source_of(&name, &file));
                    board.table_text.set(file.text);
                }
                Err(Refused { why, .. }) => {
                    board.table_text.set(String::new());
                    table_source.set(format!("{name} (not read: {why})"));
                }
            },
        )
    };
    let on_file = move |ev: leptos::ev::Event| {
        if let Some(file) = chosen_file(&ev) {
            take(file);
        }
    };
    let on_drop = move |ev: leptos::ev::DragEvent| {
        dragging.set(false);
        if let Some(file) = dropped_file(&ev) {
            take(file);
        }
    };
    view! {
        <section class="panel stock" id="stock-settings" aria-labelledby="stock-title">
            <h2 id="stock-title">"Stock plan"</h2>
            <p class="hint">"For every item of the file; the stock table and the board's changes override them per item."</p>
            <StockSetting id="lead-time" field=StockField::LeadTime label="Lead time (periods)"
                hint="periods from ordering to receiving" get=|f| f.lead_time.clone() set=|f, v| f.lead_time = v/>
            <StockSetting id="lead-time-sd" field=StockField::LeadTimeSd label="Lead-time spread (periods)"
                hint="its standard deviation; empty if it never varies" get=|f| f.lead_time_sd.clone() set=|f, v| f.lead_time_sd = v/>
            <StockSetting id="review-period" field=StockField::ReviewPeriod label="Review period (periods)"
                hint="empty: continuous review (order at the reorder point); a number: order up to a level every so many periods"
                get=|f| f.review_period.clone() set=|f, v| f.review_period = v/>
            <fieldset class="field">
                <legend>"Service target"</legend>
                <span class="choice block">
                    <input type="radio" name="target-kind" id="target-csl"
                        prop:checked=move || kind_is(TargetKind::CycleService)
                        on:change=move |_| board.stock_form.update(|f| f.target_kind = TargetKind::CycleService)/>
                    <label for="target-csl">"Cycle service level: chance of no stock-out in a cycle"</label>
                </span>
                <span class="choice block">
                    <input type="radio" name="target-kind" id="target-fill"
                        prop:checked=move || kind_is(TargetKind::FillRate)
                        on:change=move |_| board.stock_form.update(|f| f.target_kind = TargetKind::FillRate)/>
                    <label for="target-fill">"Fill rate: share of demand served from stock"</label>
                </span>
            </fieldset>
            <StockSetting id="service-target" field=StockField::Target label="Target (percent or fraction)"
                hint="95 or 0.95" get=|f| f.target.clone() set=|f, v| f.target = v/>
            <StockSetting id="order-quantity" field=StockField::OrderQuantity label="Order quantity (continuous review)"
                hint="empty: the demand over the lead time" get=|f| f.order_quantity.clone() set=|f, v| f.order_quantity = v/>
            <div class="field drop-zone" id="stock-drop" class:dragging=move || dragging.get()
                on:dragover=move |ev: leptos::ev::DragEvent| { ev.prevent_default(); dragging.set(true); }
                on:dragleave=move |_| dragging.set(false)
                on:drop=on_drop>
                <label for="stock-table">{move || if dragging.get() {
                    "Let go to read the stock table (it stays on this machine)"
                } else {
                    "Stock table (optional): paste it, or drop a file here"
                }}</label>
                <textarea id="stock-table" rows="5" spellcheck="false" autocomplete="off"
                    aria-describedby="stock-table-hint stock-table-report"
                    placeholder="item,on_hand,on_order,lead_time"
                    prop:value=move || board.table_text.get()
                    on:input=move |ev| { board.table_text.set(event_target_value(&ev)); table_source.set("pasted text".into()); }></textarea>
                <div class="intake-actions">
                    <label class="file-button" for="stock-file">"Open a stock table…"</label>
                    <input id="stock-file" class="visually-hidden-file" type="file"
                        accept=".csv,.tsv,.txt,.xlsx,.xlsm,.ods,text/csv,text/tab-separated-values,text/plain,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet,application/vnd.oasis.opendocument.spreadsheet"
                        on:change=on_file/>
                </div>
                <p class="source-line">"Stock table from: " <span id="stock-source">{move || table_source.get()}</span></p>
                <p class="hint" id="stock-table-hint">"One row per item: item, on hand, on order, and where they differ from the settings above lead time, lead-time spread, review period, service level or fill rate, order quantity, order multiple, minimum order. Without on hand no order is suggested."</p>
                <div id="stock-table-report" aria-live="polite">
                    {move || board.table.with(|t| t.as_ref().map(|t| view! {
                        <p class="hint">{format!("Read {} for items of the history.", how_many(t.rows.len(), ("row", "rows")))}</p>
                        <ul class="plain warnings">{t.warnings.iter().map(|w| view! { <li>{words::as_sentence(w)}</li> }).collect_view()}</ul>
                        <ol class="row-errors" id="stock-table-errors">{t.errors.iter().map(|e| view! { <li>{super::words::row_error_line(e)}</li> }).collect_view()}</ol>
                        <ReadByChoice at="stock" offered=t.could_read_by.clone() taken=t.read_by.clone()/>
                    }))}
                </div>
            </div>
        </section>
    }
}

/// Above the board, where a stock table is read but has no row for some items: how many it
/// covers, where its notes say why, and the choice to read by one column where offered (the
/// rows left out are otherwise said only beside the table, below the board).
#[component]
fn StockRowsNotice() -> impl IntoView {
    let board = expect_context::<BoardState>();
    let intake = expect_context::<IntakeState>();
    move || {
        let items = intake.report.with(|r| r.items.len());
        board.table.with(|t| {
            let t = t.as_ref().filter(|t| t.errors.is_empty() && t.rows.len() < items)?;
            let (offered, taken) = (t.could_read_by.clone(), t.read_by.clone());
            Some(view! {
                <div class="notice caution" id="board-stock-rows">
                    <p>{format!(
                        "The stock table has rows for {} of {items} items; the others show \u{201c}needs on hand\u{201d}. Its notes under Stock plan say which rows were left out and why.",
                        t.rows.len()
                    )}</p>
                    <ReadByChoice at="board" offered taken/>
                </div>
            })
        })
    }
}

/// The choice to read the stock table's rows by one column of the history's joined names
/// alone (a code), offered where rows naming items by it were left out, and taken back; `at`
/// begins its buttons' ids (it stands beside the table and above the board).
#[component]
fn ReadByChoice(
    at: &'static str,
    offered: Option<(String, usize)>,
    taken: Option<String>,
) -> impl IntoView {
    let board = expect_context::<BoardState>();
    let offer = offered.map(|(column, rows)| {
        let label = format!(
            "Read {} by \u{201c}{column}\u{201d} alone",
            if rows == 1 { "that row".to_string() } else { format!("those {rows} rows") }
        );
        view! {
            <p class="read-by">
                <button type="button" id=format!("{at}-read-by")
                    on:click=move |_| board.table_read_by.set(Some((column.clone(), board.table_text.get_untracked())))>{label}</button>
                " if the stock table counts the history\u{2019}s own items (not another store\u{2019}s, not a category\u{2019}s total)"
            </p>
        }
    });
    let undo = taken.map(|column| view! {
        <p class="read-by">
            {format!("Rows naming an item by \u{201c}{column}\u{201d} alone are read as that item, as chosen. ")}
            <button type="button" id=format!("{at}-read-in-full") class="quiet"
                on:click=move |_| board.table_read_by.set(None)>"Read by full names only"</button>
        </p>
    });
    view! { {offer} {undo} }
}

/// The open item's Stock plan, from its board row, with the board's changes for it alone.
#[component]
pub fn ItemStock() -> impl IntoView {
    let board = expect_context::<BoardState>();
    let intake = expect_context::<IntakeState>();
    let name = Memo::new(move |_| {
        intake
            .report
            .with(|r| r.items.get(intake.item.get()).map(|i| i.name.clone()))
    });
    let row = Memo::new(move |_| {
        let i = intake.item.get();
        board.rows.with(|rows| rows.get(i).cloned().flatten())
    });
    let change = Memo::new(move |_| {
        name.get()
            .and_then(|n| board.changes.with(|c| c.get(&n).cloned()))
            .unwrap_or_default()
    });
    let plan = expect_context::<PlanState>();
    let lead_text = RwSignal::new(String::new());
    let target_text = RwSignal::new(String::new());
    let season_text = RwSignal::new(String::new());
    let method_key = RwSignal::new(String::new());
    // The methods this item's ranking holds: (key, published name).
    let methods = Memo::new(move |_| {
        plan.plan.with(|p| match p {
            Some(Ok(p)) => p
                .backtest
                .ranking
                .iter()
                .map(|r| (r.candidate.key().to_string(), r.candidate.label()))
                .collect::<Vec<_>>(),
            _ => Vec::new(),
        })
    });
    let problem = RwSignal::new(None::<String>);
    // The fields show the item's change, or are empty (the file's settings hold).
    Effect::new(move |_| {
        let c = change.get();
        lead_text.set(c.lead_time.map(|l| l.to_string()).unwrap_or_default());
        target_text.set(match c.target {
            Some(Target::CycleService(v)) | Some(Target::FillRate(v)) => format!("{}", v * 100.0),
            None => String::new(),
        });
        season_text.set(match c.season {
            Some(SeasonChoice::Fixed(1)) => "none".into(),
            Some(SeasonChoice::Fixed(m)) => m.to_string(),
            Some(SeasonChoice::Auto) => "auto".into(),
            None => String::new(),
        });
        method_key.set(match &c.method {
            Some(Choice::Named(key)) => key.clone(),
            _ => String::new(),
        });
        problem.set(None);
    });
    let apply = move |_| {
        let Some(n) = name.get_untracked() else {
            return;
        };
        let kind = board.stock_form.with_untracked(|f| f.target_kind);
        let lead = lead_text.get_untracked();
        let target = target_text.get_untracked();
        let mut c = ItemChange::default();
        if !lead.trim().is_empty() {
            match read_lead_time(&lead) {
                Ok(l) => c.lead_time = Some(l),
                Err(e) => {
                    problem.set(Some(e.message));
                    return;
                }
            }
        }
        if !target.trim().is_empty() {
            match kind.read(&target) {
                Ok(t) => c.target = Some(t),
                Err(e) => {
                    problem.set(Some(e.to_string()));
                    return;
                }
            }
        }
        match ItemChange::check_season(&season_text.get_untracked()) {
            Ok(season) => c.season = season,
            Err(e) => {
                problem.set(Some(e));
                return;
            }
        }
        let key = method_key.get_untracked();
        if !key.is_empty() {
            c.method = Choice::from_key(&key);
        }
        board.changes.update(|all| {
            if c.is_empty() {
                all.remove(&n);
            } else {
                all.insert(n, c);
            }
        });
    };
    let clear = move |_| {
        if let Some(n) = name.get_untracked() {
            board.changes.update(|all| {
                all.remove(&n);
            });
        }
    };
    view! {
        <section class="panel item-stock" id="item-stock" aria-labelledby="item-stock-title">
            <h2 id="item-stock-title">{move || format!("Stock plan for {}", name.get().unwrap_or_default())}</h2>
            {move || match row.get() {
                None => match board.blocked.get() {
                    Some(why) => view! { <p class="lead problem">{why}</p> }.into_any(),
                    None => view! { <p class="lead">"Its figures appear here once the board has planned it."</p> }.into_any(),
                },
                Some(BoardRow { figures: Err(e), .. }) => view! { <p class="lead problem">{format!("No stock figures: {e}.")}</p> }.into_any(),
                Some(BoardRow { figures: Ok(f), .. }) => {
                    let alerts = view! {
                        <ul class="plain alerts-list">{f.alerts.iter().map(|a| view! { <li><strong>{format!("{}: ", a.kind.title())}</strong>{a.reason.clone()}</li> }).collect_view()}</ul>
                    };
                    match &f.stock {
                        Err(e) => view! { <p class="lead problem">{format!("No stock figures: {e}.")}</p>{alerts} }.into_any(),
                        Ok(s) => view! { {stock_figures(s)}{alerts} }.into_any(),
                    }
                }
            }}
            <form class="item-change" on:submit=move |ev| { ev.prevent_default(); apply(()); }>
                <h3>"For this item only"</h3>
                <div class="field inline">
                    <label for="item-lead-time">"Lead time (periods)"</label>
                    <input id="item-lead-time" type="text" inputmode="numeric" autocomplete="off" placeholder="as for the file"
                        prop:value=move || lead_text.get() on:input=move |ev| lead_text.set(event_target_value(&ev))/>
                </div>
                <div class="field inline">
                    <label for="item-target">"Service target (percent)"</label>
                    <input id="item-target" type="text" inputmode="decimal" autocomplete="off" placeholder="as for the file"
                        prop:value=move || target_text.get() on:input=move |ev| target_text.set(event_target_value(&ev))/>
                </div>
                <div class="field inline">
                    <label for="item-season">"Season length"</label>
                    <input id="item-season" type="text" autocomplete="off" placeholder="as for the file"
                        prop:value=move || season_text.get() on:input=move |ev| season_text.set(event_target_value(&ev))/>
                </div>
                <div class="field inline">
                    <label for="item-method">"Method"</label>
                    <select id="item-method" on:change=move |ev| method_key.set(event_target_value(&ev))>
                        <option value="" prop:selected=move || method_key.with(String::is_empty)>"as for the file"</option>
                        {move || methods.get().into_iter().map(|(key, label)| {
                            let k = key.clone();
                            view! { <option value=key prop:selected=move || method_key.with(|m| *m == k)>{label}</option> }
                        }).collect_view()}
                    </select>
                </div>
                <button type="submit" id="item-change-apply">"Apply to this item"</button>
                <button type="button" id="item-change-clear" on:click=clear disabled=move || change.with(ItemChange::is_empty)>"Use the file's settings"</button>
                {move || problem.get().map(|m| view! { <p class="field-error" role="alert">{m}</p> })}
            </form>
            <p class="hint">"Season length: auto, none, or a number of periods. The board marks the item \"changed\"; the Settings above stay the file's."</p>
            <p class="estimates">{ESTIMATES_WORDS}</p>
        </section>
    }
}
