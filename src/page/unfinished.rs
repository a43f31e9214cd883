//! The notice above the board's and an item's figures when the file's last period looks
//! unfinished (Intake's warning says why), with a button that leaves that period's rows out of
//! the Intake text, so the link, the work file and every plan then go without it; and, once
//! left out, a line that puts it back.
//!
//! Kept apart from: the rule (the engine's `intake::unfinished`) and the text surgery with
//! its check that the rest still reads the same (`intake::leave_out_unfinished`); this only
//! shows and asks.

use leptos::prelude::*;
use morrowcast_engine::intake;

use super::state::{IntakeState, LeftOut};
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
/// back; `id` names its paragraph (one stands on the board, one above the item's figures).
#[component]
pub fn UnfinishedNotice(id: &'static str) -> impl IntoView {
    let intake = expect_context::<IntakeState>();
    // Why the last press did not leave the period out, for the text it was pressed on.
    let refused = RwSignal::new(None::<(u64, String)>);
    let put_back_id = format!("{id}-put-back");
    move || {
        if let Some(left) = intake.current_left_out() {
            let put_back = {
                let left = left.clone();
                move |_| {
                    intake.set_text_keeping_item(left.text.clone(), &left.source);
                    intake.left_out.set(None);
                }
            };
            return view! {
                <p class="notice" id=id role="status">
                    {words::left_out_note(&left.period)}
                    " "
                    <button type="button" class="quiet" id=put_back_id.clone() on:click=put_back>
                        {format!("Put {} back", left.period)}
                    </button>
                </p>
            }
            .into_any();
        }
        let put_back_id = put_back_id.clone();
        intake
            .report
            .with(|r| {
                r.unfinished_last.as_ref().map(|unfinished| {
                    let period = unfinished.period.to_string();
                    let can_leave_out = !unfinished.rows.is_empty();
                    let button_label = format!("Leave {period} out");
                    let leave_out = {
                        let period = period.clone();
                        move |_| {
                            let version = intake.version();
                            let (text, source) =
                                (intake.text.get_untracked(), intake.source.get_untracked());
                            let outcome = intake
                                .report
                                .with_untracked(|r| intake::leave_out_unfinished(&text, r));
                            match outcome {
                                Some(Ok(without)) => {
                                    let new_source =
                                        words::without_period_source(&source, &period);
                                    intake.set_text_keeping_item(without, &new_source);
                                    intake.left_out.set(Some(LeftOut {
                                        period: period.clone(),
                                        text,
                                        source,
                                        version: intake.version(),
                                    }));
                                    focus_soon(put_back_id.clone());
                                }
                                Some(Err(why)) => refused.set(Some((version, why))),
                                None => {}
                            }
                        }
                    };
                    let why_not = move || {
                        refused.with(|r| {
                            r.as_ref()
                                .filter(|(v, _)| *v == intake.version())
                                .map(|(_, why)| why.clone())
                        })
                    };
                    view! {
                        <p class="notice" id=id>
                            {words::unfinished_last_note(&period, can_leave_out)}
                            {can_leave_out.then(|| view! {
                                " "
                                <button type="button" class="quiet" on:click=leave_out>{button_label}</button>
                            })}
                            {move || why_not().map(|why| view! { <span class="refusal" role="alert">" " {why}</span> })}
                        </p>
                    }
                    .into_any()
                })
            })
            .unwrap_or_else(|| ().into_any())
    }
}
