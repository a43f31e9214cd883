//! The controls column: Intake (paste box, file picker, drop zone, the demo, the intake report
//! and rejected cells, the item choice) and Settings (in plain words).
//!
//! Kept apart from: reading the text (the engine's intake does) and checking settings
//! (settings.rs). The user's text is never replaced by an error: it stays in the box to fix.

use leptos::prelude::*;
use leptos::task::spawn_local;
use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::BandMethod;
use morrowcast_engine::settings::SettingsText;
use morrowcast_engine::{demo, intake};
use wasm_bindgen_futures::JsFuture;
use web_sys::{File, HtmlInputElement};

use crate::worker::reading::{BookWant, Refused};

use super::reader::read_workbook;
use super::settings::{LEVEL_CHOICES, RANK_CHOICES};
use super::state::{
    IntakeState, OpenWorkbook, PlanState, WorkNotice, WorkState, DEMO_SOURCE, LARGE_TEXT,
};
use super::words;

/// Reads a file locally; `done` gets its text (a workbook's sheet as `want` says, read in the
/// reading worker, after `reading` is told the file's name), or why it could not be read,
/// with the file's name and bytes. Text is decoded by the engine (UTF-8, or UTF-16 with its
/// byte-order mark), not by the browser's `text()`, which would replace what it cannot read
/// without a word; the engine's marks for such bytes are reported by the reader, line by line.
pub(super) fn read_local_file(
    file: File,
    want: BookWant,
    reading: impl FnOnce(&str) + 'static,
    done: impl FnOnce(Result<intake::FileText, Refused>, String, Vec<u8>) + 'static,
) {
    let name = file.name();
    spawn_local(async move {
        match JsFuture::from(file.array_buffer()).await {
            Ok(buffer) => {
                let bytes = js_sys::Uint8Array::new(&buffer).to_vec();
                if intake::is_workbook(&bytes) {
                    reading(&name);
                    read_workbook(bytes.clone(), want, move |read| done(read, name, bytes));
                } else {
                    done(Ok(intake::text_file(&bytes)), name, bytes)
                }
            }
            Err(_) => done(
                Err(Refused {
                    why: "the browser could not read the file: choose it again, or paste its \
                          contents"
                        .to_string(),
                    sheets: Vec::new(),
                }),
                name,
                Vec::new(),
            ),
        }
    });
}

/// A file's source as the page names it: with the workbook's sheet read, if any.
pub(super) fn source_of(name: &str, file: &intake::FileText) -> String {
    match &file.sheet {
        Some(sheet) => format!("{name}, sheet \u{201c}{sheet}\u{201d}"),
        None => name.to_string(),
    }
}

/// The file chosen in an `<input type=file>`; the input is emptied, so choosing the same
/// file again reads it again.
pub(super) fn chosen_file(ev: &leptos::ev::Event) -> Option<File> {
    let input: HtmlInputElement = event_target(ev);
    let file = input.files().and_then(|f| f.get(0));
    input.set_value("");
    file
}

/// The (first) file a drop carries; the drop is the page's, not the browser's (which would
/// open the file in place of the page).
pub(super) fn dropped_file(ev: &leptos::ev::DragEvent) -> Option<File> {
    ev.prevent_default();
    ev.data_transfer()
        .and_then(|d| d.files())
        .and_then(|f| f.get(0))
}

/// Reads a file locally: a work file (or a saved share link) opens its work; anything else
/// is a history and goes in the Intake box.
fn read_file(state: IntakeState, work: WorkState, file: File) {
    read_local_file(
        file,
        BookWant::History,
        move |name| reading_notice(work, name),
        move |read, name, bytes| match read {
            Ok(file) => {
                if !work.open_text(&file.text, &format!("the work file {name}")) {
                    // The sheets the reading found: the workbook is not opened again.
                    let (sheet, sheets) = (file.sheet.clone(), file.sheets.clone());
                    take_sheet(state, work, &name, file);
                    offer_sheets(state, name, bytes, sheets, sheet);
                }
            }
            // The desk's text stays as it was: nothing of it is replaced by a failed read. A
            // workbook whose sheet to read is unclear offers its sheets.
            Err(Refused { why, sheets }) => {
                let choice = if offer_sheets(state, name.clone(), bytes, sheets, None) {
                    " Or choose the sheet to read below the box."
                } else {
                    ""
                };
                work.notice.set(Some(WorkNotice::Refused(format!(
                    "{name} could not be read, so nothing changed: {why}.{choice}"
                ))));
            }
        },
    );
}

