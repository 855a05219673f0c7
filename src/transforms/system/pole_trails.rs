//! Root trails: the roots of a family of polynomials, matched from one
//! parameter value to the next so that each trail is a continuous path.
//!
//! Method: at each step the roots of the new value are assigned to the trails
//! by minimising the total distance from each trail's predicted position (the
//! linear extrapolation 2·r₋₁ − r₋₂ from its last two points, or its last
//! point when it has one) to the root given it: the assignment problem, solved
//! exactly by the Hungarian method with potentials (Kuhn 1955, Munkres 1957;
//! the O(n³) shortest-augmenting-path form, from memory) up to
//! [`EXACT_UP_TO`] trails, greedily (closest pairs first) beyond. A trail
//! with no root at a step (the degree dropped) is `None` there and resumes from
//! its last point when a root returns; a root with no trail starts a new one
//! (`None` before it).
//!
//! ```
//! use residuary::transforms::system::pole_trails::Trails;
//! use residuary::C;
//! // Roots ±1 then ±1.1: matched by distance, each trail keeps its sign (by hand).
//! let mut t = Trails::default();
//! t.push(&[C::new(1.0, 0.0), C::new(-1.0, 0.0)]);
//! t.push(&[C::new(-1.1, 0.0), C::new(1.1, 0.0)]);
//! assert_eq!(t.trails[0], vec![Some(C::new(1.0, 0.0)), Some(C::new(1.1, 0.0))]);
//! assert_eq!(t.trails[1], vec![Some(C::new(-1.0, 0.0)), Some(C::new(-1.1, 0.0))]);
//! ```

use crate::C;

/// The most trails matched by the exact assignment; more are matched greedily.
pub const EXACT_UP_TO: usize = 40;

/// Trails built step by step.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Trails {
    /// One list per trail, one entry per step so far.
    pub trails: Vec<Vec<Option<C>>>,
    steps: usize,
}

impl Trails {
    /// Where each trail is expected next: the linear prediction, its last point, or its last known one.
    fn predicted(&self) -> Vec<C> {
        self.trails
            .iter()
            .map(|t| {
                let n = t.len();
                match (n.checked_sub(1).and_then(|i| t[i]), n.checked_sub(2).and_then(|i| t[i])) {
                    (Some(a), Some(b)) => 2.0 * a - b,
                    (Some(a), None) => a,
                    _ => t.iter().rev().flatten().next().copied().unwrap_or(C::new(0.0, 0.0)),
                }
            })
            .collect()
    }

    /// Add the roots of the next step (each root once per multiplicity).
    pub fn push(&mut self, roots: &[C]) {
        let guess = self.predicted();
        let n = guess.len().max(roots.len());
        let cost = |i: usize, j: usize| -> f64 {
            if i < guess.len() && j < roots.len() {
                let d = (guess[i] - roots[j]).norm();
                if d.is_finite() {
                    d
                } else {
                    1e300
                }
            } else {
                0.0
            }
        };
        let of_trail = if n <= EXACT_UP_TO { hungarian(n, &cost) } else { greedy(n, &cost) };
        for (i, trail) in self.trails.iter_mut().enumerate() {
            let j = of_trail[i];
            trail.push((j < roots.len()).then(|| roots[j]));
        }
        // Roots left over start new trails.
        let used: Vec<usize> = of_trail[..self.trails.len()].to_vec();
        for (j, &r) in roots.iter().enumerate() {
            if !used.contains(&j) {
                let mut t = vec![None; self.steps];
                t.push(Some(r));
                self.trails.push(t);
            }
        }
        self.steps += 1;
    }
}

