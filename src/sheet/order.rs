//! Sorting through one routine.
//!
//! The standard library's sort is generic: every element type and
//! comparison sorted with it adds a copy of the sorting code to the page's
//! module (about 4 KB each). The sheet sorts a few lists of at most a few
//! thousand lines, so all of them sort indices here, with the comparison
//! behind a reference, by a plain merge sort: one small copy (the standard
//! library's one copy was 4.4 KB of the module, most of it paths for long
//! or nearly sorted slices that these lists do not need).

use std::cmp::Ordering;

/// The indices `0..n` in the order `cmp` puts them. Stable: indices that
/// compare equal keep their order. A bottom-up merge sort: runs of 1, 2,
/// 4… merged pairwise between two buffers, n log n comparisons at most.
pub fn order_by(n: usize, cmp: &dyn Fn(usize, usize) -> Ordering) -> Vec<usize> {
    let mut order: Vec<usize> = (0..n).collect();
    let mut merged = vec![0; n];
    let mut run = 1;
    while run < n {
        let mut start = 0;
        while start < n {
            let mid = (start + run).min(n);
            let end = (start + 2 * run).min(n);
            let (mut i, mut j) = (start, mid);
            for slot in &mut merged[start..end] {
                // The right run's next goes first only if it is less: ties
                // keep the left's first, so equal indices keep their order.
                if j < end && (i == mid || cmp(order[j], order[i]) == Ordering::Less) {
                    *slot = order[j];
                    j += 1;
                } else {
                    *slot = order[i];
                    i += 1;
                }
            }
            start = end;
        }
        std::mem::swap(&mut order, &mut merged);
        run *= 2;
    }
    order
}

/// `items` in the order `cmp` puts them (stable).
pub fn sorted_by<T>(items: Vec<T>, cmp: &dyn Fn(&T, &T) -> Ordering) -> Vec<T> {
    let order = order_by(items.len(), &|a, b| cmp(&items[a], &items[b]));
    let mut slots: Vec<Option<T>> = items.into_iter().map(Some).collect();
    order.into_iter().filter_map(|i| slots[i].take()).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sorts_like_the_standard_library_and_keeps_ties_in_order() {
        // The reference is `slice::sort_by`, documented as stable.
        let items: Vec<(u8, usize)> = [3u8, 1, 2, 1, 3, 0, 2, 1].iter().enumerate().map(|(i, &k)| (k, i)).collect();
        let mut expected = items.clone();
        expected.sort_by_key(|a| a.0);
        assert_eq!(sorted_by(items.clone(), &|a, b| a.0.cmp(&b.0)), expected);
        expected.sort_by_key(|a| std::cmp::Reverse(a.0));
        assert_eq!(sorted_by(items, &|a, b| b.0.cmp(&a.0)), expected);
        assert_eq!(order_by(4, &|a, b| (a % 2).cmp(&(b % 2))), vec![0, 2, 1, 3]);
        assert!(sorted_by(Vec::<u8>::new(), &|a, b| a.cmp(b)).is_empty());
    }

    #[test]
    fn orders_every_short_list_and_long_ones_as_the_standard_librarys_stable_sort_does() {
        // The reference is `slice::sort_by` (stable, documented): every
        // list of up to 8 keys out of 3 (ties everywhere), then longer
        // lists of pseudo-random keys (xorshift) with few and with many
        // distinct keys, lengths around the powers of two the runs double
        // through. Each key is compared with its index, so a tie broken the
        // wrong way changes the answer.
        let check = |keys: &[u32]| {
            let mut expected: Vec<usize> = (0..keys.len()).collect();
            expected.sort_by(|&a, &b| keys[a].cmp(&keys[b]));
            assert_eq!(order_by(keys.len(), &|a, b| keys[a].cmp(&keys[b])), expected, "{keys:?}");
        };
        let mut lists = 0;
        for len in 0..=8u32 {
            for code in 0..3u32.pow(len) {
                let keys: Vec<u32> = (0..len).map(|k| code / 3u32.pow(k) % 3).collect();
                check(&keys);
                lists += 1;
            }
        }
        let mut x: u64 = 0x9e37_79b9_7f4a_7c15;
        let mut next = || {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            x
        };
        for len in [31, 32, 33, 255, 256, 257, 1000, 2047, 2048, 2049, 5000] {
            for distinct in [2, 10, 1 << 20] {
                let keys: Vec<u32> = (0..len).map(|_| (next() % distinct) as u32).collect();
                check(&keys);
                lists += 1;
            }
        }
        // Already in order, and in reverse.
        check(&(0..3000).collect::<Vec<_>>());
        check(&(0..3000).rev().collect::<Vec<_>>());
        assert_eq!(lists, (3u32.pow(9) - 1) / 2 + 33);
    }
}
