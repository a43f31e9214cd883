//! The Look-back (`lookback::look_back`): the plan of some periods ago against what sold since.
//! Constructed cases whose outcome follows by hand (a flat history of 10 is forecast 10 with a
//! narrow band, 4.3 to 15.7 at 95 %, and a stock spread of 0, so the reorder point over P
//! periods is 10 P exactly), the refusals, and a held-out check on series of our
//! own making: on demand that is what the plan assumes (level plus independent normal noise)
//! the bands and the reorder points must hold about as often as they promise.

use morrowcast_engine::calendar::Period;
use morrowcast_engine::lookback::{look_back, LookBackError, LookBackTally, StockCheck};
use morrowcast_engine::order::plan_order;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;
use morrowcast_engine::stock::{StockSettings, Target};

use crate::support::{cli, item_named, monthly, shop_shut_at_weekends, within_count, SplitMix};

/// What a Look-back should find: the last period the plan saw, each period since as (what
/// sold, within the band), and the stock check.
struct Expected {
    made_after: Period,
    since: Vec<(Option<f64>, Option<bool>)>,
    stock: StockCheck,
}

fn stock(lead_time: usize) -> StockSettings {
    StockSettings::new(lead_time, None, Target::cycle_service(0.95).unwrap()).unwrap()
}

/// The last period of a series: where a file of it alone ends.
fn end_of(series: &Series) -> Period {
    series.period(series.len() - 1)
}

/// Looks back `periods` over a monthly history of `values` with the given lead time, from the
/// end of a file `blank_after` periods longer than the item's data.
fn check(
    values: Vec<Option<f64>>,
    (periods, blank_after): (usize, i64),
    lead_time: usize,
    expected: Expected,
) {
    let series = monthly(values);
    let got = look_back(
        &series,
        &PlanSettings::default(),
        &stock(lead_time),
        None,
        periods,
        Some(end_of(&series).offset(blank_after)),
    )
    .unwrap();
    assert_eq!(got.made_after, expected.made_after, "made after");
    let since: Vec<_> = got.steps.iter().map(|s| (s.actual, s.within())).collect();
    assert_eq!(since, expected.since, "periods since");
    match (got.stock, expected.stock) {
        (
            StockCheck::Checked {
                periods,
                periodic,
                level,
                expected: e,
                demand,
                promised,
                whole_units,
            },
            StockCheck::Checked {
                periods: p,
                periodic: q,
                level: l,
                expected: x,
                demand: d,
                promised: c,
                whole_units: w,
            },
        ) => {
            assert_eq!((periods, periodic, promised, whole_units), (p, q, c, w));
            // A flat history's plan is exact up to rounding in the fits.
            assert!((level - l).abs() < 1e-6, "level {level}, want {l}");
            assert!((e - x).abs() < 1e-6, "expected {e}, want {x}");
            assert!((demand - d).abs() < 1e-9, "demand {demand}, want {d}");
        }
        (got, want) => assert_eq!(got, want),
    }
}

fn flat(n: usize) -> Vec<Option<f64>> {
    vec![Some(10.0); n]
}

fn with(mut values: Vec<Option<f64>>, since: &[Option<f64>]) -> Vec<Option<f64>> {
    values.extend_from_slice(since);
    values
}

