//! Label placement: greedy, in priority order, trying eight places around
//! each star and keeping a label only where it overlaps no label already
//! placed, no obstacle (star discs, keep-out boxes) and stays inside the
//! map area. Crowded sheets therefore lose their least important labels
//! instead of shrinking the type. A label also keeps off other stars'
//! markers; where no place around a star is free of them, it may cover
//! the markers of much fainter stars (under [`FAINTER_SHARE`] of its own
//! marker's radius), so a bright star in a crowd keeps its name.
//!
//! # Allocations
//! One hash grid of placed boxes (8 mm cells) and the output.

use std::collections::HashMap;

/// Side of a hash-grid cell, mm.
const CELL_MM: f32 = 8.0;

/// An axis-aligned box on the page, mm (`x0 < x1`, `y0 < y1`, y down).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rect {
    /// Left edge.
    pub x0: f32,
    /// Top edge.
    pub y0: f32,
    /// Right edge.
    pub x1: f32,
    /// Bottom edge.
    pub y1: f32,
}

impl Rect {
    /// A box from its corner and size.
    pub fn new(x: f32, y: f32, w: f32, h: f32) -> Rect {
        Rect {
            x0: x,
            y0: y,
            x1: x + w,
            y1: y + h,
        }
    }

    /// Width, mm.
    pub fn width(&self) -> f32 {
        self.x1 - self.x0
    }

    /// Height, mm.
    pub fn height(&self) -> f32 {
        self.y1 - self.y0
    }

    /// True when the two boxes share interior area.
    pub fn overlaps(&self, o: &Rect) -> bool {
        self.x0 < o.x1 && o.x0 < self.x1 && self.y0 < o.y1 && o.y0 < self.y1
    }

    /// True when `o` lies wholly inside `self`.
    pub fn contains(&self, o: &Rect) -> bool {
        o.x0 >= self.x0 && o.x1 <= self.x1 && o.y0 >= self.y0 && o.y1 <= self.y1
    }

    /// True when the point lies inside (edges included).
    pub fn contains_point(&self, p: [f32; 2]) -> bool {
        p[0] >= self.x0 && p[0] <= self.x1 && p[1] >= self.y0 && p[1] <= self.y1
    }

    /// The box grown by `d` on every side.
    pub fn inflate(&self, d: f32) -> Rect {
        Rect {
            x0: self.x0 - d,
            y0: self.y0 - d,
            x1: self.x1 + d,
            y1: self.y1 + d,
        }
    }
}

/// A label to place: the star it names and the size of its text block.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LabelRequest {
    /// Star centre, mm.
    pub anchor_mm: [f32; 2],
    /// Radius of the star's marker, mm (the label keeps clear of it).
    pub radius_mm: f32,
    /// Text block width, mm.
    pub width_mm: f32,
    /// Text block height, mm.
    pub height_mm: f32,
}

/// A placed label: which request, and its box.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Placed {
    /// Index into the requests.
    pub request: usize,
    /// The text block, mm.
    pub rect: Rect,
}

/// Gap between a star's marker and its label, mm.
const GAP_MM: f32 = 0.6;

/// A label may cover a marker whose radius is under this share of its own
/// star's marker radius when no place free of markers is left.
pub const FAINTER_SHARE: f32 = 0.5;

/// Candidate boxes around an anchor, best first: right, left, above,
/// below, then the four diagonals.
fn candidates(r: &LabelRequest) -> [Rect; 8] {
    let [x, y] = r.anchor_mm;
    let (w, h, d) = (r.width_mm, r.height_mm, r.radius_mm + GAP_MM);
    let diag = d * std::f32::consts::FRAC_1_SQRT_2;
    [
        Rect::new(x + d, y - h / 2.0, w, h),
        Rect::new(x - d - w, y - h / 2.0, w, h),
        Rect::new(x - w / 2.0, y - d - h, w, h),
        Rect::new(x - w / 2.0, y + d, w, h),
        Rect::new(x + diag, y - diag - h, w, h),
        Rect::new(x + diag, y + diag, w, h),
        Rect::new(x - diag - w, y - diag - h, w, h),
        Rect::new(x - diag - w, y + diag, w, h),
    ]
}

/// Boxes in a hash grid of [`CELL_MM`] cells, each with a value (a
/// marker's radius, or nothing).
struct Grid<T = ()> {
    cells: HashMap<(i32, i32), Vec<(Rect, T)>>,
}

impl<T: Copy> Grid<T> {
    fn new() -> Grid<T> {
        Grid {
            cells: HashMap::new(),
        }
    }

    fn cell_range(r: &Rect) -> (i32, i32, i32, i32) {
        (
            (r.x0 / CELL_MM).floor() as i32,
            (r.y0 / CELL_MM).floor() as i32,
            (r.x1 / CELL_MM).floor() as i32,
            (r.y1 / CELL_MM).floor() as i32,
        )
    }

