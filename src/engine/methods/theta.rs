//! Theta method. (Placeholder: being written.)
use super::{Fitted, MethodError, MethodKind};
pub fn theta(_h: &[f64], _m: Option<usize>, _horizon: usize) -> Result<Fitted, MethodError> {
    Err(MethodError::Diverged {
        method: MethodKind::Theta,
    })
}
