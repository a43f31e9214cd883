//! The page's side of the worker boundary as a pure type: tickets, at most one ask in flight,
//! the newest ask waiting behind it, and which answer the page shows.
//!
//! Kept apart from: the worker itself and the browser (src/page/courier.rs holds one of these
//! beside the worker bridge and the page's clock; this type is tested natively).
//!
//! Why one in flight: a worker answers in order, so a burst of changes (typing a horizon, a
//! string of clicks) would otherwise queue a plan per keystroke. While one is out, newer asks
//! replace each other; when its answer arrives it is dropped if a newer ask waits, and that one
//! goes out. The page so always ends showing the plan of its latest inputs.

use super::protocol::PlanAsk;

/// What to do with an answer that arrived.
#[derive(Clone, Debug, PartialEq)]
pub enum Arrival {
    /// Show it: it answers the newest ask.
    Show,
    /// Drop it and send this newer ask, which waited for it (boxed: an ask carries a series).
    SendNext(Box<PlanAsk>),
    /// Drop it: it is stale, or nothing waits for it any more.
    Drop,
}

/// Tickets and the asks between the page and one worker. Times are the page's clock in
/// milliseconds, passed in.
#[derive(Debug, Default)]
pub struct AskQueue {
    next_ticket: u64,
    in_flight: Option<u64>,
    waiting: Option<PlanAsk>,
    /// Ticket of the newest ask; `None` after [`AskQueue::forget`]. Only its answer is shown.
    latest: Option<u64>,
    /// When the worker was last asked or heard from.
    last_heard_ms: f64,
}

impl AskQueue {
    pub fn new() -> AskQueue {
        AskQueue {
            next_ticket: 1,
            ..AskQueue::default()
        }
    }

    /// Takes a new ask (its ticket is filled in here); returns it when it should be sent now,
    /// `None` when it waits behind the one in flight (replacing any ask already waiting).
    pub fn ask(&mut self, mut ask: PlanAsk, now_ms: f64) -> Option<PlanAsk> {
        ask.ticket = self.next_ticket;
        self.next_ticket += 1;
        self.latest = Some(ask.ticket);
        if self.in_flight.is_some() {
            self.waiting = Some(ask);
            return None;
        }
        Some(self.send(ask, now_ms))
    }

    fn send(&mut self, ask: PlanAsk, now_ms: f64) -> PlanAsk {
        self.in_flight = Some(ask.ticket);
        self.last_heard_ms = now_ms;
        ask
    }

    /// The answer to ask `ticket` arrived.
    pub fn arrived(&mut self, ticket: u64, now_ms: f64) -> Arrival {
        self.last_heard_ms = now_ms;
        if self.in_flight != Some(ticket) {
            return Arrival::Drop;
        }
        self.in_flight = None;
        match self.waiting.take() {
            Some(next) => Arrival::SendNext(Box::new(self.send(next, now_ms))),
            None if self.latest == Some(ticket) => Arrival::Show,
            None => Arrival::Drop,
        }
    }

    /// News of ask `ticket` arrived; true when the page should show it (the ask is the one out
    /// and nothing newer waits, so its answer will be shown).
    pub fn progressed(&mut self, ticket: u64, now_ms: f64) -> bool {
        self.last_heard_ms = now_ms;
        self.in_flight == Some(ticket) && self.waiting.is_none()
    }

    /// Whether a fault on ask `ticket` concerns the current worker (the ask is the one out).
    pub fn is_current(&self, ticket: u64) -> bool {
        self.in_flight == Some(ticket)
    }

    /// How long the worker has been silent while an ask someone waits for is out; `None` when
    /// nothing is awaited.
    pub fn silent_for(&self, now_ms: f64) -> Option<f64> {
        // An ask nobody waits for any more (the input was emptied) is not the page's worry.
        let awaited = self.latest.is_some() || self.waiting.is_some();
        self.in_flight
            .filter(|_| awaited)
            .map(|_| now_ms - self.last_heard_ms)
    }

