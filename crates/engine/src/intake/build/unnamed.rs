//! Periods a long table names nowhere: no sales, or missing from the export.
//!
//! A table of rows (a till's or an order system's export) that writes no zeros has no row for
//! a period in which nothing sold. Inside the table's span, a period no row names at all is:
//! - closed: its place in the calendar's season (weekday, month, quarter, ISO week) has no row
//!   in at least 80 % of its occurrences within 6 seasons either side, and in at least 2 of
//!   them, while the periods of the other places in that window have rows in at least 75 % of
//!   theirs (a shop shut on Sundays, a stall open only at weekends, a kiosk open only in summer;
//!   in a table of slow items a place empty by chance is left to the next rule; our choice of
//!   cut-offs): no sales;
//! - quiet: as often as the items go without a sale near it, a stretch without any is to be
//!   expected. Each item's chance of a period without a row is taken from the 30 open periods
//!   of its run on each side of the stretch, `p_i = q_i / (n_i + 1)` (q_i of those n_i periods
//!   without its row; the `+ 1` keeps an item seen to sell in every one of them from ever
//!   being quiet); with the items taken as independent the stretch has the chance
//!   `P = prod_i p_i^(o_i)` (o_i: the stretch's periods in item i's run), and it is quiet when
//!   `N P >= 0.01`, N the span's open periods (our choice of cut-off): no sales;
//! - missing from the export: neither (a month without a row in a table whose items sell every
//!   month, a busy shop's closed holiday): a gap, filled as gaps are.
//!
//! A table that writes its zeros (more rows with quantity 0 than periods with rows for other
//! items but none for an item) writes its quiet periods too: there no period is quiet, but a
//! closed one still has no rows.
//!
//! Kept apart from: the periods some row names (`long`, where an item without a row in them
//! sold nothing) and the warnings, which the builder words.

/// What a period no row names is read as.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) enum Unnamed {
    /// A period of a season place (a weekday, a month) the business is closed in: no sales.
    Closed,
    /// A period without a sale, as the items' own rates near it make likely: no sales.
    Quiet,
    /// Missing from the export: a gap.
    Missing,
}

/// A season place is closed when at least this share of its periods nearby have no row...
const CLOSED_SHARE: f64 = 0.8;

/// ...and at least `at_least` of them, while the other places have rows in at least
/// `open_share` of theirs ([`LONG_TABLE`]; a table of one row per period asks for more,
/// `build::closed_places`).
#[derive(Clone, Copy, Debug)]
pub(super) struct ClosedRule {
    pub(super) at_least: usize,
    pub(super) open_share: f64,
}

/// The closed rule of a long table (our choice).
pub(super) const LONG_TABLE: ClosedRule = ClosedRule {
    at_least: 2,
    open_share: 0.75,
};
/// Seasons either side looked at for a closed place.
const CLOSED_SEASONS: usize = 6;
/// Open periods either side of a stretch from which the items' chances are taken.
const NEARBY: usize = 30;
/// A stretch with no row is chance when its expected count in the span is at least this.
const CHANCE: f64 = 0.01;

/// One item's periods in the span: the sorted, distinct indexes of its rows (at least one).
pub(super) struct ItemRows(pub Vec<usize>);

impl ItemRows {
    fn first(&self) -> usize {
        self.0[0]
    }
    fn last(&self) -> usize {
        self.0[self.0.len() - 1]
    }
    /// Its rows in `from..to`.
    fn rows_in(&self, from: usize, to: usize) -> usize {
        self.0.partition_point(|&t| t < to) - self.0.partition_point(|&t| t < from)
    }
}

/// The reading of each period of the span (`None` where some row names it). `named[t]`: a row
/// names period t; `season`: the calendar's season length (7 daily, 52 weekly, 12 monthly, 4
/// quarterly; a place recurs that many periods later), `None` without one (yearly, undated);
/// `writes_zeros`: see the module doc; `closed`: how much a closed place asks ([`ClosedRule`]).
pub(super) fn classify(
    named: &[bool],
    season: Option<usize>,
    items: &[ItemRows],
    writes_zeros: bool,
    closed: ClosedRule,
) -> Vec<Option<Unnamed>> {
    let mut out: Vec<Option<Unnamed>> = named
        .iter()
        .map(|&is_named| (!is_named).then_some(Unnamed::Missing))
        .collect();
    if let Some(season) = season {
        mark_closed(named, season, closed, &mut out);
    }
    if !writes_zeros {
        mark_quiet(items, &mut out);
    }
    out
}

