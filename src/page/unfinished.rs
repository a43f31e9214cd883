//! The notice above the board's and an item's figures when the file's last period looks
//! unfinished (Intake's warning says why), with a button that leaves that period's rows out of
//! the Intake text, so the link, the work file and every plan then go without it.
//!
//! Kept apart from: the rule (the engine's `intake::unfinished`) and the text surgery
//! (`intake::leave_out_rows`); this only shows and asks.

use leptos::prelude::*;
use morrowcast_engine::intake;

use super::state::IntakeState;
use super::words;

/// The notice, when the last period looks unfinished; `id` names its paragraph (one notice
/// stands on the board, one above the item's figures).
#[component]
pub fn UnfinishedNotice(id: &'static str) -> impl IntoView {
    let intake = expect_context::<IntakeState>();
    move || {
        intake.report.with(|r| {
            r.unfinished_last.as_ref().map(|unfinished| {
                let period = unfinished.period.to_string();
                let rows = unfinished.rows.clone();
                let button_label = format!("Leave {period} out");
                let leave_out = move |_| {
                    let text = intake.text.with_untracked(|t| intake::leave_out_rows(t, &rows));
                    let source = intake.source.get_untracked();
                    intake.set_text(text, &words::without_period_source(&source, &period));
                };
                let can_leave_out = !unfinished.rows.is_empty();
                view! {
                    <p class="notice" id=id>
                        {words::unfinished_last_note(&unfinished.period.to_string(), can_leave_out)}
                        {can_leave_out.then(|| view! {
                            " "
                            <button type="button" class="quiet" on:click=leave_out>{button_label}</button>
                        })}
                    </p>
                }
            })
        })
    }
}
