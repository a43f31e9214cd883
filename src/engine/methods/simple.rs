//! Benchmark methods: naive, seasonal naive, moving average. (Placeholder: being written.)
use super::{Fitted, MethodError, MethodKind};
pub fn naive(_h: &[f64], _horizon: usize) -> Result<Fitted, MethodError> {
    Err(MethodError::Diverged {
        method: MethodKind::Naive,
    })
}
pub fn seasonal_naive(_h: &[f64], _m: usize, _horizon: usize) -> Result<Fitted, MethodError> {
    Err(MethodError::Diverged {
        method: MethodKind::SeasonalNaive,
    })
}
pub fn moving_average(_h: &[f64], _horizon: usize) -> Result<Fitted, MethodError> {
    Err(MethodError::Diverged {
        method: MethodKind::MovingAverage,
    })
}
