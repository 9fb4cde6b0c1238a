//! Page layout: where the map sits on a sheet, the frame that turns
//! map-plane light years into page millimetres, poster tiling, and line
//! clipping to the map area.

use crate::map::labels::Rect;

/// Outer margin of a sheet, mm (room for printers' unprintable edges).
pub const MARGIN_MM: f32 = 10.0;
/// Margin of a poster tile, mm (room for assembly marks).
pub const TILE_MARGIN_MM: f32 = 12.0;
/// Width of one panel column (title, scale bar, legend), mm.
pub const PANEL_COLUMN_MM: f32 = 58.0;
/// Gap between the map and the panel, and between panel blocks, mm.
pub const GAP_MM: f32 = 4.0;
/// Overlap between neighbouring poster tiles, mm.
pub const OVERLAP_MM: f32 = 10.0;

/// Map-plane light years to page millimetres: `page = origin + (u, −v) · s`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Frame {
    /// Scale, mm per ly.
    pub mm_per_ly: f64,
    /// Page position of the map-plane origin (the map centre), mm.
    pub origin_mm: [f64; 2],
    /// The map area on the page, mm.
    pub map_rect: Rect,
}

impl Frame {
    /// Page position of a map-plane point.
    #[inline]
    pub fn to_page(&self, uv: [f64; 2]) -> [f32; 2] {
        [
            (self.origin_mm[0] + uv[0] * self.mm_per_ly) as f32,
            (self.origin_mm[1] - uv[1] * self.mm_per_ly) as f32,
        ]
    }
}

/// Where the map and the panel go on a sheet with a panel.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SheetLayout {
    /// The map area, mm.
    pub map_rect: Rect,
    /// The panel area (title, scale bar, legend), mm.
    pub panel: Rect,
    /// True when the panel runs down the right-hand side (landscape).
    pub panel_on_right: bool,
}

/// Lays out a sheet of `width_mm` × `height_mm`: on landscape sheets the
/// panel takes `panel_columns` columns on the right, on portrait sheets
/// `panel_rows_mm` at the bottom. With no panel the map fills the sheet
/// inside the margin.
pub fn sheet_layout(
    width_mm: f32,
    height_mm: f32,
    panel_columns: usize,
    panel_rows_mm: f32,
) -> SheetLayout {
    let inner = Rect::new(
        MARGIN_MM,
        MARGIN_MM,
        width_mm - 2.0 * MARGIN_MM,
        height_mm - 2.0 * MARGIN_MM,
    );
    let right = width_mm >= height_mm;
    if right && panel_columns > 0 {
        let pw = panel_columns as f32 * (PANEL_COLUMN_MM + GAP_MM) - GAP_MM;
        SheetLayout {
            map_rect: Rect {
                x1: inner.x1 - pw - GAP_MM,
                ..inner
            },
            panel: Rect {
                x0: inner.x1 - pw,
                ..inner
            },
            panel_on_right: true,
        }
    } else if !right && panel_rows_mm > 0.0 {
        SheetLayout {
            map_rect: Rect {
                y1: inner.y1 - panel_rows_mm - GAP_MM,
                ..inner
            },
            panel: Rect {
                y0: inner.y1 - panel_rows_mm,
                ..inner
            },
            panel_on_right: false,
        }
    } else {
        SheetLayout {
            map_rect: inner,
            panel: Rect {
                x0: inner.x1,
                ..inner
            },
            panel_on_right: right,
        }
    }
}

/// How a map of `extent_mm` (width, height) is cut into tiles whose map
/// areas are `area_mm` with [`OVERLAP_MM`] shared between neighbours.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Tiling {
    /// Rows of tiles (top to bottom).
    pub rows: usize,
    /// Columns of tiles (left to right).
    pub cols: usize,
    /// Map area of one tile, mm.
    pub area_mm: [f32; 2],
    /// The whole poster's map area, mm: `n · (area − overlap) + overlap`.
    pub span_mm: [f32; 2],
}

impl Tiling {
    /// The fewest tiles that cover `extent_mm`.
    pub fn new(extent_mm: [f64; 2], area_mm: [f32; 2]) -> Tiling {
        let count = |extent: f64, area: f32| -> usize {
            let step = f64::from(area - OVERLAP_MM).max(1.0);
            (((extent - f64::from(OVERLAP_MM)) / step).ceil().max(1.0)) as usize
        };
        let cols = count(extent_mm[0], area_mm[0]);
        let rows = count(extent_mm[1], area_mm[1]);
        let span = |n: usize, area: f32| n as f32 * (area - OVERLAP_MM) + OVERLAP_MM;
        Tiling {
            rows,
            cols,
            area_mm,
            span_mm: [span(cols, area_mm[0]), span(rows, area_mm[1])],
        }
    }

    /// Number of tiles.
    pub fn count(&self) -> usize {
        self.rows * self.cols
    }

    /// The window of tile (`row`, `col`), both from 0, in poster mm from
    /// the poster's top-left corner.
    pub fn window(&self, row: usize, col: usize) -> Rect {
        Rect::new(
            col as f32 * (self.area_mm[0] - OVERLAP_MM),
            row as f32 * (self.area_mm[1] - OVERLAP_MM),
            self.area_mm[0],
            self.area_mm[1],
        )
    }

    /// The frame of tile (`row`, `col`) whose map area is `map_rect` on its
    /// page, for a poster at `mm_per_ly` centred on the map-plane origin.
    pub fn frame(&self, row: usize, col: usize, map_rect: Rect, mm_per_ly: f64) -> Frame {
        let w = self.window(row, col);
        Frame {
            mm_per_ly,
            origin_mm: [
                f64::from(map_rect.x0) + f64::from(self.span_mm[0]) / 2.0 - f64::from(w.x0),
                f64::from(map_rect.y0) + f64::from(self.span_mm[1]) / 2.0 - f64::from(w.y0),
            ],
            map_rect,
        }
    }
}