    /// Drops what was asked: the page's input has no plan to wait for any more.
    pub fn forget(&mut self) {
        self.waiting = None;
        self.latest = None;
    }

    /// The worker stopped (it faulted or fell silent) and a new one takes over: nothing is in
    /// flight or waiting any more. Tickets keep counting, so a late word from the old worker
    /// never matches a new ask.
    pub fn restart(&mut self) {
        self.in_flight = None;
        self.waiting = None;
        self.latest = None;
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use morrowcast_engine::calendar::Period;
    use morrowcast_engine::series::Series;
    use morrowcast_engine::settings::PlanSettings;

    fn ask() -> PlanAsk {
        PlanAsk {
            ticket: 0,
            series: Series::new("x", Period::month(2024, 1), vec![Some(1.0); 6]).unwrap(),
            settings: PlanSettings::default(),
            picked: None,
            drill: None,
            news_after_ms: 100.0,
        }
    }

    /// One step on a queue, and what it gave, as words: "send 1", "wait", "show", "send 3",
    /// "drop", "news", "quiet".
    enum Step {
        Ask,
        Answer(u64),
        News(u64),
        Forget,
        Restart,
    }

    fn check(steps: &[Step], expected: &[&str]) {
        let mut q = AskQueue::new();
        let got: Vec<String> = steps
            .iter()
            .map(|step| match step {
                Step::Ask => match q.ask(ask(), 0.0) {
                    Some(a) => format!("send {}", a.ticket),
                    None => "wait".into(),
                },
                Step::Answer(t) => match q.arrived(*t, 0.0) {
                    Arrival::Show => "show".into(),
                    Arrival::SendNext(a) => format!("send {}", a.ticket),
                    Arrival::Drop => "drop".into(),
                },
                Step::News(t) => if q.progressed(*t, 0.0) {
                    "news"
                } else {
                    "quiet"
                }
                .into(),
                Step::Forget => {
                    q.forget();
                    "forgot".into()
                }
                Step::Restart => {
                    q.restart();
                    "restarted".into()
                }
            })
            .collect();
        assert_eq!(got, expected);
    }

    #[test]
    fn one_in_flight_and_only_the_newest_is_shown() {
        use Step::*;
        // A single ask goes out at once and its answer is shown.
        check(&[Ask, Answer(1)], &["send 1", "show"]);
        // A burst: 2 and 3 wait in turn, 3 replaces 2; 1's answer is dropped for 3, whose
        // answer is shown. 2 never goes out.
        check(
            &[Ask, Ask, Ask, News(1), Answer(1), News(3), Answer(3)],
            &["send 1", "wait", "wait", "quiet", "send 3", "news", "show"],
        );
        // An answer for an ask not in flight (late, or from a replaced worker) is dropped.
        check(&[Ask, Answer(7), Answer(1)], &["send 1", "drop", "show"]);
        // Forgotten: the answer comes but is not shown.
        check(&[Ask, Forget, Answer(1)], &["send 1", "forgot", "drop"]);
        // Restarted: the old worker's answer is dropped, the next ask goes out at once with
        // a new ticket.
        check(
            &[Ask, Ask, Restart, Answer(1), Ask, Answer(3)],
            &["send 1", "wait", "restarted", "drop", "send 3", "show"],
        );
    }

    #[test]
    fn silence_counts_only_while_an_awaited_ask_is_out() {
        let mut q = AskQueue::new();
        assert_eq!(q.silent_for(50.0), None);
        let sent = q.ask(ask(), 100.0).unwrap();
        assert_eq!(q.silent_for(1100.0), Some(1000.0));
        assert!(q.progressed(sent.ticket, 1000.0));
        assert_eq!(q.silent_for(1100.0), Some(100.0));
        assert!(q.is_current(sent.ticket));
        q.forget();
        assert_eq!(q.silent_for(5000.0), None, "nobody waits for it");
        assert_eq!(q.arrived(sent.ticket, 5000.0), Arrival::Drop);
        assert!(!q.is_current(sent.ticket));
    }
}
