//! Work on every core, results in input order: the command line plans many items at once.
//!
//! Kept apart from: what the work is (the caller's closure; here, planning an item) and how
//! results are written ([`crate::wire`], [`crate::table`]). [`in_order`] runs the work on
//! scoped threads while the calling thread consumes the results in the order of the input, so
//! writing overlaps planning, and the output is the same on one core as on many. Threads run
//! at most [`AHEAD_PER_THREAD`] items per thread ahead of what has been consumed, so a file of
//! thousands of items never holds all its plans in memory.

use std::collections::BTreeMap;
use std::num::NonZeroUsize;
use std::sync::atomic::{AtomicBool, AtomicUsize, Ordering};
use std::sync::mpsc;

/// How far the threads may run ahead of the consumer, per thread: enough that they rarely wait
/// for it, few enough that the results waiting stay small in memory (our choice).
pub const AHEAD_PER_THREAD: usize = 32;

/// The threads to use: the cores the system offers to this process, 1 when it cannot tell.
pub fn available_threads() -> usize {
    std::thread::available_parallelism().map_or(1, NonZeroUsize::get)
}

/// Runs `work` over `items` on `threads` threads (0 counts as 1) and hands `consume` an
/// iterator of the results in input order; returns what `consume` returns. When `consume`
/// returns before the end, the threads stop taking new items. A panic in `work` reaches the
/// caller once the threads have stopped (the iterator ends early then).
pub fn in_order<T, R, F, C, Out>(items: &[T], threads: usize, work: F, consume: C) -> Out
where
    T: Sync,
    R: Send,
    F: Fn(&T) -> R + Sync,
    C: FnOnce(&mut dyn Iterator<Item = R>) -> Out,
{
    let threads = threads.max(1);
    if threads == 1 || items.len() <= 1 {
        return consume(&mut items.iter().map(&work));
    }
    let window = threads * AHEAD_PER_THREAD;
    let claimed = AtomicUsize::new(0);
    let consumed = AtomicUsize::new(0);
    let stop = AtomicBool::new(false);
    let (sender, receiver) = mpsc::channel::<(usize, R)>();
    std::thread::scope(|scope| {
        let mut workers = Vec::new();
        for _ in 0..threads.min(items.len()) {
            let sender = sender.clone();
            let (claimed, consumed, stop, work) = (&claimed, &consumed, &stop, &work);
            workers.push(scope.spawn(move || {
                // A panicking thread stops the others, so none waits on the window for ever.
                let _stops_all_on_panic = StopOnPanic(stop);
                loop {
                    if stop.load(Ordering::Relaxed) {
                        return;
                    }
                    let i = claimed.fetch_add(1, Ordering::Relaxed);
                    let Some(item) = items.get(i) else {
                        return;
                    };
                    // Stay within the window ahead of the consumer.
                    while i >= consumed.load(Ordering::Acquire) + window {
                        if stop.load(Ordering::Relaxed) {
                            return;
                        }
                        std::thread::sleep(std::time::Duration::from_micros(200));
                    }
                    if sender.send((i, work(item))).is_err() {
                        return;
                    }
                }
            }));
        }
        drop(sender);
        let mut waiting: BTreeMap<usize, R> = BTreeMap::new();
        let mut next = 0usize;
        let mut results = std::iter::from_fn(|| {
            if next >= items.len() {
                return None;
            }
            loop {
                if let Some(r) = waiting.remove(&next) {
                    next += 1;
                    consumed.store(next, Ordering::Release);
                    return Some(r);
                }
                // Every thread gone before `next` arrived: one of them panicked; the scope
                // passes the panic on when it ends.
                let (i, r) = receiver.recv().ok()?;
                waiting.insert(i, r);
            }
        });
        let out = consume(&mut results);
        stop.store(true, Ordering::Relaxed);
        // Joined here rather than by the scope, so a panic reaches the caller as it was.
        for worker in workers {
            if let Err(panic) = worker.join() {
                std::panic::resume_unwind(panic);
            }
        }
        out
    })
}

/// Sets the flag when dropped during a panic.
struct StopOnPanic<'a>(&'a AtomicBool);

impl Drop for StopOnPanic<'_> {
    fn drop(&mut self) {
        if std::thread::panicking() {
            self.0.store(true, Ordering::Relaxed);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn check(len: usize, threads: usize) {
        let items: Vec<usize> = (0..len).collect();
        let out: Vec<usize> = in_order(
            &items,
            threads,
            |x| {
                // Uneven work, so threads finish out of order.
                let mut acc = *x;
                for _ in 0..(x % 7) * 1000 {
                    acc = std::hint::black_box(acc);
                }
                acc * 2
            },
            |results| results.collect(),
        );
        assert_eq!(
            out,
            (0..len).map(|x| x * 2).collect::<Vec<_>>(),
            "{len} on {threads}"
        );
    }

    #[test]
    fn results_come_in_input_order() {
        for (len, threads) in [
            (0, 2),
            (1, 2),
            (5, 1),
            (5, 0),
            (63, 2),
            (64, 2),
            (65, 2),
            (1000, 3),
            (200, 8),
        ] {
            check(len, threads);
        }
    }

    #[test]
    fn threads_stay_within_the_window_and_stop_when_the_consumer_does() {
        let items: Vec<u32> = (0..10_000).collect();
        let done = AtomicUsize::new(0);
        let first: Vec<u32> = in_order(
            &items,
            2,
            |x| {
                done.fetch_add(1, Ordering::Relaxed);
                *x
            },
            |results| {
                let first = results.take(3).collect();
                std::thread::sleep(std::time::Duration::from_millis(50));
                // Three consumed: the threads may be at most the window ahead of that.
                assert!(done.load(Ordering::Relaxed) <= 3 + 2 * AHEAD_PER_THREAD + 2);
                first
            },
        );
        assert_eq!(first, vec![0, 1, 2]);
        assert!(done.load(Ordering::Relaxed) < 10_000);
    }

    #[test]
    #[should_panic(expected = "item 7")]
    fn a_panic_reaches_the_caller() {
        // More items than the window: the other thread must not wait for ever.
        let items: Vec<u32> = (0..1000).collect();
        let _: Vec<u32> = in_order(
            &items,
            2,
            |x| {
                assert_ne!(*x, 7, "item 7");
                *x
            },
            |results| results.collect(),
        );
    }
}
