//! Share and keep: the share link (made on request, shown selectable with its length, a copy
//! button and what its length risks), the work file (saved on request; opened through
//! Intake like any file), and whether this browser keeps the work (where, since when, a
//! control to forget it at once and one not to keep it).
//!
//! Kept apart from: what a work holds and how it is written (state/work.rs, crates/work).
//! A link is made only when asked for: it carries the data, so the page never puts one
//! anywhere by itself.

use leptos::prelude::*;

use super::browser;
use super::state::{BoardState, IntakeState, Keeping, PlanState, WorkState, LARGE_TEXT};
use super::words::link_length_advice;

/// The work file's name: the data's source and the date.
fn work_file_name(source: &str) -> String {
    super::export::file_name(source, "work", &browser::today(), "json")
}

#[component]
pub fn SharePanel() -> impl IntoView {
    let work = expect_context::<WorkState>();
    let intake = expect_context::<IntakeState>();
    let plan = expect_context::<PlanState>();
    let board = expect_context::<BoardState>();
    let link = RwSignal::new(None::<String>);
    let copied = RwSignal::new(None::<bool>);
    let too_large = RwSignal::new(false);
    // A link shown is the desk as it was when made: any change takes it away, so an outdated
    // link is never copied by mistake.
    Effect::new(move |first: Option<()>| {
        intake.text.track();
        intake.item.track();
        plan.form.track();
        board.stock_form.track();
        board.table_text.track();
        board.table_read_by.track();
        board.changes.track();
        if first.is_some() {
            link.set(None);
            copied.set(None);
            too_large.set(false);
        }
    });
    // A history over this many bytes makes a link far past what can be handed over (1.5 MB
    // of text made 315,000 characters, and packing it held the page 0.4 s): the page says so
    // and makes it only if asked again.
    let make_link = move || {
        let fragment = work.current().to_fragment();
        link.set(Some(format!("{}{fragment}", browser::page_address())));
        copied.set(None);
        too_large.set(false);
    };
    let make = move |_| {
        if intake.text.with_untracked(|t| t.len() > LARGE_TEXT) {
            link.set(None);
            too_large.set(true);
        } else {
            make_link();
        }
    };
    let copy = move |_| {
        if let Some(l) = link.get_untracked() {
            browser::copy_text(&l, move |ok| copied.set(Some(ok)));
        }
    };
    let save = move |_| {
        let w = work.current();
        let name = work_file_name(&w.history.source);
        browser::download_text(&name, "application/json", &w.to_file_text());
    };
    view! {
        <section class="panel share" id="share" aria-labelledby="share-title">
            <h2 id="share-title">"Share and keep"</h2>
            <p class="hint">"A share link or a work file carries the whole desk: the data, the settings, the Stock plan's settings and stock table, and each item's own settings. Opened here, on this or any machine, it gives the same plan."</p>
            <div class="intake-actions">
                <button type="button" id="make-link" on:click=make>"Make a share link"</button>
                <button type="button" id="save-work" on:click=save>"Save a work file"</button>
            </div>
            <Show when=move || too_large.get()>
                <div class="notice" id="share-too-large" role="status">
                    <p>{move || intake.text.with(|t| format!(
                        "This desk holds {:.1} MB of data: its link would run to hundreds of thousands of characters, which browsers, mail and chat programs cut. Save a work file and hand over the file instead.",
                        t.len() as f64 / 1e6
                    ))}</p>
                    <button type="button" class="quiet" id="make-link-anyway" on:click=move |_| make_link()>"Make the link anyway"</button>
                </div>
            </Show>
            {move || link.get().map(|l| {
                let (size, advice) = link_length_advice(l.len());
                view! {
                    <div class="share-link">
                        <label for="share-link">"Share link " <span id="share-link-length">{format!("({size})")}</span></label>
                        <textarea id="share-link" rows="3" readonly spellcheck="false" prop:value=l.clone()
                            on:focus=move |ev| { let t: web_sys::HtmlTextAreaElement = event_target(&ev); t.select(); }></textarea>
                        <p class="notice" id="share-link-carries">"The link carries your data itself, in the part after the #, which browsers never send to any server: whoever has the link has the data. Hand it only to people who may see it."</p>
                        {advice.map(|a| view! { <p class="notice" id="share-link-advice" role="status">{a}</p> })}
                        <button type="button" id="copy-link" on:click=copy>"Copy the link"</button>
                        <span id="copy-status" role="status">{move || match copied.get() {
                            Some(true) => "Copied.",
                            Some(false) => "This browser did not allow copying: select the link above and copy it (Ctrl+C).",
                            None => "",
                        }}</span>
                    </div>
                }
            })}
            <KeptHere/>
            <p class="hint">"Open a work file with \u{201c}Open a file\u{2026}\u{201d} in Intake, or drop it there; paste a share link into the Intake box or open it in the browser."</p>
        </section>
    }
}

/// Whether this browser keeps the work, with the controls to forget it and not to keep it.
#[component]
fn KeptHere() -> impl IntoView {
    let work = expect_context::<WorkState>();
    let keeping_on = move || {
        matches!(work.keeping.get(), Keeping::Starting) || work.keeping.with(Keeping::writes)
    };
    view! {
        <div class="kept-here" id="kept-here">
            <h3>"Kept in this browser"</h3>
            <p id="kept-status" role="status">{move || match work.keeping.get() {
                Keeping::Starting => "Looking for the work this browser kept…".to_string(),
                Keeping::Kept(at) if at.is_empty() => "Keeping this work in this browser…".to_string(),
                Keeping::Kept(at) => format!("Kept at {at}, in this browser's storage for this page on this machine (it never leaves it): a reload, a closed tab or a restarted browser brings this work back."),
                Keeping::Off { forgotten: true } => "Forgotten: nothing of this work is kept in this browser now. It stays on this page until you close it.".to_string(),
                Keeping::Off { forgotten: false } => "Not kept: this work is gone when you close the page. Save a work file to keep it.".to_string(),
                Keeping::Failed(_) => String::new(),
                Keeping::Held(why) => format!("Not kept now: {why}. Tick the box below to keep this desk in its place."),
            }}</p>
            {move || match work.keeping.get() {
                Keeping::Failed(why) => Some(view! {
                    <p class="notice refused" id="kept-failed" role="alert">{format!(
                        "This browser would not keep this work ({why}). It stays on this page until you close it; nothing older is kept in its place. Save a work file to keep it."
                    )}</p>
                }),
                _ => None,
            }}
            <span class="choice block">
                <input type="checkbox" id="keep-work" prop:checked=keeping_on
                    on:change=move |ev| work.set_keeping(event_target_checked(&ev))/>
                <label for="keep-work">"Keep my work in this browser"</label>
            </span>
            <button type="button" id="forget-work" on:click=move |_| work.forget()>"Forget it now"</button>
        </div>
    }
}
