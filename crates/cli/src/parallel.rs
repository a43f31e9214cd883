//! Work on every core, results in input order: the command line plans many items at once.
//!
//! Kept apart from: what the work is (the caller's closure; here, planning an item) and how
//! results are written ([`crate::wire`], [`crate::table`]). [`InOrder`] hands out results one
//! at a time in the order of the input, computing them a batch at a time on scoped threads, so
//! the output is the same on one core as on many, and at most one batch of results is held in
//! memory (a file of thousands of items never holds all its plans).

use std::collections::VecDeque;
use std::num::NonZeroUsize;
use std::sync::atomic::{AtomicUsize, Ordering};

/// Results per thread in one batch: enough that the threads rarely wait for the slowest item of
/// a batch, few enough that a batch's plans stay small in memory (our choice).
const BATCH_PER_THREAD: usize = 32;

/// The threads to use: the cores the system offers to this process, 1 when it cannot tell.
pub fn available_threads() -> usize {
    std::thread::available_parallelism().map_or(1, NonZeroUsize::get)
}

/// An iterator of `work(item)` over `items`, in their order, computed on `threads` threads a
/// batch at a time.
pub struct InOrder<'a, T, R, F> {
    items: &'a [T],
    next: usize,
    threads: usize,
    work: F,
    ready: VecDeque<R>,
}

impl<'a, T, R, F> InOrder<'a, T, R, F>
where
    T: Sync,
    R: Send,
    F: Fn(&T) -> R + Sync,
{
    /// `threads` of 0 counts as 1.
    pub fn new(items: &'a [T], threads: usize, work: F) -> Self {
        InOrder {
            items,
            next: 0,
            threads: threads.max(1),
            work,
            ready: VecDeque::new(),
        }
    }

    fn fill(&mut self) {
        let end = (self.next + self.threads * BATCH_PER_THREAD).min(self.items.len());
        let batch = &self.items[self.next..end];
        self.next = end;
        self.ready
            .extend(map_on_threads(batch, self.threads, &self.work));
    }
}

impl<T, R, F> Iterator for InOrder<'_, T, R, F>
where
    T: Sync,
    R: Send,
    F: Fn(&T) -> R + Sync,
{
    type Item = R;

    fn next(&mut self) -> Option<R> {
        if self.ready.is_empty() && self.next < self.items.len() {
            self.fill();
        }
        self.ready.pop_front()
    }
}

/// `work` over `items` on up to `threads` scoped threads, each taking the next unclaimed item
/// (so a slow item does not hold up a fixed share), results in input order. A panic in `work`
/// is passed on to the caller, as it would be without threads.
fn map_on_threads<T, R, F>(items: &[T], threads: usize, work: &F) -> Vec<R>
where
    T: Sync,
    R: Send,
    F: Fn(&T) -> R + Sync,
{
    if threads <= 1 || items.len() <= 1 {
        return items.iter().map(work).collect();
    }
    let claimed = AtomicUsize::new(0);
    let mut slots: Vec<Option<R>> = std::iter::repeat_with(|| None).take(items.len()).collect();
    std::thread::scope(|scope| {
        let workers: Vec<_> = (0..threads.min(items.len()))
            .map(|_| {
                scope.spawn(|| {
                    let mut done = Vec::new();
                    loop {
                        let i = claimed.fetch_add(1, Ordering::Relaxed);
                        let Some(item) = items.get(i) else {
                            return done;
                        };
                        done.push((i, work(item)));
                    }
                })
            })
            .collect();
        for worker in workers {
            match worker.join() {
                Ok(done) => {
                    for (i, r) in done {
                        slots[i] = Some(r);
                    }
                }
                Err(panic) => std::panic::resume_unwind(panic),
            }
        }
    });
    slots
        .into_iter()
        .map(|r| r.expect("every index below the length is claimed exactly once"))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn check(len: usize, threads: usize) {
        let items: Vec<usize> = (0..len).collect();
        let out: Vec<usize> = InOrder::new(&items, threads, |x| {
            // Uneven work, so threads finish out of order.
            let mut acc = *x;
            for _ in 0..(x % 7) * 1000 {
                acc = std::hint::black_box(acc);
            }
            acc * 2
        })
        .collect();
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
    fn batches_bound_what_is_held() {
        let items: Vec<u32> = (0..500).collect();
        let mut it = InOrder::new(&items, 2, |x| *x);
        assert_eq!(it.next(), Some(0));
        assert_eq!(it.ready.len(), 2 * BATCH_PER_THREAD - 1);
        assert_eq!(it.count(), 499);
    }

    #[test]
    #[should_panic(expected = "item 7")]
    fn a_panic_reaches_the_caller() {
        let items: Vec<u32> = (0..20).collect();
        let _: Vec<u32> = InOrder::new(&items, 2, |x| {
            assert_ne!(*x, 7, "item 7");
            *x
        })
        .collect();
    }
}
