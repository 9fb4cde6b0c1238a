//! Struct-of-arrays storage for a catalogue: one `Vec` per column, all the
//! same length, rows in a fixed order (cell, then index within the cell).

use super::NameColumn;
use crate::physics::{ClassCode, HabitableZone, StarKind, StarProfile};

/// Where a row came from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Origin {
    /// Made by the sampler and population synthesis.
    #[default]
    Generated,
    /// Read from a user's own file.
    Imported,
    /// A real star from the Hipparcos new reduction (van Leeuwen 2007).
    Hipparcos,
}

impl Origin {
    /// The value written in the `origin` column.
    pub fn as_str(self) -> &'static str {
        match self {
            Origin::Generated => "generated",
            Origin::Imported => "imported",
            Origin::Hipparcos => "hipparcos",
        }
    }

    /// Parses a value of the `origin` column.
    pub fn parse(text: &str) -> Option<Origin> {
        Origin::parse_bytes(text.as_bytes())
    }

    /// [`Origin::parse`] of the bytes of a value.
    pub fn parse_bytes(text: &[u8]) -> Option<Origin> {
        match text {
            b"generated" => Some(Origin::Generated),
            b"imported" => Some(Origin::Imported),
            b"hipparcos" => Some(Origin::Hipparcos),
            _ => None,
        }
    }
}

/// One row, for building a catalogue a star at a time.
#[derive(Debug, Clone, PartialEq)]
pub struct StarRow {
    /// Unique star id.
    pub id: u64,
    /// Id of the system the star belongs to (the primary's id).
    pub system: u64,
    /// Display name.
    pub name: String,
    /// Position, light years, galactic cartesian axes (+x to the Galactic
    /// centre, +y toward l = 90°, +z to the north Galactic pole).
    pub position_ly: [f64; 3],
    /// Physical profile.
    pub profile: StarProfile,
    /// Projected separation from the system primary, au (0 for the primary).
    pub separation_au: f64,
    /// Orbital period about the primary, days (0 for the primary).
    pub period_days: f64,
    /// Where the row came from.
    pub origin: Origin,
}

/// One row by reference, as the sampler emits it and the writers format it.
#[derive(Debug, Clone, Copy)]
pub struct RowView<'a> {
    /// Unique star id.
    pub id: u64,
    /// System id (the primary's star id).
    pub system: u64,
    /// Display name.
    pub name: &'a str,
    /// Position, light years, galactic axes.
    pub position_ly: [f64; 3],
    /// Physical profile.
    pub profile: &'a StarProfile,
    /// Separation from the primary, au.
    pub separation_au: f64,
    /// Orbital period about the primary, days.
    pub period_days: f64,
    /// Where the row came from.
    pub origin: Origin,
}

/// What a catalogue says about itself (from the sidecar spec or the file).
#[derive(Debug, Clone, Default, PartialEq)]
pub struct CatalogueMeta {
    /// Sector name for title blocks, if known.
    pub title: Option<String>,
    /// Universe seed, if the catalogue was generated.
    pub seed: Option<u64>,
    /// Centre of the sector it was generated for, ly, if known: maps
    /// centre on it and measure heights from its plane by default.
    pub centre_ly: Option<[f64; 3]>,
}

/// A catalogue of stars, stored column by column.
///
/// # Guarantees
/// Every column has `len()` entries. Members of one system are adjacent,
/// primary first, and share its position. Values that a user's own file
/// did not give and physics could not derive are `NaN`.
#[derive(Debug, Clone, Default)]
pub struct Catalogue {
    /// Unique star ids.
    pub id: Vec<u64>,
    /// System ids (equal to the primary's star id).
    pub system: Vec<u64>,
    /// Display names.
    pub name: NameColumn,
    /// x, light years, galactic axes.
    pub x_ly: Vec<f64>,
    /// y, light years, galactic axes.
    pub y_ly: Vec<f64>,
    /// z, light years, galactic axes.
    pub z_ly: Vec<f64>,
    /// Kind of object.
    pub kind: Vec<StarKind>,
    /// Spectral class code.
    pub class: Vec<ClassCode>,
    /// Current mass, solar masses.
    pub mass_msun: Vec<f64>,
    /// Initial mass, solar masses.
    pub initial_mass_msun: Vec<f64>,
    /// Radius, solar radii.
    pub radius_rsun: Vec<f64>,
    /// Luminosity, solar luminosities.
    pub luminosity_lsun: Vec<f64>,
    /// Effective temperature, kelvin.
    pub teff_k: Vec<f64>,
    /// Age, gigayears.
    pub age_gyr: Vec<f64>,
    /// Main-sequence lifetime, gigayears.
    pub lifetime_gyr: Vec<f64>,
    /// Conservative habitable-zone inner edge, au.
    pub hz_inner_au: Vec<f64>,
    /// Conservative habitable-zone outer edge, au.
    pub hz_outer_au: Vec<f64>,
    /// True colour, sRGB.
    pub color_rgb: Vec<[u8; 3]>,
    /// Absolute visual magnitude.
    pub abs_mag_v: Vec<f64>,
    /// Separation from the primary, au (0 for primaries).
    pub separation_au: Vec<f64>,
    /// Orbital period about the primary, days (0 for primaries).
    pub period_days: Vec<f64>,
    /// Fiction-grade habitable-host flag.
    pub habitable_host: Vec<bool>,
    /// Where each row came from.
    pub origin: Vec<Origin>,
    /// Title and seed, when known.
    pub meta: CatalogueMeta,
}

