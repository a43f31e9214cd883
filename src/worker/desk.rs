//! The worker's logic: answer an ask from the engine, reusing the last ranking when only the
//! picked row changed.
//!
//! Kept apart from: messaging and timing (the glue does those) and the browser (this runs and
//! is tested natively).

use morrowcast_engine::plan::{plan_item_observed, plan_item_reusing, ItemPlan, Progress};
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::{Choice, PlanSettings};

use super::protocol::{Drill, PlanAnswer, PlanAsk, Shown};

/// The worker's state: the last ranked plan, so picking a row of the same ranking refits only
/// that row's candidate (the engine reuses the ranking: `plan_item_reusing`).
#[derive(Debug, Default)]
pub struct PlanDesk {
    last: Option<(Series, PlanSettings, Result<ItemPlan, String>)>,
}

impl PlanDesk {
    pub fn new() -> PlanDesk {
        PlanDesk::default()
    }

    /// Answers one ask (with `compute_ms` 0: the caller times it).
    ///
    /// # Panics
    /// On purpose, when `ask.drill` is [`Drill::Panic`].
    pub fn answer(&mut self, ask: PlanAsk) -> PlanAnswer {
        self.answer_observed(ask, &mut |_| {})
    }

    /// [`PlanDesk::answer`], reporting the plan's [`Progress`] as it goes.
    pub fn answer_observed(
        &mut self,
        ask: PlanAsk,
        progress: &mut dyn FnMut(Progress),
    ) -> PlanAnswer {
        if ask.drill == Some(Drill::Panic) {
            panic!("fault drill: a deliberate fault to check that the page reports it");
        }
        let last = match self.last.take() {
            Some(last) if last.0 == ask.series && last.1 == ask.settings => last,
            _ => {
                let ranked = plan_item_observed(&ask.series, &ask.settings, progress)
                    .map_err(|e| e.to_string());
                (ask.series.clone(), ask.settings.clone(), ranked)
            }
        };
        let (_, _, ranked) = self.last.insert(last);
        let shown = match ranked {
            Ok(plan) => Some(shown_row(plan, &ask)),
            Err(_) => None,
        };
        PlanAnswer {
            ticket: ask.ticket,
            series: ask.series,
            ranked: ranked.clone(),
            shown,
            compute_ms: 0.0,
        }
    }
}