/// Clips the segment `a`–`b` to `r` (Liang–Barsky), or `None` when it
/// misses.
pub fn clip_segment(a: [f32; 2], b: [f32; 2], r: &Rect) -> Option<([f32; 2], [f32; 2])> {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let mut t0 = 0.0f32;
    let mut t1 = 1.0f32;
    for (p, q) in [
        (-dx, a[0] - r.x0),
        (dx, r.x1 - a[0]),
        (-dy, a[1] - r.y0),
        (dy, r.y1 - a[1]),
    ] {
        if p == 0.0 {
            if q < 0.0 {
                return None;
            }
        } else {
            let t = q / p;
            if p < 0.0 {
                t0 = t0.max(t);
            } else {
                t1 = t1.min(t);
            }
            if t0 > t1 {
                return None;
            }
        }
    }
    Some((
        [a[0] + t0 * dx, a[1] + t0 * dy],
        [a[0] + t1 * dx, a[1] + t1 * dy],
    ))
}

/// Clips a polyline to `r`, returning the pieces that remain (each with
/// at least two points). `None` vertices break the line.
pub fn clip_polyline(points: &[Option<[f32; 2]>], r: &Rect) -> Vec<Vec<[f32; 2]>> {
    let mut pieces: Vec<Vec<[f32; 2]>> = Vec::new();
    let mut current: Vec<[f32; 2]> = Vec::new();
    for pair in points.windows(2) {
        let (Some(a), Some(b)) = (pair[0], pair[1]) else {
            if current.len() >= 2 {
                pieces.push(std::mem::take(&mut current));
            }
            current.clear();
            continue;
        };
        match clip_segment(a, b, r) {
            Some((ca, cb)) => {
                let joined = current.last().is_some_and(|l| *l == ca);
                if !joined {
                    if current.len() >= 2 {
                        pieces.push(std::mem::take(&mut current));
                    }
                    current.clear();
                    current.push(ca);
                }
                current.push(cb);
            }
            None => {
                if current.len() >= 2 {
                    pieces.push(std::mem::take(&mut current));
                }
                current.clear();
            }
        }
    }
    if current.len() >= 2 {
        pieces.push(current);
    }
    pieces
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a4_landscape_layout() {
        let l = sheet_layout(297.0, 210.0, 1, 0.0);
        assert!(l.panel_on_right);
        assert_eq!(
            l.map_rect,
            Rect::new(10.0, 10.0, 297.0 - 20.0 - 62.0, 190.0)
        );
        assert_eq!(l.panel.x1, 287.0);
        let p = sheet_layout(210.0, 297.0, 1, 60.0);
        assert!(!p.panel_on_right);
        assert_eq!(p.map_rect.y1, 297.0 - 10.0 - 64.0);
    }

    #[test]
    fn tiles_cover_the_map_with_overlap() {
        // 500 mm wide on 200 mm tiles, 10 mm overlap: steps of 190 mm, so
        // 3 tiles cover 3 · 190 + 10 = 580 mm ≥ 500 (2 would cover 390).
        let t = Tiling::new([500.0, 150.0], [200.0, 180.0]);
        assert_eq!((t.rows, t.cols), (1, 3));
        assert_eq!(t.span_mm, [580.0, 180.0]);
        let a = t.window(0, 0);
        let b = t.window(0, 1);
        assert_eq!(a.x1 - b.x0, OVERLAP_MM);
        // Exactly fitting one tile needs one tile.
        assert_eq!(Tiling::new([200.0, 180.0], [200.0, 180.0]).count(), 1);
        // 2 × 2 when both directions overflow by a little.
        assert_eq!(Tiling::new([201.0, 181.0], [200.0, 180.0]).count(), 4);
    }

    #[test]
    fn neighbouring_tiles_show_the_same_star_in_the_overlap() {
        let t = Tiling::new([380.0, 100.0], [200.0, 100.0]);
        let rect = Rect::new(12.0, 12.0, 200.0, 100.0);
        let f0 = t.frame(0, 0, rect, 2.0);
        let f1 = t.frame(0, 1, rect, 2.0);
        // A star at u such that it sits 5 mm inside the shared strip.
        let poster_x = 195.0;
        let u = (poster_x - f64::from(t.span_mm[0]) / 2.0) / 2.0;
        let p0 = f0.to_page([u, 0.0]);
        let p1 = f1.to_page([u, 0.0]);
        assert!((p0[0] - (12.0 + 195.0)).abs() < 1e-4);
        assert!((p1[0] - (12.0 + 5.0)).abs() < 1e-4);
    }

    #[test]
    fn clipping() {
        let r = Rect::new(0.0, 0.0, 10.0, 10.0);
        assert_eq!(
            clip_segment([-5.0, 5.0], [15.0, 5.0], &r),
            Some(([0.0, 5.0], [10.0, 5.0]))
        );
        assert_eq!(clip_segment([-5.0, -5.0], [-1.0, 20.0], &r), None);
        let pieces = clip_polyline(
            &[
                Some([1.0, 1.0]),
                Some([5.0, 1.0]),
                None,
                Some([2.0, 2.0]),
                Some([20.0, 2.0]),
            ],
            &r,
        );
        assert_eq!(
            pieces,
            vec![vec![[1.0, 1.0], [5.0, 1.0]], vec![[2.0, 2.0], [10.0, 2.0]]]
        );
    }
}
