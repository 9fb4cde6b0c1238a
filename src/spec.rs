//! What a user asks for: a volume of space, a density model, a population
//! model and a seed, validated once before any work starts.
//!
//! A [`SectorSpec`] is built from command-line flags, from a TOML file
//! ([`SpecFile`]), or from both (flags override the file). Every value in
//! it is resolved: lengths in light years, densities in stars per cubic
//! light year, ages in gigayears.
//!
//! # Units
//! Positions and lengths: light years, galactic cartesian axes (+x toward
//! the Galactic centre, +y toward l = 90°, +z toward the north Galactic
//! pole). Input may carry a unit (`200ly`, `60pc`, `1.2kpc`).

use crate::error::{Error, Result};
use crate::physics::Fidelity;
use crate::units::LY_PER_PC;
use serde::{Deserialize, Serialize};
use std::path::{Path, PathBuf};

/// Default stellar density, stars per cubic light year (brown dwarfs not
/// counted, companions and white dwarfs counted).
///
/// # Source
/// E. Mamajek's local density table with the RECONS 10 pc M-dwarf density
/// ("memo_star_dens" web table; figshare 3206527) gives
/// n_* = 0.083–0.091 pc⁻³ = 0.0024–0.0026 ly⁻³ (derived from those table
/// values); we take the middle.
pub const DEFAULT_DENSITY_PER_LY3: f64 = 0.0025;

/// Largest density accepted, stars per cubic light year (about 170 pc⁻³,
/// a globular-cluster core); it keeps a 10 ly cell's systems within the
/// id scheme's 13-bit index.
pub const MAX_DENSITY_PER_LY3: f64 = 5.0;

/// Default thick-disk share: thick(R⊙)/thin(R⊙) = 0.12 (Jurić et al. 2008,
/// ApJ 673, 864, abstract (verified)).
pub const DEFAULT_THICK_SHARE: f64 = 0.12;

/// Default age range, gigayears: constant star formation over the age of
/// the local disk, 11.2 Gyr (Binney, Dehnen & Bertelli 2000, MNRAS 318,
/// 658, abstract (verified)).
pub const DEFAULT_AGES_GYR: [f64; 2] = [0.0, 11.2];

/// Default radius cleared around each pinned system, light years.
pub const DEFAULT_PIN_CLEAR_LY: f64 = 3.0;

/// The shape of the volume, centred on [`SectorSpec::centre_ly`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Shape {
    /// A box with full edge lengths along x, y, z, light years.
    Box {
        /// Full edge lengths, light years.
        size_ly: [f64; 3],
    },
    /// A sphere.
    Sphere {
        /// Radius, light years.
        radius_ly: f64,
    },
    /// A cylinder with its axis along z.
    Cylinder {
        /// Radius, light years.
        radius_ly: f64,
        /// Full height along z, light years.
        height_ly: f64,
    },
}

impl Shape {
    /// Half extents of the bounding box, light years.
    pub fn half_extent_ly(&self) -> [f64; 3] {
        match *self {
            Shape::Box { size_ly } => [size_ly[0] / 2.0, size_ly[1] / 2.0, size_ly[2] / 2.0],
            Shape::Sphere { radius_ly } => [radius_ly; 3],
            Shape::Cylinder {
                radius_ly,
                height_ly,
            } => [radius_ly, radius_ly, height_ly / 2.0],
        }
    }

    /// True when the offset `d` (light years from the centre) lies inside.
    /// Boxes are half-open, `[-a/2, a/2)`, so adjacent boxes never share a point.
    #[inline]
    pub fn contains(&self, d: [f64; 3]) -> bool {
        match *self {
            Shape::Box { size_ly } => (0..3).all(|i| {
                let h = size_ly[i] / 2.0;
                d[i] >= -h && d[i] < h
            }),
            Shape::Sphere { radius_ly } => {
                d[0] * d[0] + d[1] * d[1] + d[2] * d[2] <= radius_ly * radius_ly
            }
            Shape::Cylinder {
                radius_ly,
                height_ly,
            } => {
                let h = height_ly / 2.0;
                d[0] * d[0] + d[1] * d[1] <= radius_ly * radius_ly && d[2] >= -h && d[2] < h
            }
        }
    }

    /// True when the axis-aligned box `[lo, hi]` (offsets from the centre,
    /// light years) may hold points of the shape (conservative).
    pub fn may_intersect(&self, lo: [f64; 3], hi: [f64; 3]) -> bool {
        let nearest = |i: usize| 0.0f64.clamp(lo[i], hi[i]);
        match *self {
            Shape::Box { .. } => true,
            Shape::Sphere { radius_ly } => {
                let (x, y, z) = (nearest(0), nearest(1), nearest(2));
                x * x + y * y + z * z <= radius_ly * radius_ly
            }
            Shape::Cylinder { radius_ly, .. } => {
                let (x, y) = (nearest(0), nearest(1));
                x * x + y * y <= radius_ly * radius_ly
            }
        }
    }

    /// Volume, cubic light years.
    pub fn volume_ly3(&self) -> f64 {
        match *self {
            Shape::Box { size_ly } => size_ly[0] * size_ly[1] * size_ly[2],
            Shape::Sphere { radius_ly } => 4.0 / 3.0 * std::f64::consts::PI * radius_ly.powi(3),
            Shape::Cylinder {
                radius_ly,
                height_ly,
            } => std::f64::consts::PI * radius_ly * radius_ly * height_ly,
        }
    }
}

/// How the star density varies through space.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum DensityModel {
    /// The same density everywhere.
    Uniform,
    /// Thin + thick disk + halo (Jurić et al. 2008), normalised to the
    /// requested density at the home point (the origin), which sits
    /// 20.8 pc above the Galactic mid-plane at R = 8 kpc.
    Disk {
        /// Local thick-disk to thin-disk density ratio.
        thick_share: f64,
    },
}

