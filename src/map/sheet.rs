//! Building the sheets: choose the systems, project them, fit or apply
//! the scale, tile when needed, and draw every layer into [`Scene`]s.
//!
//! # Speed
//! Selection and projection run in parallel over systems (rayon, order
//! kept, so output is deterministic); drawing one sheet is one pass over
//! the projected systems filling the three columns of one
//! [`Item::Stars`] batch. Only the few stars that get labels, stalks or
//! rings are sorted or looked at again.

use crate::catalogue::Catalogue;
use crate::catalogue::table::Origin;
use crate::error::{Error, Result};
use crate::map::labels::{LabelRequest, Rect, place_labels_insisting};
use crate::map::layout::{
    Frame, GAP_MM, MARGIN_MM, OVERLAP_MM, PANEL_COLUMN_MM, TILE_MARGIN_MM, Tiling, clip_polyline,
    clip_segment, sheet_layout,
};
use crate::map::options::{LabelMode, MapFilter, MapOptions};
use crate::map::panel::{self, Block, KeyExtras, line, text, translate};
use crate::map::scale::{describe_scale, format_number, nice_ceil};
use crate::map::style::{
    GRID_PT, HEIGHT_PT, LABEL_PT, MM_PER_PT, Palette, Symbol, crowding, radius_mm,
};
use crate::map::view::{Projector, ViewSpec};
use crate::physics::StarKind;
use crate::render::overlay::Overlay;
use crate::render::raster::anchor_shift_em;
use crate::render::scene::{Anchor, Item, Rgba, Scene, Shape, Stroke};
use crate::render::text::text_width_mm;
use rayon::prelude::*;

/// What a sheet is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SheetRole {
    /// The whole map on one sheet.
    Single,
    /// The index of a poster: how the tiles join.
    Index,
    /// One poster tile, row and column counted from 1 (top left).
    Tile {
        /// Row from the top, from 1.
        row: usize,
        /// Column from the left, from 1.
        col: usize,
    },
}

/// One sheet and its role.
#[derive(Debug, Clone)]
pub struct MapSheet {
    /// Single, index or tile.
    pub role: SheetRole,
    /// The drawing.
    pub scene: Scene,
}

/// The sheets of one map and what was decided on the way.
#[derive(Debug, Clone)]
pub struct MapSheets {
    /// Sheets in file order: a single sheet, or the index then the tiles
    /// row by row.
    pub sheets: Vec<MapSheet>,
    /// The map scale, mm per ly (poster scale when tiled).
    pub mm_per_ly: f64,
    /// Rows and columns of tiles (1 × 1 for a single sheet).
    pub tiles: [usize; 2],
    /// Systems drawn (after filters).
    pub systems: usize,
    /// The filters to blame when a catalogue with systems to draw gave
    /// none: each filter that alone leaves none, else all of them
    /// together. Empty when something is drawn or nothing could be.
    pub emptied_by: Vec<MapFilter>,
    /// The map centre used, ly.
    pub centre_ly: [f64; 3],
}

/// Most sheets one poster may have.
pub const MAX_TILES: usize = 400;
/// Above this many stars on a sheet only labelled stars get stalks and
/// multiple-system rings, and odd symbols become discs.
const DETAIL_LIMIT: usize = 3000;
const SYMBOL_LIMIT: usize = 20_000;

/// One system as drawn: its primary row, the row that sets its look, and
/// its membership.
#[derive(Debug, Clone, Copy)]
struct Sys {
    /// Primary row (position, name).
    row: u32,
    /// The most luminous member that passed the filters (colour, size, symbol).
    look: u32,
    /// Members in the catalogue.
    members: u32,
    /// Any member is a habitable host.
    habitable: bool,
}

#[derive(Debug, Clone, Copy)]
struct Proj {
    uv: [f64; 2],
    sys: u32,
}

struct Ctx<'a> {
    cat: &'a Catalogue,
    opts: &'a MapOptions,
    overlay: &'a Overlay,
    pal: Palette,
    proj: Projector,
    systems: Vec<Sys>,
    projected: Vec<Proj>,
    /// Rows that are the primaries of drawn systems.
    drawn_primary: Vec<bool>,
    /// x and y extent of the drawn systems, ly.
    xy_min: [f64; 2],
    xy_max: [f64; 2],
    title: String,
    classes: Vec<(char, Rgba)>,
    /// The catalogue is a generated sector with the user's own systems
    /// pinned into it (rows of both origins): those are labelled first.
    has_pins: bool,
}

fn pos(cat: &Catalogue, row: usize) -> [f64; 3] {
    [cat.x_ly[row], cat.y_ly[row], cat.z_ly[row]]
}

fn bbox_centre(cat: &Catalogue) -> [f64; 3] {
    // Minima and maxima are exact, so the parallel split cannot change them.
    let (lo, hi) = (0..cat.len())
        .into_par_iter()
        .with_min_len(1 << 14)
        .fold(
            || ([f64::INFINITY; 3], [f64::NEG_INFINITY; 3]),
            |(mut lo, mut hi), i| {
                let p = pos(cat, i);
                for k in 0..3 {
                    if p[k].is_finite() {
                        lo[k] = lo[k].min(p[k]);
                        hi[k] = hi[k].max(p[k]);
                    }
                }
                (lo, hi)
            },
        )
        .reduce(
            || ([f64::INFINITY; 3], [f64::NEG_INFINITY; 3]),
            |a, b| {
                (
                    std::array::from_fn(|k| a.0[k].min(b.0[k])),
                    std::array::from_fn(|k| a.1[k].max(b.1[k])),
                )
            },
        );
    let mut c = [0.0; 3];
    for k in 0..3 {
        if lo[k] <= hi[k] {
            c[k] = 0.5 * (lo[k] + hi[k]);
        }
    }
    c
}

fn select_systems(cat: &Catalogue, opts: &MapOptions) -> Vec<Sys> {
    let ranges = cat.system_ranges();
    ranges
        .par_iter()
        .filter_map(|r| {
            let p = pos(cat, r.start);
            if !p.iter().all(|v| v.is_finite()) {
                return None;
            }
            if let Some([lo, hi]) = opts.z_range_ly
                && !(p[2] >= lo && p[2] <= hi)
            {
                return None;
            }
            let mut look: Option<usize> = None;
            let mut habitable = false;
            for i in r.clone() {
                if let Some(only) = &opts.only
                    && !only.contains(&cat.kind[i])
                {
                    continue;
                }
                habitable |= cat.habitable_host[i];
                let l = cat.luminosity_lsun[i];
                let better = match look {
                    None => true,
                    Some(j) => {
                        l > cat.luminosity_lsun[j]
                            || (cat.luminosity_lsun[j].is_nan() && l.is_finite())
                    }
                };
                if better {
                    look = Some(i);
                }
            }
            look.map(|look| Sys {
                row: r.start as u32,
                look: look as u32,
                members: r.len() as u32,
                habitable,
            })
        })
        .collect()
}