impl Catalogue {
    /// Number of rows.
    pub fn len(&self) -> usize {
        self.id.len()
    }

    /// True when there are no rows.
    pub fn is_empty(&self) -> bool {
        self.id.is_empty()
    }

    /// Appends one row.
    pub fn push(&mut self, row: StarRow) {
        let p = &row.profile;
        self.id.push(row.id);
        self.system.push(row.system);
        self.name.push(&row.name);
        self.x_ly.push(row.position_ly[0]);
        self.y_ly.push(row.position_ly[1]);
        self.z_ly.push(row.position_ly[2]);
        self.kind.push(p.kind);
        self.class.push(p.class);
        self.mass_msun.push(p.mass_msun);
        self.initial_mass_msun.push(p.initial_mass_msun);
        self.radius_rsun.push(p.radius_rsun);
        self.luminosity_lsun.push(p.luminosity_lsun);
        self.teff_k.push(p.teff_k);
        self.age_gyr.push(p.age_gyr);
        self.lifetime_gyr.push(p.lifetime_gyr);
        self.hz_inner_au.push(p.hz.inner_au);
        self.hz_outer_au.push(p.hz.outer_au);
        self.color_rgb.push(p.color_rgb);
        self.abs_mag_v.push(p.abs_mag_v);
        self.separation_au.push(row.separation_au);
        self.period_days.push(row.period_days);
        self.habitable_host.push(p.habitable_host);
        self.origin.push(row.origin);
    }

    /// Appends one row given by reference.
    pub fn push_view(&mut self, row: &RowView<'_>) {
        let p = row.profile;
        self.id.push(row.id);
        self.system.push(row.system);
        self.name.push(row.name);
        self.x_ly.push(row.position_ly[0]);
        self.y_ly.push(row.position_ly[1]);
        self.z_ly.push(row.position_ly[2]);
        self.kind.push(p.kind);
        self.class.push(p.class);
        self.mass_msun.push(p.mass_msun);
        self.initial_mass_msun.push(p.initial_mass_msun);
        self.radius_rsun.push(p.radius_rsun);
        self.luminosity_lsun.push(p.luminosity_lsun);
        self.teff_k.push(p.teff_k);
        self.age_gyr.push(p.age_gyr);
        self.lifetime_gyr.push(p.lifetime_gyr);
        self.hz_inner_au.push(p.hz.inner_au);
        self.hz_outer_au.push(p.hz.outer_au);
        self.color_rgb.push(p.color_rgb);
        self.abs_mag_v.push(p.abs_mag_v);
        self.separation_au.push(row.separation_au);
        self.period_days.push(row.period_days);
        self.habitable_host.push(p.habitable_host);
        self.origin.push(row.origin);
    }

    /// Moves every row of `other` to the end of `self` (meta unchanged).
    pub fn append(&mut self, other: &mut Catalogue) {
        self.id.append(&mut other.id);
        self.system.append(&mut other.system);
        self.name.append(&mut other.name);
        self.x_ly.append(&mut other.x_ly);
        self.y_ly.append(&mut other.y_ly);
        self.z_ly.append(&mut other.z_ly);
        self.kind.append(&mut other.kind);
        self.class.append(&mut other.class);
        self.mass_msun.append(&mut other.mass_msun);
        self.initial_mass_msun.append(&mut other.initial_mass_msun);
        self.radius_rsun.append(&mut other.radius_rsun);
        self.luminosity_lsun.append(&mut other.luminosity_lsun);
        self.teff_k.append(&mut other.teff_k);
        self.age_gyr.append(&mut other.age_gyr);
        self.lifetime_gyr.append(&mut other.lifetime_gyr);
        self.hz_inner_au.append(&mut other.hz_inner_au);
        self.hz_outer_au.append(&mut other.hz_outer_au);
        self.color_rgb.append(&mut other.color_rgb);
        self.abs_mag_v.append(&mut other.abs_mag_v);
        self.separation_au.append(&mut other.separation_au);
        self.period_days.append(&mut other.period_days);
        self.habitable_host.append(&mut other.habitable_host);
        self.origin.append(&mut other.origin);
    }

