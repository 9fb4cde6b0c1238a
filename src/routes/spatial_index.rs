//! A k-d tree over system positions (kiddo's immutable tree), with the
//! three queries the routes module needs: the `k` nearest systems, every
//! system within a distance, and every pair within a distance.
//!
//! kiddo compares squared distances; here every distance handed back is
//! recomputed from the coordinates with [`distance_ly`], and the radius
//! test is `distance_ly <= radius_ly` on that value, so the answer does
//! not depend on whether the tree's own comparison is inclusive.

use kiddo::{ImmutableKdTree, SquaredEuclidean};
use rayon::prelude::*;
use std::num::NonZeroUsize;

/// Straight-line distance between two points, light years.
#[inline]
pub fn distance_ly(a: &[f64; 3], b: &[f64; 3]) -> f64 {
    let dx = a[0] - b[0];
    let dy = a[1] - b[1];
    let dz = a[2] - b[2];
    (dx * dx + dy * dy + dz * dz).sqrt()
}

/// Points queried in one parallel task.
const CHUNK: usize = 2048;

/// The squared search radius handed to the tree: a hair wider than the
/// exact radius, so that points at exactly `radius_ly` are not lost to
/// rounding; the exact test is applied afterwards.
#[inline]
fn widened_r2(radius_ly: f64) -> f64 {
    let r = radius_ly * (1.0 + 1e-9);
    r * r
}

/// A k-d tree over a fixed list of points (light years).
pub struct SpatialIndex<'a> {
    points: &'a [[f64; 3]],
    tree: Option<ImmutableKdTree<f64, 3>>,
}

impl std::fmt::Debug for SpatialIndex<'_> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("SpatialIndex")
            .field("points", &self.points.len())
            .finish()
    }
}

impl<'a> SpatialIndex<'a> {
    /// Builds the tree (in parallel). Item `i` of every answer is
    /// `points[i]`.
    pub fn new(points: &'a [[f64; 3]]) -> SpatialIndex<'a> {
        let tree = if points.is_empty() || points.len() > u32::MAX as usize {
            None
        } else {
            ImmutableKdTree::<f64, 3>::new_from_slice_parallel(points).ok()
        };
        SpatialIndex { points, tree }
    }

    /// The indexed points.
    pub fn points(&self) -> &'a [[f64; 3]] {
        self.points
    }

    /// Calls `visit(j, distance_ly)` for every point `j != i` with
    /// `distance_ly <= radius_ly` from point `i`, in no particular order.
    pub fn visit_within(&self, i: usize, radius_ly: f64, mut visit: impl FnMut(usize, f64)) {
        let Some(tree) = &self.tree else { return };
        let p = &self.points[i];
        let points = self.points;
        tree.query(p)
            .within::<SquaredEuclidean<f64>>(widened_r2(radius_ly))
            .unsorted()
            .visit(|res| {
                let j = res.item as usize;
                if j != i {
                    let d = distance_ly(p, &points[j]);
                    if d <= radius_ly {
                        visit(j, d);
                    }
                }
            });
    }

    /// For every point (in order), up to `k` other points sorted by
    /// (distance, index), optionally only those within `within_ly`.
    /// Runs in parallel; the result does not depend on the thread count.
    pub fn nearest(&self, k: Option<usize>, within_ly: Option<f64>) -> Vec<Vec<(u32, f64)>> {
        let n = self.points.len();
        (0..n)
            .into_par_iter()
            .with_min_len(CHUNK)
            .map(|i| self.nearest_of(i, k, within_ly))
            .collect()
    }

    /// The neighbours of one point, as in [`SpatialIndex::nearest`].
    pub fn nearest_of(
        &self,
        i: usize,
        k: Option<usize>,
        within_ly: Option<f64>,
    ) -> Vec<(u32, f64)> {
        let Some(tree) = &self.tree else {
            return Vec::new();
        };
        let p = &self.points[i];
        let mut out: Vec<(u32, f64)> = match (k, within_ly) {
            (_, Some(r)) => {
                let mut v = Vec::new();
                self.visit_within(i, r, |j, d| v.push((j as u32, d)));
                v
            }
            (Some(0), None) => Vec::new(),
            (Some(k), None) => {
                // Ask for k + 2 (the point itself comes back, and one more
                // shows whether the k-th distance is tied), doubling until
                // ties at the k-th distance are settled by index, not by
                // the tree's internal order.
                let mut want = k.saturating_add(2).min(self.points.len());
                loop {
                    let Some(nz) = NonZeroUsize::new(want) else {
                        return Vec::new();
                    };
                    let res = tree
                        .query(p)
                        .nearest_n::<SquaredEuclidean<f64>>(nz)
                        .execute();
                    let mut v: Vec<(u32, f64)> = res
                        .iter()
                        .map(|r| r.item)
                        .filter(|&j| j as usize != i)
                        .map(|j| (j, distance_ly(p, &self.points[j as usize])))
                        .collect();
                    sort_neighbours(&mut v);
                    // Done when every point is in, or the last one kept is
                    // strictly closer than the farthest one returned.
                    let complete =
                        want >= self.points.len() || (v.len() > k && v[v.len() - 1].1 > v[k - 1].1);
                    if complete {
                        break v;
                    }
                    want = want.saturating_mul(2).min(self.points.len());
                }
            }
            (None, None) => Vec::new(),
        };
        sort_neighbours(&mut out);
        if let Some(k) = k {
            out.truncate(k);
        }
        out
    }

    /// Every unordered pair `(i, j)`, `i < j`, with `distance_ly <= radius_ly`,
    /// sorted by `(i, j)`, that `keep(i, j)` accepts. Runs in parallel; the
    /// result does not depend on the thread count.
    pub fn pairs_within(
        &self,
        radius_ly: f64,
        keep: &(dyn Fn(usize, usize) -> bool + Sync),
    ) -> Vec<(u32, u32, f64)> {
        let n = self.points.len();
        let chunks: Vec<Vec<(u32, u32, f64)>> = (0..n.div_ceil(CHUNK))
            .into_par_iter()
            .map(|c| {
                let mut out = Vec::new();
                let mut buf: Vec<(u32, f64)> = Vec::new();
                for i in c * CHUNK..((c + 1) * CHUNK).min(n) {
                    buf.clear();
                    self.visit_within(i, radius_ly, |j, d| {
                        if j > i && keep(i, j) {
                            buf.push((j as u32, d));
                        }
                    });
                    buf.sort_unstable_by_key(|x| x.0);
                    out.extend(buf.iter().map(|&(j, d)| (i as u32, j, d)));
                }
                out
            })
            .collect();
        let total = chunks.iter().map(Vec::len).sum();
        let mut all = Vec::with_capacity(total);
        for c in chunks {
            all.extend_from_slice(&c);
        }
        all
    }
}

/// Sorts neighbours by (distance, index).
fn sort_neighbours(v: &mut [(u32, f64)]) {
    v.sort_unstable_by(|a, b| a.1.total_cmp(&b.1).then(a.0.cmp(&b.0)));
}