/// Mean colour of each spectral class letter among the drawn systems.
fn class_colours(cat: &Catalogue, systems: &[Sys]) -> Vec<(char, Rgba)> {
    const ORDER: &str = "OBAFGKMLTYD";
    // Slot of each ASCII letter in ORDER (the letters are ASCII).
    let mut slot = [usize::MAX; 128];
    for (k, b) in ORDER.bytes().enumerate() {
        slot[usize::from(b)] = k;
    }
    // Whole-number sums, so the parallel order does not matter.
    let sums = systems
        .par_chunks(1 << 15)
        .map(|part| {
            let mut sums = [[0u64; 4]; 11];
            for s in part {
                let i = s.look as usize;
                // Remnants without a spectrum (codes `BH`, `NS`) have no class
                // colour: a black hole's `B` is not a B star.
                if matches!(cat.kind[i], StarKind::BlackHole | StarKind::NeutronStar) {
                    continue;
                }
                let letter = cat.class[i].letter() as usize;
                if let Some(&k) = slot.get(letter).filter(|&&k| k != usize::MAX) {
                    let c = cat.color_rgb[i];
                    sums[k][0] += u64::from(c[0]);
                    sums[k][1] += u64::from(c[1]);
                    sums[k][2] += u64::from(c[2]);
                    sums[k][3] += 1;
                }
            }
            sums
        })
        .reduce(
            || [[0u64; 4]; 11],
            |mut a, b| {
                for (x, y) in a.iter_mut().zip(b) {
                    for (u, v) in x.iter_mut().zip(y) {
                        *u += v;
                    }
                }
                a
            },
        );
    ORDER
        .chars()
        .zip(sums)
        .filter(|(_, s)| s[3] > 0)
        .map(|(ch, s)| {
            let n = s[3];
            (
                ch,
                Rgba::rgb(
                    ((s[0] + n / 2) / n) as u8,
                    ((s[1] + n / 2) / n) as u8,
                    ((s[2] + n / 2) / n) as u8,
                ),
            )
        })
        .collect()
}

/// Builds the sheets of a map of `cat` with `opts`, drawing `overlay`
/// (links under the stars, the route over them).
///
/// # Errors
/// [`Error::Usage`] when a perspective eye sits on its look point;
/// [`Error::TooLarge`] when the scale would need more than [`crate::map::MAX_TILES`]
/// sheets.
pub fn build_sheets(cat: &Catalogue, opts: &MapOptions, overlay: &Overlay) -> Result<MapSheets> {
    let centre = opts
        .centre_ly
        .or(cat.meta.centre_ly)
        .unwrap_or_else(|| bbox_centre(cat));
    let systems = select_systems(cat, opts);
    let radius = systems
        .par_iter()
        .map(|s| {
            let p = pos(cat, s.row as usize);
            let d = [p[0] - centre[0], p[1] - centre[1], p[2] - centre[2]];
            (d[0] * d[0] + d[1] * d[1] + d[2] * d[2]).sqrt()
        })
        .reduce(|| 0.0, f64::max);
    let proj = Projector::new(opts.view, centre, radius)
        .ok_or_else(|| Error::Usage("--eye and --look must be different points".to_string()))?;
    let projected: Vec<Proj> = systems
        .par_iter()
        .enumerate()
        .filter_map(|(k, s)| {
            proj.project(pos(cat, s.row as usize))
                .map(|uv| Proj { uv, sys: k as u32 })
        })
        .collect();
    let (xy_min, xy_max) = systems
        .par_iter()
        .map(|s| {
            let p = pos(cat, s.row as usize);
            ([p[0], p[1]], [p[0], p[1]])
        })
        .reduce(
            || ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]),
            |a, b| {
                (
                    [a.0[0].min(b.0[0]), a.0[1].min(b.0[1])],
                    [a.1[0].max(b.1[0]), a.1[1].max(b.1[1])],
                )
            },
        );
    let half = projected
        .par_iter()
        .map(|p| [p.uv[0].abs(), p.uv[1].abs()])
        .reduce(|| [0.0, 0.0], |a, b| [a[0].max(b[0]), a[1].max(b[1])]);
    // Half extents with a little room for markers and labels.
    let half = [(half[0] * 1.04).max(1.0), (half[1] * 1.04).max(1.0)];
    let mut drawn_primary = vec![false; cat.len()];
    for s in &systems {
        drawn_primary[s.row as usize] = true;
    }
    let title = opts
        .title
        .clone()
        .or_else(|| cat.meta.title.clone())
        .unwrap_or_else(|| "Star map".to_string());
    let classes = class_colours(cat, &systems);
    let emptied_by = if systems.is_empty() {
        filters_leaving_none(cat, opts)
    } else {
        Vec::new()
    };
    let ctx = Ctx {
        cat,
        opts,
        overlay,
        pal: Palette::of(opts.theme),
        proj,
        systems,
        projected,
        drawn_primary,
        xy_min,
        xy_max,
        title,
        classes,
        has_pins: cat.origin.par_iter().any(|&o| o == Origin::Generated)
            && cat.origin.par_iter().any(|&o| o == Origin::Imported),
    };
    let mut sheets = ctx.sheets(half, centre)?;
    sheets.emptied_by = emptied_by;
    Ok(sheets)
}

/// The filters of `opts` that leave no system of `cat` (see
/// [`MapSheets::emptied_by`]); only called when all of them together
/// leave none.
fn filters_leaving_none(cat: &Catalogue, opts: &MapOptions) -> Vec<MapFilter> {
    let with = |only: bool, z_range: bool| MapOptions {
        only: opts.only.clone().filter(|_| only),
        z_range_ly: opts.z_range_ly.filter(|_| z_range),
        ..opts.clone()
    };
    let leaves_none = |o: &MapOptions| select_systems(cat, o).is_empty();
    let mut active = Vec::new();
    if opts.only.is_some() {
        active.push(MapFilter::Only);
    }
    if opts.z_range_ly.is_some() {
        active.push(MapFilter::ZRange);
    }
    if active.is_empty() || leaves_none(&with(false, false)) {
        return Vec::new();
    }
    let alone: Vec<MapFilter> = active
        .iter()
        .copied()
        .filter(|f| leaves_none(&with(*f == MapFilter::Only, *f == MapFilter::ZRange)))
        .collect();
    if alone.is_empty() { active } else { alone }
}

fn format_height(dz: f64) -> String {
    let digits = if dz.abs() < 100.0 { 1 } else { 0 };
    let size = format!("{:.digits$}", dz.abs());
    // A height that rounds to nothing is in the plane: no sign, so never
    // a "-0.0".
    let sign = if size.bytes().all(|b| b == b'0' || b == b'.') {
        ""
    } else if dz > 0.0 {
        "+"
    } else {
        "-"
    };
    format!("{sign}{size} ly")
}

/// A visible star on one sheet.
#[derive(Debug, Clone, Copy)]
struct Vis {
    at: [f32; 2],
    radius: f32,
    sys: u32,
}