/// Initial mass functions on offer.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum ImfChoice {
    /// Kirkpatrick et al. 2024 (ApJS 271, 55), the 20 pc census IMF.
    #[default]
    Kirkpatrick,
    /// Kroupa 2001 (MNRAS 322, 231).
    Kroupa,
    /// Chabrier 2003 (PASP 115, 763), single objects.
    Chabrier,
}

impl ImfChoice {
    /// The name used on the command line and in spec files.
    pub fn as_str(self) -> &'static str {
        match self {
            ImfChoice::Kirkpatrick => "kirkpatrick",
            ImfChoice::Kroupa => "kroupa",
            ImfChoice::Chabrier => "chabrier",
        }
    }

    /// Parses `kirkpatrick`, `kroupa` or `chabrier`.
    pub fn parse(text: &str) -> Option<ImfChoice> {
        match text.trim().to_ascii_lowercase().as_str() {
            "kirkpatrick" | "kirkpatrick2024" => Some(ImfChoice::Kirkpatrick),
            "kroupa" | "kroupa2001" => Some(ImfChoice::Kroupa),
            "chabrier" | "chabrier2003" => Some(ImfChoice::Chabrier),
            _ => None,
        }
    }
}

/// What lives in the volume: mass function, ages, remnants, physics.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PopulationModel {
    /// The initial mass function.
    pub imf: ImfChoice,
    /// Range of ages drawn, gigayears (constant star formation over it,
    /// weighted toward young stars for disk heating; see `population`).
    pub ages_gyr: [f64; 2],
    /// Keep every neutron star and black hole instead of losing the kicked ones.
    pub keep_remnants: bool,
    /// Physics fidelity.
    pub fidelity: Fidelity,
}

impl Default for PopulationModel {
    fn default() -> Self {
        PopulationModel {
            imf: ImfChoice::Kirkpatrick,
            ages_gyr: DEFAULT_AGES_GYR,
            keep_remnants: false,
            fidelity: Fidelity::Fitted,
        }
    }
}

/// A user's own system placed by hand (`--pin`): one row of the pin file.
#[derive(Debug, Clone, PartialEq)]
pub struct PinnedSystem {
    /// Name of the primary.
    pub name: String,
    /// Position, light years, galactic axes (absolute, not relative to the centre).
    pub position_ly: [f64; 3],
    /// What the star is.
    pub star: PinnedStar,
}

/// The star of a [`PinnedSystem`].
#[derive(Debug, Clone, PartialEq)]
pub enum PinnedStar {
    /// The row gave at most a mass and an age: the star is evolved like a
    /// generated one, from this initial mass to this age, with the spec's
    /// physics.
    Evolved {
        /// Initial mass, solar masses.
        initial_mass_msun: f64,
        /// Age, gigayears.
        age_gyr: f64,
    },
    /// The row described the star itself (kind, class, Teff, luminosity,
    /// radius, ...): its values as the catalogue reader reads and completes
    /// them, the same as `summary` shows for the file.
    Described(crate::physics::StarProfile),
}

/// A fully resolved request for a region of space.
#[derive(Debug, Clone, PartialEq)]
pub struct SectorSpec {
    /// Sector name for title blocks.
    pub title: Option<String>,
    /// Universe seed: the same seed is one fixed universe.
    pub seed: u64,
    /// The volume's shape.
    pub shape: Shape,
    /// The volume's centre, light years, galactic axes.
    pub centre_ly: [f64; 3],
    /// Stars per cubic light year at the home point (brown dwarfs not counted).
    pub density_per_ly3: f64,
    /// How density varies with position.
    pub density_model: DensityModel,
    /// What the stars are.
    pub population: PopulationModel,
    /// Put a sun-like single star at the centre.
    pub home: bool,
    /// The user's own systems.
    pub pins: Vec<PinnedSystem>,
    /// The file the pins came from (recorded in the sidecar).
    pub pin_file: Option<PathBuf>,
    /// FNV-1a hash of the pin file's bytes when it was read (recorded in
    /// the sidecar, so a changed pin file is noticed on regeneration).
    pub pin_file_fnv1a: Option<u64>,
    /// Generated systems closer than this to a pin (or the home system) are removed, light years.
    pub pin_clear_ly: f64,
}

impl SectorSpec {
    /// A spec with the defaults: uniform local density, Kirkpatrick IMF,
    /// fitted physics, no home system, no pins.
    pub fn new(seed: u64, shape: Shape, centre_ly: [f64; 3]) -> SectorSpec {
        SectorSpec {
            title: None,
            seed,
            shape,
            centre_ly,
            density_per_ly3: DEFAULT_DENSITY_PER_LY3,
            density_model: DensityModel::Uniform,
            population: PopulationModel::default(),
            home: false,
            pins: Vec::new(),
            pin_file: None,
            pin_file_fnv1a: None,
            pin_clear_ly: DEFAULT_PIN_CLEAR_LY,
        }
    }

    /// Checks every value; the sampler relies on this having passed.
    /// Errors name the command-line flag of the bad setting.
    pub fn validate(&self) -> Result<()> {
        self.validate_named(&|setting| setting.flag().to_string())
    }

