//! Every colour, stroke width, type size and symbol of a map sheet, in
//! one place, for the two themes.

use crate::physics::StarKind;
use crate::render::paper::Theme;
use crate::render::scene::{Rgba, Shape, Stroke};

/// Smallest type on a sheet, points (a readable minimum for print;
/// common practice, no source).
pub const MIN_TEXT_PT: f32 = 6.0;
/// Star-name labels, points.
pub const LABEL_PT: f32 = 7.0;
/// Height labels under names, points.
pub const HEIGHT_PT: f32 = 6.0;
/// Grid coordinates, points.
pub const GRID_PT: f32 = 6.0;
/// Body text of the panel, points.
pub const BODY_PT: f32 = 7.0;
/// Block headings, points.
pub const HEADING_PT: f32 = 8.0;
/// The sheet title, points.
pub const TITLE_PT: f32 = 13.0;

/// Millimetres per point (1 pt = 1/72 in, 1 in = 25.4 mm).
pub const MM_PER_PT: f32 = 25.4 / 72.0;

/// The colours of one theme.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Palette {
    /// Paper.
    pub background: Rgba,
    /// Text and frame.
    pub ink: Rgba,
    /// Secondary text (grid numbers, height labels).
    pub muted: Rgba,
    /// Grid lines.
    pub grid: Rgba,
    /// Height stalks.
    pub stalk: Rgba,
    /// Outline of star discs (print) so that pale colours still show.
    pub star_outline: Option<Stroke>,
    /// Jump-network links.
    pub link: Rgba,
    /// A highlighted route.
    pub route: Rgba,
    /// Panel background boxes.
    pub panel: Rgba,
    /// Tile outlines on an index sheet.
    pub tile: Rgba,
}

impl Palette {
    /// The palette of a theme.
    pub fn of(theme: Theme) -> Palette {
        match theme {
            Theme::Print => Palette {
                background: Rgba::rgb(255, 255, 255),
                ink: Rgba::rgb(25, 25, 30),
                muted: Rgba::rgb(95, 95, 105),
                grid: Rgba::rgb(200, 205, 215),
                stalk: Rgba::rgb(120, 120, 130),
                star_outline: Some(Stroke {
                    color: Rgba::rgb(40, 40, 45),
                    width_mm: 0.08,
                    dash_mm: None,
                }),
                link: Rgba::rgb(150, 170, 200),
                route: Rgba::rgb(200, 40, 30),
                panel: Rgba::rgb(255, 255, 255),
                tile: Rgba::rgb(30, 90, 200),
            },
            Theme::Screen => Palette {
                background: Rgba::rgb(8, 10, 22),
                ink: Rgba::rgb(225, 228, 235),
                muted: Rgba::rgb(150, 155, 170),
                grid: Rgba::rgb(40, 48, 75),
                stalk: Rgba::rgb(95, 100, 125),
                star_outline: None,
                link: Rgba::rgb(60, 90, 140),
                route: Rgba::rgb(255, 120, 60),
                panel: Rgba::rgb(8, 10, 22),
                tile: Rgba::rgb(110, 170, 255),
            },
        }
    }

    /// A stroke of this palette.
    pub fn stroke(color: Rgba, width_mm: f32) -> Stroke {
        Stroke {
            color,
            width_mm,
            dash_mm: None,
        }
    }
}

/// How a kind of object is drawn: discs for main-sequence stars, open or
/// filled symbols for the rest so they read in black-and-white print.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Symbol {
    /// A filled disc (main sequence and anything unknown).
    Disc,
    /// A filled diamond (subgiants, giants, supergiants).
    Giant,
    /// An open ring (white dwarfs).
    WhiteDwarf,
    /// A four-pointed star (neutron stars).
    NeutronStar,
    /// An open square (black holes).
    BlackHole,
    /// A filled triangle (brown dwarfs).
    BrownDwarf,
}

impl Symbol {
    /// The symbol of a kind.
    pub fn of(kind: StarKind) -> Symbol {
        match kind {
            StarKind::MainSequence => Symbol::Disc,
            StarKind::Subgiant
            | StarKind::Giant
            | StarKind::CoreHelium
            | StarKind::AsymptoticGiant
            | StarKind::Supergiant => Symbol::Giant,
            StarKind::WhiteDwarf => Symbol::WhiteDwarf,
            StarKind::NeutronStar => Symbol::NeutronStar,
            StarKind::BlackHole => Symbol::BlackHole,
            StarKind::BrownDwarf => Symbol::BrownDwarf,
        }
    }

