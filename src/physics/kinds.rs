//! The vocabulary of the physics core: kinds of object, fidelity levels,
//! the spectral-class code and the profile record.

use std::fmt;

/// The evolutionary stage or kind of an object.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum StarKind {
    /// Core hydrogen burning.
    MainSequence,
    /// Hertzsprung gap: hydrogen exhausted in the core, shell burning begins.
    Subgiant,
    /// First (red) giant branch.
    Giant,
    /// Core helium burning (horizontal branch, red clump, blue loop).
    CoreHelium,
    /// Asymptotic giant branch.
    AsymptoticGiant,
    /// Any post-main-sequence stage of a massive star (initial mass above
    /// about 10 Msun): red, yellow or blue supergiant.
    Supergiant,
    /// A degenerate remnant of a star below about 8 Msun.
    WhiteDwarf,
    /// A neutron-degenerate remnant.
    NeutronStar,
    /// A collapsed remnant inside its event horizon.
    BlackHole,
    /// A substellar object, 0.013–0.075 Msun, that never burns hydrogen.
    BrownDwarf,
}

impl StarKind {
    /// Every kind, in a fixed order (for legends, summaries and parsing).
    pub const ALL: [StarKind; 10] = [
        StarKind::MainSequence,
        StarKind::Subgiant,
        StarKind::Giant,
        StarKind::CoreHelium,
        StarKind::AsymptoticGiant,
        StarKind::Supergiant,
        StarKind::WhiteDwarf,
        StarKind::NeutronStar,
        StarKind::BlackHole,
        StarKind::BrownDwarf,
    ];

    /// The name used in files and on the command line (`main-sequence`).
    pub fn as_str(self) -> &'static str {
        match self {
            StarKind::MainSequence => "main-sequence",
            StarKind::Subgiant => "subgiant",
            StarKind::Giant => "giant",
            StarKind::CoreHelium => "core-helium",
            StarKind::AsymptoticGiant => "asymptotic-giant",
            StarKind::Supergiant => "supergiant",
            StarKind::WhiteDwarf => "white-dwarf",
            StarKind::NeutronStar => "neutron-star",
            StarKind::BlackHole => "black-hole",
            StarKind::BrownDwarf => "brown-dwarf",
        }
    }

    /// Parses a name written by [`StarKind::as_str`].
    pub fn parse(name: &str) -> Option<StarKind> {
        StarKind::parse_bytes(name.as_bytes())
    }

    /// [`StarKind::parse`] of the bytes of a name.
    pub fn parse_bytes(name: &[u8]) -> Option<StarKind> {
        Some(match name {
            b"main-sequence" => StarKind::MainSequence,
            b"subgiant" => StarKind::Subgiant,
            b"giant" => StarKind::Giant,
            b"core-helium" => StarKind::CoreHelium,
            b"asymptotic-giant" => StarKind::AsymptoticGiant,
            b"supergiant" => StarKind::Supergiant,
            b"white-dwarf" => StarKind::WhiteDwarf,
            b"neutron-star" => StarKind::NeutronStar,
            b"black-hole" => StarKind::BlackHole,
            b"brown-dwarf" => StarKind::BrownDwarf,
            _ => return None,
        })
    }

    /// The comma-separated list of all names, for error messages.
    pub fn names() -> String {
        StarKind::ALL.map(|k| k.as_str()).join(", ")
    }

    /// True for objects that count as stars in densities (everything but brown dwarfs).
    pub fn is_star(self) -> bool {
        self != StarKind::BrownDwarf
    }

    /// True for white dwarfs, neutron stars and black holes.
    pub fn is_remnant(self) -> bool {
        matches!(
            self,
            StarKind::WhiteDwarf | StarKind::NeutronStar | StarKind::BlackHole
        )
    }

    /// True for the post-main-sequence stages that are still burning.
    pub fn is_evolved(self) -> bool {
        matches!(
            self,
            StarKind::Subgiant
                | StarKind::Giant
                | StarKind::CoreHelium
                | StarKind::AsymptoticGiant
                | StarKind::Supergiant
        )
    }
}

impl fmt::Display for StarKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

/// Which kind of object a request builds.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum KindChoice {
    /// Follow the star's evolution from initial mass and age.
    Auto,
    /// Build this kind of object with the given mass.
    Explicit(StarKind),
}

/// The two fidelity levels of the physics core.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Fidelity {
    /// Published fitting formulae (Tout et al. 1996, Hurley et al. 2000, ...).
    #[default]
    Fitted,
    /// Textbook power laws (common practice, no single source).
    Rules,
}

impl Fidelity {
    /// The name used on the command line and in spec files.
    pub fn as_str(self) -> &'static str {
        match self {
            Fidelity::Fitted => "fitted",
            Fidelity::Rules => "rules",
        }
    }

    /// Parses `fitted` or `rules`.
    pub fn parse(name: &str) -> Option<Fidelity> {
        match name {
            "fitted" => Some(Fidelity::Fitted),
            "rules" => Some(Fidelity::Rules),
            _ => None,
        }
    }
}

/// A spectral-class code such as `G2V`, `K1III`, `M4.5V`, `DA2.4`, `T5`.
///
/// # Guarantees
/// At most 15 ASCII bytes; stored inline, so copying a profile never allocates.
#[derive(Clone, Copy, PartialEq, Eq, Hash)]
pub struct ClassCode {
    bytes: [u8; 15],
    len: u8,
}