    /// Checks every value, naming a bad setting by `name` (its flag, or
    /// the spec file, line and key it came from).
    fn validate_named(&self, name: &dyn Fn(Setting) -> String) -> Result<()> {
        let positive = |setting: Setting, v: f64| -> Result<()> {
            if v.is_finite() && v > 0.0 {
                Ok(())
            } else {
                Err(Error::invalid(
                    &name(setting),
                    v,
                    "it must be a positive, finite length",
                ))
            }
        };
        match self.shape {
            Shape::Box { size_ly } => {
                for v in size_ly {
                    positive(Setting::BoxSize, v)?;
                }
            }
            Shape::Sphere { radius_ly } => positive(Setting::SphereRadius, radius_ly)?,
            Shape::Cylinder {
                radius_ly,
                height_ly,
            } => {
                positive(Setting::CylinderRadius, radius_ly)?;
                positive(Setting::CylinderHeight, height_ly)?;
            }
        }
        let limit = crate::sampler::cells::MAX_ABS_COORD_LY;
        let h = self.shape.half_extent_ly();
        if h.iter().any(|&h_i| h_i > limit) {
            // The shape alone is too large: name the shape's setting, not the centre.
            let (setting, value) = match self.shape {
                Shape::Box { size_ly } => (Setting::BoxSize, ly_text(&size_ly)),
                Shape::Sphere { radius_ly } => (Setting::SphereRadius, ly_text(&[radius_ly])),
                Shape::Cylinder { radius_ly, .. } if radius_ly > limit => {
                    (Setting::CylinderRadius, ly_text(&[radius_ly]))
                }
                Shape::Cylinder { height_ly, .. } => {
                    (Setting::CylinderHeight, ly_text(&[height_ly]))
                }
            };
            return Err(Error::invalid(
                &name(setting),
                value,
                format!("the volume must lie within {limit} ly of the origin on every axis"),
            ));
        }
        for (&c, &h_i) in self.centre_ly.iter().zip(h.iter()) {
            if !c.is_finite() || c.abs() + h_i > limit {
                return Err(Error::invalid(
                    &name(Setting::Centre),
                    ly_text(&self.centre_ly),
                    format!("the volume must lie within {limit} ly of the origin on every axis"),
                ));
            }
        }
        let d = self.density_per_ly3;
        if !(d.is_finite() && d > 0.0 && d <= MAX_DENSITY_PER_LY3) {
            return Err(Error::invalid(
                &name(Setting::Density),
                d,
                format!(
                    "it must be a positive number of stars per cubic light year, at most {MAX_DENSITY_PER_LY3}"
                ),
            ));
        }
        if let DensityModel::Disk { thick_share } = self.density_model
            && !(thick_share.is_finite() && (0.0..=1.0).contains(&thick_share))
        {
            return Err(Error::invalid(
                &name(Setting::ThickShare),
                thick_share,
                "it must be a number from 0 to 1",
            ));
        }
        let [a, b] = self.population.ages_gyr;
        if !(a.is_finite()
            && b.is_finite()
            && a >= 0.0
            && b > a
            && b <= crate::units::UNIVERSE_AGE_GYR)
        {
            return Err(Error::invalid(
                &name(Setting::Ages),
                format!("{a},{b}"),
                "it must be MIN,MAX in gigayears with 0 <= MIN < MAX <= 13.8",
            ));
        }
        if !(self.pin_clear_ly.is_finite() && self.pin_clear_ly >= 0.0) {
            return Err(Error::invalid(
                &name(Setting::PinClear),
                self.pin_clear_ly,
                "it must be a length of zero or more",
            ));
        }
        Ok(())
    }
}

/// A setting of a spec that can hold a bad value. An error names it by its
/// command-line flag or, when a spec file holds the value, by the file,
/// the line and the key.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum Setting {
    /// The shape's kind (`shape.kind`).
    ShapeKind,
    /// A box's edge lengths (`--box`, `shape.size_ly`).
    BoxSize,
    /// A sphere's radius (`--sphere`, `shape.radius_ly`).
    SphereRadius,
    /// A cylinder's radius (`--cylinder`, `shape.radius_ly`).
    CylinderRadius,
    /// A cylinder's height (`--cylinder`, `shape.height_ly`).
    CylinderHeight,
    /// The centre (`--centre`, `centre_ly`).
    Centre,
    /// The density (`--density`, `density`).
    Density,
    /// The density model (`--disk`, `density_model`).
    DensityModel,
    /// The thick-disk share (`--thick-share`, `thick_share`).
    ThickShare,
    /// The initial mass function (`--imf`, `imf`).
    Imf,
    /// The age range (`--ages`, `ages_gyr`).
    Ages,
    /// The physics fidelity (`--physics`, `physics`).
    Physics,
    /// The pin file (`--pin`, `pin`).
    Pin,
    /// The clearing radius around pins (`--pin-clear`, `pin_clear_ly`).
    PinClear,
    /// The shard (`--shard`, `shard`).
    Shard,
}

impl Setting {
    /// The command-line flag that sets it; the spec-file key for a setting
    /// whose flag cannot hold a bad value.
    pub fn flag(self) -> &'static str {
        match self {
            Setting::ShapeKind => "shape.kind",
            Setting::BoxSize => "--box",
            Setting::SphereRadius => "--sphere",
            Setting::CylinderRadius | Setting::CylinderHeight => "--cylinder",
            Setting::Centre => "--centre",
            Setting::Density => "--density",
            Setting::DensityModel => "density_model",
            Setting::ThickShare => "--thick-share",
            Setting::Imf => "--imf",
            Setting::Ages => "--ages",
            Setting::Physics => "--physics",
            Setting::Pin => "--pin",
            Setting::PinClear => "--pin-clear",
            Setting::Shard => "--shard",
        }
    }

    /// Its key in a spec file, dotted below a table (`shape.radius_ly`).
    pub fn key(self) -> &'static str {
        match self {
            Setting::ShapeKind => "shape.kind",
            Setting::BoxSize => "shape.size_ly",
            Setting::SphereRadius | Setting::CylinderRadius => "shape.radius_ly",
            Setting::CylinderHeight => "shape.height_ly",
            Setting::Centre => "centre_ly",
            Setting::Density => "density",
            Setting::DensityModel => "density_model",
            Setting::ThickShare => "thick_share",
            Setting::Imf => "imf",
            Setting::Ages => "ages_gyr",
            Setting::Physics => "physics",
            Setting::Pin => "pin",
            Setting::PinClear => "pin_clear_ly",
            Setting::Shard => "shard",
        }
    }
}

