//! The notice above the board's and an item's figures when the file's last period looks
//! unfinished (Intake's warning says why), with a button that leaves that period's rows out of
//! the Intake text, so the link, the work file and every plan then go without it; and, once
//! left out, a line that puts it back.
//!
//! Kept apart from: the rule (the engine's `intake::unfinished`), the leaving out and putting
//! back (`IntakeState::leave_out_last`, `put_back`, over `intake::leave_out_unfinished`);
//! this only shows and asks.

use leptos::prelude::*;

use super::state::IntakeState;
use super::words;

/// Puts the keyboard focus on the element with `id`, once drawn.
fn focus_soon(id: String) {
    set_timeout(
        move || {
            if let Some(el) = web_sys::window()
                .and_then(|w| w.document())
                .and_then(|d| d.get_element_by_id(&id))
            {
                if let Ok(el) = wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(el) {
                    let _ = el.focus();
                }
            }
        },
        std::time::Duration::from_millis(0),
    );
}

/// The notice, when the last period looks unfinished, or the line that puts a period left out
/// back; `id` names its paragraph (one stands on the board, one above the item's figures),
/// and its buttons `{id}-leave-out`, `{id}-put-back`.
#[component]
pub fn UnfinishedNotice(id: &'static str) -> impl IntoView {
    let intake = expect_context::<IntakeState>();
    // Why the last press did not leave the period out, for the text it was pressed on.
    let refused = RwSignal::new(None::<(u64, String)>);
    let (leave_out_id, put_back_id) = (format!("{id}-leave-out"), format!("{id}-put-back"));
    let leave_out = {
        let put_back_id = put_back_id.clone();
        move |_| match intake.leave_out_last() {
            Ok(()) => focus_soon(put_back_id.clone()),
            Err(why) => refused.set(Some((intake.version(), why))),
        }
    };
    let put_back = {
        let leave_out_id = leave_out_id.clone();
        move |_| {
            intake.put_back();
            focus_soon(leave_out_id.clone());
        }
    };
    let why_not = move || {
        refused.with(|r| {
            r.as_ref()
                .filter(|(v, _)| *v == intake.version())
                .map(|(_, why)| why.clone())
        })
    };
    move || {
        if let Some(left) = intake.current_left_out() {
            return view! {
                <p class="notice" id=id role="status">
                    {words::left_out_note(&left.period)} " "
                    <button type="button" class="quiet" id=put_back_id.clone() on:click=put_back.clone()>
                        {format!("Put {} back", left.period)}
                    </button>
                </p>
            }
            .into_any();
        }
        let Some(period) = intake
            .report
            .with(|r| r.unfinished_last.as_ref().map(|u| u.period.to_string()))
        else {
            return ().into_any();
        };
        let can_leave_out = intake.can_leave_out_last();
        view! {
            <p class="notice caution" id=id>
                {words::unfinished_last_note(&period, can_leave_out)}
                {can_leave_out.then(|| view! {
                    " "
                    <button type="button" class="quiet" id=leave_out_id.clone() on:click=leave_out.clone()>
                        {format!("Leave {period} out")}
                    </button>
                })}
                {move || why_not().map(|why| view! { <span class="refusal" role="alert">" " {why}</span> })}
            </p>
        }
        .into_any()
    }
}
