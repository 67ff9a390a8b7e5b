//! Independent pieces of work on all cores: the parts of a set checked and encoded, the cores'
//! casting moulds built. Each worker takes the next piece as it frees (a set's parts differ a
//! hundredfold in size, so fixed blocks would leave a core idle), and the results come back in
//! order. What each piece gets does not depend on the number of threads; with an error, the one
//! returned is that of the first failing piece in order, as one thread working through the list
//! would find it.

use std::sync::atomic::{AtomicUsize, Ordering};
use std::sync::mpsc;

/// `run(i)` for every `i` in `0..n` on up to [`crate::parallel::threads`] scoped threads, the
/// results in index order. `done(i, &result)` is called on the calling thread as each finishes
/// (in the order they finish). After a failure at `i`, indices above `i` not yet started are
/// skipped (their result is `None`); every index below it is still run, so the first failure in
/// order is always found.
pub(crate) fn each_part<T: Send, E: Send>(
    n: usize,
    run: impl Fn(usize) -> Result<T, E> + Sync,
    done: &mut dyn FnMut(usize, &Result<T, E>),
) -> Vec<Option<Result<T, E>>> {
    let threads = crate::parallel::threads().clamp(1, n.max(1));
    let mut out: Vec<Option<Result<T, E>>> = (0..n).map(|_| None).collect();
    if threads == 1 {
        for (i, slot) in out.iter_mut().enumerate() {
            let r = run(i);
            done(i, &r);
            let failed = r.is_err();
            *slot = Some(r);
            if failed {
                break;
            }
        }
        return out;
    }
    let next = AtomicUsize::new(0);
    let failed_at = AtomicUsize::new(usize::MAX);
    let (tx, rx) = mpsc::channel::<(usize, Result<T, E>)>();
    std::thread::scope(|s| {
        for _ in 0..threads {
            let tx = tx.clone();
            let (run, next, failed_at) = (&run, &next, &failed_at);
            s.spawn(move || {
                loop {
                    let i = next.fetch_add(1, Ordering::Relaxed);
                    if i >= n || i > failed_at.load(Ordering::Relaxed) {
                        break;
                    }
                    let r = run(i);
                    if r.is_err() {
                        failed_at.fetch_min(i, Ordering::Relaxed);
                    }
                    // The receiver lives until every worker has finished.
                    if tx.send((i, r)).is_err() {
                        break;
                    }
                }
            });
        }
        drop(tx);
        while let Ok((i, r)) = rx.recv() {
            done(i, &r);
            out[i] = Some(r);
        }
    });
    out
}

/// The results of [`each_part`] in order, or the first error in order.
pub(crate) fn in_order<T, E>(results: Vec<Option<Result<T, E>>>) -> Result<Vec<T>, E> {
    let mut out = Vec::with_capacity(results.len());
    for r in results {
        match r {
            Some(Ok(v)) => out.push(v),
            Some(Err(e)) => return Err(e),
            // Skipped only after an earlier failure, which was returned above.
            None => break,
        }
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn results_come_back_in_order_and_the_first_failure_wins() {
        let mut seen = 0;
        let r = each_part(50, |i| Ok::<usize, usize>(i * i), &mut |_, _| seen += 1);
        assert_eq!(seen, 50);
        assert_eq!(in_order(r), Ok((0..50).map(|i| i * i).collect::<Vec<_>>()));
        // Failures at 7 and 30: 7 is reported, whichever thread finds which first.
        let r = each_part(40, |i| if i == 7 || i == 30 { Err(i) } else { Ok(i) }, &mut |_, _| {});
        assert_eq!(in_order(r), Err(7));
    }
}