/// Where a spec file's keys sit: the file and the line of each key
/// (dotted below a table, `shape.radius_ly`), so that an error in a value
/// the file holds can name the file, the line and the key.
#[derive(Debug, Clone, Default, PartialEq)]
struct KeyLines {
    path: PathBuf,
    lines: std::collections::BTreeMap<String, usize>,
}

impl KeyLines {
    /// Finds the line of every key of `text`, already known to be valid TOML.
    fn find(text: &str, path: &Path) -> KeyLines {
        let mut key_lines = KeyLines {
            path: path.to_path_buf(),
            lines: Default::default(),
        };
        let line_of = |offset: usize| text[..offset.min(text.len())].matches('\n').count() + 1;
        let Ok(document) = toml::de::DeTable::parse(text) else {
            return key_lines;
        };
        for (key, value) in document.get_ref().iter() {
            key_lines
                .lines
                .insert(key.get_ref().to_string(), line_of(key.span().start));
            if let toml::de::DeValue::Table(table) = value.get_ref() {
                for (inner, _) in table.iter() {
                    key_lines.lines.insert(
                        format!("{}.{}", key.get_ref(), inner.get_ref()),
                        line_of(inner.span().start),
                    );
                }
            }
        }
        key_lines
    }
}

/// Lengths in light years as an error message shows them: to 0.1 ly,
/// comma-separated, with the unit (`652312.8 ly`, `978469.1,0,0 ly`), so a
/// value converted from pc or kpc does not show float noise.
fn ly_text(values: &[f64]) -> String {
    let shown: Vec<String> = values
        .iter()
        .map(|v| format!("{}", (v * 10.0).round() / 10.0 + 0.0))
        .collect();
    format!("{} ly", shown.join(","))
}

/// Parses a length such as `200`, `200ly`, `60pc`, `1.5kpc`, `2kly` into light years.
///
/// `option` names the flag or key in the error message.
pub fn parse_length_ly(option: &str, text: &str) -> Result<f64> {
    let t = text.trim();
    let (number, factor) = split_unit(t);
    let factor = factor.ok_or_else(|| {
        Error::invalid(
            option,
            text,
            "it must be a length in light years, optionally with a unit: ly, pc, kly or kpc (e.g. 200ly, 60pc)",
        )
    })?;
    let v: f64 = number.trim().parse().map_err(|_| {
        Error::invalid(
            option,
            text,
            "it must be a number of light years, optionally with a unit: ly, pc, kly or kpc (e.g. 200ly, 60pc)",
        )
    })?;
    let ly = v * factor;
    if !(ly.is_finite() && ly > 0.0) {
        return Err(Error::invalid(
            option,
            text,
            "it must be a positive, finite length",
        ));
    }
    Ok(ly)
}

fn split_unit(t: &str) -> (&str, Option<f64>) {
    let end = t
        .rfind(|c: char| c.is_ascii_digit() || c == '.')
        .map(|i| i + 1)
        .unwrap_or(0);
    let (num, unit) = t.split_at(end);
    let factor = match unit.trim().to_ascii_lowercase().as_str() {
        "" | "ly" => Some(1.0),
        "kly" => Some(1000.0),
        "pc" => Some(LY_PER_PC),
        "kpc" => Some(1000.0 * LY_PER_PC),
        _ => None,
    };
    (num, factor)
}

/// Parses a signed coordinate (`-50`, `-12pc`) into light years.
pub fn parse_coordinate_ly(option: &str, text: &str) -> Result<f64> {
    let t = text.trim();
    let (number, factor) = split_unit(t);
    let bad = || {
        Error::invalid(
            option,
            text,
            "each coordinate must be a number of light years, optionally with a unit ly, pc, kly or kpc",
        )
    };
    let factor = factor.ok_or_else(bad)?;
    let v: f64 = number.trim().parse().map_err(|_| bad())?;
    let ly = v * factor;
    if !ly.is_finite() {
        return Err(bad());
    }
    Ok(ly)
}

/// Parses `N` lengths separated by commas (`--box 100,100,50ly`).
pub fn parse_length_list(option: &str, text: &str, n: usize, what: &str) -> Result<Vec<f64>> {
    let parts: Vec<&str> = text.split(',').collect();
    if parts.len() != n {
        return Err(Error::invalid(option, text, format!("it must be {what}")));
    }
    parts.iter().map(|p| parse_length_ly(option, p)).collect()
}

/// Parses `X,Y,Z` (light years, or with a unit each; negatives allowed).
pub fn parse_centre(option: &str, text: &str) -> Result<[f64; 3]> {
    let parts: Vec<&str> = text.split(',').collect();
    if parts.len() != 3 {
        return Err(Error::invalid(
            option,
            text,
            "it must be three coordinates X,Y,Z in light years (e.g. -50,0,0)",
        ));
    }
    let mut c = [0.0; 3];
    for (i, p) in parts.iter().enumerate() {
        c[i] = parse_coordinate_ly(option, p)?;
    }
    Ok(c)
}

