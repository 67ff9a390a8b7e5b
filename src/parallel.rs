//! Work over the analysis stations on all cores: contiguous blocks of indices, one scoped thread
//! each, results returned in index order, so that what is computed, and the order in which it
//! is folded together, does not depend on the number of threads.
//!
//! The number of threads is the machine's available parallelism unless a program sets it with
//! [`set_threads`] (the command line does, from `LAYLOFT_THREADS`); one thread computes the same
//! numbers, for timing and for comparing outputs.

use std::ops::Range;
use std::sync::atomic::{AtomicUsize, Ordering};
use std::sync::mpsc;

/// The number of worker threads asked for; 0: the machine's available parallelism.
static THREADS: AtomicUsize = AtomicUsize::new(0);

/// Sets the number of worker threads for the stations' work (sections, stress recovery); 0
/// returns to the machine's available parallelism. The results do not depend on it.
pub fn set_threads(n: usize) {
    THREADS.store(n, Ordering::Relaxed);
}

/// The number of worker threads: as set by [`set_threads`], otherwise the machine's available
/// parallelism (1 when unknown).
pub(crate) fn threads() -> usize {
    match THREADS.load(Ordering::Relaxed) {
        0 => std::thread::available_parallelism().map_or(1, |n| n.get()),
        n => n,
    }
}

/// `0..n` cut into at most `parts` contiguous blocks whose lengths differ by at most one, in
/// order; none is empty.
pub(crate) fn blocks(n: usize, parts: usize) -> Vec<Range<usize>> {
    let parts = parts.clamp(1, n.max(1));
    let (base, extra) = (n / parts, n % parts);
    let mut start = 0;
    (0..parts)
        .map(|k| {
            let len = base + usize::from(k < extra);
            let r = start..start + len;
            start += len;
            r
        })
        .filter(|r| !r.is_empty())
        .collect()
}

/// Runs `run(block, tick)` for contiguous blocks of `0..n` on up to [`threads`] scoped
/// threads and returns the blocks' results in order. `run` calls `tick()` once per index done;
/// the calling thread turns the ticks into `progress(done)` calls. A panic in a worker is
/// resumed on the calling thread.
pub(crate) fn in_blocks<R: Send>(
    n: usize,
    run: impl Fn(Range<usize>, &dyn Fn()) -> R + Sync,
    progress: &mut dyn FnMut(usize),
) -> Vec<R> {
    let ranges = blocks(n, threads());
    if ranges.len() <= 1 {
        let done = std::cell::Cell::new(0usize);
        let progress = std::cell::RefCell::new(progress);
        let tick = || {
            done.set(done.get() + 1);
            (progress.borrow_mut())(done.get());
        };
        return ranges.into_iter().map(|r| run(r, &tick)).collect();
    }
    let (tx, rx) = mpsc::channel::<()>();
    std::thread::scope(|s| {
        let run = &run;
        let handles: Vec<_> = ranges
            .into_iter()
            .map(|r| {
                let tx = tx.clone();
                s.spawn(move || {
                    run(r, &|| {
                        // The receiver lives until every worker has finished.
                        let _ = tx.send(());
                    })
                })
            })
            .collect();
        drop(tx);
        let mut done = 0;
        while rx.recv().is_ok() {
            done += 1;
            progress(done);
        }
        handles
            .into_iter()
            .map(|h| h.join().unwrap_or_else(|e| std::panic::resume_unwind(e)))
            .collect()
    })
}

/// `[f(0), f(1), ..., f(n - 1)]`, the elements made on up to `threads` scoped threads, each
/// writing a contiguous block in place: a large table's memory is first touched (and its
/// pages mapped) by the threads that fill it, not by one. The same vector for any number of
/// threads.
pub(crate) fn filled<T: Send>(n: usize, threads: usize, f: impl Fn(usize) -> T + Sync) -> Vec<T> {
    let mut v: Vec<T> = Vec::with_capacity(n);
    let ranges = blocks(n, threads);
    if ranges.len() <= 1 {
        v.extend((0..n).map(&f));
        return v;
    }
    let mut spare = &mut v.spare_capacity_mut()[..n];
    std::thread::scope(|scope| {
        for r in ranges {
            let (block, rest) = std::mem::take(&mut spare).split_at_mut(r.len());
            spare = rest;
            let f = &f;
            scope.spawn(move || {
                for (slot, i) in block.iter_mut().zip(r) {
                    slot.write(f(i));
                }
            });
        }
    });
    // SAFETY: the blocks cover `0..n` (see `blocks`) and each thread wrote every slot of its
    // block; `scope` returns only when all have finished, and a panic in one is resumed here
    // before this line, so no slot is left unwritten.
    unsafe { v.set_len(n) };
    v
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_vector_filled_on_many_threads_is_the_one_filled_on_one() {
        for n in [0, 1, 2, 3, 7, 1000, 4097] {
            let one: Vec<(usize, String)> = filled(n, 1, |i| (i * i, format!("{i}")));
            for threads in [2, 3, 8, 5000] {
                let many = filled(n, threads, |i| (i * i, format!("{i}")));
                assert_eq!(many, one, "{n} elements on {threads} threads");
            }
            assert_eq!(one.len(), n);
        }
    }

    #[test]
    fn blocks_cover_the_range_in_order_without_gaps() {
        for n in 0..40 {
            for parts in 1..9 {
                let b = blocks(n, parts);
                let flat: Vec<usize> = b.iter().flat_map(|r| r.clone()).collect();
                assert_eq!(flat, (0..n).collect::<Vec<_>>(), "n {n}, parts {parts}");
                assert!(b.len() <= parts.max(1));
                let lens: Vec<usize> = b.iter().map(|r| r.len()).collect();
                if let (Some(lo), Some(hi)) = (lens.iter().min(), lens.iter().max()) {
                    assert!(hi - lo <= 1, "{lens:?}");
                }
            }
        }
    }

    #[test]
    fn results_come_back_in_block_order_with_every_tick_counted() {
        let mut ticks = Vec::new();
        let out = in_blocks(
            17,
            |r, tick| {
                r.clone().for_each(|_| tick());
                r.collect::<Vec<_>>()
            },
            &mut |d| ticks.push(d),
        );
        let flat: Vec<usize> = out.into_iter().flatten().collect();
        assert_eq!(flat, (0..17).collect::<Vec<_>>());
        assert_eq!(ticks.last(), Some(&17));
    }
}