/// The stars of part of a sheet, sorted into what `draw_stars` draws.
struct StarLists<'v> {
    centres: Vec<[f32; 2]>,
    radii: Vec<f32>,
    fills: Vec<Rgba>,
    faded_centres: Vec<[f32; 2]>,
    faded_radii: Vec<f32>,
    faded_fills: Vec<Rgba>,
    markers: Vec<(&'v Vis, Symbol, bool)>,
}

impl<'v> StarLists<'v> {
    fn with_capacity(n: usize) -> Self {
        StarLists {
            centres: Vec::with_capacity(n),
            radii: Vec::with_capacity(n),
            fills: Vec::with_capacity(n),
            faded_centres: Vec::new(),
            faded_radii: Vec::new(),
            faded_fills: Vec::new(),
            markers: Vec::new(),
        }
    }

    /// The lists of `parts` one after the other.
    fn join(parts: Vec<StarLists<'v>>) -> Self {
        let total = |f: fn(&StarLists<'v>) -> usize| parts.iter().map(f).sum::<usize>();
        let mut all = StarLists::with_capacity(total(|l| l.centres.len()));
        all.faded_centres.reserve(total(|l| l.faded_centres.len()));
        all.faded_radii.reserve(total(|l| l.faded_radii.len()));
        all.faded_fills.reserve(total(|l| l.faded_fills.len()));
        all.markers.reserve(total(|l| l.markers.len()));
        for l in parts {
            all.centres.extend_from_slice(&l.centres);
            all.radii.extend_from_slice(&l.radii);
            all.fills.extend_from_slice(&l.fills);
            all.faded_centres.extend_from_slice(&l.faded_centres);
            all.faded_radii.extend_from_slice(&l.faded_radii);
            all.faded_fills.extend_from_slice(&l.faded_fills);
            all.markers.extend(l.markers);
        }
        all
    }
}

impl Ctx<'_> {
    fn page_mm(&self) -> (f32, f32) {
        self.opts.paper.size_mm(self.opts.landscape)
    }

    fn floor_mm(&self) -> f32 {
        (0.6 * 25.4 / self.opts.dpi).max(0.05)
    }

    fn has_panel(&self) -> bool {
        let l = &self.opts.layers;
        l.title || l.legend || l.scalebar
    }

    /// Panel blocks for a sheet at `mm_per_ly` with `crowd`.
    fn blocks(
        &self,
        mm_per_ly: f64,
        crowd: f32,
        poster: Option<(f64, [usize; 2])>,
    ) -> Vec<Vec<Block>> {
        let l = &self.opts.layers;
        let mut first = Vec::new();
        let mut second = Vec::new();
        let mut third = Vec::new();
        if l.title {
            first.push(panel::title_block(
                &self.title,
                &self.facts(mm_per_ly, poster),
                &self.pal,
            ));
        }
        if l.scalebar {
            let note = if self.proj.is_perspective() {
                Some("lengths true at the look point")
            } else if matches!(self.opts.view, ViewSpec::Oblique { .. }) {
                Some("lengths true along x")
            } else {
                None
            };
            first.push(panel::scale_block(mm_per_ly, note, &self.pal));
        }
        if l.legend {
            let extras = KeyExtras {
                stalks: l.stalks,
                generated: self.opts.mark_generated,
                links: !self.overlay.links.is_empty(),
                route: self.overlay.route.len() >= 2,
            };
            second.push(panel::symbols_block(extras, &self.pal));
            if !self.classes.is_empty() {
                third.push(panel::colours_block(&self.classes, &self.pal));
            }
            third.push(panel::sizes_block(crowd, self.floor_mm(), &self.pal));
        }
        vec![first, second, third]
    }

    fn facts(&self, mm_per_ly: f64, poster: Option<(f64, [usize; 2])>) -> Vec<String> {
        let o = self.opts;
        let mut f = Vec::new();
        if let Some(seed) = self.cat.meta.seed {
            f.push(format!("seed {seed}"));
        }
        match poster {
            Some((poster_scale, [rows, cols])) => {
                f.push(format!("poster scale {}", describe_scale(poster_scale)));
                f.push(format!(
                    "{rows} × {cols} sheets; this index {}",
                    describe_scale(mm_per_ly)
                ));
            }
            None => f.push(format!("scale {}", describe_scale(mm_per_ly))),
        }
        let paper = format!(
            "{} {}",
            o.paper.as_str().to_uppercase(),
            if o.landscape { "landscape" } else { "portrait" }
        );
        f.push(if o.raster {
            format!("{paper}, {} dpi", format_number(f64::from(o.dpi)))
        } else {
            paper
        });
        let c = self.proj.centre_ly;
        let view = match o.view {
            ViewSpec::Oblique { tilt_deg } => {
                format!("oblique view, tilt {}°", format_number(tilt_deg))
            }
            v => format!("{} view", v.name()),
        };
        f.push(view);
        f.push(format!(
            "centre {}, {}, {} ly",
            format_number(c[0]),
            format_number(c[1]),
            format_number(c[2])
        ));
        if let Some(e) = self.proj.eye_ly() {
            f.push(format!(
                "eye {}, {}, {} ly",
                format_number(e[0]),
                format_number(e[1]),
                format_number(e[2])
            ));
        }
        f.push(format!(
            "heights from the plane z = {} ly",
            format_number(c[2])
        ));
        f.push(format!(
            "{} shown",
            crate::report::counted(self.systems.len() as u64, "system", "systems")
        ));
        if let Some(only) = &o.only {
            f.push(format!(
                "only {}",
                only.iter()
                    .map(|k| k.as_str())
                    .collect::<Vec<_>>()
                    .join(", ")
            ));
        }
        if let Some([lo, hi]) = o.z_range_ly {
            f.push(format!(
                "z from {} to {} ly",
                format_number(lo),
                format_number(hi)
            ));
        }
        f
    }

    /// Places the panel's block columns; returns the panel's size need.
    fn panel_need(&self, cols: &[Vec<Block>], landscape_panel: bool) -> (usize, f32) {
        let col_h = |c: &Vec<Block>| -> f32 {
            c.iter().map(|b| b.height_mm).sum::<f32>() + GAP_MM * c.len().saturating_sub(1) as f32
        };
        let non_empty: Vec<&Vec<Block>> = cols.iter().filter(|c| !c.is_empty()).collect();
        if landscape_panel {
            (usize::from(!non_empty.is_empty()), 0.0)
        } else {
            (0, non_empty.iter().map(|c| col_h(c)).fold(0.0, f32::max))
        }
    }

    fn place_panel(
        &self,
        cols: Vec<Vec<Block>>,
        panel: Rect,
        on_right: bool,
        items: &mut Vec<Item>,
    ) {
        if on_right {
            let mut y = panel.y0;
            for block in cols.into_iter().flatten() {
                if y + block.height_mm > panel.y1 + 0.01 {
                    break;
                }
                let mut it = block.items;
                translate(&mut it, panel.x0, y);
                items.extend(it);
                y += block.height_mm + GAP_MM;
            }
        } else {
            let mut x = panel.x0;
            for col in cols.into_iter().filter(|c| !c.is_empty()) {
                let mut y = panel.y0;
                for block in col {
                    let mut it = block.items;
                    translate(&mut it, x, y);
                    items.extend(it);
                    y += block.height_mm + GAP_MM;
                }
                x += PANEL_COLUMN_MM + GAP_MM;
            }
        }
    }