/// Parses a density: stars per cubic light year, or with `/pc3` per cubic parsec.
pub fn parse_density(option: &str, text: &str) -> Result<f64> {
    let t = text.trim();
    let lower = t.to_ascii_lowercase();
    let (num, per_pc3) = if let Some(n) = lower.strip_suffix("/pc3") {
        (n.to_string(), true)
    } else if let Some(n) = lower.strip_suffix("/ly3") {
        (n.to_string(), false)
    } else {
        (lower.clone(), false)
    };
    let allowed = format!(
        "it must be a positive number of stars per cubic light year (or per cubic parsec with the suffix /pc3), at most {MAX_DENSITY_PER_LY3} per cubic light year"
    );
    let v: f64 = num
        .trim()
        .parse()
        .map_err(|_| Error::invalid(option, text, &allowed))?;
    let per_ly3 = if per_pc3 { v / LY_PER_PC.powi(3) } else { v };
    if !(per_ly3.is_finite() && per_ly3 > 0.0 && per_ly3 <= MAX_DENSITY_PER_LY3) {
        return Err(Error::invalid(option, text, &allowed));
    }
    Ok(per_ly3)
}

/// A number or a text with a unit, as a TOML value may hold.
#[derive(Debug, Clone, Serialize, Deserialize, PartialEq)]
#[serde(untagged)]
pub enum NumberOrText {
    /// A plain number (light years, or stars per cubic light year).
    Number(f64),
    /// A text with a unit (`60pc`, `0.09/pc3`).
    Text(String),
}

impl NumberOrText {
    fn as_text(&self) -> String {
        match self {
            NumberOrText::Number(v) => format!("{v}"),
            NumberOrText::Text(t) => t.clone(),
        }
    }
}

/// The shape table of a spec file.
#[derive(Debug, Clone, Default, Serialize, Deserialize, PartialEq)]
#[serde(deny_unknown_fields)]
pub struct ShapeFile {
    /// `box`, `sphere` or `cylinder`.
    pub kind: String,
    /// Box edge lengths.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub size_ly: Option<Vec<NumberOrText>>,
    /// Sphere or cylinder radius.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub radius_ly: Option<NumberOrText>,
    /// Cylinder full height.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub height_ly: Option<NumberOrText>,
}

/// The TOML form of a spec: every key optional, flags fill or override it.
#[derive(Debug, Clone, Default, Serialize, Deserialize, PartialEq)]
#[serde(deny_unknown_fields)]
pub struct SpecFile {
    /// The starloom version that wrote the file (informational).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub starloom_version: Option<String>,
    /// Sector title.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub title: Option<String>,
    /// Universe seed.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub seed: Option<u64>,
    /// Centre, light years.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub centre_ly: Option<Vec<NumberOrText>>,
    /// Stars per cubic light year (a number) or a text with `/pc3`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub density: Option<NumberOrText>,
    /// `uniform` or `disk`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub density_model: Option<String>,
    /// Thick-disk share for the disk model.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub thick_share: Option<f64>,
    /// `kirkpatrick`, `kroupa` or `chabrier`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub imf: Option<String>,
    /// `[min, max]` ages, gigayears.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ages_gyr: Option<Vec<f64>>,
    /// Keep all neutron stars and black holes.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub keep_remnants: Option<bool>,
    /// `fitted` or `rules`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub physics: Option<String>,
    /// A sun-like home system at the centre.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub home: Option<bool>,
    /// CSV file of pinned systems; a relative path is taken from the
    /// spec file's folder.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub pin: Option<String>,
    /// FNV-1a hash of the pin file's bytes, 16 hex digits: when present,
    /// a pin file whose bytes no longer match is refused.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub pin_fnv1a: Option<String>,
    /// Clearing radius around pins.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub pin_clear_ly: Option<NumberOrText>,
    /// `K/N`: which slice of the cells this file holds.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub shard: Option<String>,
    /// The volume.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub shape: Option<ShapeFile>,
    /// Where each key read from a file sits; keys set by flags have none.
    #[serde(skip)]
    key_lines: Option<KeyLines>,
}

impl SpecFile {
    /// Reads and parses a spec file; errors name the file and the line.
    pub fn read(path: &Path) -> Result<SpecFile> {
        let text = std::fs::read_to_string(path).map_err(|e| Error::MissingInput {
            path: path.to_path_buf(),
            message: e.to_string(),
        })?;
        Self::parse(&text, path)
    }

    /// Parses spec-file text; `path` is used in error messages.
    pub fn parse(text: &str, path: &Path) -> Result<SpecFile> {
        let mut file: SpecFile = toml::from_str(text).map_err(|e| {
            let line = e
                .span()
                .map(|s| text[..s.start.min(text.len())].matches('\n').count() + 1);
            let msg = e.message().trim().replace('\n', " ");
            Error::BadFile {
                path: path.to_path_buf(),
                message: match line {
                    Some(l) => format!("line {l}: {msg}"),
                    None => msg,
                },
            }
        })?;
        file.key_lines = Some(KeyLines::find(text, path));
        Ok(file)
    }