    /// True when `r` overlaps a box whose value `counts`.
    fn hits_where(&self, r: &Rect, counts: impl Fn(T) -> bool) -> bool {
        let (cx0, cy0, cx1, cy1) = Self::cell_range(r);
        for cx in cx0..=cx1 {
            for cy in cy0..=cy1 {
                if let Some(v) = self.cells.get(&(cx, cy))
                    && v.iter().any(|(o, t)| counts(*t) && o.overlaps(r))
                {
                    return true;
                }
            }
        }
        false
    }

    fn insert_with(&mut self, r: Rect, value: T) {
        let (cx0, cy0, cx1, cy1) = Self::cell_range(&r);
        for cx in cx0..=cx1 {
            for cy in cy0..=cy1 {
                self.cells.entry((cx, cy)).or_default().push((r, value));
            }
        }
    }
}

impl Grid {
    fn hits(&self, r: &Rect) -> bool {
        self.hits_where(r, |()| true)
    }

    fn insert(&mut self, r: Rect) {
        self.insert_with(r, ());
    }
}

/// Places labels for `requests` (highest priority first) inside `area`,
/// avoiding each other, the `obstacles` (star discs as boxes, panels) and
/// every star's marker but those of much fainter stars (see the module
/// notes), and keeping at most `budget` labels. Deterministic.
///
/// # Guarantees
/// No two returned boxes overlap; every box lies inside `area`; no box
/// overlaps an obstacle; no box overlaps another star's marker of at least
/// [`FAINTER_SHARE`] times its own star's marker radius.
pub fn place_labels(
    requests: &[LabelRequest],
    obstacles: &[Rect],
    area: Rect,
    budget: usize,
) -> Vec<Placed> {
    place_labels_insisting(requests, 0, obstacles, area, budget)
}

