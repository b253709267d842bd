//! Sorting through one routine.
//!
//! The standard library's sort is generic: every element type and
//! comparison sorted with it adds a copy of the sorting code to the page's
//! module (about 4 KB each). The sheet sorts a few short lists, so all of
//! them sort indices here, with the comparison behind a reference: one copy.

use std::cmp::Ordering;

/// The indices `0..n` in the order `cmp` puts them. Stable: indices that
/// compare equal keep their order.
pub fn order_by(n: usize, cmp: &dyn Fn(usize, usize) -> Ordering) -> Vec<usize> {
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&a, &b| cmp(a, b));
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
}
