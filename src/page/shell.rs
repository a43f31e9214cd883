//! The page: masthead, the controls column (Intake, Settings) and the results column
//! (Look-ahead, Backtest ranking, Error ledger, Pattern view), with the conventions stated.
//! A share link in the address opens its work at the start.
//!
//! Kept apart from: the state's computation (state/) and each part's contents (panels.rs,
//! results.rs). Loads the demo on a first visit; a reload keeps the tab's own Intake text.

use leptos::prelude::*;
use morrowcast_engine::demo;

use super::board_panel::{ItemBoard, ItemStock, StockPanel};
use super::browser;
use super::panels::{IntakePanel, SettingsPanel};
use super::results::{ErrorLedger, Headline, LookAheadPanel, PatternView, Ranking};
use super::share::SharePanel;
use super::state::{BoardState, IntakeState, PlanState, Resized, WorkState, DEMO_SOURCE};

#[component]
pub fn App() -> impl IntoView {
    let (text, source) =
        browser::kept_text().unwrap_or_else(|| (demo::demo_csv(), DEMO_SOURCE.to_string()));
    let intake = IntakeState::new(text, source);
    // The board's per-item changes: the detail plans an item as the board does.
    let changes = RwSignal::new(std::collections::BTreeMap::new());
    let state = PlanState::new(intake, changes);
    let board = BoardState::new(intake, state, changes);
    let work = WorkState::new(intake, state, board);
    // Opened with a share link: its work replaces the start (before any plan is asked for,
    // since effects run after this). The fragment then leaves the address, so a reload shows
    // the desk as it is then; a link that cannot be read stays there, said so, and the page
    // starts as it would without it.
    if let Some(fragment) = browser::work_fragment() {
        work.open_text(&fragment, "the share link");
        if matches!(
            work.notice.get_untracked(),
            Some(super::state::WorkNotice::Opened(_))
        ) {
            browser::clear_fragment();
        }
    }
    let resized = RwSignal::new(0u32);
    provide_context(intake);
    provide_context(state);
    provide_context(board);
    provide_context(work);
    provide_context(Resized(resized));
    // Charts redraw at their new size; the handle lives as long as the page.
    let _resize = window_event_listener(leptos::ev::resize, move |_| resized.update(|t| *t += 1));
    view! {
        <a class="skip-link" href="#results">"Skip to the results"</a>
        <header class="masthead">
            <div class="masthead-inner">
                <p class="wordmark"><span class="wordmark-sign" aria-hidden="true"></span>"Morrowcast"</p>
                <p class="tagline">"Demand forecasts from your own sales history."</p>
                <p class="privacy" id="privacy-note">
                    "All computation stays on this machine: nothing you paste, drop or open is sent anywhere."
                </p>
            </div>
        </header>
        <main>
        // The desk's first view once a file holds several items.
        <Show when=move || intake.report.with(|r| r.items.len() > 1)>
            <div class="board-wrap"><ItemBoard/></div>
        </Show>
        <div class="layout">
            <div class="controls">
                <IntakePanel/>
                <SettingsPanel/>
                <StockPanel/>
                <SharePanel/>
            </div>
            <div class="results" id="results" tabindex="-1">
                <Headline/>
                // Until there is a plan, a short guide instead of empty charts and bare tables.
                <Show when=move || state.plan.with(|p| matches!(p, Some(Ok(_)))) fallback=WhatComes>
                    <ItemStock/>
                    <LookAheadPanel/>
                    <Ranking/>
                    <ErrorLedger/>
                    <PatternView/>
                </Show>
            </div>
        </div>
        </main>
        <footer class="colophon">
            <p id="sign-convention">
                <strong>"Error sign: "</strong>
                "error = forecast − demand. A positive error is an over-forecast, a negative one an under-forecast. "
                "Bias is the running sum of errors; tracking signal = bias ÷ MAD."
            </p>
            <p>"Morrowcast runs entirely in this browser tab. Closing the tab forgets your data."</p>
        </footer>
    }
}

/// What the results column will hold, shown while there is no plan to show.
#[component]
fn WhatComes() -> impl IntoView {
    view! {
        <section class="panel what-comes" id="what-comes" aria-labelledby="what-comes-title">
            <h2 id="what-comes-title">"What appears here"</h2>
            <ul class="plain">
                <li><strong>"Look-ahead: "</strong>"the history, the fit, the holdout forecast and the forecast with its band, with a table."</li>
                <li><strong>"Backtest ranking: "</strong>"every method that fits the item, scored on the holdout."</li>
                <li><strong>"Error ledger: "</strong>"the errors period by period and the tracking signal against its limits."</li>
                <li><strong>"Pattern view: "</strong>"season length, trend and demand class, each with its evidence."</li>
            </ul>
        </section>
    }
}
