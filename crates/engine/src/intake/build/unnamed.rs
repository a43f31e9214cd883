//! Periods a long table names nowhere: no sales, or missing from the export.
//!
//! A table of rows (a till's or an order system's export) that writes no zeros has no row for
//! a period in which nothing sold. Inside the table's span, a period no row names at all is:
//! - closed: its place in the calendar's season (weekday, month, quarter, ISO week) has no
//!   row at all in at least 80 % of its occurrences and in at least 2 of them, while the other
//!   places have rows in most of theirs (a shop shut on Sundays, a nursery shut in January;
//!   our choice of cut-offs): no sales;
//! - no sales: as often as the items sell, periods with no sale at all are to be expected.
//!   With `r_i` the share of item i's run (closed days left out) that has rows, and the items
//!   taken as independent, a stretch of L periods without any row has the chance
//!   `P = prod_t prod_i (1 - r_i)` (over the items whose run covers t); the stretch is chance
//!   when `N P >= 0.01`, N the span's periods (closed days left out; our choice of cut-off);
//! - missing from the export: a stretch less likely than that (a month without a row in a
//!   table whose items sell every month): a gap, filled as gaps are.
//!
//! A table that writes a zero anywhere (a row with quantity 0) writes its quiet periods too,
//! so there every period no row names is missing.
//!
//! Kept apart from: the periods some row names (`long`, where an item without a row in them
//! sold nothing) and the warnings, which the builder words.

/// What a period no row names is read as.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) enum Unnamed {
    /// A period of a season position (a weekday, a month) the business is closed in: no sales.
    Closed,
    /// A period without a sale, as the items' own rates make likely: no sales.
    Quiet,
    /// Missing from the export: a gap.
    Missing,
}

/// A season position is closed when at least this share of its periods have no row...
const CLOSED_SHARE: f64 = 0.8;
/// ...and at least this many of them.
const CLOSED_AT_LEAST: usize = 2;
/// A stretch with no row is chance when its expected count in the span is at least this.
const CHANCE: f64 = 0.01;

/// One item's run in the span: first and last index, and how many periods in it have rows.
#[derive(Clone, Copy, Debug)]
pub(super) struct Run {
    pub first: usize,
    pub last: usize,
    pub with_rows: usize,
}