    /// The physical profile of row `i`, rebuilt from the columns (the
    /// optimistic habitable-zone edges, which are not stored, are NaN).
    pub fn profile(&self, i: usize) -> StarProfile {
        StarProfile {
            kind: self.kind[i],
            class: self.class[i],
            mass_msun: self.mass_msun[i],
            initial_mass_msun: self.initial_mass_msun[i],
            radius_rsun: self.radius_rsun[i],
            luminosity_lsun: self.luminosity_lsun[i],
            teff_k: self.teff_k[i],
            age_gyr: self.age_gyr[i],
            lifetime_gyr: self.lifetime_gyr[i],
            hz: HabitableZone {
                inner_au: self.hz_inner_au[i],
                outer_au: self.hz_outer_au[i],
                optimistic_inner_au: f64::NAN,
                optimistic_outer_au: f64::NAN,
                teff_in_range: (2600.0..=7200.0).contains(&self.teff_k[i]),
            },
            color_rgb: self.color_rgb[i],
            abs_mag_v: self.abs_mag_v[i],
            habitable_host: self.habitable_host[i],
        }
    }

    /// Position of row `i`, light years.
    pub fn position_ly(&self, i: usize) -> [f64; 3] {
        [self.x_ly[i], self.y_ly[i], self.z_ly[i]]
    }

    /// Row ranges of the systems, in catalogue order: each range holds one
    /// system's members, primary first.
    pub fn system_ranges(&self) -> Vec<std::ops::Range<usize>> {
        use rayon::prelude::*;
        let n = self.len();
        if n == 0 {
            return Vec::new();
        }
        // A system starts where the id changes. Found in pieces on all
        // threads; the starts come back in row order.
        let piece = 1 << 16;
        let sys = &self.system;
        let starts: Vec<Vec<usize>> = (0..n.div_ceil(piece))
            .into_par_iter()
            .map(|k| {
                let (a, b) = (k * piece, ((k + 1) * piece).min(n));
                (a.max(1)..b).filter(|&i| sys[i] != sys[i - 1]).collect()
            })
            .collect();
        let mut ranges = Vec::with_capacity(1 + starts.iter().map(Vec::len).sum::<usize>());
        let mut start = 0;
        for i in starts.into_iter().flatten() {
            ranges.push(start..i);
            start = i;
        }
        ranges.push(start..n);
        ranges
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The ranges by one plain pass over the rows.
    fn ranges_one_by_one(system: &[u64]) -> Vec<std::ops::Range<usize>> {
        let mut out: Vec<std::ops::Range<usize>> = Vec::new();
        for (i, s) in system.iter().enumerate() {
            match out.last_mut() {
                Some(r) if system[r.start] == *s => r.end = i + 1,
                _ => out.push(i..i + 1),
            }
        }
        out
    }

    #[test]
    fn origins_parse_back_from_their_names_only() {
        for o in [Origin::Generated, Origin::Imported, Origin::Hipparcos] {
            assert_eq!(Origin::parse(o.as_str()), Some(o));
            assert_eq!(Origin::parse(&o.as_str().to_ascii_uppercase()), None);
        }
        assert_eq!(Origin::parse(""), None);
    }

    #[test]
    fn system_ranges_split_where_the_system_changes() {
        // Runs of 1 to 4 rows, so runs straddle the parallel pieces.
        for n in [0usize, 1, 2, 65_535, 65_536, 65_537, 200_001] {
            let mut cat = Catalogue::default();
            let mut sys = 0u64;
            let mut left = 0u64;
            for i in 0..n as u64 {
                if left == 0 {
                    sys = i * 7 + 3;
                    left = 1 + ((i * 2_654_435_761) >> 7) % 4;
                }
                left -= 1;
                cat.id.push(i);
                cat.system.push(sys);
            }
            assert_eq!(
                cat.system_ranges(),
                ranges_one_by_one(&cat.system),
                "{n} rows"
            );
        }
    }
}