    /// Replaces every setting that `flags` holds (those typed on the
    /// command line), so that errors in them name the flag, not this file.
    /// A shape in `flags` replaces this file's whole shape table.
    pub fn override_with(&mut self, flags: SpecFile) {
        let SpecFile {
            starloom_version,
            title,
            seed,
            centre_ly,
            density,
            density_model,
            thick_share,
            imf,
            ages_gyr,
            keep_remnants,
            physics,
            home,
            pin,
            pin_fnv1a,
            pin_clear_ly,
            shard,
            shape,
            key_lines: _,
        } = flags;
        let mut forget = |key: &str| {
            if let Some(key_lines) = &mut self.key_lines {
                let table = format!("{key}.");
                key_lines
                    .lines
                    .retain(|k, _| k != key && !k.starts_with(&table));
            }
        };
        fn put<T>(slot: &mut Option<T>, value: Option<T>, key: &str, forget: &mut dyn FnMut(&str)) {
            if value.is_some() {
                *slot = value;
                forget(key);
            }
        }
        put(
            &mut self.starloom_version,
            starloom_version,
            "starloom_version",
            &mut forget,
        );
        put(&mut self.title, title, "title", &mut forget);
        put(&mut self.seed, seed, "seed", &mut forget);
        put(&mut self.centre_ly, centre_ly, "centre_ly", &mut forget);
        put(&mut self.density, density, "density", &mut forget);
        put(
            &mut self.density_model,
            density_model,
            "density_model",
            &mut forget,
        );
        put(
            &mut self.thick_share,
            thick_share,
            "thick_share",
            &mut forget,
        );
        put(&mut self.imf, imf, "imf", &mut forget);
        put(&mut self.ages_gyr, ages_gyr, "ages_gyr", &mut forget);
        put(
            &mut self.keep_remnants,
            keep_remnants,
            "keep_remnants",
            &mut forget,
        );
        put(&mut self.physics, physics, "physics", &mut forget);
        put(&mut self.home, home, "home", &mut forget);
        // A pin file typed on the command line is read as it is now: the
        // file's recorded hash belongs to the file's own pin.
        if pin.is_some() {
            self.pin_fnv1a = None;
        }
        put(&mut self.pin, pin, "pin", &mut forget);
        put(&mut self.pin_fnv1a, pin_fnv1a, "pin_fnv1a", &mut forget);
        put(
            &mut self.pin_clear_ly,
            pin_clear_ly,
            "pin_clear_ly",
            &mut forget,
        );
        put(&mut self.shard, shard, "shard", &mut forget);
        put(&mut self.shape, shape, "shape", &mut forget);
    }

    /// The file and line a key was read from (`path, line 19`), if it was.
    fn place(&self, key: &str) -> Option<String> {
        let key_lines = self.key_lines.as_ref()?;
        let line = key_lines.lines.get(key)?;
        Some(format!("{}, line {line}", key_lines.path.display()))
    }

    /// How an error names `setting`: the file, line and key when this file
    /// holds its value (`s.toml, line 19: radius_ly`), else its flag.
    pub fn label(&self, setting: Setting) -> String {
        let key = setting.key();
        match self.place(key) {
            Some(place) => {
                let leaf = key.rsplit('.').next().unwrap_or(key);
                format!("{place}: {leaf}")
            }
            None => setting.flag().to_string(),
        }
    }

    /// The sector's centre, ly: the origin when the file gives none.
    pub fn centre(&self) -> Result<[f64; 3]> {
        match &self.centre_ly {
            None => Ok([0.0; 3]),
            Some(v) => {
                let text: Vec<String> = v.iter().map(NumberOrText::as_text).collect();
                parse_centre(&self.label(Setting::Centre), &text.join(","))
            }
        }
    }

    /// Resolves the file into a spec. `seed` is used when the file has none;
    /// `base` is the folder that relative pin paths are taken from.
    pub fn resolve(&self, default_seed: u64, base: &Path) -> Result<SectorSpec> {
        let shape = match &self.shape {
            None => {
                return Err(Error::Usage(
                    "give a volume: exactly one of --box X,Y,Z, --sphere R or --cylinder R,H (or a [shape] table in --spec)".into(),
                ));
            }
            Some(s) => self.resolve_shape(s)?,
        };
        let mut spec = SectorSpec::new(self.seed.unwrap_or(default_seed), shape, self.centre()?);
        spec.title = self.title.clone();
        if let Some(d) = &self.density {
            spec.density_per_ly3 = parse_density(&self.label(Setting::Density), &d.as_text())?;
        }
        let thick_share = self.thick_share.unwrap_or(DEFAULT_THICK_SHARE);
        spec.density_model = match self.density_model.as_deref().unwrap_or("uniform") {
            "uniform" => DensityModel::Uniform,
            "disk" | "disc" => DensityModel::Disk { thick_share },
            other => {
                return Err(Error::invalid(
                    &self.label(Setting::DensityModel),
                    other,
                    "it must be 'uniform' or 'disk'",
                ));
            }
        };
        if let Some(imf) = &self.imf {
            spec.population.imf = ImfChoice::parse(imf).ok_or_else(|| {
                Error::invalid(
                    &self.label(Setting::Imf),
                    imf,
                    "it must be kirkpatrick, kroupa or chabrier",
                )
            })?;
        }
        if let Some(ages) = &self.ages_gyr {
            if ages.len() != 2 {
                return Err(Error::invalid(
                    &self.label(Setting::Ages),
                    format!("{ages:?}"),
                    "it must be MIN,MAX in gigayears",
                ));
            }
            spec.population.ages_gyr = [ages[0], ages[1]];
        }
        spec.population.keep_remnants = self.keep_remnants.unwrap_or(false);
        if let Some(p) = &self.physics {
            spec.population.fidelity = Fidelity::parse(p).ok_or_else(|| {
                Error::invalid(
                    &self.label(Setting::Physics),
                    p,
                    "it must be 'fitted' or 'rules'",
                )
            })?;
        }
        spec.home = self.home.unwrap_or(false);
        if let Some(c) = &self.pin_clear_ly {
            spec.pin_clear_ly = match c {
                NumberOrText::Number(v) => *v,
                NumberOrText::Text(t) => parse_length_ly(&self.label(Setting::PinClear), t)?,
            };
        }
        if let Some(pin) = &self.pin {
            let p = Path::new(pin);
            let path = if p.is_absolute() {
                p.to_path_buf()
            } else {
                base.join(p)
            };
            match load_pins(&mut spec, path.clone(), self.pin_fnv1a.as_deref()) {
                Err(Error::MissingInput { message, .. }) if self.place("pin").is_some() => {
                    return Err(Error::invalid(
                        &self.label(Setting::Pin),
                        pin,
                        format!(
                            "it must name a readable CSV of pinned systems (cannot read {}: {message})",
                            path.display()
                        ),
                    ));
                }
                loaded => loaded?,
            }
        }
        spec.validate_named(&|setting| self.label(setting))?;
        Ok(spec)
    }