/// Says that a workbook is being read (in its worker; a large one takes a while).
fn reading_notice(work: WorkState, name: &str) {
    work.notice.set(Some(WorkNotice::Opened(format!(
        "Reading the workbook {name}\u{2026}"
    ))));
}

/// Puts a file's text (a workbook's sheet) in the box, saying what was read of a workbook
/// (its sheet, the others) or of UTF-16 text.
fn take_sheet(state: IntakeState, work: WorkState, name: &str, file: intake::FileText) {
    state.set_text(file.text.clone(), &source_of(name, &file));
    if let Some(note) = file.note {
        work.notice
            .set(Some(WorkNotice::Opened(format!("{name}: {note}."))));
    }
}

/// Keeps a workbook of two readable sheets or more (`sheets`) for the sheet choice, `sheet`
/// the one in the box (`None`: none of it, which sheet to read being unclear); whether it was
/// kept.
fn offer_sheets(
    state: IntakeState,
    file: String,
    bytes: Vec<u8>,
    sheets: Vec<String>,
    sheet: Option<String>,
) -> bool {
    let offered = sheets.len() >= 2;
    if offered {
        state.workbook.set(Some(OpenWorkbook {
            file,
            bytes: std::sync::Arc::new(bytes),
            sheets,
            sheet,
        }));
    }
    offered
}

/// The choice of a workbook's sheet, under the source line while the box holds one of its
/// sheets (or nothing of it, its sheet unclear): choosing reads that sheet into the box.
#[component]
fn SheetChoice() -> impl IntoView {
    let state = expect_context::<IntakeState>();
    let work = expect_context::<WorkState>();
    let choose = move |ev: leptos::ev::Event| {
        let name = event_target_value(&ev);
        let Some(book) = state.workbook.get_untracked() else {
            return;
        };
        reading_notice(work, &book.file);
        let bytes = book.bytes.as_ref().clone();
        read_workbook(
            bytes,
            BookWant::Sheet(name.clone()),
            move |read| match read {
                Ok(file) => {
                    take_sheet(state, work, &book.file, file);
                    state.workbook.set(Some(OpenWorkbook {
                        sheet: Some(name),
                        ..book
                    }));
                }
                Err(Refused { why, .. }) => work
                    .notice
                    .set(Some(WorkNotice::Refused(format!("{}: {why}.", book.file)))),
            },
        );
    };
    move || {
        state.workbook.get().map(|book| {
            let unclear = book.sheet.is_none();
            view! {
                <p class="field sheet-choice">
                    <label for="sheet-choice">{format!("Sheet of {} to read", book.file)}</label>
                    <select id="sheet-choice" on:change=choose>
                        {unclear.then(|| view! { <option value="" selected=true disabled=true>"choose a sheet"</option> })}
                        {book.sheets.iter().map(|s| {
                            let selected = book.sheet.as_deref() == Some(s.as_str());
                            view! { <option value=s.clone() selected=selected>{s.clone()}</option> }
                        }).collect_view()}
                    </select>
                </p>
            }
        })
    }
}

/// A paste of more than [`LARGE_TEXT`] into an empty box, or over all of it, goes straight to
/// Intake without the browser putting it in the box first: the box would lay out the whole
/// text on the page's only thread (measured: about 3 s for 1.4 MB) only to show its head.
/// Smaller pastes, and pastes into part of a text, are the browser's as usual.
fn take_large_paste(state: IntakeState, work: WorkState, ev: web_sys::ClipboardEvent) {
    let Some(text) = ev.clipboard_data().and_then(|d| d.get_data("text").ok()) else {
        return;
    };
    if text.len() <= LARGE_TEXT {
        return;
    }
    let area: web_sys::HtmlTextAreaElement = event_target(&ev);
    let length = area.text_length();
    let whole = length == 0
        || (area.selection_start() == Ok(Some(0)) && area.selection_end() == Ok(Some(length)));
    if !whole {
        return;
    }
    ev.prevent_default();
    if !work.open_text(&text, "the pasted share link") {
        state.set_typed(text);
    }
}

/// Files of more items than this offer no drop-down of items (our choice: a list of thousands
/// is slow to draw and no way to find one; the Item board sorts, filters and opens them).
const MAX_ITEM_CHOICES: usize = 200;

