//! Unit tests of the entry point's checks and invariants (reference checks live in
//! tests/smoothing_reference.rs).

use super::*;

const SEVEN: [MethodKind; 7] = KINDS;

fn seasonal_series(n: usize) -> Vec<f64> {
    (0..n)
        .map(|t| 100.0 + t as f64 + 10.0 * ((t % 4) as f64 - 1.5))
        .collect()
}

#[test]
fn minimum_lengths_are_enforced() {
    let y = seasonal_series(20);
    assert!(fit(MethodKind::Ses, &y[..1], None, 3).is_err());
    assert!(fit(MethodKind::Ses, &y[..2], None, 3).is_ok());
    assert_eq!(
        fit(MethodKind::Holt, &y[..2], None, 3),
        Err(MethodError::TooShort {
            method: MethodKind::Holt,
            needed: 3,
            found: 2
        })
    );
    assert!(fit(MethodKind::DampedTrend, &y[..3], None, 3).is_ok());
    assert!(matches!(
        fit(MethodKind::HoltWintersAdditive, &y[..7], Some(4), 3),
        Err(MethodError::TooShort { needed: 8, .. })
    ));
    assert!(fit(MethodKind::HoltWintersAdditive, &y[..8], Some(4), 3).is_ok());
}

#[test]
fn seasonal_kinds_need_a_season() {
    let y = seasonal_series(20);
    assert_eq!(
        fit(MethodKind::HoltWintersMultiplicative, &y, Some(1), 3),
        Err(MethodError::NeedsSeason {
            method: MethodKind::HoltWintersMultiplicative
        })
    );
}

#[test]
fn multiplicative_needs_positive_history() {
    let mut y = seasonal_series(20);
    y[5] = 0.0;
    for kind in [
        MethodKind::HoltWintersMultiplicative,
        MethodKind::DampedHoltWintersMultiplicative,
    ] {
        assert_eq!(
            fit(kind, &y, Some(4), 3),
            Err(MethodError::NeedsPositive { method: kind })
        );
    }
    assert!(fit(MethodKind::HoltWintersAdditive, &y, Some(4), 3).is_ok());
}

#[test]
fn fitted_shapes_and_variances() {
    let y = seasonal_series(24);
    for kind in SEVEN {
        let f = fit(kind, &y, Some(4), 6).unwrap();
        assert_eq!(f.fitted().len(), y.len());
        assert_eq!(f.forecast().len(), 6);
        match f.variance() {
            Some(v) => {
                assert!(!matches!(
                    kind,
                    MethodKind::HoltWintersMultiplicative
                        | MethodKind::DampedHoltWintersMultiplicative
                ));
                assert_eq!(v.len(), 6);
                assert!(v.windows(2).all(|w| w[1] >= w[0]), "{kind}: {v:?}");
            }
            None => assert!(matches!(
                kind,
                MethodKind::HoltWintersMultiplicative | MethodKind::DampedHoltWintersMultiplicative
            )),
        }
        let p = f.parameters();
        let value = |name: &str| p.iter().find(|x| x.name == name).map(|x| x.value);
        let alpha = value("alpha").unwrap();
        assert!((1e-4..=1.0 - 1e-4).contains(&alpha));
        if let Some(beta) = value("beta") {
            assert!(beta <= alpha + 1e-12);
        }
        if let Some(gamma) = value("gamma") {
            assert!(gamma <= 1.0 - alpha + 1e-12);
        }
        if let Some(phi) = value("phi") {
            assert!((0.8..=0.98).contains(&phi));
        }
    }
}

#[test]
fn a_clean_seasonal_pattern_is_learnt() {
    // y = 100 + t + season: additive Holt-Winters can fit it exactly.
    let y = seasonal_series(40);
    let f = fit(MethodKind::HoltWintersAdditive, &y, Some(4), 4).unwrap();
    let want: Vec<f64> = (40..44)
        .map(|t| 100.0 + t as f64 + 10.0 * ((t % 4) as f64 - 1.5))
        .collect();
    for (got, want) in f.forecast().iter().zip(&want) {
        assert!((got - want).abs() < 1e-3 * want, "{got} vs {want}");
    }
}

#[test]
fn awkward_inputs_do_not_panic() {
    let constant = vec![5.0; 30];
    let tiny = vec![1e-300; 30];
    let huge = vec![1e300, 1.0, 1e300, 1.0, 1e300, 1.0, 1e300, 1.0];
    let with_nan = vec![1.0, f64::NAN, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0];
    for kind in SEVEN {
        for y in [&constant, &tiny, &huge, &with_nan] {
            for horizon in [0, 1, 13] {
                let _ = fit(kind, y, Some(4), horizon);
            }
        }
        assert!(fit(kind, &constant, Some(4), 3).is_ok(), "{kind}");
        assert!(fit(kind, &with_nan, Some(4), 3).is_err());
        assert!(fit(kind, &[], Some(4), 3).is_err());
    }
}

#[test]
fn updating_keeps_the_fit_and_runs_its_states_on() {
    let y = seasonal_series(40);
    for kind in SEVEN {
        let season = kind.needs_season().then_some(4);
        let earlier = fit(kind, &y[..32], season, 5).unwrap();
        let Some(crate::methods::Anchor::Smoothing(anchor)) = earlier.anchor.clone() else {
            panic!("{kind:?}: a smoothing fit keeps its anchor");
        };
        // Over the same history, updating reproduces the fit exactly.
        let same = update(kind, &anchor, &y[..32], 5).unwrap();
        assert_eq!(same.forecast(), earlier.forecast(), "{kind:?}");
        assert_eq!(same.parameters(), earlier.parameters(), "{kind:?}");
        // Over a longer history the parameters stay, the fitted values up to 32 are the same,
        // and the forecast starts from the later states.
        let later = update(kind, &anchor, &y, 5).unwrap();
        assert_eq!(later.parameters(), earlier.parameters(), "{kind:?}");
        assert_eq!(&later.fitted()[..32], earlier.fitted(), "{kind:?}");
        assert_eq!(later.fitted().len(), 40);
        assert_ne!(later.forecast(), earlier.forecast(), "{kind:?}");
    }
    // A later zero rules a multiplicative season out, as a fit would.
    let mut with_zero = y.clone();
    with_zero[35] = 0.0;
    let earlier = fit(MethodKind::HoltWintersMultiplicative, &y[..32], Some(4), 5).unwrap();
    let Some(crate::methods::Anchor::Smoothing(anchor)) = earlier.anchor.clone() else {
        panic!("a smoothing fit keeps its anchor");
    };
    assert_eq!(
        update(
            MethodKind::HoltWintersMultiplicative,
            &anchor,
            &with_zero,
            5
        ),
        Err(MethodError::NeedsPositive {
            method: MethodKind::HoltWintersMultiplicative
        })
    );
}