/// The assignment row → column minimising the total cost of an n × n matrix (Hungarian method with
/// potentials, O(n³)); returns the column of each row.
fn hungarian(n: usize, cost: &dyn Fn(usize, usize) -> f64) -> Vec<usize> {
    // 1-based arrays, index 0 the virtual start column.
    let (mut u, mut v) = (vec![0.0f64; n + 1], vec![0.0f64; n + 1]);
    let mut row_of = vec![0usize; n + 1];
    let mut way = vec![0usize; n + 1];
    for i in 1..=n {
        row_of[0] = i;
        let mut j0 = 0;
        let mut min = vec![f64::INFINITY; n + 1];
        let mut used = vec![false; n + 1];
        loop {
            used[j0] = true;
            let i0 = row_of[j0];
            let (mut delta, mut j1) = (f64::INFINITY, 0);
            for j in 1..=n {
                if !used[j] {
                    let c = cost(i0 - 1, j - 1) - u[i0] - v[j];
                    if c < min[j] {
                        min[j] = c;
                        way[j] = j0;
                    }
                    if min[j] < delta {
                        delta = min[j];
                        j1 = j;
                    }
                }
            }
            if j1 == 0 {
                // Only with non-finite costs: take any free column.
                j1 = (1..=n).find(|&j| !used[j]).unwrap_or(1);
                delta = 0.0;
            }
            for j in 0..=n {
                if used[j] {
                    u[row_of[j]] += delta;
                    v[j] -= delta;
                } else {
                    min[j] -= delta;
                }
            }
            j0 = j1;
            if row_of[j0] == 0 {
                break;
            }
        }
        loop {
            let j1 = way[j0];
            row_of[j0] = row_of[j1];
            j0 = j1;
            if j0 == 0 {
                break;
            }
        }
    }
    let mut col_of = vec![0usize; n];
    for j in 1..=n {
        if row_of[j] > 0 {
            col_of[row_of[j] - 1] = j - 1;
        }
    }
    col_of
}

/// Closest pairs first.
fn greedy(n: usize, cost: &dyn Fn(usize, usize) -> f64) -> Vec<usize> {
    let mut pairs: Vec<(f64, usize, usize)> = (0..n).flat_map(|i| (0..n).map(move |j| (i, j))).map(|(i, j)| (cost(i, j), i, j)).collect();
    pairs.sort_by(|a, b| a.0.total_cmp(&b.0));
    let (mut col_of, mut taken) = (vec![usize::MAX; n], vec![false; n]);
    for (_, i, j) in pairs {
        if col_of[i] == usize::MAX && !taken[j] {
            col_of[i] = j;
            taken[j] = true;
        }
    }
    col_of
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_assignment_is_the_cheapest_of_all_permutations() {
        // Brute force over the 4! = 24 permutations (by definition of the assignment problem).
        let m = [[4.0, 1.0, 3.0, 2.0], [2.0, 0.0, 5.0, 3.0], [3.0, 2.0, 2.0, 1.0], [1.0, 4.0, 2.0, 6.0]];
        let cost = |i: usize, j: usize| m[i][j];
        let got = hungarian(4, &cost);
        let total = |p: &[usize]| p.iter().enumerate().map(|(i, &j)| m[i][j]).sum::<f64>();
        let mut best = f64::INFINITY;
        let mut p = [0usize, 1, 2, 3];
        fn perms(k: usize, p: &mut [usize; 4], f: &mut dyn FnMut(&[usize])) {
            if k == 4 {
                f(p);
                return;
            }
            for i in k..4 {
                p.swap(k, i);
                perms(k + 1, p, f);
                p.swap(k, i);
            }
        }
        perms(0, &mut p, &mut |q| best = best.min(total(q)));
        assert_eq!(total(&got), best);
    }

    #[test]
    fn a_dropped_root_leaves_a_gap() {
        let mut t = Trails::default();
        t.push(&[C::new(1.0, 0.0), C::new(-5.0, 0.0)]);
        t.push(&[C::new(1.1, 0.0)]);
        t.push(&[C::new(1.2, 0.0), C::new(-4.0, 0.0)]);
        assert_eq!(t.trails[1], vec![Some(C::new(-5.0, 0.0)), None, Some(C::new(-4.0, 0.0))]);
        assert_eq!(t.trails.len(), 2);
    }
}