#[test]
fn each_period_since_is_set_against_the_plan_of_then() {
    // 24 months of 10, then 10 and 30: the plan of December 2022 forecast 10 with no spread;
    // over a lead time of 2 its reorder point 20 met a demand of 40.
    check(
        with(flat(24), &[Some(10.0), Some(30.0)]),
        (2, 0),
        2,
        Expected {
            made_after: Period::month(2022, 12),
            since: vec![(Some(10.0), Some(true)), (Some(30.0), Some(false))],
            stock: StockCheck::Checked {
                periods: 2,
                periodic: false,
                level: 20.0,
                whole_units: true,
                expected: 20.0,
                demand: 40.0,
                promised: 1.0,
            },
        },
    );
    // Below the band, then within it; the level covers 16.
    check(
        with(flat(24), &[Some(3.0), Some(13.0), Some(10.0)]),
        (3, 0),
        2,
        Expected {
            made_after: Period::month(2022, 12),
            since: vec![
                (Some(3.0), Some(false)),
                (Some(13.0), Some(true)),
                (Some(10.0), Some(true)),
            ],
            stock: StockCheck::Checked {
                periods: 2,
                periodic: false,
                level: 20.0,
                whole_units: true,
                expected: 20.0,
                demand: 16.0,
                promised: 1.0,
            },
        },
    );
    // A lead time longer than the periods since: too soon to judge the reorder point.
    check(
        with(flat(24), &[Some(10.0), Some(17.0)]),
        (2, 0),
        3,
        Expected {
            made_after: Period::month(2022, 12),
            since: vec![(Some(10.0), Some(true)), (Some(17.0), Some(false))],
            stock: StockCheck::TooSoon {
                periods: 3,
                passed: 2,
            },
        },
    );
    // A gap since: not compared, and the demand over the lead time is not known.
    check(
        with(flat(24), &[Some(10.0), None, Some(10.0)]),
        (3, 0),
        2,
        Expected {
            made_after: Period::month(2022, 12),
            since: vec![
                (Some(10.0), Some(true)),
                (None, None),
                (Some(10.0), Some(true)),
            ],
            stock: StockCheck::Gap { periods: 2 },
        },
    );
    // Cut where a gap ends the earlier history: the plan of then ended at its last known
    // period (November 2022), so December is one of the periods since.
    check(
        with(flat(23), &[None, Some(10.0)]),
        (1, 0),
        1,
        Expected {
            made_after: Period::month(2022, 11),
            since: vec![(None, None), (Some(10.0), Some(true))],
            stock: StockCheck::Gap { periods: 1 },
        },
    );
}

#[test]
fn the_look_back_counts_from_the_files_end_and_leaves_shut_periods_out() {
    // The item's data ends a month before the file's: looking back 3 from the file's end, the
    // plan of then saw December 2022, and the file's last month is a gap of the item.
    check(
        with(flat(24), &[Some(10.0), Some(17.0)]),
        (3, 1),
        2,
        Expected {
            made_after: Period::month(2022, 12),
            since: vec![
                (Some(10.0), Some(true)),
                (Some(17.0), Some(false)),
                (None, None),
            ],
            stock: StockCheck::Checked {
                periods: 2,
                periodic: false,
                level: 20.0,
                whole_units: true,
                expected: 20.0,
                demand: 27.0,
                promised: 1.0,
            },
        },
    );
    // A shop shut at weekends, looked back on over a week: Saturday and Sunday are forecast 0
    // and sold 0, which says nothing of the band, so they are left out of the counts.
    let shop = shop_shut_at_weekends(7 * 20);
    let week = look_back(&shop, &PlanSettings::default(), &stock(1), None, 7, None).unwrap();
    let shut: Vec<bool> = week.steps.iter().map(|s| s.shut).collect();
    assert_eq!(shut, [false, false, false, false, false, true, true]);
    assert_eq!((week.known().count(), week.left_out()), (5, (0, 2)));
    assert!(week.steps[5..].iter().all(|s| s.within().is_none()));
}

/// The plan looked back on is the plan of then, whatever the number of periods: an automatic
/// horizon stays the monthly 12 (its bands and Stock plan as shown then), and the 13th period
/// since is forecast by the same plan made with a longer horizon, marked as such.
#[test]
fn looking_back_beyond_the_horizon_leaves_the_plan_of_then_as_it_was() {
    let mut rng = SplitMix(13);
    let values: Vec<Option<f64>> = (0..60)
        .map(|t| Some(50.0 + 10.0 * ((t % 12) as f64 / 2.0).sin() + 4.0 * rng.normal()))
        .collect();
    let series = monthly(values.clone());
    let settings = PlanSettings::default();
    let back = look_back(&series, &settings, &stock(2), None, 13, None).unwrap();
    let then = monthly(values[..47].to_vec());
    let order = plan_order(&then, &settings, &stock(2), None, false, None).unwrap();
    assert_eq!(order.plan.forecast.len(), 12);
    let bands: Vec<_> = back.steps[..12].iter().map(|s| s.band).collect();
    let shown: Vec<_> = order.plan.forecast.iter().map(|p| p.band).collect();
    assert_eq!(bands, shown);
    let extended: Vec<bool> = back.steps.iter().map(|s| s.extended).collect();
    assert_eq!(extended, [[false; 12].as_slice(), &[true]].concat());
    assert_eq!(back.extended(), 1);
    match back.stock {
        StockCheck::Checked { level, .. } => assert_eq!(level, order.stock.figures.level),
        other => panic!("{other:?}"),
    }
}

