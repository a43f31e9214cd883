//! The page's state, in three parts handed around by context: [`IntakeState`] (the Intake text
//! and what the engine read from it), [`PlanState`] (the settings form and the plans the
//! worker computes for the open item) and [`BoardState`] (the Stock plan's settings and every
//! item's row, from the worker pool), with [`WorkState`] over all three (the whole desk as
//! one work, for share links and work files), plus the page-wide [`Resized`] tick charts redraw on.
//!
//! Kept apart from: how the state is shown (panels, results) and the worker's messages
//! (courier.rs). The page reads Intake itself up to 200 KB (the report shows as you type;
//! larger texts go to the reading worker, src/page/reader.rs);
//! every plan is computed in the worker.

mod board;
mod intake;
mod plan;
mod work;

pub use board::BoardState;
pub use intake::{IntakeState, OpenWorkbook, DEMO_SOURCE, LARGE_TEXT};
pub use plan::PlanState;
pub use work::{Keeping, WorkNotice, WorkState, NO_TABLE};

use leptos::prelude::RwSignal;

/// Bumped when the window is resized, so charts redraw at their new size.
#[derive(Clone, Copy)]
pub struct Resized(pub RwSignal<u32>);
