//! Croston, SBA, TSB. (Placeholder: being written.)
use super::{Fitted, MethodError, MethodKind};
pub fn fit(kind: MethodKind, _h: &[f64], _horizon: usize) -> Result<Fitted, MethodError> {
    Err(MethodError::Diverged { method: kind })
}