#[test]
fn look_backs_that_compare_nothing_are_refused_with_a_reason() {
    let series = monthly(flat(24));
    let end = end_of(&series);
    let ask = |settings: &PlanSettings, periods| {
        look_back(&series, settings, &stock(1), None, periods, Some(end)).map(|_| ())
    };
    let default = PlanSettings::default();
    assert_eq!(ask(&default, 0), Err(LookBackError::NoPeriods));
    assert_eq!(
        ask(&default, 24),
        Err(LookBackError::TooFewPeriods {
            asked: 24,
            held: 24
        })
    );
    assert_eq!(
        ask(&default, 21),
        Err(LookBackError::TooFewPeriods {
            asked: 21,
            held: 24
        })
    );
    // Data that ends three months before the file's end: nothing sold since is recorded.
    let later = |periods| {
        look_back(
            &series,
            &default,
            &stock(1),
            None,
            periods,
            Some(end.offset(3)),
        )
        .map(|_| ())
    };
    assert_eq!(later(3), Err(LookBackError::EndedBefore { last: end }));
    // Four months leave too few rolling origins for a Stock plan; the bands are still set
    // against what sold.
    let far = look_back(&series, &default, &stock(1), None, 20, Some(end)).unwrap();
    assert_eq!((far.steps.len(), far.within()), (20, 20));
    assert!(
        matches!(&far.stock, StockCheck::NoFigures(why) if why.contains("origins")),
        "{:?}",
        far.stock
    );
    for error in [
        LookBackError::NoPeriods,
        LookBackError::TooFewPeriods { asked: 3, held: 2 },
        LookBackError::TooFewPeriods { asked: 3, held: 24 },
        LookBackError::EndedBefore { last: end },
    ] {
        assert!(error.to_string().contains("look back"), "{error}");
    }
}

/// Held out on series of our own making: 400 monthly items of level 100 plus independent
/// normal noise of standard deviation 10 (the plan's own assumptions, so its promises should
/// hold), 48 months each, looked back over 3 with a lead time of 2. The bands (95 %) and the
/// reorder points (cycle service 95 %) must hold within about three binomial standard
/// deviations of what they promise (1,200 periods: 1.9 points; 400 items: 3.3 points).
#[test]
fn bands_and_reorder_points_hold_about_what_they_promise_on_demand_as_assumed() {
    let mut rng = SplitMix(48);
    let mut tally = LookBackTally::default();
    for _ in 0..400 {
        let values = (0..48).map(|_| Some(100.0 + 10.0 * rng.normal())).collect();
        let series = monthly(values);
        let item = look_back(&series, &PlanSettings::default(), &stock(2), None, 3, None).unwrap();
        tally.add(&item);
    }
    assert_eq!(
        (tally.items, tally.periods, tally.stock_checked),
        (400, 1200, 400)
    );
    let within = tally.within_share().unwrap();
    let covered = tally.covered_share().unwrap();
    let promised = tally.promised().unwrap();
    assert!((promised - 0.95).abs() < 1e-9, "promised {promised}");
    assert!((0.93..=0.97).contains(&within), "bands held {within}");
    assert!(
        (0.917..=0.983).contains(&covered),
        "reorder points held {covered}"
    );
}

/// The demo as CSV, and the same without its last `periods` lines (the file as it stood then).
fn demo_then(periods: usize) -> (Vec<u8>, Vec<u8>) {
    let now = cli(&["demo"], b"").stdout;
    let text = String::from_utf8(now.clone()).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    let then = lines[..lines.len() - periods].join("\n") + "\n";
    (now, then.into_bytes())
}