    fn resolve_shape(&self, s: &ShapeFile) -> Result<Shape> {
        let len = |setting: Setting, v: &Option<NumberOrText>| -> Result<f64> {
            match v {
                None => {
                    let key = setting.key().trim_start_matches("shape.");
                    let need = format!("the {} shape needs '{key}'", s.kind);
                    Err(Error::Usage(match self.place("shape") {
                        Some(place) => format!("{place}: {need}"),
                        None => need,
                    }))
                }
                Some(NumberOrText::Number(x)) if x.is_finite() && *x > 0.0 => Ok(*x),
                Some(other) => parse_length_ly(&self.label(setting), &other.as_text()),
            }
        };
        match s.kind.as_str() {
            "box" => {
                let v = s.size_ly.as_ref().ok_or_else(|| {
                    let need = "the box shape needs 'size_ly = [X, Y, Z]'";
                    Error::Usage(match self.place("shape") {
                        Some(place) => format!("{place}: {need}"),
                        None => need.into(),
                    })
                })?;
                let text: Vec<String> = v.iter().map(NumberOrText::as_text).collect();
                let l = parse_length_list(
                    &self.label(Setting::BoxSize),
                    &text.join(","),
                    3,
                    "three full edge lengths X,Y,Z in light years (e.g. 100,100,50 or 30pc,30pc,10pc)",
                )?;
                Ok(Shape::Box {
                    size_ly: [l[0], l[1], l[2]],
                })
            }
            "sphere" => Ok(Shape::Sphere {
                radius_ly: len(Setting::SphereRadius, &s.radius_ly)?,
            }),
            "cylinder" => Ok(Shape::Cylinder {
                radius_ly: len(Setting::CylinderRadius, &s.radius_ly)?,
                height_ly: len(Setting::CylinderHeight, &s.height_ly)?,
            }),
            other => Err(Error::invalid(
                &self.label(Setting::ShapeKind),
                other,
                "it must be 'box', 'sphere' or 'cylinder'",
            )),
        }
    }
}

/// Reads the pins of `spec` from `path` (see
/// [`crate::catalogue::reader::read_pins`]) and records the file and its
/// hash. `expected_fnv1a` is the hash a spec file recorded: a file whose
/// bytes no longer match is refused.
pub fn load_pins(spec: &mut SectorSpec, path: PathBuf, expected_fnv1a: Option<&str>) -> Result<()> {
    let bytes = std::fs::read(&path).map_err(|e| Error::MissingInput {
        path: path.clone(),
        message: e.to_string(),
    })?;
    let hash = fnv1a_64(&bytes);
    if let Some(expected) = expected_fnv1a
        && u64::from_str_radix(expected.trim(), 16).ok() != Some(hash)
    {
        return Err(Error::BadFile {
            path: path.clone(),
            message: format!(
                "the pin file has changed since the spec was written (FNV-1a {hash:016x}, the spec recorded {expected}); restore it, or give it again with --pin to make a new sector"
            ),
        });
    }
    spec.pins = crate::catalogue::reader::read_pins(&path)?;
    spec.pin_file = Some(path);
    spec.pin_file_fnv1a = Some(hash);
    Ok(())
}

/// The 64-bit FNV-1a hash of `bytes` (Fowler, Noll and Vo; offset basis
/// 0xcbf29ce484222325, prime 0x100000001b3): enough to notice an edited
/// file, not a defence against a deliberate collision.
fn fnv1a_64(bytes: &[u8]) -> u64 {
    bytes.iter().fold(0xcbf2_9ce4_8422_2325, |h, &b| {
        (h ^ b as u64).wrapping_mul(0x0000_0100_0000_01b3)
    })
}

/// How the sidecar at `sidecar` names `pin_file`: relative to the
/// sidecar's folder when the pin file lies in it or below it (so the
/// folder can move), else absolute.
fn pin_path_for_sidecar(pin_file: &Path, sidecar: &Path) -> String {
    let absolute = |p: &Path| normalise(&std::path::absolute(p).unwrap_or(p.to_path_buf()));
    let pin = absolute(pin_file);
    let folder = match sidecar.parent() {
        Some(d) if !d.as_os_str().is_empty() => absolute(d),
        _ => absolute(Path::new(".")),
    };
    match pin.strip_prefix(&folder) {
        Ok(relative) if !relative.as_os_str().is_empty() => relative.display().to_string(),
        _ => pin.display().to_string(),
    }
}

/// `path` without `.` components and with `..` applied (no file-system
/// look-ups, so symbolic links are taken as written).
fn normalise(path: &Path) -> PathBuf {
    use std::path::Component;
    let mut out = PathBuf::new();
    for c in path.components() {
        match c {
            Component::CurDir => {}
            Component::ParentDir => {
                out.pop();
            }
            other => out.push(other),
        }
    }
    out
}

