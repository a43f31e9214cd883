//! Patterns: season length, trend and demand class, each with its evidence.
//! (Placeholder API: being written.)

use crate::engine::calendar::Frequency;

/// Where the season-length candidate came from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum SeasonSource {
    Calendar,
    Autocorrelation,
    User,
    NoCandidate,
}

/// The season-length verdict and its evidence.
#[derive(Clone, Debug, PartialEq)]
pub struct SeasonVerdict {
    /// Accepted season length (>= 2), or `None`.
    pub length: Option<usize>,
    pub candidate: Option<usize>,
    pub source: SeasonSource,
    /// Sample autocorrelations r_1..r_max.
    pub autocorrelation: Vec<f64>,
    /// |r_m| at the candidate lag.
    pub statistic: f64,
    /// 1.645 sqrt((1 + 2 sum_{k<m} r_k^2)/n).
    pub threshold: f64,
    pub full_seasons: usize,
    /// One sentence that explains the verdict.
    pub reason: String,
}

pub fn detect_season(_values: &[f64], _frequency: Frequency, user: Option<usize>) -> SeasonVerdict {
    SeasonVerdict {
        length: user.filter(|m| *m >= 2),
        candidate: user,
        source: SeasonSource::User,
        autocorrelation: vec![],
        statistic: 0.0,
        threshold: 0.0,
        full_seasons: 0,
        reason: String::new(),
    }
}

/// Trend direction from the Mann-Kendall test.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum TrendDirection {
    Up,
    Down,
    None,
}
impl TrendDirection {
    /// "up", "down" or "none".
    pub fn as_str(self) -> &'static str {
        match self {
            TrendDirection::Up => "up",
            TrendDirection::Down => "down",
            TrendDirection::None => "none",
        }
    }
}

/// The trend verdict and its evidence.
#[derive(Clone, Debug, PartialEq)]
pub struct TrendVerdict {
    pub direction: TrendDirection,
    pub s: f64,
    pub z: f64,
    pub p_value: f64,
    pub significance: f64,
}

pub fn mann_kendall(_values: &[f64]) -> TrendVerdict {
    TrendVerdict {
        direction: TrendDirection::None,
        s: 0.0,
        z: 0.0,
        p_value: 1.0,
        significance: 0.05,
    }
}

/// Demand classes of Syntetos, Boylan & Croston (2005).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum DemandClass {
    Smooth,
    Erratic,
    Intermittent,
    Lumpy,
}
impl DemandClass {
    /// "smooth", "erratic", "intermittent" or "lumpy".
    pub fn as_str(self) -> &'static str {
        match self {
            DemandClass::Smooth => "smooth",
            DemandClass::Erratic => "erratic",
            DemandClass::Intermittent => "intermittent",
            DemandClass::Lumpy => "lumpy",
        }
    }
}

/// The demand-class verdict and its evidence.
#[derive(Clone, Debug, PartialEq)]
pub struct DemandVerdict {
    pub class: DemandClass,
    pub adi: f64,
    pub cv2: f64,
}

pub fn classify_demand(_values: &[f64]) -> DemandVerdict {
    DemandVerdict {
        class: DemandClass::Smooth,
        adi: 1.0,
        cv2: 0.0,
    }
}
