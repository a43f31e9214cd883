//! The page's Web Workers: the plan worker (what crosses between the page and it, the work
//! done there, the page's queue of asks) and the reading worker ([`reading`]).
//!
//! Kept apart from: the DOM (the worker has none) and the command line's JSON contract
//! (crates/cli/src/wire.rs). The page sends a [`PlanAsk`] (the chosen item's series, the
//! settings, the ranking row the user picked); the worker answers with a [`PlanAnswer`] holding
//! the ranked plan and the plan of the picked row, after [`WorkerNews::Progress`] messages when
//! the plan is slow. Messages are bincode (gloo-worker's codec) of the engine's own types: both
//! ends are built from this source at once, so the encoding is not a contract and may change
//! with any commit. Infinity and NaN cross unchanged (JSON could not carry them).
//!
//! The Item board sends [`BoardAsk`] batches to a pool of the same workers and gets
//! [`WorkerNews::Rows`] back ([`board`]: each item planned with its Stock plan, boiled down to
//! its row).
//!
//! A text over 200 KB and a workbook are read by a worker built apart ([`reading`]: its own
//! wasm, loaded at the first of them), so this one holds neither Intake nor the workbook
//! reader.
//!
//! Parts: [`protocol`] (the messages and the fault words), [`desk`] (the worker's whole logic,
//! pure), [`board`] (a batch of the board's items to rows; pure), [`queue`] (the page's side:
//! tickets, one ask in flight, the newest waiting; pure), [`reading`] (the reading worker's
//! messages and answers, pure, and its glue), and the plan worker's gloo-worker glue (wasm
//! only), which only times the desk and passes messages. The pure parts are tested natively.

pub mod board;
pub mod desk;
pub mod protocol;
pub mod queue;
pub mod reading;

#[cfg(target_arch = "wasm32")]
mod glue;

pub use board::{answer_board, BoardAsk, BoardFigures, BoardItem, BoardRow, BoardStock, NoStock};
pub use desk::PlanDesk;
#[cfg(target_arch = "wasm32")]
pub use glue::{answering, PlanWorker};
pub use protocol::{
    fault_message, parse_fault, Drill, PlanAnswer, PlanAsk, Shown, WorkerAsk, WorkerNews,
    FAULT_PREFIX,
};
pub use queue::{Arrival, AskQueue};