    fn sheets(&self, half: [f64; 2], centre: [f64; 3]) -> Result<MapSheets> {
        let (pw, ph) = self.page_mm();
        let landscape_panel = pw >= ph;
        // Measure the panel with a provisional scale (block sizes do not
        // depend on it).
        let (ncols, rows_mm) = if self.has_panel() {
            self.panel_need(&self.blocks(1.0, 1.0, None), landscape_panel)
        } else {
            (0, 0.0)
        };
        let layout = sheet_layout(pw, ph, ncols, rows_mm);
        let area = layout.map_rect;
        let fit = (f64::from(area.width()) / (2.0 * half[0]))
            .min(f64::from(area.height()) / (2.0 * half[1]));
        let mm_per_ly = match self.opts.mm_per_ly {
            Some(s) => s,
            // A round number of ly per cm that fits the top view; 3D views
            // are not measured with a ruler, so they fill the sheet.
            None if self.proj.is_top() => 10.0 / nice_ceil(10.0 / fit),
            None => fit,
        };
        let extent = [2.0 * half[0] * mm_per_ly, 2.0 * half[1] * mm_per_ly];
        let fits = extent[0] <= f64::from(area.width()) + 1e-6
            && extent[1] <= f64::from(area.height()) + 1e-6;
        let n_sys = self.systems.len();
        if fits {
            let frame = Frame {
                mm_per_ly,
                origin_mm: [
                    f64::from(area.x0 + area.x1) / 2.0,
                    f64::from(area.y0 + area.y1) / 2.0,
                ],
                map_rect: area,
            };
            let crowd = crowding(self.projected.len(), extent[0] * extent[1]);
            let mut items = Vec::new();
            self.draw_map(&frame, crowd, &[], &mut items);
            if self.has_panel() {
                let cols = self.blocks(mm_per_ly, crowd, None);
                self.place_panel(cols, layout.panel, layout.panel_on_right, &mut items);
            }
            return Ok(MapSheets {
                sheets: vec![MapSheet {
                    role: SheetRole::Single,
                    scene: self.scene(items),
                }],
                mm_per_ly,
                tiles: [1, 1],
                systems: n_sys,
                centre_ly: centre,
                emptied_by: Vec::new(),
            });
        }
        // A poster: tiles with a bare margin, plus an index sheet.
        let tile_rect = Rect::new(
            TILE_MARGIN_MM,
            TILE_MARGIN_MM,
            pw - 2.0 * TILE_MARGIN_MM,
            ph - 2.0 * TILE_MARGIN_MM,
        );
        let tiling = Tiling::new(extent, [tile_rect.width(), tile_rect.height()]);
        if tiling.count() > MAX_TILES {
            return Err(Error::TooLarge(format!(
                "at {} the map needs {} × {} = {} sheets of {}, more than {MAX_TILES}; choose a smaller --scale or a larger --paper",
                describe_scale(mm_per_ly),
                tiling.rows,
                tiling.cols,
                tiling.count(),
                self.opts.paper.as_str().to_uppercase()
            )));
        }
        let crowd = crowding(
            self.projected.len(),
            f64::from(tiling.span_mm[0]) * f64::from(tiling.span_mm[1]),
        );
        let mut sheets = Vec::with_capacity(tiling.count() + 1);
        // Index: the whole poster fitted into the map area.
        let idx_scale = mm_per_ly
            * (f64::from(area.width()) / f64::from(tiling.span_mm[0]))
                .min(f64::from(area.height()) / f64::from(tiling.span_mm[1]));
        let idx_frame = Frame {
            mm_per_ly: idx_scale,
            origin_mm: [
                f64::from(area.x0 + area.x1) / 2.0,
                f64::from(area.y0 + area.y1) / 2.0,
            ],
            map_rect: area,
        };
        let idx_crowd = crowding(
            self.projected.len(),
            extent[0] * extent[1] * (idx_scale / mm_per_ly).powi(2),
        );
        let mut items = Vec::new();
        // Star labels keep clear of the tile names, which are what the
        // index is for.
        let names = self.tile_names(&idx_frame, &tiling, mm_per_ly);
        let name_boxes: Vec<Rect> = names.iter().map(|n| n.bounds.inflate(0.8)).collect();
        self.draw_map(&idx_frame, idx_crowd, &name_boxes, &mut items);
        self.draw_tile_index(&names, &mut items);
        if self.has_panel() {
            let cols = self.blocks(
                idx_scale,
                idx_crowd,
                Some((mm_per_ly, [tiling.rows, tiling.cols])),
            );
            self.place_panel(cols, layout.panel, layout.panel_on_right, &mut items);
        }
        sheets.push(MapSheet {
            role: SheetRole::Index,
            scene: self.scene(items),
        });
        for row in 0..tiling.rows {
            for col in 0..tiling.cols {
                let frame = tiling.frame(row, col, tile_rect, mm_per_ly);
                let mut items = Vec::new();
                self.draw_map(&frame, crowd, &[], &mut items);
                self.draw_assembly_marks(&frame, &tiling, row, col, &mut items);
                sheets.push(MapSheet {
                    role: SheetRole::Tile {
                        row: row + 1,
                        col: col + 1,
                    },
                    scene: self.scene(items),
                });
            }
        }
        Ok(MapSheets {
            sheets,
            mm_per_ly,
            tiles: [tiling.rows, tiling.cols],
            systems: n_sys,
            centre_ly: centre,
            emptied_by: Vec::new(),
        })
    }

    fn scene(&self, items: Vec<Item>) -> Scene {
        let (w, h) = self.page_mm();
        Scene {
            width_mm: w,
            height_mm: h,
            background: self.pal.background,
            items,
        }
    }