/// The reading of each period of the span (`None` where some row names it). `named[t]`: a row
/// names period t; `season`: each period's position in the calendar's season and the number
/// of positions (`None` without a season: yearly, undated); `writes_zeros`: some row's
/// quantity is 0.
pub(super) fn classify(
    named: &[bool],
    season: Option<(&dyn Fn(usize) -> usize, usize)>,
    runs: &[Run],
    writes_zeros: bool,
) -> Vec<Option<Unnamed>> {
    let n = named.len();
    let mut out: Vec<Option<Unnamed>> = named
        .iter()
        .map(|&is_named| (!is_named).then_some(Unnamed::Missing))
        .collect();
    if writes_zeros {
        return out;
    }
    if let Some((position, positions)) = season {
        let mut periods = vec![0usize; positions];
        let mut empty = vec![0usize; positions];
        for (t, &is_named) in named.iter().enumerate() {
            let w = position(t);
            periods[w] += 1;
            empty[w] += usize::from(!is_named);
        }
        let all_empty = empty.iter().sum::<usize>() as f64;
        let closed: Vec<bool> = (0..positions)
            .map(|w| {
                let others_empty = all_empty - empty[w] as f64;
                empty[w] >= CLOSED_AT_LEAST
                    && empty[w] as f64 >= CLOSED_SHARE * periods[w] as f64
                    && 2.0 * others_empty < (n - periods[w]) as f64
            })
            .collect();
        for (t, reading) in out.iter_mut().enumerate() {
            if reading.is_some() && closed[position(t)] {
                *reading = Some(Unnamed::Closed);
            }
        }
    }
    // Closed days before t, to leave them out of each run's length.
    let mut closed_before = vec![0usize; n + 1];
    for t in 0..n {
        closed_before[t + 1] = closed_before[t] + usize::from(out[t] == Some(Unnamed::Closed));
    }
    // ln prod_i (1 - r_i) at each t, summed over runs by a difference array.
    let mut step = vec![0.0f64; n + 1];
    for run in runs {
        let open =
            (run.last + 1 - run.first) - (closed_before[run.last + 1] - closed_before[run.first]);
        if open == 0 || run.with_rows >= open {
            continue;
        }
        let ln_quiet = (1.0 - run.with_rows as f64 / open as f64).ln();
        step[run.first] += ln_quiet;
        step[run.last + 1] -= ln_quiet;
    }
    let mut ln_quiet = Vec::with_capacity(n);
    let mut acc = 0.0;
    for s in &step[..n] {
        acc += s;
        ln_quiet.push(acc);
    }
    let open_periods = n - closed_before[n];
    let ln_limit = CHANCE.ln() - (open_periods.max(1) as f64).ln();
    let mut t = 0;
    while t < n {
        if out[t] != Some(Unnamed::Missing) {
            t += 1;
            continue;
        }
        // A stretch of periods no row names, closed days inside it passed over.
        let start = t;
        let mut ln_chance = 0.0;
        while t < n && matches!(out[t], Some(Unnamed::Missing | Unnamed::Closed)) {
            if out[t] == Some(Unnamed::Missing) {
                ln_chance += ln_quiet[t];
            }
            t += 1;
        }
        if ln_chance >= ln_limit {
            for reading in &mut out[start..t] {
                if *reading == Some(Unnamed::Missing) {
                    *reading = Some(Unnamed::Quiet);
                }
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::{classify, Run, Unnamed};

    /// `rows`: one string per item over the span, `x` a row, `.` none; `daily_from`: the
    /// weekday of period 0 for a daily table. Expected: `.` named, `c` closed, `q` quiet,
    /// `m` missing.
    fn check(rows: &[&str], daily_from: Option<usize>, writes_zeros: bool, expected: &str) {
        let n = rows[0].len();
        let named: Vec<bool> = (0..n)
            .map(|t| rows.iter().any(|r| r.as_bytes()[t] == b'x'))
            .collect();
        let runs: Vec<Run> = rows
            .iter()
            .map(|r| Run {
                first: r.find('x').unwrap(),
                last: r.rfind('x').unwrap(),
                with_rows: r.matches('x').count(),
            })
            .collect();
        let weekday = daily_from.map(|d| move |t: usize| (t + d) % 7);
        let season = weekday.as_ref().map(|f| (f as &dyn Fn(usize) -> usize, 7));
        let got: String = classify(&named, season, &runs, writes_zeros)
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
        check(&["x.xx.x..x.xx.x"], None, false, ".q..q.qq.q..q.");
        // The same in a table that writes zeros: missing.
        check(&["x.xx.x..x.xx.x"], None, true, ".m..m.mm.m..m.");
        // Three items selling in every period but one that no row names: missing.
        check(
            &[
                "xxxxxx.xxxxxxxxxxxxxxxx",
                "xxxxxx.xxxxxxxxxxxxxxxx",
                "xxxxxx.xxxxxxxxxxxxxxxx",
            ],
            None,
            false,
            "......m................",
        );
        // A busy daily table shut on Sundays (period 0 a Monday): closed days.
        let busy = "xxxxxx.xxxxxx.xxxxxx.xxxxxx.x";
        check(
            &[busy, busy],
            Some(0),
            false,
            "......c......c......c......c.",
        );
        // A sparse daily table: no weekday stands out, the quiet days are chance.
        let sparse = "x..x.....x...x..x......x....x";
        check(&[sparse], Some(0), false, ".qq.qqqqq.qqq.qq.qqqqqq.qqqq.");
        // A long stretch without rows in a table of frequent sellers: missing even for one item.
        check(
            &["xxxx.xxxxx........xxxxxxx.xxx"],
            None,
            false,
            "....q.....mmmmmmmm.......q...",
        );
    }
}