/// As [`place_labels`], but the first `insist` requests (the stars the
/// user asked about, such as a route's ends) may cover other stars'
/// markers when no free place is left around them.
///
/// # Guarantees
/// As [`place_labels`], except that the first `insist` requests' boxes may
/// overlap any other star's marker.
pub fn place_labels_insisting(
    requests: &[LabelRequest],
    insist: usize,
    obstacles: &[Rect],
    area: Rect,
    budget: usize,
) -> Vec<Placed> {
    let mut blocked = Grid::new();
    for o in obstacles {
        blocked.insert(*o);
    }
    // Each star's own marker blocks other labels.
    // Star markers with their radii.
    let mut markers: Grid<f32> = Grid::new();
    for r in requests {
        let [x, y] = r.anchor_mm;
        let d = r.radius_mm;
        markers.insert_with(
            Rect {
                x0: x - d,
                y0: y - d,
                x1: x + d,
                y1: y + d,
            },
            d,
        );
    }
    let mut placed_grid = Grid::new();
    let mut placed = Vec::new();
    for (i, r) in requests.iter().enumerate() {
        if placed.len() >= budget {
            break;
        }
        if !(r.width_mm > 0.0 && r.height_mm > 0.0 && r.anchor_mm.iter().all(|v| v.is_finite())) {
            continue;
        }
        let cands = candidates(r);
        let free = |c: &Rect| area.contains(c) && !placed_grid.hits(c) && !blocked.hits(c);
        // No other star's marker (nor its own: the diagonal places of a
        // large disc touch its box); failing that, none but much fainter
        // stars' markers.
        let clear_of =
            |c: &Rect, min_radius_mm: f32| !markers.hits_where(c, |d| d >= min_radius_mm);
        let found = cands
            .iter()
            .find(|c| free(c) && clear_of(c, 0.0))
            .or_else(|| {
                cands
                    .iter()
                    .find(|c| free(c) && clear_of(c, FAINTER_SHARE * r.radius_mm))
            })
            .or_else(|| {
                (i < insist)
                    .then(|| cands.iter().find(|c| free(c)))
                    .flatten()
            })
            .copied();
        if let Some(rect) = found {
            placed_grid.insert(rect);
            placed.push(Placed { request: i, rect });
        }
    }
    placed
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn a_lone_label_goes_to_the_right() {
        let r = LabelRequest {
            anchor_mm: [50.0, 50.0],
            radius_mm: 1.0,
            width_mm: 10.0,
            height_mm: 3.0,
        };
        let p = place_labels(&[r], &[], Rect::new(0.0, 0.0, 100.0, 100.0), 10);
        assert_eq!(p.len(), 1);
        assert!((p[0].rect.x0 - 51.6).abs() < 1e-4);
    }

    #[test]
    fn the_budget_and_the_area_limit_labels() {
        let r = |x: f32| LabelRequest {
            anchor_mm: [x, 50.0],
            radius_mm: 0.5,
            width_mm: 5.0,
            height_mm: 2.0,
        };
        let reqs: Vec<_> = (0..10).map(|i| r(10.0 + 20.0 * i as f32)).collect();
        let p = place_labels(&reqs, &[], Rect::new(0.0, 0.0, 300.0, 100.0), 3);
        assert_eq!(p.len(), 3);
        // Near the right edge a label moves to the left of its star.
        let p = place_labels(&[r(97.0)], &[], Rect::new(0.0, 0.0, 100.0, 100.0), 3);
        assert!(p[0].rect.x1 <= 97.0);
    }

    #[test]
    fn an_insisted_label_may_cover_neighbouring_stars() {
        // A star ringed by others closer than its label is wide.
        let req = |x: f32, y: f32| LabelRequest {
            anchor_mm: [x, y],
            radius_mm: 0.5,
            width_mm: 8.0,
            height_mm: 3.0,
        };
        let mut reqs = vec![req(50.0, 50.0)];
        for k in 0..16 {
            let a = k as f32 * std::f32::consts::PI / 8.0;
            reqs.push(req(50.0 + 3.0 * a.cos(), 50.0 + 3.0 * a.sin()));
        }
        let area = Rect::new(0.0, 0.0, 100.0, 100.0);
        let plain = place_labels(&reqs, &[], area, 1);
        assert!(plain.iter().all(|p| p.request != 0), "{plain:?}");
        let insisted = place_labels_insisting(&reqs, 1, &[], area, 1);
        assert_eq!(insisted.len(), 1);
        assert_eq!(insisted[0].request, 0);
    }

    #[test]
    fn a_bright_star_in_a_crowd_of_faint_ones_keeps_its_name() {
        // A 3 mm disc ringed by 0.5 mm dots closer than its label is wide:
        // its label covers some dots. Ringed by 2 mm discs (over half its
        // radius) it still gets none, as a faint star among equals.
        let req = |x: f32, y: f32, r: f32| LabelRequest {
            anchor_mm: [x, y],
            radius_mm: r,
            width_mm: 12.0,
            height_mm: 4.0,
        };
        let area = Rect::new(0.0, 0.0, 100.0, 100.0);
        let ring = |r: f32| {
            let mut reqs = vec![req(50.0, 50.0, 3.0)];
            for k in 0..24 {
                let a = k as f32 * std::f32::consts::PI / 12.0;
                reqs.push(req(50.0 + 6.0 * a.cos(), 50.0 + 6.0 * a.sin(), r));
            }
            reqs
        };
        let faint = place_labels(&ring(0.5), &[], area, 1);
        assert_eq!(faint.len(), 1);
        assert_eq!(faint[0].request, 0);
        let equals = place_labels(&ring(2.0), &[], area, 1);
        assert!(equals.iter().all(|p| p.request != 0), "{equals:?}");
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(64))]
        #[test]
        fn placed_labels_never_overlap(
            stars in proptest::collection::vec(
                (0f32..200.0, 0f32..150.0, 0.05f32..2.0, 2f32..25.0, 1.5f32..5.0), 1..300),
            budget in 1usize..400,
        ) {
            let reqs: Vec<LabelRequest> = stars.iter().map(|&(x, y, r, w, h)| LabelRequest {
                anchor_mm: [x, y], radius_mm: r, width_mm: w, height_mm: h,
            }).collect();
            let area = Rect::new(0.0, 0.0, 200.0, 150.0);
            let obstacle = Rect::new(80.0, 60.0, 30.0, 20.0);
            let placed = place_labels(&reqs, &[obstacle], area, budget);
            prop_assert!(placed.len() <= budget);
            for (i, a) in placed.iter().enumerate() {
                prop_assert!(area.contains(&a.rect));
                prop_assert!(!a.rect.overlaps(&obstacle));
                for b in &placed[i + 1..] {
                    prop_assert!(!a.rect.overlaps(&b.rect), "{:?} overlaps {:?}", a, b);
                }
                // No label covers another star's marker unless that star is
                // much fainter (a smaller marker).
                let own = reqs[a.request].radius_mm;
                for (j, r) in reqs.iter().enumerate() {
                    if j == a.request || r.radius_mm < FAINTER_SHARE * own { continue; }
                    let m = Rect { x0: r.anchor_mm[0] - r.radius_mm, y0: r.anchor_mm[1] - r.radius_mm,
                                   x1: r.anchor_mm[0] + r.radius_mm, y1: r.anchor_mm[1] + r.radius_mm };
                    prop_assert!(!a.rect.overlaps(&m));
                }
            }
        }
    }
}