/// Prefix sums of `flag` over the span: `sums[b] - sums[a]` counts it in `a..b`.
pub(super) fn prefix(n: usize, flag: impl Fn(usize) -> bool) -> Vec<usize> {
    let mut sums = vec![0; n + 1];
    for t in 0..n {
        sums[t + 1] = sums[t] + usize::from(flag(t));
    }
    sums
}

fn mark_closed(named: &[bool], places: usize, rule: ClosedRule, out: &mut [Option<Unnamed>]) {
    let n = named.len();
    let reach = CLOSED_SEASONS * places;
    // Periods inside a run without any row as long as a season (a shop's holiday, a stretch
    // missing from the export) say nothing of which places are open or shut: left out of the
    // counts below, where they had made every place near a long outage look shut and pulled
    // the open places' share under the rule's for six seasons either side (a two-week holiday
    // left the Sundays around it interpolated; a helper review's probes).
    let mut in_long_gap = vec![false; n];
    let mut t = 0;
    while t < n {
        let start = t;
        while t < n && !named[t] {
            t += 1;
        }
        if t - start >= places {
            in_long_gap[start..t].fill(true);
        }
        t = t.max(start + 1);
    }
    // A period whose place has no row in most of its occurrences nearby (itself included).
    let candidate: Vec<bool> = (0..n)
        .map(|t| {
            let first = t - (t / places).min(CLOSED_SEASONS) * places;
            let (mut seen, mut empty) = (0usize, 0usize);
            for s in (first..n.min(t + reach + 1)).step_by(places) {
                if !in_long_gap[s] {
                    seen += 1;
                    empty += usize::from(!named[s]);
                }
            }
            empty >= rule.at_least && empty as f64 >= CLOSED_SHARE * seen as f64
        })
        .collect();
    let open = prefix(n, |t| !candidate[t] && !in_long_gap[t]);
    let open_named = prefix(n, |t| !candidate[t] && named[t]);
    for t in 0..n {
        if out[t].is_none() || !candidate[t] {
            continue;
        }
        let (a, b) = (t.saturating_sub(reach), n.min(t + reach + 1));
        let others = open[b] - open[a];
        let open_rows = (open_named[b] - open_named[a]) as f64;
        if others > 0 && open_rows >= rule.open_share * others as f64 {
            out[t] = Some(Unnamed::Closed);
        }
    }
}

