//! Resolved map settings and the parsers that turn option text into them.

use crate::error::{Error, Result};
use crate::map::view::{DEFAULT_TILT_DEG, ViewSpec};
use crate::physics::StarKind;
use crate::render::paper::{Paper, Theme};

/// Which stars get a name label.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum LabelMode {
    /// The most luminous systems, as many as fit legibly (the default).
    #[default]
    Bright,
    /// Systems with a habitable host.
    Habitable,
    /// Every system, as many as fit legibly.
    All,
    /// No labels.
    None,
}

impl LabelMode {
    /// Parses `bright`, `habitable`, `all` or `none`.
    pub fn parse(text: &str) -> Result<LabelMode> {
        match text.trim().to_ascii_lowercase().as_str() {
            "bright" => Ok(LabelMode::Bright),
            "habitable" => Ok(LabelMode::Habitable),
            "all" => Ok(LabelMode::All),
            "none" => Ok(LabelMode::None),
            _ => Err(Error::invalid(
                "--label",
                text,
                "it must be one of bright, habitable, all, none",
            )),
        }
    }
}

/// Which layers a sheet shows (all by default).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Layers {
    /// Coordinate grid (the reference-plane grid in 3D views).
    pub grid: bool,
    /// Star names.
    pub labels: bool,
    /// Symbol, colour and size key.
    pub legend: bool,
    /// Scale bars in ly and pc.
    pub scalebar: bool,
    /// Title block.
    pub title: bool,
    /// Height stalks and signed height labels.
    pub stalks: bool,
    /// Frame around the map.
    pub frame: bool,
}

impl Default for Layers {
    fn default() -> Layers {
        Layers {
            grid: true,
            labels: true,
            legend: true,
            scalebar: true,
            title: true,
            stalks: true,
            frame: true,
        }
    }
}

impl Layers {
    /// The layer names `--hide` takes.
    pub const NAMES: &'static str = "grid, labels, legend, scalebar, title, stalks, frame";

    /// All layers except those in a comma-separated `--hide` list.
    pub fn hiding(list: &str) -> Result<Layers> {
        let mut l = Layers::default();
        for name in list.split(',').map(str::trim).filter(|s| !s.is_empty()) {
            let flag = match name.to_ascii_lowercase().as_str() {
                "grid" => &mut l.grid,
                "labels" | "label" => &mut l.labels,
                "legend" => &mut l.legend,
                "scalebar" | "scale-bar" => &mut l.scalebar,
                "title" => &mut l.title,
                "stalks" | "stalk" => &mut l.stalks,
                "frame" => &mut l.frame,
                _ => {
                    return Err(Error::invalid(
                        "--hide",
                        list,
                        format!(
                            "'{name}' is not a layer; it must be a comma-separated list of {}",
                            Layers::NAMES
                        ),
                    ));
                }
            };
            *flag = false;
        }
        Ok(l)
    }
}

/// A filter of [`MapOptions`] that chooses which systems are drawn.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MapFilter {
    /// [`MapOptions::only`]: only some kinds of star.
    Only,
    /// [`MapOptions::z_range_ly`]: only some heights.
    ZRange,
}

/// Everything that decides how a map looks, fully resolved.
#[derive(Debug, Clone, PartialEq)]
pub struct MapOptions {
    /// The view.
    pub view: ViewSpec,
    /// Map centre, ly; `None` for the middle of the catalogue's bounding box.
    pub centre_ly: Option<[f64; 3]>,
    /// Paper size.
    pub paper: Paper,
    /// Landscape (true, the default) or portrait.
    pub landscape: bool,
    /// Raster resolution, dots per inch (sets the smallest dot).
    pub dpi: f32,
    /// The sheets are for a raster file (PNG), so the title block names
    /// `dpi`; false for vector files (SVG, PDF), where a resolution means
    /// nothing and the title block leaves it out.
    pub raster: bool,
    /// Scale, mm of paper per ly; `None` to fit one sheet.
    pub mm_per_ly: Option<f64>,
    /// Which stars get labels.
    pub labels: LabelMode,
    /// Which layers are shown.
    pub layers: Layers,
    /// Only these kinds (`None` for all).
    pub only: Option<Vec<StarKind>>,
    /// Only heights in `[min, max]`, ly (absolute z).
    pub z_range_ly: Option<[f64; 2]>,
    /// Colour scheme.
    pub theme: Theme,
    /// Draw rows with `Origin::Generated` faded, so catalogued stars stand out.
    pub mark_generated: bool,
    /// Sheet title; `None` for the catalogue's own title or "Star map".
    pub title: Option<String>,
}

impl Default for MapOptions {
    fn default() -> MapOptions {
        MapOptions {
            view: ViewSpec::Top,
            centre_ly: None,
            paper: Paper::A4,
            landscape: true,
            dpi: 300.0,
            raster: true,
            mm_per_ly: None,
            labels: LabelMode::Bright,
            layers: Layers::default(),
            only: None,
            z_range_ly: None,
            theme: Theme::Print,
            mark_generated: false,
            title: None,
        }
    }
}

pub use crate::render::output::parse_dpi;
pub use crate::render::paper::{parse_paper, parse_theme};

