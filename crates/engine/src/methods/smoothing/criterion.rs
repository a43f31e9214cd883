//! The corrected Akaike information criterion (AICc) of a fitted exponential smoothing model,
//! under additive and under multiplicative errors: how the combination picks its exponential
//! smoothing member (Hyndman, Koehler, Snyder & Grose 2002, IJF 18:439-454; Hyndman, Koehler,
//! Ord & Snyder 2008, Forecasting with Exponential Smoothing, ch. 5 and 7).
//!
//! Kept apart from: fitting ([`super::estimate`]: the parameters are the least-squares ones,
//! whichever error the criterion assumes) and from the combination's use of the choice
//! ([`crate::backtest`], which also builds the method's holdout forecasts from its own fits).
//!
//! With one-step fitted values ŷ_t over n periods, up to a constant both share:
//! * additive errors: −2 ln L = n ln(Σ (y_t − ŷ_t)² / n);
//! * multiplicative errors: −2 ln L = n ln(Σ ((y_t − ŷ_t) / ŷ_t)² / n) + 2 Σ ln |ŷ_t|, only
//!   where every ŷ_t > 0;
//! * AICc = −2 ln L + 2k + 2k(k + 1) / (n − k − 1), k = the smoothing parameters, the free
//!   initial states (l0, b0, m − 1 seasonal) and the error variance.
//!
//! Both error forms have the same point forecasts for these models (the recursions agree);
//! they differ in the likelihood, so a model is scored by the lower of the two. The
//! multiplicative form is evaluated at the least-squares fit, not at its own maximum (our
//! simplification: one fit serves both; measured on the M3 data, README, Benchmarks).

use super::super::adjusted::ADJUSTED;
use super::super::{fit, Anchor, Fitted, MethodError, MethodKind};

/// The models the criterion chooses among: the smoothing module's own, simplest first (a tie
/// keeps the simpler). The non-seasonal ones are fitted to the seasonally adjusted history
/// when a season is accepted ([`crate::methods::fit`]); the Holt-Winters ones only with a
/// season.
pub const CHOICES: [MethodKind; 7] = super::KINDS;

/// Whether `better` (an AICc) beats the best so far.
pub fn lower(better: f64, best: Option<f64>) -> bool {
    best.is_none_or(|b| better < b)
}

/// Fits every model of [`CHOICES`] that applies to `history` (with `season`, the accepted
/// season length), each with its outcome.
pub fn fit_each(
    history: &[f64],
    season: Option<usize>,
    horizon: usize,
) -> Vec<(MethodKind, Result<Fitted, MethodError>)> {
    CHOICES
        .into_iter()
        .filter(|k| !k.needs_season() || season.is_some())
        .map(|kind| (kind, fit(kind, history, season, horizon)))
        .collect()
}

/// Of [`fit_each`]'s fits, the one with the lowest [`aicc`] (its [`Fitted::kind`] names the
/// model chosen); when no fit has an AICc (too few periods for the parameters), the simplest
/// that fitted; else the first error.
pub fn choose(
    fits: &[(MethodKind, Result<Fitted, MethodError>)],
    history: &[f64],
) -> Result<Fitted, MethodError> {
    let mut best: Option<(f64, &Fitted)> = None;
    for f in fits.iter().filter_map(|(_, f)| f.as_ref().ok()) {
        if let Some(a) = aicc(f, history) {
            if lower(a, best.map(|b| b.0)) {
                best = Some((a, f));
            }
        }
    }
    if let Some((_, f)) = best {
        return Ok(f.clone());
    }
    let simplest = fits.iter().find_map(|(_, f)| f.as_ref().ok());
    match (simplest, fits.iter().find_map(|(_, f)| f.as_ref().err())) {
        (Some(f), _) => Ok(f.clone()),
        (None, Some(e)) => Err(e.clone()),
        (None, None) => Err(MethodError::Diverged {
            method: MethodKind::SmoothingByAicc,
        }),
    }
}

/// [`choose`] over [`fit_each`]: the exponential smoothing model with the lowest AICc on
/// `history`, fitted.
pub fn fit_by_aicc(
    history: &[f64],
    season: Option<usize>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    choose(&fit_each(history, season, horizon), history)
}

/// −2 ln L of one-step fitted values, without the constant n (ln 2π + 1) both forms share.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Likelihoods {
    /// The periods with a fitted value (n).
    pub periods: usize,
    /// n ln(Σ (y_t − ŷ_t)² / n).
    pub additive: f64,
    /// n ln(Σ ((y_t − ŷ_t) / ŷ_t)² / n) + 2 Σ ln ŷ_t; `None` unless every ŷ_t > 0.
    pub multiplicative: Option<f64>,
}

/// [`Likelihoods`] of `fitted` against `history` (periods without a fitted value left out);
/// `None` when no period has one or the fit is exact.
pub fn likelihoods(fitted: &[Option<f64>], history: &[f64]) -> Option<Likelihoods> {
    let (mut sse, mut relative, mut logs, mut n) = (0.0, 0.0, 0.0, 0usize);
    let mut positive = true;
    for (f, y) in fitted.iter().zip(history) {
        let Some(f) = f else { continue };
        let e = y - f;
        sse += e * e;
        n += 1;
        if *f > 0.0 {
            relative += (e / f).powi(2);
            logs += f.ln();
        } else {
            positive = false;
        }
    }
    if n == 0 || sse <= 0.0 || !sse.is_finite() {
        return None;
    }
    let periods = n as f64;
    Some(Likelihoods {
        periods: n,
        additive: periods * (sse / periods).ln(),
        multiplicative: (positive && relative > 0.0 && relative.is_finite())
            .then(|| periods * (relative / periods).ln() + 2.0 * logs),
    })
}

/// AICc = −2 ln L + 2k + 2k(k + 1) / (n − k − 1); `None` when n ≤ k + 1.
pub fn corrected_aic(minus_two_log_likelihood: f64, periods: usize, k: usize) -> Option<f64> {
    let (n, k) = (periods as f64, k as f64);
    (n - k - 1.0 > 0.0).then(|| minus_two_log_likelihood + 2.0 * k + 2.0 * k * (k + 1.0) / (n - k - 1.0))
}

/// The lower AICc of `fit` (an exponential smoothing fit to `history`) under additive or
/// multiplicative errors; `None` for other methods, or when n ≤ k + 1 or the fit is exact.
pub fn aicc(fit: &Fitted, history: &[f64]) -> Option<f64> {
    let Some(Anchor::Smoothing(anchor)) = &fit.anchor else {
        return None;
    };
    // A non-seasonal model fitted to the seasonally adjusted history (methods/adjusted.rs)
    // lists the adjustment as one entry; its m indices (mean 1 or sum 0) are m − 1 free states.
    let adjusted = fit
        .parameters
        .iter()
        .find(|p| p.name == ADJUSTED)
        .map_or(0, |p| p.value as usize);
    let listed = fit.parameters.len() - usize::from(adjusted > 0);
    let seasonal_states = anchor.model.period().max(adjusted).saturating_sub(1);
    let k = listed + seasonal_states + 1;
    let l = likelihoods(&fit.fitted, history)?;
    let best = l.multiplicative.map_or(l.additive, |m| m.min(l.additive));
    corrected_aic(best, l.periods, k)
}