fn mark_quiet(items: &[ItemRows], out: &mut [Option<Unnamed>]) {
    let n = out.len();
    let closed = prefix(n, |t| out[t] == Some(Unnamed::Closed));
    let missing = prefix(n, |t| out[t] == Some(Unnamed::Missing));
    let open_periods = n - closed[n];
    let ln_limit = CHANCE.ln() - (open_periods.max(1) as f64).ln();
    // Open periods in x..y, and the period `count` open ones before `at` (or after `from`),
    // closed ones passed over.
    let open = |x: usize, y: usize| (y - x) - (closed[y] - closed[x]);
    let back = |at: usize, count: usize| -> usize {
        let mut a = at;
        while a > 0 && open(a, at) < count {
            a -= 1;
        }
        a
    };
    let ahead = |from: usize, count: usize| -> usize {
        let mut b = from;
        while b < n && open(from, b) < count {
            b += 1;
        }
        b
    };
    let mut t = 0;
    while t < n {
        if out[t] != Some(Unnamed::Missing) {
            t += 1;
            continue;
        }
        // A stretch of periods no row names, closed ones inside it passed over.
        let start = t;
        while t < n && matches!(out[t], Some(Unnamed::Missing | Unnamed::Closed)) {
            t += 1;
        }
        let (left, right) = (back(start, NEARBY), ahead(t, NEARBY));
        let mut ln_chance = 0.0;
        for item in items {
            let (first, end) = (item.first(), item.last() + 1);
            let (lo, hi) = (start.max(first), t.min(end));
            let in_stretch = if lo < hi {
                missing[hi] - missing[lo]
            } else {
                0
            };
            if in_stretch == 0 {
                continue;
            }
            let (a, b) = (left.max(first), right.min(end));
            let nearby = open(a, start) + open(t, b);
            let rows = item.rows_in(a, start) + item.rows_in(t, b);
            let q = nearby - rows;
            ln_chance += in_stretch as f64 * (q as f64 / (nearby as f64 + 1.0)).ln();
        }
        if ln_chance >= ln_limit {
            for reading in &mut out[start..t] {
                if *reading == Some(Unnamed::Missing) {
                    *reading = Some(Unnamed::Quiet);
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::{classify, ItemRows, Unnamed, LONG_TABLE};

    /// `rows`: one string per item over the span, `x` a row, `.` none; `daily`: a season of
    /// 7. Expected: `.` named, `c` closed, `q` quiet, `m` missing.
    fn check(rows: &[&str], daily: bool, writes_zeros: bool, expected: &str) {
        let n = rows[0].len();
        let named: Vec<bool> = (0..n)
            .map(|t| rows.iter().any(|r| r.as_bytes()[t] == b'x'))
            .collect();
        let items: Vec<ItemRows> = rows
            .iter()
            .map(|r| ItemRows(r.match_indices('x').map(|(t, _)| t).collect()))
            .collect();
        let got: String = classify(&named, daily.then_some(7), &items, writes_zeros, LONG_TABLE)
            .iter()
            .map(|r| match r {
                None => '.',
                Some(Unnamed::Closed) => 'c',
                Some(Unnamed::Quiet) => 'q',
                Some(Unnamed::Missing) => 'm',
            })
            .collect();
        assert_eq!(got, expected, "{rows:?}");
    }

    #[test]
    fn readings_of_periods_no_row_names() {
        // One item selling about every other period: its quiet periods are chance.
        check(&["x.xx.x..x.xx.x"], false, false, ".q..q.qq.q..q.");
        // The same in a table that writes zeros: missing.
        check(&["x.xx.x..x.xx.x"], false, true, ".m..m.mm.m..m.");
        // One item selling in every period but one: missing, however few the periods.
        check(&["xxxxxx.xxxxx"], false, false, "......m.....");
        // Three items selling in every period but one that no row names: missing.
        check(
            &[
                "xxxxxx.xxxxxxxxxxxxxxxx",
                "xxxxxx.xxxxxxxxxxxxxxxx",
                "xxxxxx.xxxxxxxxxxxxxxxx",
            ],
            false,
            false,
            "......m................",
        );
        // A busy daily table shut on Sundays (period 0 a Monday): closed days, also where
        // the table writes zeros.
        let busy = "xxxxxx.xxxxxx.xxxxxx.xxxxxx.x";
        let shut = "......c......c......c......c.";
        check(&[busy, busy], true, false, shut);
        check(&[busy, busy], true, true, shut);
        // Open only at weekends: the five weekdays are closed.
        let weekends = "xx.....xx.....xx.....xx";
        check(&[weekends], true, false, "..ccccc..ccccc..ccccc..");
        // A sparse daily table: no weekday stands out, the quiet days are chance.
        let sparse = "x..x.....x...x..x......x....x";
        check(&[sparse], true, false, ".qq.qqqqq.qqq.qq.qqqqqq.qqqq.");
        // A two-week holiday of a shop shut on Sundays: the Sundays around it stay closed (the
        // holiday's own days, a run as long as a season, do not count against the open days).
        let holiday = ["xxxxxx.".repeat(4), ".".repeat(14), "xxxxxx.".repeat(4)].concat();
        let read = [
            "......c".repeat(4),
            "mmmmmmc".repeat(2),
            "......c".repeat(4),
        ]
        .concat();
        check(&[&holiday, &holiday], true, false, &read);
        // A stretch without rows in a table of frequent sellers: missing, while a lone quiet
        // period of an item seen to go without sales is chance.
        check(
            &["xxxx.xxxxx........xxxxxxx.xxx"],
            false,
            false,
            "....q.....mmmmmmmm.......q...",
        );
    }
}
