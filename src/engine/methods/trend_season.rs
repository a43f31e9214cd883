//! Linear trend with seasonal indices. (Placeholder: being written.)
use super::{Fitted, MethodError, MethodKind};
pub fn trend_seasonal(_h: &[f64], _m: usize, _horizon: usize) -> Result<Fitted, MethodError> {
    Err(MethodError::Diverged {
        method: MethodKind::TrendSeasonal,
    })
}