/// The row the user picked with its refit plan, or the engine's choice.
fn shown_row(ranked: &ItemPlan, ask: &PlanAsk) -> Shown {
    let ranking = &ranked.backtest.ranking;
    // The row the engine chose (not always the top one: its choice rule may prefer the
    // combination).
    let chosen = ranking
        .iter()
        .position(|r| r.candidate == ranked.chosen)
        .unwrap_or(0);
    let engine_choice = Shown {
        row: chosen,
        plan: ranked.clone(),
    };
    let Some(row) = ask
        .picked
        .as_ref()
        .and_then(|w| ranking.iter().position(|r| &r.candidate == w))
    else {
        return engine_choice;
    };
    if row == chosen {
        return engine_choice;
    }
    let candidate = &ranking[row].candidate;
    // The same plan with the picked row chosen: the ranking stays whole.
    let only = ask
        .settings
        .clone()
        .with_choice(Choice::Named(candidate.key().to_string()));
    match plan_item_reusing(&ask.series, &only, ranked, &ask.settings) {
        Ok(plan) if &plan.chosen == candidate => Shown { row, plan },
        // The refit chose another candidate: show the engine's choice rather than mislabel
        // the row.
        _ => engine_choice,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use morrowcast_engine::backtest::Candidate;
    use morrowcast_engine::calendar::Period;
    use morrowcast_engine::methods::MethodKind;
    use morrowcast_engine::plan::plan_item;
    use serde::Serialize;

    fn seasonal() -> Series {
        let values = (0..48)
            .map(|t| {
                Some(
                    100.0
                        + 2.0 * t as f64
                        + [0., 5., 9., 4., -3., -8., -6., 1., 7., 3., -5., -7.][t % 12],
                )
            })
            .collect();
        Series::new("test item", Period::month(2022, 1), values).unwrap()
    }

    fn ask(ticket: u64, picked: Option<Candidate>) -> PlanAsk {
        PlanAsk {
            ticket,
            series: seasonal(),
            settings: PlanSettings::default(),
            picked,
            drill: None,
            news_after_ms: 0.0,
        }
    }

    #[test]
    fn answer_carries_the_ranked_plan_of_the_engine() {
        let mut desk = PlanDesk::new();
        let a = desk.answer(ask(7, None));
        assert_eq!(a.ticket, 7);
        let direct = plan_item(&seasonal(), &PlanSettings::default()).unwrap();
        assert_eq!(a.ranked.as_ref().unwrap(), &direct);
        let shown = a.shown.unwrap();
        assert_eq!(shown.plan, direct);
        assert_eq!(direct.backtest.ranking[shown.row].candidate, direct.chosen);
    }

    #[test]
    fn a_picked_row_is_refitted_with_its_own_candidate() {
        let mut desk = PlanDesk::new();
        let first = desk.answer(ask(1, None)).ranked.unwrap();
        let other = first
            .backtest
            .ranking
            .iter()
            .position(|r| r.candidate != first.chosen)
            .unwrap();
        let picked = first.backtest.ranking[other].candidate.clone();
        let a = desk.answer(ask(2, Some(picked)));
        let shown = a.shown.unwrap();
        assert_eq!(shown.row, other);
        assert_eq!(shown.plan.chosen, first.backtest.ranking[other].candidate);
        // The ranking itself is the same as before the pick.
        assert_eq!(a.ranked.unwrap(), first);
    }

    #[test]
    fn progress_is_reported_while_answering() {
        let mut desk = PlanDesk::new();
        let mut steps = Vec::new();
        let a = desk.answer_observed(ask(1, None), &mut |p| steps.push(p));
        assert!(a.ranked.is_ok());
        let last = steps.last().unwrap();
        assert_eq!(last.done + 1, last.total, "{steps:?}");
        // The same ask again reuses the ranked plan: no backtest, so no progress.
        steps.clear();
        desk.answer_observed(ask(2, None), &mut |p| steps.push(p));
        assert!(steps.is_empty(), "{steps:?}");
    }

    #[test]
    #[should_panic(expected = "fault drill")]
    fn the_fault_drill_panics_on_purpose() {
        let mut q = ask(1, None);
        q.drill = Some(Drill::Panic);
        PlanDesk::new().answer(q);
    }

    #[test]
    fn an_unknown_pick_shows_the_engine_choice() {
        let mut desk = PlanDesk::new();
        // A candidate this ranking does not hold (Croston applies only to demand with zeros).
        let absent = Candidate::Method(MethodKind::Croston);
        let a = desk.answer(ask(1, Some(absent)));
        let ranked = a.ranked.unwrap();
        assert_eq!(a.shown.unwrap().plan, ranked);
    }

    #[test]
    fn messages_survive_the_codec_both_ways() {
        // The worker's codec is bincode (gloo-worker's default); this is the same encoding.
        let mut desk = PlanDesk::new();
        let a = desk.answer(ask(3, None));
        let bytes = bincode::serialize(&a).unwrap();
        let back: PlanAnswer = bincode::deserialize(&bytes).unwrap();
        assert_eq!(back, a);
        let q = ask(4, Some(Candidate::Method(MethodKind::Ses)));
        let back: PlanAsk = bincode::deserialize(&bincode::serialize(&q).unwrap()).unwrap();
        assert_eq!(back, q);
    }

    #[test]
    fn a_series_that_breaks_its_invariants_is_refused_on_arrival() {
        // An infinite value: Series::new refuses it, so a message holding one was not made by
        // Series::new; reading it back must check again. The bytes are built by hand.
        #[derive(Serialize)]
        struct Parts {
            name: String,
            start: Period,
            values: Vec<Option<f64>>,
        }
        let bad = Parts {
            name: "x".into(),
            start: Period::month(2022, 1),
            values: vec![Some(f64::INFINITY)],
        };
        let bytes = bincode::serialize(&bad).unwrap();
        assert!(bincode::deserialize::<Series>(&bytes).is_err());
    }
}