    /// Every map layer inside `frame.map_rect`.
    /// Grid, links, stars and labels of one map area; no star label
    /// covers any of `keep_clear`.
    fn draw_map(&self, frame: &Frame, crowd: f32, keep_clear: &[Rect], items: &mut Vec<Item>) {
        let layers = &self.opts.layers;
        let rect = frame.map_rect;
        // Star labels keep off the grid's numbers and axis names.
        let mut keep_clear = keep_clear.to_vec();
        if layers.grid {
            keep_clear.extend(self.draw_grid(frame, items));
        }
        self.draw_links(frame, items);
        // Visible stars: centre inside the map area.
        let floor = self.floor_mm();
        let vis: Vec<Vis> = self
            .projected
            .par_iter()
            .filter_map(|p| {
                let at = frame.to_page(p.uv);
                if !rect.contains_point(at) {
                    return None;
                }
                let s = &self.systems[p.sys as usize];
                let radius = radius_mm(self.cat.luminosity_lsun[s.look as usize], crowd, floor);
                Some(Vis {
                    at,
                    radius,
                    sys: p.sys,
                })
            })
            .collect();
        let labelled = if layers.labels {
            self.place_labels(&vis, rect, &keep_clear)
        } else {
            Vec::new()
        };
        let detailed = vis.len() <= DETAIL_LIMIT;
        if layers.stalks {
            let stalk = Palette::stroke(self.pal.stalk, 0.15);
            if detailed {
                for v in &vis {
                    self.draw_stalk(frame, v, stalk, items);
                }
            } else {
                for (v, _) in &labelled {
                    self.draw_stalk(frame, v, stalk, items);
                }
            }
        }
        self.draw_route(frame, items);
        self.draw_stars(&vis, crowd, items);
        // Multiple systems: a thin ring around the marker.
        let ring = Palette::stroke(self.pal.ink, 0.12);
        let mut mark = |v: &Vis| {
            if self.systems[v.sys as usize].members > 1 {
                items.push(Item::Marker {
                    centre_mm: v.at,
                    radius_mm: v.radius + 0.4,
                    shape: Shape::Ring,
                    fill: None,
                    stroke: Some(ring),
                });
            }
        };
        if vis.len() <= SYMBOL_LIMIT {
            vis.iter().for_each(&mut mark);
        } else {
            labelled.iter().for_each(|(v, _)| mark(v));
        }
        for (v, r) in &labelled {
            self.draw_label(v, r, items);
        }
        if layers.frame {
            items.push(Item::Line {
                points_mm: vec![
                    [rect.x0, rect.y0],
                    [rect.x1, rect.y0],
                    [rect.x1, rect.y1],
                    [rect.x0, rect.y1],
                ],
                closed: true,
                stroke: Palette::stroke(self.pal.ink, 0.3),
            });
        }
    }

    fn draw_stars(&self, vis: &[Vis], crowd: f32, items: &mut Vec<Item>) {
        let cat = self.cat;
        let use_symbols = vis.len() <= SYMBOL_LIMIT
            || vis
                .par_iter()
                .filter(|v| {
                    Symbol::of(cat.kind[self.systems[v.sys as usize].look as usize]) != Symbol::Disc
                })
                .count()
                <= SYMBOL_LIMIT;
        // Sorted into lists in pieces on all threads, then joined in
        // order: the same lists as one pass over `vis`.
        let parts: Vec<StarLists<'_>> = vis
            .par_chunks(1 << 15)
            .map(|piece| {
                let mut l = StarLists::with_capacity(piece.len());
                for v in piece {
                    let s = &self.systems[v.sys as usize];
                    let look = s.look as usize;
                    let c = cat.color_rgb[look];
                    let generated =
                        self.opts.mark_generated && cat.origin[s.row as usize] == Origin::Generated;
                    let symbol = Symbol::of(cat.kind[look]);
                    if symbol != Symbol::Disc && use_symbols {
                        l.markers.push((v, symbol, generated));
                    } else if generated {
                        l.faded_centres.push(v.at);
                        l.faded_radii.push(v.radius);
                        l.faded_fills.push(Rgba {
                            r: c[0],
                            g: c[1],
                            b: c[2],
                            a: 110,
                        });
                    } else {
                        l.centres.push(v.at);
                        l.radii.push(v.radius);
                        l.fills.push(Rgba::rgb(c[0], c[1], c[2]));
                    }
                }
                l
            })
            .collect();
        let StarLists {
            centres,
            radii,
            fills,
            faded_centres,
            faded_radii,
            faded_fills,
            markers,
        } = StarLists::join(parts);
        if !faded_centres.is_empty() {
            items.push(Item::Stars {
                centres_mm: faded_centres,
                radii_mm: faded_radii,
                fills: faded_fills,
                outline: None,
            });
        }
        if !centres.is_empty() {
            items.push(Item::Stars {
                centres_mm: centres,
                radii_mm: radii,
                fills,
                // On a sheet dense enough that discs touch, outlines would
                // merge into a dark mass; the fills alone read better.
                outline: if crowd > 0.3 {
                    self.pal.star_outline
                } else {
                    None
                },
            });
        }
        for (v, symbol, generated) in markers {
            let look = self.systems[v.sys as usize].look as usize;
            let c = cat.color_rgb[look];
            let alpha = if generated { 110 } else { 255 };
            let fill = Rgba {
                r: c[0],
                g: c[1],
                b: c[2],
                a: alpha,
            };
            let (shape, filled) = symbol.shape();
            let r = v.radius.max(symbol.min_radius_mm() * crowd.max(0.5));
            let stroke = if filled {
                self.pal.star_outline.unwrap_or(Palette::stroke(fill, 0.08))
            } else {
                Palette::stroke(
                    Rgba {
                        a: alpha,
                        ..self.pal.ink
                    },
                    (0.2 * crowd).max(0.1),
                )
            };
            items.push(Item::Marker {
                centre_mm: v.at,
                radius_mm: r,
                shape,
                fill: filled.then_some(fill),
                stroke: Some(stroke),
            });
        }
    }

