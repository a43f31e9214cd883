"""The Bias alert's limits (crates/engine/src/alerts.rs, BIAS_LIMITS), by simulation.

The alert reads, for the last k = 3, 6 and 12 one-step errors of a history of n errors (each
window only where at least 12 errors come before it), S = sum of the window's errors /
(sigma sqrt(k)) and S' the same with each error clipped to +-3 sigma, where sigma =
1.4826 median |e| over the up to 24 errors just before that window. A window passes when S
and S' share their sign and both pass the limit c. For independent normal errors each S is
about standard normal, but the windows overlap and sigma is estimated from few errors, so the
c that is passed on some window in 5 % of histories is above 1.96 and depends on n (which
windows are read and from how many errors sigma comes). This draws 1,000,000 histories of n
independent standard normal errors for each n from 15 (the first window readable) to 36 (from
there on every window's sigma rests on 24 errors, so c no longer changes) and prints c(n), the
95 % quantile of max over windows of min(|S|, |S'|) (0 where the signs differ).

Run: python3 scripts/bias_limits.py   (numpy; about a minute)
Printed with numpy 2.4.6 on 2026-12-03 (the engine's table, rounded to 2 places):
2.23, 2.24, 2.20, 2.53, 2.51, 2.49, 2.48, 2.46, 2.45, 2.67, 2.66, 2.63, 2.63, 2.60, 2.60, 2.59,
2.58, 2.58, 2.58, 2.57, 2.58, 2.56
"""
import numpy as np

WINDOWS = [3, 6, 12]
BEFORE, SCALE, CLIP = 12, 24, 3.0


def statistic(e):
    n = e.shape[1]
    best = np.zeros(e.shape[0])
    for k in WINDOWS:
        if n < k + BEFORE:
            continue
        ref = e[:, max(0, n - k - SCALE):n - k]
        sigma = 1.482602218505602 * np.median(np.abs(ref), axis=1)
        window = e[:, n - k:]
        root = np.sqrt(k)
        plain = window.sum(axis=1) / (sigma * root)
        clipped = np.clip(window, -CLIP * sigma[:, None], CLIP * sigma[:, None]).sum(axis=1) / (sigma * root)
        score = np.where(np.sign(plain) == np.sign(clipped), np.minimum(np.abs(plain), np.abs(clipped)), 0.0)
        best = np.maximum(best, score)
    return best


rng = np.random.default_rng(20261203)
limits = []
for n in range(15, 37):
    scores = np.concatenate([statistic(rng.standard_normal((250_000, n))) for _ in range(4)])
    limits.append(np.quantile(scores, 0.95))
print(", ".join(f"{c:.2f}" for c in limits))