impl ClassCode {
    /// Builds a code from text, keeping the first 15 ASCII bytes.
    pub fn from_str_lossy(text: &str) -> ClassCode {
        let mut bytes = [0u8; 15];
        if text.len() <= 15 && text.is_ascii() {
            // Nothing to drop: the code is the text.
            bytes[..text.len()].copy_from_slice(text.as_bytes());
            return ClassCode {
                bytes,
                len: text.len() as u8,
            };
        }
        let mut len = 0;
        for b in text.bytes().filter(u8::is_ascii).take(15) {
            bytes[len] = b;
            len += 1;
        }
        ClassCode {
            bytes,
            len: len as u8,
        }
    }

    /// A code from ASCII bytes known at compile time (at most 15 are kept).
    pub(crate) const fn from_ascii(text: &[u8]) -> ClassCode {
        let mut bytes = [0u8; 15];
        let mut len = 0;
        while len < text.len() && len < 15 {
            bytes[len] = text[len];
            len += 1;
        }
        ClassCode {
            bytes,
            len: len as u8,
        }
    }

    /// A code from the first `len` (at most 15) of these bytes, which the
    /// caller guarantees are ASCII, with zeros after them (as every other
    /// constructor leaves them, so that equal codes compare equal).
    pub(crate) fn from_bytes(bytes: [u8; 15], len: usize) -> ClassCode {
        debug_assert!(bytes[..len.min(15)].is_ascii());
        debug_assert!(bytes[len.min(15)..].iter().all(|&b| b == 0));
        ClassCode {
            bytes,
            len: len.min(15) as u8,
        }
    }

    /// The code's ASCII bytes (the same as `as_str().as_bytes()`, without
    /// checking the encoding again).
    #[inline]
    pub fn as_bytes(&self) -> &[u8] {
        &self.bytes[..self.len as usize]
    }

    /// The code as text.
    pub fn as_str(&self) -> &str {
        // Only ASCII bytes are ever stored.
        std::str::from_utf8(&self.bytes[..self.len as usize]).unwrap_or("")
    }

    /// The leading class letter (`G` for `G2V`, `D` for white dwarfs), or
    /// `'?'` for an empty code.
    pub fn letter(&self) -> char {
        if self.len == 0 {
            '?'
        } else {
            self.bytes[0] as char
        }
    }
}

impl fmt::Display for ClassCode {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

impl fmt::Debug for ClassCode {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "ClassCode({})", self.as_str())
    }
}

/// Habitable-zone edges in astronomical units (Kopparapu et al. 2013/2014).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HabitableZone {
    /// Conservative inner edge, au.
    pub inner_au: f64,
    /// Conservative outer edge (maximum greenhouse), au.
    pub outer_au: f64,
    /// Optimistic inner edge (recent Venus), au.
    pub optimistic_inner_au: f64,
    /// Optimistic outer edge (early Mars), au.
    pub optimistic_outer_au: f64,
    /// False when Teff lies outside 2600–7200 K, where the fits do not
    /// hold and the edges were computed at the nearest valid temperature.
    pub teff_in_range: bool,
}

/// Everything the physics core says about one object.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StarProfile {
    /// Evolutionary stage or kind.
    pub kind: StarKind,
    /// Spectral class with subclass and luminosity class.
    pub class: ClassCode,
    /// Current mass, solar masses.
    pub mass_msun: f64,
    /// Zero-age main-sequence mass, solar masses.
    pub initial_mass_msun: f64,
    /// Current radius, nominal solar radii.
    pub radius_rsun: f64,
    /// Current luminosity, nominal solar luminosities.
    pub luminosity_lsun: f64,
    /// Effective temperature, kelvin.
    pub teff_k: f64,
    /// Age since formation, gigayears.
    pub age_gyr: f64,
    /// Main-sequence lifetime for the initial mass, gigayears (0 for brown
    /// dwarfs and for remnants without a single-star progenitor).
    pub lifetime_gyr: f64,
    /// Habitable-zone edges.
    pub hz: HabitableZone,
    /// True colour of the photosphere, sRGB, largest channel 255.
    pub color_rgb: [u8; 3],
    /// Absolute visual magnitude M_V.
    pub abs_mag_v: f64,
    /// Fiction-grade flag: a main-sequence star of 0.5–1.4 Msun, old enough for life.
    pub habitable_host: bool,
}

impl StarProfile {
    /// The colour as `#rrggbb`.
    pub fn color_hex(&self) -> String {
        let [r, g, b] = self.color_rgb;
        format!("#{r:02x}{g:02x}{b:02x}")
    }
}

#[cfg(test)]
mod tests {
    use super::StarKind;

    #[test]
    fn every_kind_parses_back_from_its_name_and_nothing_else_does() {
        for k in StarKind::ALL {
            assert_eq!(StarKind::parse(k.as_str()), Some(k), "{}", k.as_str());
            assert_eq!(StarKind::parse_bytes(k.as_str().as_bytes()), Some(k));
            let upper = k.as_str().to_ascii_uppercase();
            assert_eq!(StarKind::parse(&upper), None, "{upper}");
            assert_eq!(StarKind::parse(&format!("{} ", k.as_str())), None);
        }
        assert_eq!(StarKind::parse(""), None);
    }
}