    /// The labels of this sheet: which stars, and their boxes.
    fn place_labels(&self, vis: &[Vis], rect: Rect, keep_clear: &[Rect]) -> Vec<(Vis, Rect)> {
        let cat = self.cat;
        let mode = self.opts.labels;
        if mode == LabelMode::None || vis.is_empty() {
            return Vec::new();
        }
        let area = f64::from(rect.width() * rect.height());
        let budget = match mode {
            LabelMode::All => usize::MAX,
            _ => (area / 250.0).ceil() as usize,
        };
        let lum = |v: &Vis| {
            let l = cat.luminosity_lsun[self.systems[v.sys as usize].look as usize];
            if l.is_nan() { 1.0 } else { l }
        };
        // Systems with a name, and a habitable host when only those are
        // asked for.
        let wanted = |v: &Vis| {
            let s = &self.systems[v.sys as usize];
            !cat.name[s.row as usize].is_empty() && (mode != LabelMode::Habitable || s.habitable)
        };
        let keep = budget.saturating_mul(6).min(50_000);
        let by_key =
            |a: &(f64, u32, u32), b: &(f64, u32, u32)| b.0.total_cmp(&a.0).then(a.1.cmp(&b.1));
        // The `keep` best by `by_key`, in no particular order.
        let keep_best = |candidates: &mut Vec<(f64, u32, u32)>| {
            if candidates.len() > keep {
                candidates.select_nth_unstable_by(keep, by_key);
                candidates.truncate(keep);
            }
        };
        // Candidates with their sort keys, gathered in parallel slices that
        // each keep only their `keep` best: the key orders candidates
        // strictly (systems are unique), so the best of all are among
        // them, whatever the slices. The few brightest are then picked
        // and sorted.
        const SLICE: usize = 1 << 16;
        let mut keyed: Vec<(f64, u32, u32)> = vis
            .par_chunks(SLICE)
            .enumerate()
            .flat_map_iter(|(c, part)| {
                let mut best: Vec<(f64, u32, u32)> = part
                    .iter()
                    .enumerate()
                    .filter(|(_, v)| wanted(v))
                    .map(|(j, v)| (lum(v), v.sys, (c * SLICE + j) as u32))
                    .collect();
                keep_best(&mut best);
                best
            })
            .collect();
        keep_best(&mut keyed);
        keyed.sort_by(by_key);
        let mut order: Vec<usize> = keyed.iter().map(|k| k.2 as usize).collect();
        let by_lum = |a: &usize, b: &usize| {
            lum(&vis[*b])
                .total_cmp(&lum(&vis[*a]))
                .then(vis[*a].sys.cmp(&vis[*b].sys))
        };
        // The user's own systems pinned into a generated sector (rows read
        // from their file among generated ones) come first, ahead of every
        // generated star, and are labelled even where that covers
        // neighbouring stars: they are the story's places.
        let mut insist = 0;
        let row_origin = |i: usize| cat.origin[self.systems[vis[i].sys as usize].row as usize];
        if self.has_pins {
            let mut pins: Vec<usize> = (0..vis.len())
                .filter(|&i| row_origin(i) == Origin::Imported && wanted(&vis[i]))
                .collect();
            pins.sort_by(by_lum);
            insist = pins.len();
            let rest = order
                .into_iter()
                .filter(|&i| row_origin(i) != Origin::Imported);
            pins.extend(rest);
            order = pins;
        }
        // Route stops before those, its two ends first: the ends are what
        // the user asked about, so they are labelled even where that
        // covers neighbouring stars.
        if !self.overlay.route.is_empty() {
            let route = &self.overlay.route;
            let ends = [route[0], route[route.len() - 1]];
            let stops: std::collections::HashSet<usize> = route.iter().copied().collect();
            let row_of = |i: usize| self.systems[vis[i].sys as usize].row as usize;
            let mut first: Vec<usize> = (0..vis.len())
                .filter(|&i| ends.contains(&row_of(i)))
                .collect();
            first.sort_by_key(|&i| (ends.iter().position(|&e| e == row_of(i)), vis[i].sys));
            // The ends, then the pins not on the route, insist.
            let pins: Vec<usize> = order[..insist]
                .iter()
                .copied()
                .filter(|&i| !stops.contains(&row_of(i)))
                .collect();
            let rest: Vec<usize> = order[insist..]
                .iter()
                .copied()
                .filter(|&i| !stops.contains(&row_of(i)))
                .collect();
            insist = first.len() + pins.len();
            let mut middle: Vec<usize> = (0..vis.len())
                .filter(|&i| stops.contains(&row_of(i)) && !ends.contains(&row_of(i)))
                .collect();
            middle.sort_by(by_lum);
            first.extend(pins);
            first.extend(middle);
            first.extend(rest);
            order = first;
        }
        let stalks = self.opts.layers.stalks;
        let name_h = LABEL_PT * MM_PER_PT;
        let height_h = HEIGHT_PT * MM_PER_PT;
        let requests: Vec<LabelRequest> = order
            .iter()
            .map(|&i| {
                let v = &vis[i];
                let s = &self.systems[v.sys as usize];
                let name = &cat.name[s.row as usize];
                let mut w = text_width_mm(name, LABEL_PT, false);
                let mut h = name_h * 1.05;
                if stalks {
                    let dz = cat.z_ly[s.row as usize] - self.proj.centre_ly[2];
                    w = w.max(text_width_mm(&format_height(dz), HEIGHT_PT, false));
                    h += height_h * 1.1;
                }
                LabelRequest {
                    anchor_mm: v.at,
                    radius_mm: v.radius + if s.members > 1 { 0.5 } else { 0.0 },
                    width_mm: w,
                    height_mm: h,
                }
            })
            .collect();
        place_labels_insisting(&requests, insist, keep_clear, rect.inflate(-0.5), budget)
            .into_iter()
            .map(|p| (vis[order[p.request]], p.rect))
            .collect()
    }

    fn draw_label(&self, v: &Vis, r: &Rect, items: &mut Vec<Item>) {
        let s = &self.systems[v.sys as usize];
        let row = s.row as usize;
        let name_h = LABEL_PT * MM_PER_PT;
        items.push(text(
            r.x0,
            r.y0 + name_h * 0.8,
            &self.cat.name[row],
            LABEL_PT,
            self.pal.ink,
            false,
            Anchor::Start,
        ));
        if self.opts.layers.stalks {
            let dz = self.cat.z_ly[row] - self.proj.centre_ly[2];
            items.push(text(
                r.x0,
                r.y0 + name_h * 1.05 + HEIGHT_PT * MM_PER_PT * 0.85,
                &format_height(dz),
                HEIGHT_PT,
                self.pal.muted,
                false,
                Anchor::Start,
            ));
        }
    }

    fn draw_stalk(&self, frame: &Frame, v: &Vis, stroke: Stroke, items: &mut Vec<Item>) {
        let row = self.systems[v.sys as usize].row as usize;
        let p = pos(self.cat, row);
        let dz = p[2] - self.proj.centre_ly[2];
        if dz.abs() < 1e-9 {
            return;
        }
        let foot = if self.proj.is_top() {
            // Seen from straight above a stalk has no length; draw it down
            // the sheet (above the plane) or up (below), as in a slightly
            // tipped view, half its true length, at most 15 mm.
            let len = ((dz.abs() * frame.mm_per_ly * 0.5) as f32).min(15.0);
            let dir = if dz > 0.0 { 1.0 } else { -1.0 };
            Some([v.at[0], v.at[1] + dir * len])
        } else {
            self.proj
                .project([p[0], p[1], self.proj.centre_ly[2]])
                .map(|uv| frame.to_page(uv))
        };
        let Some(foot) = foot else { return };
        let stroke = if dz < 0.0 {
            Stroke {
                dash_mm: Some((0.6, 0.4)),
                ..stroke
            }
        } else {
            stroke
        };
        let rect = frame.map_rect;
        if let Some((a, b)) = clip_segment(v.at, foot, &rect) {
            items.push(line(a, b, stroke));
            if rect.contains_point(foot) {
                items.push(line(
                    [foot[0] - 0.6, foot[1]],
                    [foot[0] + 0.6, foot[1]],
                    Stroke {
                        dash_mm: None,
                        ..stroke
                    },
                ));
            }
        }
    }

    fn draw_links(&self, frame: &Frame, items: &mut Vec<Item>) {
        let stroke = Palette::stroke(self.pal.link, 0.15);
        let n = self.cat.len();
        for &[a, b] in &self.overlay.links {
            if a >= n || b >= n || !self.drawn_primary[a] || !self.drawn_primary[b] {
                continue;
            }
            let (Some(pa), Some(pb)) = (
                self.proj.project(pos(self.cat, a)),
                self.proj.project(pos(self.cat, b)),
            ) else {
                continue;
            };
            if let Some((p, q)) =
                clip_segment(frame.to_page(pa), frame.to_page(pb), &frame.map_rect)
            {
                items.push(line(p, q, stroke));
            }
        }
    }