/// `morrowcast look-back` against `morrowcast stock` run on the file as it stood then: the
/// plan it looks back on is the one the desk showed then, figure for figure; and what sold is
/// the file's own last rows.
#[test]
fn the_command_lines_look_back_is_the_stock_plan_of_the_file_as_it_stood_then() {
    let (now, then) = demo_then(2);
    let args = ["--lead-time", "1", "--review", "1", "--json"];
    let back = cli(
        &[&["look-back", "-", "--periods", "2"][..], &args[..]].concat(),
        &now,
    );
    assert_eq!(back.code, 0, "{}", back.stderr);
    let then_stock = cli(&[&["stock", "-"][..], &args[..]].concat(), &then);
    assert_eq!(then_stock.code, 0, "{}", then_stock.stderr);
    let back = back.json();
    let report = morrowcast_engine::intake::read_bytes(&now);
    let mut within = 0;
    let mut covered = 0;
    for item in back["items"].as_array().unwrap() {
        let name = item["name"].as_str().unwrap();
        let stocked = item_named(&then_stock.json(), name).clone();
        assert_eq!(item["made_after"], "2026-09", "{name}");
        let stock = &item["stock"];
        assert_eq!(stock["check"], "checked", "{name}");
        assert_eq!(stock["protection_periods"], 2, "{name}");
        assert_eq!(stock["order_up_to"], stocked["order_up_to"], "{name}");
        assert_eq!(
            stock["expected"], stocked["demand_over_protection"],
            "{name}"
        );
        let sold = &report.items.iter().find(|i| i.name == name).unwrap().values;
        let periods = item["periods"].as_array().unwrap();
        let sold_since: Vec<f64> = periods
            .iter()
            .map(|p| p["sold"].as_f64().unwrap())
            .collect();
        assert_eq!(
            sold_since,
            [sold[sold.len() - 2].unwrap(), sold[sold.len() - 1].unwrap()]
        );
        assert_eq!(
            stock["demand"].as_f64().unwrap(),
            sold_since.iter().sum::<f64>()
        );
        within += within_count(item);
        covered += usize::from(stock["covered"] == true);
    }
    let tally = &back["tally"];
    assert_eq!(
        (&tally["items"], &tally["periods"], &tally["stock_checked"]),
        (&6.into(), &12.into(), &6.into())
    );
    assert_eq!(
        (&tally["within"], &tally["covered"]),
        (&within.into(), &covered.into())
    );
}

#[test]
fn the_command_line_refuses_a_look_back_of_no_periods_and_names_items_it_cannot_plan() {
    let (now, _) = demo_then(0);
    let zero = cli(&["look-back", "-", "--periods", "0"], &now);
    assert_eq!(zero.code, 2);
    assert!(
        zero.stderr.contains("--periods takes a whole number"),
        "{}",
        zero.stderr
    );
    // 60 months: looking back 60 leaves nothing to plan; every item says why.
    let all = cli(&["look-back", "-", "--periods", "60"], &now);
    assert_eq!(all.code, 1);
    assert!(
        all.stderr
            .contains("Seed packets: no Look-back: looking back 60 periods"),
        "{}",
        all.stderr
    );
    let text = cli(&["look-back", "-"], &now);
    assert_eq!(text.code, 0, "{}", text.stderr);
    let out = text.text();
    for said in [
        "the plan of 1 period(s) ago",
        "judgement decide the order",
        "Look-back over 6 item(s)",
    ] {
        assert!(out.contains(said), "{said}: {out}");
    }
}

/// The shortfall against a level, in whole units and not: (level, demand, whole units) to
/// the shortfall.
#[test]
fn a_level_in_whole_units_counts_as_the_stock_an_order_brings() {
    for (level, demand, whole_units, short) in [
        (70.92, 71.0, true, 0.0),
        (70.92, 71.0, false, 0.08),
        (70.92, 72.0, true, 1.0),
        (70.0, 69.0, true, 0.0),
    ] {
        let check = StockCheck::Checked {
            periods: 1,
            periodic: true,
            level,
            whole_units,
            expected: 60.0,
            demand,
            promised: 0.95,
        };
        let got = check.shortfall().unwrap();
        assert!(
            (got - short).abs() < 1e-9,
            "{level} {demand} {whole_units}: {got}"
        );
        assert_eq!(check.covered(), Some(short == 0.0));
    }
}