    /// Every symbol in legend order, with its legend text.
    pub const LEGEND: [(Symbol, &'static str); 6] = [
        (Symbol::Disc, "main-sequence star"),
        (Symbol::Giant, "subgiant or giant"),
        (Symbol::WhiteDwarf, "white dwarf"),
        (Symbol::NeutronStar, "neutron star"),
        (Symbol::BlackHole, "black hole"),
        (Symbol::BrownDwarf, "brown dwarf"),
    ];

    /// The scene shape, and whether it is filled with the star's colour.
    pub fn shape(self) -> (Shape, bool) {
        match self {
            Symbol::Disc => (Shape::Disc, true),
            Symbol::Giant => (Shape::Diamond, true),
            Symbol::WhiteDwarf => (Shape::Ring, false),
            Symbol::NeutronStar => (Shape::Cross, true),
            Symbol::BlackHole => (Shape::Square, false),
            Symbol::BrownDwarf => (Shape::Triangle, true),
        }
    }

    /// Extra size of a symbol over a disc of the same luminosity, so that
    /// faint remnants stay visible (common practice, no source).
    pub fn min_radius_mm(self) -> f32 {
        match self {
            Symbol::Disc => 0.0,
            Symbol::BrownDwarf => 0.35,
            _ => 0.55,
        }
    }
}

/// Marker radius for a luminosity: linear in log10 L from 0.25 mm at
/// 10⁻⁴ L☉ to 2.0 mm at 10⁴ L☉ (clamped), times `crowding` (0.25–1),
/// never below `floor_mm`. A log scale keeps the 10⁸ range of stellar
/// luminosities on paper (common practice, no source). Unknown
/// luminosities draw as 1 L☉.
#[inline]
pub fn radius_mm(luminosity_lsun: f64, crowding: f32, floor_mm: f32) -> f32 {
    let l = if luminosity_lsun.is_finite() && luminosity_lsun > 0.0 {
        luminosity_lsun.log10() as f32
    } else {
        0.0
    };
    let t = ((l + 4.0) / 8.0).clamp(0.0, 1.0);
    ((0.25 + 1.75 * t) * crowding).max(floor_mm)
}

/// Crowding factor for `n` drawn stars on `area_mm2` of map: 1 up to 2
/// stars per cm², then falling as 1/√density, never below 0.25.
pub fn crowding(n: usize, area_mm2: f64) -> f32 {
    let per_cm2 = n as f64 / (area_mm2 / 100.0).max(1e-9);
    (2.0 / per_cm2.max(1e-12)).sqrt().clamp(0.25, 1.0) as f32
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn radius_grows_with_luminosity() {
        assert!((radius_mm(1e-4, 1.0, 0.0) - 0.25).abs() < 1e-6);
        assert!((radius_mm(1.0, 1.0, 0.0) - 1.125).abs() < 1e-6);
        assert!((radius_mm(1e4, 1.0, 0.0) - 2.0).abs() < 1e-6);
        assert!((radius_mm(1e9, 1.0, 0.0) - 2.0).abs() < 1e-6);
        assert!(radius_mm(10.0, 1.0, 0.0) > radius_mm(0.1, 1.0, 0.0));
        assert_eq!(radius_mm(1e-6, 0.25, 0.1), 0.1);
        assert_eq!(radius_mm(f64::NAN, 1.0, 0.0), radius_mm(1.0, 1.0, 0.0));
    }

    #[test]
    fn crowding_shrinks_dense_sheets() {
        assert_eq!(crowding(10, 10_000.0), 1.0);
        assert_eq!(crowding(1_000_000, 100_000.0), 0.25);
        let mid = crowding(800, 10_000.0);
        assert!((mid - 0.5).abs() < 1e-6);
    }

    #[test]
    fn kinds_get_distinct_symbols() {
        let s: std::collections::BTreeSet<_> = [
            StarKind::MainSequence,
            StarKind::Giant,
            StarKind::WhiteDwarf,
            StarKind::NeutronStar,
            StarKind::BlackHole,
            StarKind::BrownDwarf,
        ]
        .into_iter()
        .map(|k| Symbol::of(k).shape().0 as u8)
        .collect();
        assert_eq!(s.len(), 6);
    }
}