    fn draw_route(&self, frame: &Frame, items: &mut Vec<Item>) {
        let n = self.cat.len();
        let points: Vec<Option<[f32; 2]>> = self
            .overlay
            .route
            .iter()
            .map(|&r| {
                (r < n)
                    .then(|| self.proj.project(pos(self.cat, r)))
                    .flatten()
                    .map(|uv| frame.to_page(uv))
            })
            .collect();
        if points.len() < 2 {
            return;
        }
        let stroke = Palette::stroke(self.pal.route, 0.6);
        for piece in clip_polyline(&points, &frame.map_rect) {
            items.push(Item::Line {
                points_mm: piece,
                closed: false,
                stroke,
            });
        }
        for p in points.iter().flatten() {
            if frame.map_rect.contains_point(*p) {
                items.push(Item::Marker {
                    centre_mm: *p,
                    radius_mm: 1.2,
                    shape: Shape::Ring,
                    fill: None,
                    stroke: Some(Palette::stroke(self.pal.route, 0.3)),
                });
            }
        }
    }

    /// Draws the grid; returns the boxes of the numbers and axis names it
    /// drew, which star labels keep clear of.
    fn draw_grid(&self, frame: &Frame, items: &mut Vec<Item>) -> Vec<Rect> {
        let rect = frame.map_rect;
        let s = frame.mm_per_ly;
        let step = nice_ceil(18.0 / s);
        let stroke = Palette::stroke(self.pal.grid, 0.12);
        let c = self.proj.centre_ly;
        let em = GRID_PT * MM_PER_PT;
        let muted = self.pal.muted;
        let mut texts = GridTexts::new(rect);
        if self.proj.is_top() {
            let u0 = (f64::from(rect.x0) - frame.origin_mm[0]) / s;
            let u1 = (f64::from(rect.x1) - frame.origin_mm[0]) / s;
            let v0 = (frame.origin_mm[1] - f64::from(rect.y1)) / s;
            let v1 = (frame.origin_mm[1] - f64::from(rect.y0)) / s;
            // The axis names in the corners come first; tick numbers that
            // would touch them, each other or the frame are left out.
            let x_name = [rect.x1 - 1.0, rect.y0 + em * 1.1];
            let y_name = [rect.x0 + 0.8, rect.y1 - 1.0];
            texts.reserve(x_name, "x, ly", true, Anchor::End);
            texts.reserve(y_name, "y, ly", true, Anchor::Start);
            let mut k = ((u0 + c[0]) / step).ceil() as i64;
            while (k as f64) * step - c[0] <= u1 {
                let x = k as f64 * step;
                let px = frame.to_page([x - c[0], 0.0])[0];
                items.push(line([px, rect.y0], [px, rect.y1], stroke));
                let at = [px + 0.6, rect.y0 + em * 1.1];
                texts.put(at, &format_number(x), Anchor::Start, muted, items);
                k += 1;
            }
            let mut k = ((v0 + c[1]) / step).ceil() as i64;
            while (k as f64) * step - c[1] <= v1 {
                let y = k as f64 * step;
                let py = frame.to_page([0.0, y - c[1]])[1];
                items.push(line([rect.x0, py], [rect.x1, py], stroke));
                let at = [rect.x0 + 0.8, py - 0.6];
                texts.put(at, &format_number(y), Anchor::Start, muted, items);
                k += 1;
            }
            for (at, name, anchor) in [
                (x_name, "x, ly", Anchor::End),
                (y_name, "y, ly", Anchor::Start),
            ] {
                items.push(text(at[0], at[1], name, GRID_PT, muted, true, anchor));
            }
            return texts.boxes;
        }
        // The reference plane z = cz over the stars' x, y extent.
        if self.systems.is_empty() {
            return texts.boxes;
        }
        let x0 = (self.xy_min[0] / step).floor() * step;
        let x1 = (self.xy_max[0] / step).ceil() * step;
        let y0 = (self.xy_min[1] / step).floor() * step;
        let y1 = (self.xy_max[1] / step).ceil() * step;
        let samples = if self.proj.is_perspective() { 48 } else { 1 };
        let polyline = |a: [f64; 2], b: [f64; 2], items: &mut Vec<Item>| {
            let pts: Vec<Option<[f32; 2]>> = (0..=samples)
                .map(|i| {
                    let t = i as f64 / samples as f64;
                    let p = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), c[2]];
                    self.proj.project(p).map(|uv| frame.to_page(uv))
                })
                .collect();
            for piece in clip_polyline(&pts, &rect) {
                items.push(Item::Line {
                    points_mm: piece,
                    closed: false,
                    stroke,
                });
            }
        };
        let nx = ((x1 - x0) / step).round() as i64;
        let ny = ((y1 - y0) / step).round() as i64;
        if nx > 400 || ny > 400 {
            return texts.boxes;
        }
        let mut put_text = |p: [f64; 3], s: String, anchor: Anchor, items: &mut Vec<Item>| {
            if let Some(uv) = self.proj.project(p) {
                let at = frame.to_page(uv);
                texts.put([at[0], at[1] + em * 1.1], &s, anchor, muted, items);
            }
        };
        for i in 0..=nx {
            let x = x0 + i as f64 * step;
            polyline([x, y0], [x, y1], items);
            put_text(
                [x, y0, c[2]],
                format!("x {}", format_number(x)),
                Anchor::Middle,
                items,
            );
        }
        for j in 0..=ny {
            let y = y0 + j as f64 * step;
            polyline([x0, y], [x1, y], items);
            put_text(
                [x0, y, c[2]],
                format!("y {} ", format_number(y)),
                Anchor::End,
                items,
            );
        }
        texts.boxes
    }

    /// Where the index sheet names each tile: centred in the tile's outline
    /// at a size that fits it.
    fn tile_names(&self, frame: &Frame, tiling: &Tiling, poster_scale: f64) -> Vec<TileName> {
        let k = (frame.mm_per_ly / poster_scale) as f32;
        let left = frame.origin_mm[0] as f32 - tiling.span_mm[0] * k / 2.0;
        let top = frame.origin_mm[1] as f32 - tiling.span_mm[1] * k / 2.0;
        let mut names = Vec::with_capacity(tiling.rows * tiling.cols);
        for row in 0..tiling.rows {
            for col in 0..tiling.cols {
                let w = tiling.window(row, col);
                let outline = Rect {
                    x0: left + w.x0 * k,
                    y0: top + w.y0 * k,
                    x1: left + w.x1 * k,
                    y1: top + w.y1 * k,
                };
                let size_pt = (outline.height() * 0.25 / MM_PER_PT).clamp(6.0, 16.0);
                let text = format!("r{}c{}", row + 1, col + 1);
                let baseline = [
                    (outline.x0 + outline.x1) / 2.0,
                    (outline.y0 + outline.y1) / 2.0 + size_pt * MM_PER_PT * 0.35,
                ];
                names.push(TileName {
                    outline,
                    bounds: text_bounds(baseline, &text, size_pt, true, Anchor::Middle),
                    baseline,
                    size_pt,
                    text,
                });
            }
        }
        names
    }

    /// The index sheet's tile outlines and names.
    fn draw_tile_index(&self, names: &[TileName], items: &mut Vec<Item>) {
        let stroke = Palette::stroke(self.pal.tile, 0.35);
        for n in names {
            let r = n.outline;
            items.push(Item::Line {
                points_mm: vec![[r.x0, r.y0], [r.x1, r.y0], [r.x1, r.y1], [r.x0, r.y1]],
                closed: true,
                stroke,
            });
            items.push(text(
                n.baseline[0],
                n.baseline[1],
                &n.text,
                n.size_pt,
                self.pal.tile,
                true,
                Anchor::Middle,
            ));
        }
    }

    fn draw_assembly_marks(
        &self,
        frame: &Frame,
        tiling: &Tiling,
        row: usize,
        col: usize,
        items: &mut Vec<Item>,
    ) {
        let r = frame.map_rect;
        let ink = Palette::stroke(self.pal.ink, 0.2);
        // Crop marks at the corners, in the margin.
        for (x, y, sx, sy) in [
            (r.x0, r.y0, -1.0, -1.0),
            (r.x1, r.y0, 1.0, -1.0),
            (r.x0, r.y1, -1.0, 1.0),
            (r.x1, r.y1, 1.0, 1.0),
        ] {
            items.push(line([x + sx * 1.5, y], [x + sx * 7.0, y], ink));
            items.push(line([x, y + sy * 1.5], [x, y + sy * 7.0], ink));
        }
        // Overlap strips shared with each neighbour: a dashed line where the
        // neighbour's map begins, and the neighbour's name in the margin.
        let dashed = Stroke {
            dash_mm: Some((1.5, 1.0)),
            ..Palette::stroke(self.pal.tile, 0.2)
        };
        let em = GRID_PT * MM_PER_PT;
        let tile_name = |r: usize, c: usize| format!("r{}c{}", r + 1, c + 1);
        let mid_x = (r.x0 + r.x1) / 2.0;
        let mid_y = (r.y0 + r.y1) / 2.0;
        let (o, tile) = (OVERLAP_MM, self.pal.tile);
        if col + 1 < tiling.cols {
            items.push(line([r.x1 - o, r.y0], [r.x1 - o, r.y1], dashed));
            items.push(text(
                r.x1 + 2.0,
                mid_y,
                &format!("{} >", tile_name(row, col + 1)),
                GRID_PT,
                tile,
                true,
                Anchor::Start,
            ));
        }
        if col > 0 {
            items.push(line([r.x0 + o, r.y0], [r.x0 + o, r.y1], dashed));
            items.push(text(
                r.x0 - 2.0,
                mid_y,
                &format!("< {}", tile_name(row, col - 1)),
                GRID_PT,
                tile,
                true,
                Anchor::End,
            ));
        }
        if row + 1 < tiling.rows {
            items.push(line([r.x0, r.y1 - o], [r.x1, r.y1 - o], dashed));
            items.push(text(
                mid_x,
                r.y1 + 2.0 + em,
                &format!("v {}", tile_name(row + 1, col)),
                GRID_PT,
                tile,
                true,
                Anchor::Middle,
            ));
        }
        if row > 0 {
            items.push(line([r.x0, r.y0 + o], [r.x1, r.y0 + o], dashed));
            items.push(text(
                mid_x,
                r.y0 - 2.0,
                &format!("^ {}", tile_name(row - 1, col)),
                GRID_PT,
                tile,
                true,
                Anchor::Middle,
            ));
        }
        // Footer: which sheet this is.
        let footer = format!(
            "{} · sheet {} of {} × {} · {} · overlap {} mm",
            self.title,
            tile_name(row, col),
            tiling.rows,
            tiling.cols,
            describe_scale(frame.mm_per_ly),
            format_number(f64::from(OVERLAP_MM))
        );
        let (_, ph) = self.page_mm();
        items.push(text(
            r.x0,
            ph - MARGIN_MM * 0.4,
            &footer,
            GRID_PT,
            self.pal.ink,
            false,
            Anchor::Start,
        ));
    }
}