/// The sidecar form of a resolved spec (every key filled in), for
/// `populate --spec PATH.toml` to regenerate the same catalogue; `sidecar`
/// is where it will be written (a pin file in its folder is named
/// relative to it).
pub fn to_spec_file(spec: &SectorSpec, shard: Option<(u64, u64)>, sidecar: &Path) -> SpecFile {
    let shape = match spec.shape {
        Shape::Box { size_ly } => ShapeFile {
            kind: "box".into(),
            size_ly: Some(size_ly.iter().map(|&v| NumberOrText::Number(v)).collect()),
            ..Default::default()
        },
        Shape::Sphere { radius_ly } => ShapeFile {
            kind: "sphere".into(),
            radius_ly: Some(NumberOrText::Number(radius_ly)),
            ..Default::default()
        },
        Shape::Cylinder {
            radius_ly,
            height_ly,
        } => ShapeFile {
            kind: "cylinder".into(),
            radius_ly: Some(NumberOrText::Number(radius_ly)),
            height_ly: Some(NumberOrText::Number(height_ly)),
            ..Default::default()
        },
    };
    let (model, thick) = match spec.density_model {
        DensityModel::Uniform => ("uniform", None),
        DensityModel::Disk { thick_share } => ("disk", Some(thick_share)),
    };
    SpecFile {
        starloom_version: Some(env!("CARGO_PKG_VERSION").into()),
        title: spec.title.clone(),
        seed: Some(spec.seed),
        centre_ly: Some(
            spec.centre_ly
                .iter()
                .map(|&v| NumberOrText::Number(v))
                .collect(),
        ),
        density: Some(NumberOrText::Number(spec.density_per_ly3)),
        density_model: Some(model.into()),
        thick_share: thick,
        imf: Some(spec.population.imf.as_str().into()),
        ages_gyr: Some(spec.population.ages_gyr.to_vec()),
        keep_remnants: Some(spec.population.keep_remnants),
        physics: Some(spec.population.fidelity.as_str().into()),
        home: Some(spec.home),
        pin: spec
            .pin_file
            .as_ref()
            .map(|p| pin_path_for_sidecar(p, sidecar)),
        pin_fnv1a: spec
            .pin_file
            .as_ref()
            .and(spec.pin_file_fnv1a)
            .map(|h| format!("{h:016x}")),
        pin_clear_ly: Some(NumberOrText::Number(spec.pin_clear_ly)),
        shard: shard.map(|(k, n)| format!("{k}/{n}")),
        shape: Some(shape),
        key_lines: None,
    }
}

/// The sidecar spec written beside a catalogue: `PATH.toml` (the
/// catalogue's full file name with `.toml` appended).
pub fn sidecar_path(catalogue: &Path) -> PathBuf {
    let mut side = catalogue.as_os_str().to_owned();
    side.push(".toml");
    PathBuf::from(side)
}

/// The sidecar TOML text of a resolved spec, to be written at `sidecar`.
pub fn to_toml(spec: &SectorSpec, shard: Option<(u64, u64)>, sidecar: &Path) -> String {
    let body = toml::to_string(&to_spec_file(spec, shard, sidecar)).unwrap_or_default();
    format!(
        "# starloom sector spec: `starloom populate --spec THIS_FILE --out FILE` regenerates the same catalogue.\n{body}"
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lengths_with_units() {
        assert_eq!(parse_length_ly("--sphere", "200").unwrap(), 200.0);
        assert_eq!(parse_length_ly("--sphere", "200ly").unwrap(), 200.0);
        // 1 pc = 3.261 563 777 ly (derived from IAU 2015 B2 and the Julian-year light year).
        assert!((parse_length_ly("--sphere", "60pc").unwrap() - 195.693_826_6).abs() < 1e-5);
        assert!(parse_length_ly("--sphere", "-5").is_err());
        assert!(parse_length_ly("--sphere", "5 furlongs").is_err());
        assert!(parse_length_ly("--sphere", "inf").is_err());
        assert_eq!(
            parse_centre("--centre", "-50,0,0").unwrap(),
            [-50.0, 0.0, 0.0]
        );
        let d = parse_density("--density", "0.09/pc3").unwrap();
        assert!((d - 0.09 / LY_PER_PC.powi(3)).abs() < 1e-12);
        assert!(parse_density("--density", "0").is_err());
    }

    #[test]
    fn too_far_names_the_length_in_ly_without_float_noise() {
        // 200 kpc, typed as a user would: 652 312.755… ly.
        let radius_ly = parse_length_ly("--sphere", "200kpc").unwrap();
        let spec = SectorSpec::new(1, Shape::Sphere { radius_ly }, [0.0; 3]);
        let text = spec.validate().unwrap_err().to_string();
        assert!(text.contains("--sphere got '652312.8 ly'"), "{text}");
        let far = parse_centre("--centre", "300kpc,0,-0").unwrap();
        let spec = SectorSpec::new(1, Shape::Sphere { radius_ly: 10.0 }, far);
        let text = spec.validate().unwrap_err().to_string();
        assert!(text.contains("--centre got '978469.1,0,0 ly'"), "{text}");
    }

    #[test]
    fn sidecar_round_trip() {
        let mut spec = SectorSpec::new(
            42,
            Shape::Cylinder {
                radius_ly: 30.0,
                height_ly: 12.5,
            },
            [-5.0, 1.0, 2.0],
        );
        spec.density_model = DensityModel::Disk { thick_share: 0.04 };
        spec.population.ages_gyr = [1.0, 3.0];
        spec.home = true;
        let text = to_toml(&spec, None, Path::new("x.toml"));
        let back = SpecFile::parse(&text, Path::new("x.toml"))
            .unwrap()
            .resolve(0, Path::new("."))
            .unwrap();
        assert_eq!(back, spec);
    }

    #[test]
    fn bad_spec_file_names_the_line() {
        let err = SpecFile::parse("seed = 1\nshape = 3\n", Path::new("s.toml")).unwrap_err();
        assert!(err.to_string().contains("line 2"), "{err}");
    }
}
