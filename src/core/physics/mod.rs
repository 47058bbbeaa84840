//! Physics: the viewing geometry, optics, turbulence, the four limits, the target criteria, and
//! light (the sun, daylight, exposure and signal).
//! Imports nothing else of the core.

pub mod chain;
pub mod earth;
pub mod engine;
pub mod geometry;
pub mod light;
pub mod optics;
pub mod roots;
pub mod target;
pub mod turbulence;

/// Sorts a short slice so that `before(a, b)` never holds for a later `a` and an earlier `b`,
/// keeping the order of equal items (an insertion sort: the slices sorted here hold a handful to
/// a few dozen items, and the standard library's sort costs the page some kilobytes of code).
pub(crate) fn sort_short<T: Copy>(items: &mut [T], before: impl Fn(&T, &T) -> bool) {
    for i in 1..items.len() {
        let mut j = i;
        while j > 0 && before(&items[j], &items[j - 1]) {
            items.swap(j, j - 1);
            j -= 1;
        }
    }
}

#[cfg(test)]
mod tests {
    #[test]
    fn sort_short_matches_the_standard_stable_sort() {
        // Pairs sorted by their first item only, so that stability shows in the second.
        let mut seed = 7u64;
        for len in 0..40 {
            let items: Vec<(u8, usize)> = (0..len)
                .map(|i| {
                    seed = seed.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
                    ((seed >> 60) as u8, i)
                })
                .collect();
            let mut ours = items.clone();
            super::sort_short(&mut ours, |a, b| a.0 < b.0);
            let mut standard = items;
            standard.sort_by_key(|p| p.0);
            assert_eq!(ours, standard);
        }
    }
}
