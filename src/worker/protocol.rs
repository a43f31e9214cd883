//! The messages between the page and the plan worker, and the words of a worker's fault.
//!
//! Kept apart from: what the worker does with an ask ([`super::desk`]) and how the page sends
//! them ([`super::queue`], src/page/courier.rs).

use serde::{Deserialize, Serialize};

use morrowcast_engine::backtest::Candidate;

use super::board::{BoardAsk, BoardRow};
use morrowcast_engine::plan::ItemPlan;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;

/// How a panic's message in the worker starts, as the page sees it in the error event:
/// `morrowcast worker, ask 17: panicked at ...`. The ask's ticket lets the page tell a fault of
/// its current worker from one of a worker it has already replaced.
pub const FAULT_PREFIX: &str = "morrowcast worker, ask ";

/// The message the worker's panic hook throws for a panic while answering ask `ticket`.
pub fn fault_message(ticket: u64, panic: &str) -> String {
    format!("{FAULT_PREFIX}{ticket}: {panic}")
}

/// The ask and the detail in a worker's fault message (the page's error event may wrap it,
/// as in "Uncaught Error: morrowcast worker, ask 17: ..."); `None` for any other message.
pub fn parse_fault(message: &str) -> Option<(u64, &str)> {
    let rest = &message[message.find(FAULT_PREFIX)? + FAULT_PREFIX.len()..];
    let (ticket, detail) = rest.split_once(": ")?;
    Some((ticket.parse().ok()?, detail))
}

/// What the page asks a worker for: one item's whole plan (the detail), or a batch of the
/// Item board's rows.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub enum WorkerAsk {
    Plan(PlanAsk),
    Board(BoardAsk),
}

/// One request to the worker.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PlanAsk {
    /// Increases with every ask; the answer carries it back so the page can drop stale ones.
    pub ticket: u64,
    pub series: Series,
    pub settings: PlanSettings,
    /// The ranking row the user picked; `None`: the engine's choice.
    pub picked: Option<Candidate>,
    /// A deliberate failure instead of a plan (the page's `#drill=worker-fault` and
    /// `#drill=worker-silent`), so the browser tests can check that it is caught, reported
    /// and recovered from.
    pub drill: Option<Drill>,
    /// Progress news is sent only once the plan has run this long (milliseconds): a quick
    /// plan's answer comes before any bar could be seen. The page sends 100, its
    /// `#drill=eager-news` 0 (so a test sees news whatever the machine's speed).
    pub news_after_ms: f64,
}

/// The worker's fault drills.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum Drill {
    /// Panic (as a bug would).
    Panic,
    /// Never answer (as a worker that did not start would look to the page).
    Silence,
}

/// What the Look-ahead and the Error ledger show: one row of the ranking and its plan.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Shown {
    /// Index of the row in the ranking.
    pub row: usize,
    /// The plan refitted with that row's candidate (the ranked plan itself for the row the
    /// engine chose).
    pub plan: ItemPlan,
}

/// What the worker sends back: news of how far an ask has come, then its answer.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub enum WorkerNews {
    /// `done` of `total` steps of the ask with this ticket (sent only for slow plans).
    Progress {
        ticket: u64,
        done: usize,
        total: usize,
    },
    /// Boxed: an answer is large, progress news small.
    Answer(Box<PlanAnswer>),
    /// The rows of one [`BoardAsk`] batch, and the worker's time on it (milliseconds).
    Rows {
        ticket: u64,
        rows: Vec<BoardRow>,
        compute_ms: f64,
    },
}

/// The worker's answer to one [`PlanAsk`].
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PlanAnswer {
    pub ticket: u64,
    /// The series the plan was made from (the page's input may have moved on).
    pub series: Series,
    /// The ranked plan, or the engine's message saying why there is none.
    pub ranked: Result<ItemPlan, String>,
    /// The row to show; `None` when there is no ranked plan.
    pub shown: Option<Shown>,
    /// Time the worker spent on this ask, in milliseconds (0 natively).
    pub compute_ms: f64,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fault_messages_name_their_ask_and_read_back() {
        let m = fault_message(17, "panicked at src/x.rs:1:2: boom");
        assert_eq!(
            parse_fault(&m),
            Some((17, "panicked at src/x.rs:1:2: boom"))
        );
        let wrapped = format!("Uncaught Error: {m}");
        assert_eq!(parse_fault(&wrapped).map(|f| f.0), Some(17));
        assert_eq!(parse_fault("Uncaught TypeError: x is undefined"), None);
    }
}