/// The box of a one-line text with its baseline at `at`, mm: from 0.8 em
/// above the baseline to 0.2 em below it.
fn text_bounds(at: [f32; 2], s: &str, size_pt: f32, bold: bool, anchor: Anchor) -> Rect {
    let w = text_width_mm(s, size_pt, bold);
    let h = size_pt * MM_PER_PT;
    Rect::new(at[0] + anchor_shift_em(anchor, w), at[1] - 0.8 * h, w, h)
}

/// One tile's outline and name on the index sheet.
struct TileName {
    outline: Rect,
    /// The name's box, mm.
    bounds: Rect,
    baseline: [f32; 2],
    size_pt: f32,
    text: String,
}

/// The grid's texts placed on one sheet: each lies inside the map frame,
/// clear of every earlier one, or is left out.
struct GridTexts {
    inside: Rect,
    boxes: Vec<Rect>,
}

impl GridTexts {
    /// Room between two grid texts and between a text and the frame, mm.
    const GAP_MM: f32 = 0.3;

    fn new(map_rect: Rect) -> GridTexts {
        GridTexts {
            inside: map_rect.inflate(-Self::GAP_MM),
            boxes: Vec::new(),
        }
    }

    /// Keeps room for a text drawn later.
    fn reserve(&mut self, at: [f32; 2], s: &str, bold: bool, anchor: Anchor) {
        self.boxes.push(text_bounds(at, s, GRID_PT, bold, anchor));
    }

    /// Draws `s` (regular weight) at `at` if it fits.
    fn put(&mut self, at: [f32; 2], s: &str, anchor: Anchor, colour: Rgba, items: &mut Vec<Item>) {
        let b = text_bounds(at, s, GRID_PT, false, anchor);
        let padded = b.inflate(Self::GAP_MM);
        if !self.inside.contains(&b) || self.boxes.iter().any(|o| o.overlaps(&padded)) {
            return;
        }
        self.boxes.push(b);
        items.push(text(at[0], at[1], s, GRID_PT, colour, false, anchor));
    }
}

#[cfg(test)]
mod tests {
    use super::format_height;

    #[test]
    fn heights_are_signed_except_in_the_plane() {
        assert_eq!(format_height(2.04), "+2.0 ly");
        assert_eq!(format_height(-0.06), "-0.1 ly");
        assert_eq!(format_height(-0.04), "0.0 ly");
        assert_eq!(format_height(0.0), "0.0 ly");
        assert_eq!(format_height(-0.0), "0.0 ly");
        assert_eq!(format_height(150.4), "+150 ly");
        assert_eq!(format_height(-99.96), "-100.0 ly");
        assert_eq!(format_height(-0.4e-9), "0.0 ly");
    }
}