/// Lines of a long text the box shows.
const SHOWN_LINES: usize = 200;

/// The first [`SHOWN_LINES`] lines of `text`.
fn head(text: &str) -> String {
    let shown: Vec<&str> = text.lines().take(SHOWN_LINES).collect();
    shown.join("\n")
}

#[component]
pub fn IntakePanel() -> impl IntoView {
    let state = expect_context::<IntakeState>();
    let work = expect_context::<WorkState>();
    let dragging = RwSignal::new(false);
    // Whether a long text is shown whole (the user asked to edit it here); new text resets it.
    let whole = RwSignal::new(false);
    let source = Memo::new(move |_| state.source.get());
    Effect::new(move |_| {
        source.track();
        whole.set(false);
    });
    let partial = move || !whole.get() && state.text.with(|t| t.len() > LARGE_TEXT);
    let demo_missing = RwSignal::new(false);
    let load_demo = move |_| {
        let csv = demo::demo_csv();
        demo_missing.set(csv.is_empty());
        state.set_text(csv, DEMO_SOURCE);
    };
    let on_file = move |ev: leptos::ev::Event| {
        if let Some(file) = chosen_file(&ev) {
            read_file(state, work, file);
        }
    };
    let on_drop = move |ev: leptos::ev::DragEvent| {
        dragging.set(false);
        if let Some(file) = dropped_file(&ev) {
            read_file(state, work, file);
        }
    };
    view! {
        <section class="panel intake" id="intake" aria-labelledby="intake-title">
            <h2 id="intake-title">"Intake"</h2>
            <p class="hint">"Sales history as a table: a period column and one or more value columns, one row per item and period, or one row per item (or per item and year: Year, Jan ... Dec) with the periods across the top. CSV, TSV or plain text, or a workbook (.xlsx, .ods: its fullest sheet). A work file or a share link opens the whole desk."</p>
            {move || work.notice.get().map(|n| match n {
                WorkNotice::Opened(m) => view! { <p class="notice" id="work-notice" role="status">{m}</p> }.into_any(),
                WorkNotice::Refused(m) => view! { <p class="notice refused" id="work-notice" role="alert">{m}</p> }.into_any(),
            })}
            <Show when=move || work.set_aside.get()>
                <p class="notice" id="set-aside">
                    "The desk this browser kept before is set aside, not lost. "
                    <button type="button" class="quiet" id="bring-back" on:click=move |_| work.bring_back()>"Bring back my desk"</button>
                    " "
                    <button type="button" class="quiet" id="discard-aside" on:click=move |_| work.discard_aside()>"Discard it"</button>
                </p>
            </Show>
            <div
                class="drop-zone"
                class:dragging=move || dragging.get()
                on:dragover=move |ev: leptos::ev::DragEvent| { ev.prevent_default(); dragging.set(true); }
                on:dragleave=move |_| dragging.set(false)
                on:drop=on_drop
                id="drop-zone"
            >
                <label for="intake-text">{move || if dragging.get() {
                    "Let go to read the file (it stays on this machine)"
                } else {
                    "Paste your table here, or drop a file on this box"
                }}</label>
                <textarea
                    id="intake-text"
                    rows="9"
                    spellcheck="false"
                    autocomplete="off"
                    aria-describedby="intake-report intake-partial"
                    prop:readOnly=partial
                    prop:value=move || if partial() { state.text.with(|t| head(t)) } else { state.text.get() }
                    on:paste=move |ev: leptos::ev::ClipboardEvent| take_large_paste(state, work, ev)
                    on:input=move |ev| {
                        let text = event_target_value(&ev);
                        // A share link pasted here opens its work; one that cannot be read is
                        // said so and the box shows its text again.
                        if !work.open_text(&text, "the pasted share link") {
                            state.set_typed(text);
                        } else if matches!(work.notice.get_untracked(), Some(WorkNotice::Refused(_))) {
                            state.text.update(|_| {});
                        }
                    }
                ></textarea>
            </div>
            <Show when=partial>
                <div class="notice" id="intake-partial">
                    <p>{move || state.text.with(|t| {
                        let lines = t.lines().count();
                        format!(
                            "This table is {:.1} MB ({lines} lines). The box shows its first {SHOWN_LINES} lines so the page stays quick; every line was read (see the report below).",
                            t.len() as f64 / 1e6
                        )
                    })}</p>
                    <button type="button" class="quiet" id="intake-edit-whole" on:click=move |_| whole.set(true)>"Edit the whole text here (slow)"</button>
                    " "
                    <button type="button" class="quiet" id="intake-empty" on:click=move |_| state.set_text(String::new(), "pasted text")>"Empty the box to paste anew"</button>
                </div>
            </Show>
            <div class="intake-actions">
                <label class="file-button" for="intake-file">"Open a file…"</label>
                <input
                    id="intake-file"
                    class="visually-hidden-file"
                    type="file"
                    accept=".csv,.tsv,.txt,.json,.xlsx,.xlsm,.ods,text/csv,text/tab-separated-values,text/plain,application/json,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet,application/vnd.oasis.opendocument.spreadsheet"
                    on:change=on_file
                />
                <button type="button" id="load-demo" on:click=load_demo>"Load the demo"</button>
            </div>
            <p class="source-line">"Reading: " <span id="intake-source">{move || state.source.with(|s| if s.is_empty() { "nothing yet".to_string() } else { s.clone() })}</span></p>
            <SheetChoice/>
            <Show when=move || demo_missing.get()>
                <p class="notice">"The demo data is not part of this build yet."</p>
            </Show>
            <div id="intake-report" class="intake-report" aria-live="polite">
                <Show when=move || state.reading.get()>
                    <p class="notice" id="intake-reading">{move || state.text.with(|t| format!(
                        "Reading the table ({:.1} MB) beside the page, which stays usable meanwhile…",
                        t.len() as f64 / 1e6
                    ))}</p>
                </Show>
                <ul class="plain" class:hidden=move || state.reading.get()>
                    {move || state.report.with(|r| state.text.with(|t| words::intake_lines(t, r)).into_iter().map(|l| view! { <li>{l}</li> }).collect_view())}
                </ul>
                // An empty box is said above ("Nothing read yet"), not listed as a problem: it
                // is also what shows for the moment the start looks for the kept work.
                <Show when=move || state.report.with(|r| r.has_errors()) && state.text.with(|t| !t.trim().is_empty())>
                    <h3 class="errors-title">"What could not be read"</h3>
                    <ol class="row-errors" id="row-errors">
                        {move || state.report.with(|r| r.errors.iter().map(|e| view! { <li>{words::row_error_line(e)}</li> }).collect_view())}
                    </ol>
                </Show>
            </div>
            <Show when=move || state.report.with(|r| r.items.len() > MAX_ITEM_CHOICES)>
                <p class="hint" id="item-choice-hint">"Open an item from the Item board above: its name opens its detail."</p>
            </Show>
            <Show when=move || state.report.with(|r| (2..=MAX_ITEM_CHOICES).contains(&r.items.len()))>
                <div class="field">
                    <label for="item-choice">"Item to forecast"</label>
                    <select id="item-choice" on:change=move |ev| {
                        state.item.set(event_target_value(&ev).parse().unwrap_or(0));
                    }>
                        {move || state.report.with(|r| r.items.iter().enumerate().map(|(i, it)| {
                            let name = it.name.clone();
                            view! { <option value=i.to_string() prop:selected=move || state.item.get() == i>{name}</option> }
                        }).collect_view())}
                    </select>
                </div>
            </Show>
        </section>
    }
}

