//! ARIMA laboratory: would the airline model, ARIMA(0,1,1)(0,1,1)_m (Box & Jenkins 1970), as
//! one more member of the combination where a season is accepted, help the automatic choice on
//! the M3 data? A research tool: the model is fitted here by conditional sum of squares (grid,
//! then a finer grid around the best), not by the engine.
//!
//! Run: `cargo bench --bench arima_lab [-- --subset MONTHLY --limit 200]`.

#[path = "common/m3_data.rs"]
mod m3_data;
use m3_data::{chosen_series, planned, RuleScores};

/// Residuals a_t of w_t = (1 - theta B)(1 - cap B^m) a_t, a before the start taken as zero;
/// their sum of squares.
fn css(w: &[f64], m: usize, theta: f64, cap: f64) -> (f64, Vec<f64>) {
    let mut a = vec![0.0; w.len()];
    let mut sse = 0.0;
    for t in 0..w.len() {
        let back = |k: usize| if t >= k { a[t - k] } else { 0.0 };
        let v = w[t] + theta * back(1) + cap * back(m) - theta * cap * back(m + 1);
        a[t] = v;
        sse += v * v;
    }
    (sse, a)
}

/// The airline model's point forecast of `h` periods, `None` when the history is too short.
fn airline(y: &[f64], m: usize, h: usize) -> Option<Vec<f64>> {
    airline_fit(y, m, h).map(|(f, _, _)| f)
}

/// The airline model's forecast and its fitted (theta, cap).
fn airline_fit(y: &[f64], m: usize, h: usize) -> Option<(Vec<f64>, f64, f64)> {
    let n = y.len();
    if n < 2 * m + 4 {
        return None;
    }
    let w: Vec<f64> = (m + 1..n)
        .map(|t| y[t] - y[t - 1] - y[t - m] + y[t - m - 1])
        .collect();
    let mut best = (f64::INFINITY, 0.0, 0.0);
    let grid = |lo: f64, hi: f64, step: f64, best: &mut (f64, f64, f64)| {
        let mut th = lo;
        while th <= hi + 1e-12 {
            let mut ca = lo;
            while ca <= hi + 1e-12 {
                let (sse, _) = css(&w, m, th.clamp(-0.98, 0.98), ca.clamp(-0.98, 0.98));
                if sse < best.0 {
                    *best = (sse, th.clamp(-0.98, 0.98), ca.clamp(-0.98, 0.98));
                }
                ca += step;
            }
            th += step;
        }
    };
    grid(-0.95, 0.95, 0.05, &mut best);
    let (_, t0, c0) = best;
    let mut fine = best;
    let mut th = t0 - 0.05;
    while th <= t0 + 0.05 + 1e-12 {
        let mut ca = c0 - 0.05;
        while ca <= c0 + 0.05 + 1e-12 {
            let (t, c) = (th.clamp(-0.98, 0.98), ca.clamp(-0.98, 0.98));
            let (sse, _) = css(&w, m, t, c);
            if sse < fine.0 {
                fine = (sse, t, c);
            }
            ca += 0.005;
        }
        th += 0.005;
    }
    let (_, theta, cap) = fine;
    let (_, mut a) = css(&w, m, theta, cap);
    let mut yy = y.to_vec();
    for _ in 0..h {
        let t = a.len();
        let back = |k: usize| if t >= k { a[t - k] } else { 0.0 };
        let wf = -theta * back(1) - cap * back(m) + theta * cap * back(m + 1);
        a.push(0.0);
        let k = yy.len();
        let next = wf + yy[k - 1] + yy[k - m] - yy[k - m - 1];
        yy.push(next);
    }
    Some((yy[n..].to_vec(), theta, cap))
}

/// `--check`: the model on log AirPassengers (tests/fixtures/refs), whose airline fit is
/// theta 0.40, cap 0.56 by maximum likelihood (Box & Jenkins' series G; values from memory,
/// conditional sum of squares lands close, not on them).
fn check() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/fixtures/refs/AirPassengers.csv"
    );
    let text = std::fs::read_to_string(path).expect("AirPassengers fixture");
    let y: Vec<f64> = text
        .lines()
        .skip(1)
        .filter_map(|l| l.rsplit(',').next()?.trim().parse::<f64>().ok())
        .map(f64::ln)
        .collect();
    let (f, theta, cap) = airline_fit(&y, 12, 12).expect("144 months");
    println!(
        "log AirPassengers: {} values, theta {theta:.3}, cap {cap:.3}, first forecast {:.1}",
        y.len(),
        f[0].exp()
    );
}

fn main() {
    if std::env::args().any(|a| a == "--check") {
        return check();
    }
    let all = chosen_series();
    let mut scores = RuleScores::default();
    for s in &all {
        let h = s.horizon;
        let Some((p, auto)) = planned(s) else {
            continue;
        };
        let k = p.chosen.members().len() as f64;
        scores.add(s, "auto (today)", &auto);
        let season = p.seasons.accepted_length().filter(|m| *m > 1);
        let raw = season.and_then(|m| airline(&s.train, m, h));
        let logged = season
            .filter(|_| s.train.iter().all(|v| *v > 0.0))
            .and_then(|m| {
                let ly: Vec<f64> = s.train.iter().map(|v| v.ln()).collect();
                airline(&ly, m, h).map(|f| f.iter().map(|v| v.exp()).collect::<Vec<f64>>())
            });
        let mix = |f: &Option<Vec<f64>>| -> Vec<f64> {
            match f {
                Some(f) => auto
                    .iter()
                    .zip(f)
                    .map(|(a, b)| (a * k + b) / (k + 1.0))
                    .collect(),
                None => auto.clone(),
            }
        };
        scores.add(s, "auto + airline", &mix(&raw));
        scores.add(s, "auto + airline (log)", &mix(&logged));
        if season.is_none() {
            scores.add(s, "auto (no season)", &auto);
        }
        let members = p.chosen.members().to_vec();
        if let (Some(f), true) = (&raw, members.len() > 3) {
            let mut fs: Vec<Vec<f64>> = members[..members.len() - 1]
                .iter()
                .filter_map(|k| {
                    morrowcast_engine::backtest::forecast_with(
                        &morrowcast_engine::backtest::Candidate::Method(*k),
                        &s.train,
                        p.seasons,
                        h,
                    )
                    .ok()
                })
                .collect();
            fs.push(f.clone());
            let n = fs.len() as f64;
            let swapped: Vec<f64> = (0..h)
                .map(|i| fs.iter().map(|f| f[i]).sum::<f64>() / n)
                .collect();
            scores.add(s, "airline for the last member", &swapped);
        } else {
            scores.add(s, "airline for the last member", &auto);
        }
        let half: Vec<f64> = match &raw {
            Some(f) => auto
                .iter()
                .zip(f)
                .map(|(a, b)| (a * k + 0.5 * b) / (k + 0.5))
                .collect(),
            None => auto.clone(),
        };
        scores.add(s, "auto + half airline", &half);
        if let Some(f) = &raw {
            scores.add(s, "airline alone (seasonal only)", f);
            scores.add(s, "auto (seasonal only)", &auto);
        }
        if let Some(f) = &logged {
            scores.add(s, "airline log alone (seasonal only)", f);
        }
    }
    scores.print(3);
}