/// Parses `--tilt` (0–89 degrees).
pub fn parse_tilt(text: &str) -> Result<f64> {
    let bad = || {
        Error::invalid(
            "--tilt",
            text,
            "it must be an angle in degrees from 0 (straight down) to 89",
        )
    };
    let v: f64 = text.trim().parse().map_err(|_| bad())?;
    if !(0.0..=89.0).contains(&v) {
        return Err(bad());
    }
    Ok(v)
}

/// Builds the view from `--view`, `--tilt`, `--eye` and `--look`.
///
/// # Errors
/// An unknown view, a bad number, or camera options given to a view that
/// does not use them.
pub fn parse_view(
    view: &str,
    tilt: Option<&str>,
    eye: Option<&str>,
    look: Option<&str>,
) -> Result<ViewSpec> {
    let name = view.trim().to_ascii_lowercase();
    let spec = match name.as_str() {
        "top" => ViewSpec::Top,
        "oblique" => ViewSpec::Oblique {
            tilt_deg: match tilt {
                Some(t) => parse_tilt(t)?,
                None => DEFAULT_TILT_DEG,
            },
        },
        "perspective" => ViewSpec::Perspective {
            eye_ly: eye
                .map(|e| crate::spec::parse_centre("--eye", e))
                .transpose()?,
            look_ly: look
                .map(|l| crate::spec::parse_centre("--look", l))
                .transpose()?,
        },
        _ => {
            return Err(Error::invalid(
                "--view",
                view,
                "it must be one of top, oblique, perspective",
            ));
        }
    };
    if tilt.is_some() && name != "oblique" {
        return Err(Error::Usage(
            "--tilt applies only to --view oblique".to_string(),
        ));
    }
    if (eye.is_some() || look.is_some()) && name != "perspective" {
        return Err(Error::Usage(
            "--eye and --look apply only to --view perspective".to_string(),
        ));
    }
    Ok(spec)
}

/// Parses `--only` (comma-separated kind names).
pub fn parse_only(text: &str) -> Result<Vec<StarKind>> {
    let mut kinds = Vec::new();
    for name in text.split(',').map(str::trim).filter(|s| !s.is_empty()) {
        let kind = StarKind::parse(&name.to_ascii_lowercase()).ok_or_else(|| {
            Error::invalid(
                "--only",
                text,
                format!(
                    "'{name}' is not a kind; it must be a comma-separated list of {}",
                    StarKind::names()
                ),
            )
        })?;
        if !kinds.contains(&kind) {
            kinds.push(kind);
        }
    }
    if kinds.is_empty() {
        return Err(Error::invalid(
            "--only",
            text,
            format!("it must name at least one of {}", StarKind::names()),
        ));
    }
    Ok(kinds)
}

/// Parses `--z-range MIN,MAX` (ly, or with units; MIN < MAX).
pub fn parse_z_range(text: &str) -> Result<[f64; 2]> {
    let parts: Vec<&str> = text.split(',').collect();
    let bad = || {
        Error::invalid(
            "--z-range",
            text,
            "it must be two heights MIN,MAX in light years with MIN below MAX (e.g. -20,20)",
        )
    };
    if parts.len() != 2 {
        return Err(bad());
    }
    let lo = crate::spec::parse_coordinate_ly("--z-range", parts[0]).map_err(|_| bad())?;
    let hi = crate::spec::parse_coordinate_ly("--z-range", parts[1]).map_err(|_| bad())?;
    if lo >= hi {
        return Err(bad());
    }
    Ok([lo, hi])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn option_parsers() {
        assert_eq!(parse_paper("A3").unwrap(), Paper::A3);
        assert!(
            parse_paper("b5")
                .unwrap_err()
                .to_string()
                .contains("--paper")
        );
        assert_eq!(parse_dpi("300").unwrap(), 300.0);
        assert!(parse_dpi("9").is_err());
        assert!(parse_dpi("2401").is_err());
        assert!(parse_dpi("abc").is_err());
        assert_eq!(parse_theme("screen").unwrap(), Theme::Screen);
        assert!(parse_theme("neon").is_err());
        assert_eq!(LabelMode::parse("habitable").unwrap(), LabelMode::Habitable);
        assert!(LabelMode::parse("some").is_err());
        let l = Layers::hiding("grid, stalks").unwrap();
        assert!(!l.grid && !l.stalks && l.labels && l.frame);
        assert!(Layers::hiding("grid,sky").is_err());
    }

    #[test]
    fn views_and_filters() {
        assert_eq!(parse_view("top", None, None, None).unwrap(), ViewSpec::Top);
        assert_eq!(
            parse_view("oblique", None, None, None).unwrap(),
            ViewSpec::Oblique { tilt_deg: 35.0 }
        );
        assert_eq!(
            parse_view("perspective", None, Some("-300,-200,150"), None).unwrap(),
            ViewSpec::Perspective {
                eye_ly: Some([-300.0, -200.0, 150.0]),
                look_ly: None
            }
        );
        assert!(parse_view("side", None, None, None).is_err());
        assert!(parse_view("top", Some("20"), None, None).is_err());
        assert!(parse_view("oblique", Some("95"), None, None).is_err());
        assert_eq!(
            parse_only("main-sequence,white-dwarf").unwrap(),
            vec![StarKind::MainSequence, StarKind::WhiteDwarf]
        );
        assert!(parse_only("dwarf").is_err());
        assert_eq!(parse_z_range("-20,20").unwrap(), [-20.0, 20.0]);
        assert!(parse_z_range("20,-20").is_err());
        assert!(parse_z_range("5").is_err());
    }
}