/// A labelled text field with its hint and its error tied to it (`aria-describedby`,
/// `aria-invalid`, the error announced): the one markup of every typed setting on the page.
#[component]
pub(super) fn TextField(
    id: &'static str,
    label: &'static str,
    hint: &'static str,
    #[prop(into)] value: Signal<String>,
    #[prop(into)] error: Signal<Option<String>>,
    on_input: Callback<String>,
    /// Words after the hint that follow the data ("; here a period is a week").
    #[prop(optional, into)]
    hint_after: Signal<String>,
) -> impl IntoView {
    let hint_id = format!("{id}-hint");
    view! {
        <div class="field" class:invalid=move || error.with(Option::is_some)>
            <label for=id>{label}</label>
            <input
                id=id
                type="text"
                inputmode="decimal"
                autocomplete="off"
                aria-describedby=hint_id.clone()
                aria-invalid=move || if error.with(Option::is_some) { "true" } else { "false" }
                prop:value=move || value.get()
                on:input=move |ev| on_input.run(event_target_value(&ev))
            />
            <p class="hint" id=hint_id>{hint}{hint_after}</p>
            {move || error.get().map(|m| view! { <p class="field-error" role="alert">{m}</p> })}
        </div>
    }
}

/// A text field of the settings form.
#[component]
fn TextSetting(
    id: &'static str,
    label: &'static str,
    hint: &'static str,
    get: fn(&SettingsText) -> String,
    set: fn(&mut SettingsText, String),
) -> impl IntoView {
    let state = expect_context::<PlanState>();
    let error = Signal::derive(move || {
        state
            .form_errors
            .with(|e| e.iter().find(|e| e.field == id).map(|e| e.message.clone()))
    });
    view! {
        <TextField id label hint error
            value=Signal::derive(move || state.form.with(get))
            on_input=Callback::new(move |v| state.form.update(|f| set(f, v)))/>
    }
}

