//! The fixed cubic cell grid: cell coordinates, the cells a shape
//! touches, and their fixed order (z, then y, then x, each ascending).

use crate::spec::SectorSpec;

/// Edge of one cell, light years.
pub const CELL_EDGE_LY: f64 = 10.0;
/// Largest |coordinate| of a volume, light years (cell ids hold 16 bits per axis).
pub const MAX_ABS_COORD_LY: f64 = 320_000.0;

/// The block of cells covering a spec's bounding box.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CellGrid {
    /// Lowest cell coordinates.
    pub lo: [i64; 3],
    /// Cells along each axis.
    pub n: [u64; 3],
}

impl CellGrid {
    /// The cells covering the bounding box of `spec`'s shape.
    pub fn for_spec(spec: &SectorSpec) -> CellGrid {
        let h = spec.shape.half_extent_ly();
        let mut lo = [0i64; 3];
        let mut n = [0u64; 3];
        for i in 0..3 {
            let a = ((spec.centre_ly[i] - h[i]) / CELL_EDGE_LY).floor() as i64;
            let b = ((spec.centre_ly[i] + h[i]) / CELL_EDGE_LY).floor() as i64;
            lo[i] = a;
            n[i] = (b - a + 1) as u64;
        }
        CellGrid { lo, n }
    }

    /// Number of cells.
    pub fn len(&self) -> u64 {
        self.n[0] * self.n[1] * self.n[2]
    }

    /// True when the grid has no cells.
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }

    /// Cell coordinates of the `linear`-th cell in the fixed order.
    #[inline]
    pub fn cell(&self, linear: u64) -> [i64; 3] {
        let x = linear % self.n[0];
        let rest = linear / self.n[0];
        let y = rest % self.n[1];
        let z = rest / self.n[1];
        [
            self.lo[0] + x as i64,
            self.lo[1] + y as i64,
            self.lo[2] + z as i64,
        ]
    }
}

/// The cell holding a point, light years.
pub fn cell_of(p: [f64; 3]) -> [i64; 3] {
    [
        (p[0] / CELL_EDGE_LY).floor() as i64,
        (p[1] / CELL_EDGE_LY).floor() as i64,
        (p[2] / CELL_EDGE_LY).floor() as i64,
    ]
}
