//! The results column: the headline, Look-ahead (chart, forecast table, exports), Backtest
//! ranking (click a row to show it), Error ledger (table, tracking-signal chart, bias sentence)
//! and Pattern view (history, seasonal overlay, autocorrelation evidence).
//!
//! Kept apart from: computing (state.rs calls the engine) and drawing (src/chart). Every chart
//! has its summary in text beside it and a label for screen readers.

use leptos::html::Canvas;
use leptos::prelude::*;

use super::browser;
use super::export;
use super::model;
use super::state::{IntakeState, PlanState, Resized};
use super::unfinished::UnfinishedNotice;
use super::words;
use crate::chart::canvas::PageCanvas;
use crate::chart::{self, Area, ChartError};
use morrowcast_engine::order::ends_early;

fn fixed(v: f64, decimals: usize) -> String {
    if v.is_finite() {
        format!("{v:.decimals$}")
    } else {
        "n/a".into()
    }
}

fn fixed_opt(v: Option<f64>, decimals: usize) -> String {
    v.map(|v| fixed(v, decimals))
        .unwrap_or_else(|| "n/a".into())
}

/// A canvas that redraws whenever its data changes, its text summary beside it, and a button
/// that saves it as PNG. `absent`: said instead when a plan has no data for this chart (the
/// overlay of a forecast without a season), so the caption never stands over a blank.
fn chart_figure<T>(
    id: &'static str,
    caption: &'static str,
    file_part: &'static str,
    absent: &'static str,
    data: Memo<Option<T>>,
    summary: fn(&T) -> String,
    draw: fn(&Area<'_, PageCanvas>, &T) -> Result<(), ChartError>,
) -> impl IntoView
where
    T: Clone + PartialEq + Send + Sync + 'static,
{
    let state = expect_context::<PlanState>();
    let resized = expect_context::<Resized>().0;
    let canvas = NodeRef::<Canvas>::new();
    let failure = RwSignal::new(None::<String>);
    // Counts the draws asked for; a draw runs only if no newer one was asked meanwhile.
    let asked = StoredValue::new(0u64);
    // Syncs the canvas (outside Leptos) with the data. Each chart draws in a task of its own
    // (a timer of 0 ms), so a new plan's five charts do not hold the page for one long task
    // (measured: 60-100 ms together with the layout they force, on the board's benchmark).
    Effect::new(move |_| {
        resized.track();
        let value = data.get();
        asked.update_value(|n| *n += 1);
        let this_draw = asked.get_value();
        if let (Some(el), Some(value)) = (canvas.get(), value) {
            set_timeout(
                move || {
                    if asked.try_get_value() != Some(this_draw) {
                        return;
                    }
                    let result = browser::measured(&format!("morrowcast:draw:{id}"), || {
                        browser::draw_into(&el, |area| draw(area, &value))
                    });
                    // The chart may have left the page meanwhile (another item, no plan).
                    let _ = failure.try_set(result.err().map(|e| e.to_string()));
                },
                std::time::Duration::ZERO,
            );
        }
    });
    let text = move || {
        data.with(|d| match d {
            Some(d) => summary(d),
            None if state.plan.with(|p| matches!(p, Some(Ok(_)))) => absent.to_string(),
            None => String::new(),
        })
    };
    let save = move |_| {
        if let Some(el) = canvas.get() {
            let item = state.plan.with(|p| {
                p.as_ref()
                    .and_then(|p| p.as_ref().ok())
                    .map(|p| p.name.clone())
            });
            let name = export::file_name(
                &item.unwrap_or_default(),
                file_part,
                &browser::today(),
                "png",
            );
            browser::download_canvas(&el, &name);
        }
    };
    let summary_id = format!("{id}-summary");
    view! {
        <figure class="chart" class:empty=move || data.with(|d| d.is_none())>
            <figcaption>{caption}</figcaption>
            <canvas id=id node_ref=canvas role="img" aria-label=text aria-describedby=summary_id.clone()></canvas>
            <p class="chart-summary" id=summary_id>{text}</p>
            {move || failure.get().map(|m| view! { <p class="notice">{m}</p> })}
            <button type="button" class="quiet" on:click=save>"Save chart as PNG"</button>
        </figure>
    }
}

#[component]
pub fn Headline() -> impl IntoView {
    let state = expect_context::<PlanState>();
    let intake = expect_context::<IntakeState>();
    view! {
        // Shown only when the worker takes longer than a moment (the style delays it 0.2 s).
        <div class="busy" class:on=move || state.busy.get() role="status" id="busy">
            {move || state.busy.get().then(|| view! {
                {move || match state.progress.get() {
                    Some((done, total)) => view! {
                        <progress aria-label="Computing the plan" max=total.to_string() value=done.to_string()></progress>
                    }.into_any(),
                    None => view! { <progress aria-label="Computing the plan"></progress> }.into_any(),
                }}
                <span>{move || {
                    let steps = state.progress.get().map(|(d, t)| format!(": step {} of {t}", (d + 1).min(t))).unwrap_or_default();
                    intake.series.with(|s| match s {
                        Some(Ok(s)) => format!("Ranking the methods for {}{steps}…", s.name()),
                        _ => "Working…".to_string(),
                    })
                }}</span>
            })}
        </div>
        <section class="headline" aria-live="polite" id="headline">
            {move || state.plan.with(|p| match p {
                // No plan yet: either there is no item, or its first plan is on its way.
                None => view! { <p class="lead">{move || intake.series.with(|s| match s {
                    Some(Ok(s)) => format!("Working out the forecast for {}: it appears here in a moment.", s.name()),
                    _ if intake.reading.get() => "Reading the table: its forecasts appear here in a moment.".to_string(),
                    _ => "Load data in Intake to see its forecast here.".to_string(),
                })}</p> }.into_any(),
                Some(Err(e)) => view! { <p class="lead problem" role="alert">{format!("This item cannot be forecast yet: {e}.")}</p> }.into_any(),
                Some(Ok(plan)) => {
                    let method = state.shown.with(|s| s.as_ref().map(|s| s.plan.chosen.label()).unwrap_or_default());
                    let h = plan.frequency().periods(plan.forecast.len());
                    view! {
                        <h2 class="item-name" id="item-name">{plan.name.clone()}</h2>
                        <p class="lead">{format!("Forecast for the next {h} by {method}, with a {}% band.", plan.level.percent())}</p>
                        {move || intake.report.with(|r| r.has_errors().then(|| view! {
                            <p class="notice" id="unread-cells">{words::unread_cells_note(r.errors.len())}</p>
                        }))}
                        <UnfinishedNotice id="unfinished-last"/>
                        {move || intake.series.with(|s| match s {
                            Some(Ok(s)) => intake.report.with(|r| ends_early(s, r.last_period())).map(|why| view! {
                                <p class="notice" id="ends-early">{words::ends_early_note(&why.to_string())}</p>
                            }),
                            _ => None,
                        })}
                        <p class="timing" id="compute-time">{move || format!("Recomputed in {:.0} ms.", state.compute_ms.get())}</p>
                    }.into_any()
                }
            })}
        </section>
    }
}

#[component]
pub fn LookAheadPanel() -> impl IntoView {
    let state = expect_context::<PlanState>();
    let data = Memo::new(move |_| {
        let shown = state.shown.get()?;
        state.plan.with(|p| {
            let ranked = p.as_ref()?.as_ref().ok()?;
            state.planned.with(|s| {
                let series = s.as_ref()?;
                let row = ranked.backtest.ranking.get(shown.row)?;
                Some(model::look_ahead(series, ranked, row, &shown.plan))
            })
        })
    });
    let export_forecast = move |_| {
        if let Some(s) = state.shown.get() {
            let csv = export::forecast_csv(
                &s.plan.forecast,
                &s.plan.chosen.label(),
                s.plan.level.percent(),
            );
            let name = export::file_name(&s.plan.name, "forecast", &browser::today(), "csv");
            browser::download_text(&name, "text/csv", &csv);
        }
    };
    view! {
        <section class="panel" id="look-ahead" aria-labelledby="look-ahead-title">
            <h2 id="look-ahead-title">"Look-ahead"</h2>
            {chart_figure("look-ahead-chart", "Demand, the fit, the holdout forecast and the forecast with its band", "look-ahead", "", data, chart::look_ahead_summary, chart::draw_look_ahead)}
            <div class="table-wrap">
                <table class="quiet-table" id="forecast-table">
                    <caption>{move || state.shown.with(|s| s.as_ref().map(|s| format!("Forecast by {} with its {}% band", s.plan.chosen.label(), s.plan.level.percent())).unwrap_or_default())}</caption>
                    <thead><tr><th scope="col">"Period"</th><th scope="col" class="num">"Forecast"</th><th scope="col" class="num">"Low"</th><th scope="col" class="num">"High"</th></tr></thead>
                    <tbody>
                        {move || state.shown.with(|s| s.as_ref().map(|s| s.plan.forecast.iter().map(|f| view! {
                            <tr><th scope="row">{f.period.to_string()}</th><td class="num">{fixed(f.band.value, 1)}</td><td class="num">{fixed(f.band.low, 1)}</td><td class="num">{fixed(f.band.high, 1)}</td></tr>
                        }).collect_view()))}
                    </tbody>
                </table>
            </div>
            <button type="button" id="export-forecast" on:click=export_forecast>"Save the forecast as CSV"</button>
        </section>
    }
}

#[component]
pub fn Ranking() -> impl IntoView {
    let state = expect_context::<PlanState>();
    let metric = move || state.settings.with(|s| s.rank_by());
    view! {
        <section class="panel" id="ranking" aria-labelledby="ranking-title">
            <h2 id="ranking-title">"Backtest ranking"</h2>
            <p class="hint">{move || state.plan.with(|p| match p {
                Some(Ok(p)) => format!(
                    "Each method was fitted on the training part and scored on the last {} periods (pooled over {}), ranked by {}.{} Pick a row to show that method in the Look-ahead and the Error ledger.",
                    p.backtest.holdout_demand.len(), words::counted(p.backtest.origins_used, "origin", "origins"), p.backtest.rank_by.key().to_uppercase(),
                    words::combination_choice(&p.chosen)),
                _ => String::new(),
            })}</p>
            <div class="table-wrap">
                <table class="quiet-table ranking" id="ranking-table">
                    <caption class="visually-hidden">"Methods ranked on the holdout"</caption>
                    <thead><tr>
                        <th scope="col" class="num">"Rank"</th>
                        <th scope="col">"Method"</th>
                        <th scope="col" class="num" class:sorted=move || metric() == morrowcast_engine::backtest::RankBy::Mase>"MASE"</th>
                        <th scope="col" class="num" class:sorted=move || metric() == morrowcast_engine::backtest::RankBy::Mape>"MAPE %"</th>
                        <th scope="col" class="num" class:sorted=move || metric() == morrowcast_engine::backtest::RankBy::Rmse>"RMSE"</th>
                        <th scope="col" class="num" class:sorted=move || metric() == morrowcast_engine::backtest::RankBy::Bias>"Bias"</th>
                    </tr></thead>
                    <tbody>
                        {move || state.plan.with(|p| match p {
                            Some(Ok(p)) => p.backtest.ranking.iter().enumerate().map(|(i, s)| {
                                let label = s.candidate.label();
                                let pick = s.candidate.clone();
                                let pick_row = s.candidate.clone();
                                let is_shown = move || state.shown.with(|sh| sh.as_ref().map(|sh| sh.row) == Some(i));
                                let m = &s.measures;
                                view! {
                                    <tr class:shown=is_shown on:click=move |_| state.pick(pick_row.clone())>
                                        <td class="num">{i + 1}</td>
                                        <th scope="row">
                                            <button type="button" class="row-pick" aria-pressed=move || if is_shown() { "true" } else { "false" }
                                                on:click=move |ev| { ev.stop_propagation(); state.pick(pick.clone()); }>{label}</button>
                                        </th>
                                        <td class="num">{fixed_opt(m.mase, 3)}</td>
                                        <td class="num">{fixed_opt(m.mape, 1)}</td>
                                        <td class="num">{fixed(m.rmse, 2)}</td>
                                        <td class="num">{fixed(m.bias, 1)}</td>
                                    </tr>
                                }
                            }).collect_view().into_any(),
                            _ => view! { <tr><td colspan="6">"No ranking yet."</td></tr> }.into_any(),
                        })}
                    </tbody>
                </table>
            </div>
            <ul class="plain notes">
                {move || state.plan.with(|p| match p {
                    Some(Ok(p)) => p.notes.iter().map(|n| view! { <li>{words::as_sentence(n)}</li> }).collect_view().into_any(),
                    _ => ().into_any(),
                })}
            </ul>
        </section>
    }
}

#[component]
pub fn ErrorLedger() -> impl IntoView {
    let state = expect_context::<PlanState>();
    // The shown row's plan carries its own ledger (the engine builds it once, with the
    // tracking limit the plan was made with).
    let ledger = Memo::new(move |_| {
        state
            .shown
            .with(|s| s.as_ref().map(|s| s.plan.ledger.clone()))
    });
    let tracking = Memo::new(move |_| {
        state.shown.with(|s| {
            s.as_ref()
                .map(|s| model::tracking(&s.plan.ledger, s.plan.tracking_limit))
        })
    });
    let export_ledger = move |_| {
        if let (Some(l), Some(s)) = (ledger.get(), state.shown.get()) {
            let name = export::file_name(&s.plan.name, "error-ledger", &browser::today(), "csv");
            browser::download_text(&name, "text/csv", &export::ledger_csv(&l));
        }
    };
    view! {
        <section class="panel" id="error-ledger" aria-labelledby="ledger-title">
            <h2 id="ledger-title">"Error ledger"</h2>
            <p class="convention">"Error = forecast − demand: above zero the forecast was too high, below zero too low."</p>
            <p class="bias-sentence" id="bias-sentence">{move || ledger.with(|l| l.as_ref().map(|l| words::bias_sentence(l, model::UNIT)).unwrap_or_default())}</p>
            <div class="table-wrap">
                <table class="quiet-table ledger" id="ledger-table">
                    <caption class="visually-hidden">"The holdout period by period"</caption>
                    <thead><tr>
                        <th scope="col">"Period"</th><th scope="col" class="num">"Demand"</th><th scope="col" class="num">"Forecast"</th>
                        <th scope="col" class="num">"Error"</th><th scope="col" class="num">"Abs. error"</th><th scope="col" class="num">"Sq. error"</th>
                        <th scope="col" class="num">"% error"</th><th scope="col" class="num">"MAD"</th><th scope="col" class="num">"MSE"</th>
                        <th scope="col" class="num">"RMSE"</th><th scope="col" class="num">"MAPE %"</th><th scope="col" class="num">"Bias"</th>
                        <th scope="col" class="num">"Tracking signal"</th>
                    </tr></thead>
                    <tbody>
                        {move || ledger.with(|l| l.as_ref().map(|l| l.iter().map(|e| {
                            let r = &e.row;
                            view! {
                                <tr class:out-of-limits=r.out_of_limits>
                                    <th scope="row">{e.period.to_string()}</th>
                                    <td class="num">{fixed(r.demand, 1)}</td><td class="num">{fixed(r.forecast, 1)}</td>
                                    <td class="num">{fixed(r.error, 1)}</td><td class="num">{fixed(r.abs_error, 1)}</td><td class="num">{fixed(r.sq_error, 1)}</td>
                                    <td class="num">{fixed_opt(r.pct_error, 1)}</td><td class="num">{fixed(r.mad, 2)}</td><td class="num">{fixed(r.mse, 1)}</td>
                                    <td class="num">{fixed(r.rmse, 2)}</td><td class="num">{fixed_opt(r.mape, 1)}</td><td class="num">{fixed(r.bias, 1)}</td>
                                    <td class="num">{fixed_opt(r.tracking_signal, 2)}{r.out_of_limits.then(|| view! { <span class="flag">" beyond the limit"</span> })}</td>
                                </tr>
                            }
                        }).collect_view()))}
                    </tbody>
                </table>
            </div>
            {chart_figure("tracking-chart", "Tracking signal against its limits", "tracking-signal", "", tracking, chart::tracking_summary, chart::draw_tracking)}
            <button type="button" id="export-ledger" on:click=export_ledger>"Save the Error ledger as CSV"</button>
        </section>
    }
}

#[component]
pub fn PatternView() -> impl IntoView {
    let state = expect_context::<PlanState>();
    let with_plan = move |f: &dyn Fn(
        &morrowcast_engine::series::Series,
        &morrowcast_engine::plan::ItemPlan,
    ) -> Option<String>| {
        state.plan.with(|p| {
            let plan = p.as_ref()?.as_ref().ok()?;
            state.planned.with(|s| f(s.as_ref()?, plan))
        })
    };
    let history = Memo::new(move |_| {
        state.plan.with(|p| {
            let plan = p.as_ref()?.as_ref().ok()?;
            state
                .planned
                .with(|s| Some(model::history(s.as_ref()?, plan)))
        })
    });
    let overlay = Memo::new(move |_| {
        state.plan.with(|p| {
            let plan = p.as_ref()?.as_ref().ok()?;
            state
                .planned
                // A season on trial that the chosen forecast follows is drawn too.
                .with(|s| {
                    let season = plan
                        .season
                        .length
                        .or(plan.seasons.for_candidate(&plan.chosen));
                    model::overlay(s.as_ref()?, &plan.history, season)
                })
        })
    });
    let acf = Memo::new(move |_| {
        state.plan.with(|p| {
            p.as_ref()
                .and_then(|p| p.as_ref().ok())
                .map(model::autocorrelation)
        })
    });
    view! {
        <section class="panel" id="pattern-view" aria-labelledby="pattern-title">
            <h2 id="pattern-title">"Pattern view"</h2>
            <ul class="plain verdicts" id="verdicts">
                <li id="season-verdict">{move || with_plan(&|_, p| Some(words::season_words(&p.season)))}</li>
                <li>{move || with_plan(&|_, p| Some(words::trend_words(&p.trend)))}</li>
                <li>{move || with_plan(&|_, p| Some(words::demand_words(&p.demand)))}</li>
            </ul>
            <SeasonChoices/>
            {chart_figure("history-chart", "History, period by period", "history", "", history, chart::history_summary, chart::draw_history)}
            <div class="chart-pair">
                {chart_figure("overlay-chart", "Seasonal overlay: one line per year", "seasonal-overlay", "No season in this forecast, so no years to lay over each other; a season length chosen above or under Settings draws them.", overlay, chart::overlay_summary, chart::draw_overlay)}
                {chart_figure("acf-chart", "Autocorrelation by lag, with the season test's threshold", "autocorrelation", "", acf, chart::autocorrelation_summary, chart::draw_autocorrelation)}
            </div>
        </section>
    }
}

/// One-click season choices beside the verdict: try the rejected candidate anyway, go without
/// a season, or return to detection. Each sets the Settings field, so the two never disagree.
#[component]
fn SeasonChoices() -> impl IntoView {
    let state = expect_context::<PlanState>();
    let set = move |value: String| state.form.update(|f| f.season = value);
    let typed = move || state.form.with(|f| f.season.trim().to_string());
    let automatic = move || {
        let t = typed();
        t.is_empty() || t.eq_ignore_ascii_case("auto")
    };
    view! {
        <p class="hint season-choices" id="season-choices">
            {move || state.plan.with(|p| {
                let p = p.as_ref()?.as_ref().ok()?;
                if !automatic() {
                    return Some(view! {
                        <span>{match typed().as_str() {
                            "1" => "No season, as set under Settings. ".to_string(),
                            t => format!("Season length {t}, as set under Settings. "),
                        }}</span>
                        <button type="button" class="quiet" id="season-auto" on:click=move |_| set("auto".into())>"Detect it again"</button>
                    }.into_any());
                }
                Some(match (p.season.length, p.season.candidate) {
                    (Some(_), _) => view! {
                        <span>"Or type another season length under Settings. "</span>
                        <button type="button" class="quiet" id="season-none" on:click=move |_| set("1".into())>"Forecast without a season"</button>
                    }.into_any(),
                    // Too short to fit any seasonal method: said, and nothing offered.
                    (None, Some(m)) if p.season.full_seasons < 2 => view! {
                        <span>{words::rejected_season_hint(m, p.season.full_seasons)}</span>
                    }.into_any(),
                    (None, Some(m)) => view! {
                        <span>{words::rejected_season_hint(m, p.season.full_seasons)}</span>
                        <button type="button" class="quiet" id="season-try" on:click=move |_| set(m.to_string())>{format!("Use a {m}-period season anyway")}</button>
                    }.into_any(),
                    (None, None) => view! { <span>"To set a season length yourself, type it under Settings."</span> }.into_any(),
                })
            })}
        </p>
    }
}