#[component]
pub fn SettingsPanel() -> impl IntoView {
    let state = expect_context::<PlanState>();
    let level_is = move |p: f64| {
        state
            .form
            .with(|f| f.level.trim().parse::<f64>().ok() == Some(p))
    };
    view! {
        <section class="panel settings" id="settings" aria-labelledby="settings-title">
            <h2 id="settings-title">"Settings"</h2>
            <p class="hint">"Every change recomputes at once."</p>
            <TextSetting id="horizon" label="Periods to forecast"
                hint="auto (one season, else 6) or a number"
                get=|f| f.horizon.clone() set=|f, v| f.horizon = v/>
            <TextSetting id="holdout" label="Holdout: periods kept back to test the methods"
                hint="auto (the last full season) or a number"
                get=|f| f.holdout.clone() set=|f, v| f.holdout = v/>
            <TextSetting id="season" label="Season length"
                hint="auto (detected), or a number of periods; 1 means no season"
                get=|f| f.season.clone() set=|f, v| f.season = v/>
            <fieldset class="field">
                <legend>"Band level"</legend>
                <div class="choice-row">
                    {LEVEL_CHOICES.iter().map(|p| {
                        let p = *p;
                        let id = format!("level-{p}");
                        view! {
                            <span class="choice">
                                <input type="radio" name="level" id=id.clone()
                                    prop:checked=move || level_is(p)
                                    on:change=move |_| state.form.update(|f| f.level = p.to_string())/>
                                <label for=id>{format!("{p}%")}</label>
                            </span>
                        }
                    }).collect_view()}
                </div>
            </fieldset>
            <TextSetting id="level" label="…or type a band level (percent)"
                hint="from 50 to 99.9"
                get=|f| f.level.clone() set=|f, v| f.level = v/>
            <fieldset class="field">
                <legend>"How the band is worked out"</legend>
                <span class="choice block">
                    <input type="radio" name="band" id="band-horizon"
                        prop:checked=move || state.form.with(|f| f.band == BandMethod::HorizonAware)
                        on:change=move |_| state.form.update(|f| f.band = BandMethod::HorizonAware)/>
                    <label for="band-horizon">"Horizon-aware: widens the further ahead"</label>
                </span>
                <span class="choice block">
                    <input type="radio" name="band" id="band-mad"
                        prop:checked=move || state.form.with(|f| f.band == BandMethod::MadRule)
                        on:change=move |_| state.form.update(|f| f.band = BandMethod::MadRule)/>
                    <label for="band-mad">"MAD rule: forecast ± z × 1.25 × MAD"</label>
                </span>
            </fieldset>
            <div class="field">
                <label for="rank-by">"Rank the methods by"</label>
                <select id="rank-by" on:change=move |ev| {
                    let key = event_target_value(&ev);
                    state.form.update(|f| f.rank_by = RankBy::from_key(&key).unwrap_or_default());
                }>
                    {RANK_CHOICES.iter().map(|(r, name)| {
                        let r = *r;
                        view! { <option value=r.key() prop:selected=move || state.form.with(|f| f.rank_by == r)>{*name}</option> }
                    }).collect_view()}
                </select>
            </div>
            <TextSetting id="tracking-limit" label="Tracking-signal limit"
                hint="periods beyond plus or minus this are marked; 4 is common practice"
                get=|f| f.tracking_limit.clone() set=|f, v| f.tracking_limit = v/>
        </section>
    }
}
