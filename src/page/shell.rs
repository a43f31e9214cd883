//! The page: masthead, the controls column (Intake, Settings) and the results column
//! (Look-ahead, Backtest ranking, Error ledger, Pattern view), with the conventions stated.
//! The first desk is a share link in the address, the work this browser kept, or the demo
//! (state/work.rs); a share link put into the address later opens without a reload.
//!
//! Kept apart from: the state's computation (state/) and each part's contents (panels.rs,
//! results.rs).

use leptos::prelude::*;

use super::board_panel::{ItemBoard, ItemStock, StockPanel};
use super::panels::{IntakePanel, SettingsPanel};
use super::results::{ErrorLedger, Headline, LookAheadPanel, PatternView, Ranking};
use super::share::SharePanel;
use super::state::{BoardState, IntakeState, PlanState, Resized, WorkState};

#[component]
pub fn App() -> impl IntoView {
    // Empty until the start puts the first desk in place (WorkState::start).
    let intake = IntakeState::new(String::new(), String::new());
    // The board's per-item changes: the detail plans an item as the board does.
    let changes = RwSignal::new(std::collections::BTreeMap::new());
    let state = PlanState::new(intake, changes);
    let board = BoardState::new(intake, state, changes);
    let work = WorkState::new(intake, state, board);
    work.start();
    let resized = RwSignal::new(0u32);
    provide_context(intake);
    provide_context(state);
    provide_context(board);
    provide_context(work);
    provide_context(Resized(resized));
    // Charts redraw at their new size; the handle lives as long as the page.
    let _resize = window_event_listener(leptos::ev::resize, move |_| resized.update(|t| *t += 1));
    // A share link put into the address bar of this open tab opens without a reload.
    let _address = window_event_listener(leptos::ev::hashchange, move |_| work.follow_address());
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
                    <super::look_back::ItemLookBack/>
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
            <p>"Morrowcast runs entirely in this browser. Your work is kept only in this browser on this machine (see Share and keep), never sent anywhere."</p>
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
                <li><strong>"Stock plan: "</strong>"safety stock, reorder point or order-up-to level, and the order today once on hand is given: estimates your own policies and judgement decide on."</li>
            </ul>
        </section>
    }
}
