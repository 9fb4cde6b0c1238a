//! Reading catalogues: files starloom wrote and a user's own star lists.
//!
//! `.csv` files (and anything not ending in `.jsonl`) are read as CSV with
//! a header row; `.jsonl` files as one JSON object per line with the same
//! keys. A user's file needs a position, as `x_ly,y_ly,z_ly`, `x_pc,y_pc,z_pc`
//! or `ra_deg,dec_deg` with `distance_ly` or `distance_pc` (ICRS, turned into
//! galactic axes by [`crate::coords::icrs_to_galactic_cartesian`]); every
//! other column is optional. What is missing is derived where the physics
//! allows (a mass gives the whole profile; two of luminosity, radius and
//! Teff give the third by Stefan–Boltzmann), else it is NaN. A missing `id`
//! becomes the row number (from 1), a missing `system` makes each row its own
//! system. Title and seed come from the sidecar `PATH.toml` if present.
//!
//! A number must be finite, and one no star can have is refused: masses
//! and radii must be above 0; luminosity, Teff, ages, lifetimes, habitable
//! zones, distances, separations and periods 0 or more (0 is what starloom
//! writes for a black hole's light and a single star's orbit). Errors name
//! the line (the header is line 1), the column and the value.
//!
//! # Speed
//! The file is read into memory, cut into line-aligned chunks and the
//! chunks are parsed in parallel with hand-split fields and a fast decimal
//! parser; files with quoted fields go through the `csv` crate instead.
//! Rows of starloom's own header are decoded in a fixed field order, as
//! bytes, with no per-column dispatch; any row that decoder cannot take
//! whole goes to the general one, so both give the same values and errors;
//! a value out of range is one more reason to hand a row over, tested on
//! the value's bits with one comparison a value and one branch a row.

use crate::catalogue::NameColumn;
use crate::catalogue::table::{Catalogue, CatalogueMeta, Origin};
use crate::error::{Error, Result};
use crate::physics::spectral_class::DWARF_SEQUENCE;
use crate::physics::{
    ClassCode, KindChoice, StarKind, StarRequest, blackbody_color, habitable_zone, photometry,
    spectral_class, star_profile,
};
use crate::units::{Gigayears, LY_PER_PC, SolarMasses};
use rayon::prelude::*;
use std::path::Path;

/// Nominal solar effective temperature, K (IAU 2015 Resolution B3).
const TEFF_SUN_K: f64 = 5772.0;

/// A set of catalogue columns a caller needs, for [`read_catalogue_columns`].
///
/// Ids, systems and positions are always read. Columns left out of the set
/// are not parsed; they hold placeholders that mean "not read", not data:
/// numbers are 0 (so the unread columns cost no memory traffic), names
/// and classes are empty, kinds `main-sequence`, colours white, flags
/// `false`, origins `imported`.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Columns(u32);

impl Columns {
    /// Ids, systems and positions (always read).
    pub const POSITIONS: Columns = Columns(0);
    /// `name`.
    pub const NAME: Columns = Columns(1 << 0);
    /// `kind`.
    pub const KIND: Columns = Columns(1 << 1);
    /// `class`.
    pub const CLASS: Columns = Columns(1 << 2);
    /// `mass_msun`.
    pub const MASS: Columns = Columns(1 << 3);
    /// `initial_mass_msun`.
    pub const INITIAL_MASS: Columns = Columns(1 << 4);
    /// `radius_rsun`.
    pub const RADIUS: Columns = Columns(1 << 5);
    /// `luminosity_lsun`.
    pub const LUMINOSITY: Columns = Columns(1 << 6);
    /// `teff_k`.
    pub const TEFF: Columns = Columns(1 << 7);
    /// `age_gyr`.
    pub const AGE: Columns = Columns(1 << 8);
    /// `lifetime_gyr`.
    pub const LIFETIME: Columns = Columns(1 << 9);
    /// `hz_inner_au` and `hz_outer_au`.
    pub const HABITABLE_ZONE: Columns = Columns(1 << 10);
    /// `colour_hex`.
    pub const COLOUR: Columns = Columns(1 << 11);
    /// `abs_mag_v`.
    pub const ABS_MAG_V: Columns = Columns(1 << 12);
    /// `separation_au`.
    pub const SEPARATION: Columns = Columns(1 << 13);
    /// `period_days`.
    pub const PERIOD: Columns = Columns(1 << 14);
    /// `habitable_host`.
    pub const HABITABLE_HOST: Columns = Columns(1 << 15);
    /// `origin`.
    pub const ORIGIN: Columns = Columns(1 << 16);
    /// Every column.
    pub const ALL: Columns = Columns((1 << 17) - 1);
    /// Columns that the reader derives with the physics core when a file
    /// leaves them out.
    const DERIVED: Columns = Columns(
        Self::KIND.0
            | Self::CLASS.0
            | Self::INITIAL_MASS.0
            | Self::RADIUS.0
            | Self::LUMINOSITY.0
            | Self::TEFF.0
            | Self::LIFETIME.0
            | Self::HABITABLE_ZONE.0
            | Self::COLOUR.0
            | Self::ABS_MAG_V.0
            | Self::HABITABLE_HOST.0,
    );

    /// Both sets together.
    pub const fn with(self, other: Columns) -> Columns {
        Columns(self.0 | other.0)
    }

    /// True when every column of `other` is in this set.
    pub const fn contains(self, other: Columns) -> bool {
        self.0 & other.0 == other.0
    }

    /// The set a column belongs to; positions, ids, systems and unknown
    /// columns are in every set.
    fn of(col: Col) -> Columns {
        match col {
            Col::Name => Self::NAME,
            Col::Kind => Self::KIND,
            Col::Class => Self::CLASS,
            Col::Mass => Self::MASS,
            Col::InitialMass => Self::INITIAL_MASS,
            Col::Radius => Self::RADIUS,
            Col::Lum => Self::LUMINOSITY,
            Col::Teff => Self::TEFF,
            Col::Age => Self::AGE,
            Col::Lifetime => Self::LIFETIME,
            Col::HzIn | Col::HzOut => Self::HABITABLE_ZONE,
            Col::Colour => Self::COLOUR,
            Col::AbsMag => Self::ABS_MAG_V,
            Col::Sep => Self::SEPARATION,
            Col::Period => Self::PERIOD,
            Col::Habitable => Self::HABITABLE_HOST,
            Col::Origin => Self::ORIGIN,
            _ => Self::POSITIONS,
        }
    }
}

impl std::ops::BitOr for Columns {
    type Output = Columns;
    fn bitor(self, other: Columns) -> Columns {
        self.with(other)
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Col {
    Id,
    System,
    Name,
    Xly,
    Yly,
    Zly,
    Xpc,
    Ypc,
    Zpc,
    Ra,
    Dec,
    DistLy,
    DistPc,
    Kind,
    Class,
    Mass,
    InitialMass,
    Radius,
    Lum,
    Teff,
    Age,
    Lifetime,
    HzIn,
    HzOut,
    Colour,
    AbsMag,
    Sep,
    Period,
    Habitable,
    Origin,
    Ignored,
}

fn column_of(name: &str) -> Col {
    match name.trim().trim_matches('"').to_ascii_lowercase().as_str() {
        "id" => Col::Id,
        "system" => Col::System,
        "name" => Col::Name,
        "x_ly" => Col::Xly,
        "y_ly" => Col::Yly,
        "z_ly" => Col::Zly,
        "x_pc" => Col::Xpc,
        "y_pc" => Col::Ypc,
        "z_pc" => Col::Zpc,
        "ra_deg" => Col::Ra,
        "dec_deg" => Col::Dec,
        "distance_ly" => Col::DistLy,
        "distance_pc" => Col::DistPc,
        "kind" => Col::Kind,
        "class" => Col::Class,
        "mass_msun" => Col::Mass,
        "initial_mass_msun" => Col::InitialMass,
        "radius_rsun" => Col::Radius,
        "luminosity_lsun" => Col::Lum,
        "teff_k" => Col::Teff,
        "age_gyr" => Col::Age,
        "lifetime_gyr" => Col::Lifetime,
        "hz_inner_au" => Col::HzIn,
        "hz_outer_au" => Col::HzOut,
        "colour_hex" | "color_hex" => Col::Colour,
        "abs_mag_v" => Col::AbsMag,
        "separation_au" => Col::Sep,
        "period_days" => Col::Period,
        "habitable_host" => Col::Habitable,
        "origin" => Col::Origin,
        _ => Col::Ignored,
    }
}

#[derive(Debug, Clone, Copy)]
enum Positions {
    Ly,
    Pc,
    Sky { distance_in_pc: bool },
}

/// Per-row flags of values a file left out.
const MISSING_KIND: u8 = 1;
const MISSING_CLASS: u8 = 2;
const MISSING_COLOUR: u8 = 4;
const MISSING_HABITABLE: u8 = 8;

struct Layout {
    cols: Vec<Col>,
    /// The columns read, with their field index, in header order.
    active: Vec<(usize, Col)>,
    names: Vec<String>,
    positions: Positions,
    /// Columns parsed and stored; the others are skipped.
    wanted: Columns,
    /// The header is the one starloom writes ([`super::csv_format::COLUMNS`]),
    /// so rows can go through [`parse_own_fields`].
    own_format: bool,
}

impl Layout {
    /// The same layout reading every column.
    fn all_columns(&self) -> Layout {
        let cols: Vec<Col> = self.names.iter().map(|n| column_of(n)).collect();
        Layout {
            active: active_columns(&cols),
            cols,
            names: self.names.clone(),
            positions: self.positions,
            wanted: Columns::ALL,
            own_format: self.own_format,
        }
    }
}

/// The columns of `cols` that are read, with their field index.
fn active_columns(cols: &[Col]) -> Vec<(usize, Col)> {
    cols.iter()
        .copied()
        .enumerate()
        .filter(|&(_, c)| c != Col::Ignored)
        .collect()
}

/// Lays out a header for reading `wanted`. When the header lacks a wanted
/// column that physics would derive, every column is read, since the
/// derivation needs them.
fn make_layout(path: &Path, names: Vec<String>, wanted: Columns) -> Result<Layout> {
    let all: Vec<Col> = names.iter().map(|n| column_of(n)).collect();
    let present = all
        .iter()
        .fold(Columns::POSITIONS, |acc, &c| acc.with(Columns::of(c)));
    let derived_wanted = Columns(wanted.0 & Columns::DERIVED.0);
    let wanted = if present.contains(derived_wanted) {
        wanted
    } else {
        Columns::ALL
    };
    let cols: Vec<Col> = all
        .into_iter()
        .map(|c| {
            if wanted.contains(Columns::of(c)) {
                c
            } else {
                Col::Ignored
            }
        })
        .collect();
    let has = |c: Col| cols.contains(&c);
    let positions = if has(Col::Xly) && has(Col::Yly) && has(Col::Zly) {
        Positions::Ly
    } else if has(Col::Xpc) && has(Col::Ypc) && has(Col::Zpc) {
        Positions::Pc
    } else if has(Col::Ra) && has(Col::Dec) && (has(Col::DistLy) || has(Col::DistPc)) {
        Positions::Sky {
            distance_in_pc: !has(Col::DistLy),
        }
    } else {
        return Err(Error::BadFile {
            path: path.to_path_buf(),
            message: "the header needs positions: x_ly,y_ly,z_ly or x_pc,y_pc,z_pc or ra_deg,dec_deg with distance_ly or distance_pc".into(),
        });
    };
    Ok(Layout {
        active: active_columns(&cols),
        cols,
        own_format: names == super::csv_format::COLUMNS,
        names,
        positions,
        wanted,
    })
}

/// Parses a whole number as `str::parse::<u64>` does: up to 19 plain
/// digits (which cannot overflow) directly, anything else through the
/// standard parser.
///
/// # Speed
/// Eight digits at a time in one 64-bit word ([`eight_digits`]).
#[inline]
fn parse_u64(s: &str) -> Option<u64> {
    parse_u64_bytes(s.as_bytes())
}

/// [`parse_u64`] of the bytes of a `str`.
#[inline]
fn parse_u64_bytes(b: &[u8]) -> Option<u64> {
    let slow = || std::str::from_utf8(b).ok()?.parse().ok();
    if b.is_empty() || b.len() > 19 {
        return slow();
    }
    let (head, eights) = b.split_at(b.len() % 8);
    let mut v = 0u64;
    for &c in head {
        if !c.is_ascii_digit() {
            return slow();
        }
        v = v * 10 + u64::from(c - b'0');
    }
    for w in eights.chunks_exact(8) {
        // Little-endian: the first digit is the lowest byte.
        let Some(d) = eight_digits(u64::from_le_bytes(w.try_into().expect("eight bytes"))) else {
            return slow();
        };
        v = v * 100_000_000 + d;
    }
    Some(v)
}

/// Powers of ten that are exact in binary (10^22 is the largest).
const POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// Parses a decimal number quickly. A mantissa of up to 15 significant
/// digits scaled by a power of ten up to 10^22 either way is exact
/// (correctly rounded), since both operands are exact doubles and IEEE 754
/// rounds one multiplication or division correctly (Clinger 1990, "How to
/// read floating point numbers accurately", PLDI '90, the fast path);
/// anything else goes to the standard parser.
#[inline]
fn parse_f64(s: &str) -> Option<f64> {
    parse_f64_bytes(s.as_bytes())
}

/// [`parse_f64`] of the bytes of a `str`.
#[inline]
fn parse_f64_bytes(b: &[u8]) -> Option<f64> {
    let slow = || std::str::from_utf8(b).ok()?.parse::<f64>().ok();
    let (neg, digits) = match b.first() {
        Some(b'-') => (true, &b[1..]),
        Some(b'+') => (false, &b[1..]),
        _ => (false, b),
    };
    let mut mantissa: u64 = 0;
    let mut i = 0;
    // Digits, then at most one point and more digits.
    while i < digits.len() && digits[i].is_ascii_digit() {
        mantissa = mantissa
            .wrapping_mul(10)
            .wrapping_add(u64::from(digits[i] - b'0'));
        i += 1;
    }
    let mut n_digits = i;
    let mut decimals = 0i32;
    if i < digits.len() && digits[i] == b'.' {
        i += 1;
        let from = i;
        while i < digits.len() && digits[i].is_ascii_digit() {
            mantissa = mantissa
                .wrapping_mul(10)
                .wrapping_add(u64::from(digits[i] - b'0'));
            i += 1;
        }
        n_digits += i - from;
        decimals = (i - from) as i32;
    }
    let mut exponent = 0i32;
    if i < digits.len() {
        // Only an exponent may follow: e or E, a sign, 1 to 3 digits.
        if !matches!(digits[i], b'e' | b'E') || n_digits == 0 {
            return slow();
        }
        let exp = &digits[i + 1..];
        let (exp_neg, exp_digits) = match exp.first() {
            Some(b'-') => (true, &exp[1..]),
            Some(b'+') => (false, &exp[1..]),
            _ => (false, exp),
        };
        if exp_digits.is_empty() || exp_digits.len() > 3 {
            return slow();
        }
        for &c in exp_digits {
            if !c.is_ascii_digit() {
                return None;
            }
            exponent = exponent * 10 + i32::from(c - b'0');
        }
        if exp_neg {
            exponent = -exponent;
        }
    }
    if n_digits == 0 || n_digits > 15 {
        return slow();
    }
    let scale = exponent - decimals;
    let m = mantissa as f64;
    let v = if (0..=22).contains(&scale) {
        m * POW10[scale as usize]
    } else if (-22..0).contains(&scale) {
        m / POW10[(-scale) as usize]
    } else {
        return slow();
    };
    Some(if neg { -v } else { v })
}

/// Eight ASCII digits of a little-endian word (the first digit in the
/// lowest byte) as their value; `None` unless every byte is a digit.
///
/// # Speed
/// Checked as digits, then combined in pairs, fours and eights by three
/// multiply-and-mask steps (common practice, no source).
#[inline(always)]
fn eight_digits(word: u64) -> Option<u64> {
    let d = word.wrapping_sub(0x3030_3030_3030_3030);
    // A byte below '0' borrows into its high bit; one above '9' sets it
    // once 0x46 is added.
    if (word.wrapping_add(0x4646_4646_4646_4646) | d) & 0x8080_8080_8080_8080 != 0 {
        return None;
    }
    let d = (d.wrapping_mul(10) + (d >> 8)) & 0x00ff_00ff_00ff_00ff;
    let d = (d.wrapping_mul(100) + (d >> 16)) & 0x0000_ffff_0000_ffff;
    Some((d.wrapping_mul(10_000) + (d >> 32)) & 0xffff_ffff)
}

/// [`parse_f64_bytes`] of `b[from..to]` (a trimmed field), the same value
/// or `None`. A plain decimal `[-]digits[.digits]` of at most 16 bytes
/// after the sign, optionally followed by an exponent `e` or `E`, a sign
/// and one to three digits, is read by [`decimal_at`] as whole words; the
/// digits and the decimal exponent then give the value with one correctly
/// rounded multiplication or division by an exact power of ten (Clinger
/// 1990, the fast path), which is the standard parser's correctly rounded
/// value. Anything else goes to [`parse_f64_bytes`].
#[inline]
fn parse_f64_at(b: &[u8], from: usize, to: usize) -> Option<f64> {
    let neg = b.get(from) == Some(&b'-');
    let start = from + usize::from(neg);
    let v = match decimal_at(b, start, to) {
        // No exponent: with a point there are at most 15 digits, a
        // mantissa exact as a double; without one, the only rounding is
        // the conversion of the whole number.
        Some((digits, decimals)) => digits as f64 / POW10[decimals],
        None => match with_exponent_at(b, start, to) {
            Some(v) => v,
            None => return parse_f64_bytes(&b[from..to]),
        },
    };
    // `v` is not negative: setting the sign bit is the negation, with no
    // branch on the sign (which is random in coordinates).
    Some(f64::from_bits(v.to_bits() | (u64::from(neg) << 63)))
}

/// `b[start..to]` read as a number with an exponent: the digits of
/// [`decimal_at`], then `e` or `E`, an optional sign and one to three
/// digits, as [`parse_f64_bytes`] reads it; `None` for anything else,
/// and where the fast path would not be exact (a mantissa above 2^53 or a
/// scale beyond 10^±22).
#[cold]
fn with_exponent_at(b: &[u8], start: usize, to: usize) -> Option<f64> {
    // The `e` is two to five bytes before the end; `| 0x20` folds `E`.
    let e_at = (2..=5)
        .map(|back| to.checked_sub(back))
        .take_while(|at| at.is_some_and(|at| at > start))
        .flatten()
        .find(|&at| b[at] | 0x20 == b'e')?;
    let exp = &b[e_at + 1..to];
    let (exp_neg, exp_digits) = match exp.first() {
        Some(b'-') => (true, &exp[1..]),
        Some(b'+') => (false, &exp[1..]),
        _ => (false, exp),
    };
    if exp_digits.is_empty() || exp_digits.len() > 3 {
        return None;
    }
    let mut exponent = 0i32;
    for &c in exp_digits {
        if !c.is_ascii_digit() {
            return None;
        }
        exponent = exponent * 10 + i32::from(c - b'0');
    }
    if exp_neg {
        exponent = -exponent;
    }
    let (digits, decimals) = decimal_at(b, start, e_at)?;
    if digits > 1 << 53 {
        return None;
    }
    let m = digits as f64;
    let scale = exponent - decimals as i32;
    if (0..=22).contains(&scale) {
        Some(m * POW10[scale as usize])
    } else if (-22..0).contains(&scale) {
        Some(m / POW10[(-scale) as usize])
    } else {
        None
    }
}

/// For [`decimal_at`]: the field of `n` bytes that ends at `to` in `b`,
/// read as the top `n` bytes of a little-endian word of type `$t` (its
/// last byte the top one) with the bytes below it set to '0', and its
/// point squeezed out (a '0' shifted in at the bottom): that word of
/// would-be digits and the count of digits after the point. The
/// enclosing function returns `None` when `b` holds too few bytes before
/// `to` for a whole word.
macro_rules! point_squeezed {
    ($t:ty, $b:expr, $to:expr, $n:expr) => {{
        const BYTES: usize = std::mem::size_of::<$t>();
        const ZEROS: $t = <$t>::from_ne_bytes([b'0'; BYTES]);
        const DOTS: $t = <$t>::from_ne_bytes([b'.'; BYTES]);
        const ONES: $t = <$t>::from_ne_bytes([1; BYTES]);
        const HIGHS: $t = <$t>::from_ne_bytes([0x80; BYTES]);
        let window: [u8; BYTES] = $b.get($to.checked_sub(BYTES)?..$to)?.try_into().ok()?;
        let field = <$t>::MAX << (8 * (BYTES - $n));
        let w = (<$t>::from_le_bytes(window) & field) | (ZEROS & !field);
        let x = w ^ DOTS;
        let dots = x.wrapping_sub(ONES) & !x & HIGHS;
        if dots == 0 {
            (w, 0)
        } else {
            // The lowest marked byte is a point for certain (a false mark
            // can only sit above a true one); a second point fails the
            // digit test.
            let q = dots.trailing_zeros() / 8;
            let below: $t = (1 << (8 * q)) - 1;
            let above = <$t>::MAX.checked_shl(8 * q + 8).unwrap_or(0);
            let squeezed = (w & above) | ((w & below) << 8) | <$t>::from(b'0');
            (squeezed, BYTES - 1 - q as usize)
        }
    }};
}

/// The digits of `b[start..to]`, a decimal `digits[.digits]` with no sign
/// of one to sixteen bytes, as a whole number and the count of digits
/// after the point; `None` for anything else (no digit, a second point,
/// any other byte, or too few bytes before `to` for a whole word).
///
/// # Speed
/// The field is read from the word of `b` that ends at `to` (eight bytes
/// for short fields, sixteen for longer ones): the bytes before the field
/// are set to '0', the point is found and squeezed out with masks, and
/// the digits are combined eight at a time, with no loop over the bytes.
#[inline(always)]
fn decimal_at(b: &[u8], start: usize, to: usize) -> Option<(u64, usize)> {
    let n = to.checked_sub(start)?;
    if n == 0 || n > 16 || (n == 1 && b[start] == b'.') {
        return None;
    }
    if n <= 8 {
        let (digits, decimals) = point_squeezed!(u64, b, to, n);
        return Some((eight_digits(digits)?, decimals));
    }
    let (digits, decimals) = point_squeezed!(u128, b, to, n);
    let high = eight_digits(digits as u64)?;
    let low = eight_digits((digits >> 64) as u64)?;
    Some((high * 100_000_000 + low, decimals))
}

struct Partial {
    /// Columns held; the others stay empty until [`fill_unread`].
    wanted: Columns,
    cat: Catalogue,
    missing: Vec<u8>,
    /// Rows whose id / system the file did not give.
    no_id: Vec<bool>,
    no_system: Vec<bool>,
    /// Scratch: the separator offsets of the chunk being parsed (see
    /// [`find_separators`]); kept only for its allocation.
    seps: Vec<u32>,
}

impl Partial {
    /// Room for `rows` more rows in the wanted columns.
    fn reserve(&mut self, rows: usize) {
        let w = self.wanted;
        let c = &mut self.cat;
        c.id.reserve(rows);
        c.system.reserve(rows);
        c.x_ly.reserve(rows);
        c.y_ly.reserve(rows);
        c.z_ly.reserve(rows);
        for (set, col) in [
            (Columns::MASS, &mut c.mass_msun),
            (Columns::INITIAL_MASS, &mut c.initial_mass_msun),
            (Columns::RADIUS, &mut c.radius_rsun),
            (Columns::LUMINOSITY, &mut c.luminosity_lsun),
            (Columns::TEFF, &mut c.teff_k),
            (Columns::AGE, &mut c.age_gyr),
            (Columns::LIFETIME, &mut c.lifetime_gyr),
            (Columns::HABITABLE_ZONE, &mut c.hz_inner_au),
            (Columns::HABITABLE_ZONE, &mut c.hz_outer_au),
            (Columns::ABS_MAG_V, &mut c.abs_mag_v),
            (Columns::SEPARATION, &mut c.separation_au),
            (Columns::PERIOD, &mut c.period_days),
        ] {
            if w.contains(set) {
                col.reserve(rows);
            }
        }
        if w.contains(Columns::NAME) {
            c.name.reserve(rows, 12 * rows);
        }
        if w.contains(Columns::KIND) {
            c.kind.reserve(rows);
        }
        if w.contains(Columns::CLASS) {
            c.class.reserve(rows);
        }
        if w.contains(Columns::COLOUR) {
            c.color_rgb.reserve(rows);
        }
        if w.contains(Columns::HABITABLE_HOST) {
            c.habitable_host.reserve(rows);
        }
        if w.contains(Columns::ORIGIN) {
            c.origin.reserve(rows);
        }
        self.missing.reserve(rows);
        self.no_id.reserve(rows);
        self.no_system.reserve(rows);
    }

    /// Empties every column, keeping the allocations.
    fn clear(&mut self) {
        let c = &mut self.cat;
        c.id.clear();
        c.system.clear();
        c.name.clear();
        c.x_ly.clear();
        c.y_ly.clear();
        c.z_ly.clear();
        c.kind.clear();
        c.class.clear();
        c.mass_msun.clear();
        c.initial_mass_msun.clear();
        c.radius_rsun.clear();
        c.luminosity_lsun.clear();
        c.teff_k.clear();
        c.age_gyr.clear();
        c.lifetime_gyr.clear();
        c.hz_inner_au.clear();
        c.hz_outer_au.clear();
        c.color_rgb.clear();
        c.abs_mag_v.clear();
        c.separation_au.clear();
        c.period_days.clear();
        c.habitable_host.clear();
        c.origin.clear();
        self.missing.clear();
        self.no_id.clear();
        self.no_system.clear();
    }

    fn new(wanted: Columns) -> Partial {
        Partial {
            wanted,
            cat: Catalogue::default(),
            missing: Vec::new(),
            no_id: Vec::new(),
            no_system: Vec::new(),
            seps: Vec::new(),
        }
    }
}

/// The message of a row that a projected read cannot finish (a wanted
/// value is empty and would need deriving).
const NEEDS_FULL_READ: &str = "needs the full read";

struct RowError {
    /// Line within the chunk, 0-based.
    line_in_chunk: u64,
    column: String,
    message: String,
}

fn parse_hex_colour(s: &str) -> Option<[u8; 3]> {
    parse_hex_colour_bytes(s.as_bytes())
}

/// The colour of `#rrggbb` (or `rrggbb`), either case.
///
/// # Speed
/// No branch per digit (random hex digits would defeat branch
/// prediction): all six are checked together, and a digit's value is its
/// low four bits, plus nine for a letter (bit 6 set).
fn parse_hex_colour_bytes(s: &[u8]) -> Option<[u8; 3]> {
    let h = s.strip_prefix(b"#").unwrap_or(s);
    let h: &[u8; 6] = h.try_into().ok()?;
    let ok = h.iter().fold(true, |ok, c| ok & c.is_ascii_hexdigit());
    if !ok {
        return None;
    }
    let nibble = |c: u8| (c & 0x0f) + 9 * (c >> 6);
    let byte = |i: usize| nibble(h[i]) << 4 | nibble(h[i + 1]);
    Some([byte(0), byte(2), byte(4)])
}

fn parse_bool(s: &str) -> Option<bool> {
    parse_bool_bytes(s.as_bytes())
}

#[inline]
fn parse_bool_bytes(s: &[u8]) -> Option<bool> {
    // The words starloom writes, first.
    match s {
        b"false" => return Some(false),
        b"true" => return Some(true),
        _ => {}
    }
    let is = |word: &str| s.eq_ignore_ascii_case(word.as_bytes());
    if is("true") || is("1") || is("yes") || is("y") {
        Some(true)
    } else if is("false") || is("0") || is("no") || is("n") {
        Some(false)
    } else {
        None
    }
}

/// Parses one record into `out`; `fields` are the raw field texts.
fn parse_record(
    layout: &Layout,
    fields: &[&str],
    out: &mut Partial,
) -> std::result::Result<(), (String, String)> {
    if fields.len() != layout.cols.len() {
        let col = if fields.len() < layout.cols.len() {
            layout.names[fields.len()].clone()
        } else {
            "(end of row)".to_string()
        };
        return Err((
            col,
            format!(
                "the row has {} fields but the header has {}",
                fields.len(),
                layout.cols.len()
            ),
        ));
    }
    parse_fields(layout, |k| fields[k], out)
}

/// Parses one record of the header's field count into `out`; `field(k)`
/// is the raw text of field `k`, asked for the read columns only.
#[inline]
fn parse_fields<'f>(
    layout: &Layout,
    field: impl Fn(usize) -> &'f str,
    out: &mut Partial,
) -> std::result::Result<(), (String, String)> {
    let nan = f64::NAN;
    let (mut id, mut system) = (None, None);
    let mut id_text = "";
    let mut name = "";
    let mut xyz = [nan; 3];
    let (mut ra, mut dec, mut dist) = (nan, nan, nan);
    let mut kind = None;
    let mut class = None;
    let mut num = [nan; 12];
    let mut colour = None;
    let mut habitable = None;
    let mut origin = Origin::Imported;
    for &(k, col) in &layout.active {
        let s = field(k).trim_ascii();
        let bad = |what: &str| (layout.names[k].clone(), format!("'{s}' is not {what}"));
        // An empty field is NaN, a value the file left out; anything else
        // must be a number that `allowed` admits.
        let checked = |(allowed, clause): (Allowed, &str)| {
            if s.is_empty() {
                return Ok(nan);
            }
            let v = parse_f64(s).ok_or_else(|| bad("a number"))?;
            if !v.is_finite() {
                return Err(bad("a finite number"));
            }
            if !allowed.admits(v) {
                return Err((layout.names[k].clone(), format!("'{s}' must be {clause}")));
            }
            Ok(v)
        };
        let number = || checked((Allowed::Finite, "a finite number"));
        let physical = |slot: usize| checked(NUM_ALLOWED[slot]);
        match col {
            Col::Id | Col::System => {
                if !s.is_empty() {
                    // A single star's system is its own id: one parse.
                    let v = match id {
                        Some(v) if col == Col::System && s == id_text => v,
                        _ => parse_u64(s).ok_or_else(|| bad("a whole number of 0 or more"))?,
                    };
                    if col == Col::Id {
                        id = Some(v);
                        id_text = s;
                    } else {
                        system = Some(v)
                    }
                }
            }
            Col::Name => name = s,
            Col::Xly | Col::Xpc => xyz[0] = number()?,
            Col::Yly | Col::Ypc => xyz[1] = number()?,
            Col::Zly | Col::Zpc => xyz[2] = number()?,
            Col::Ra => ra = number()?,
            Col::Dec => dec = number()?,
            Col::DistLy => {
                dist = checked((Allowed::ZeroOrMore, "a number of light years, 0 or more"))?
            }
            Col::DistPc => {
                if !matches!(
                    layout.positions,
                    Positions::Sky {
                        distance_in_pc: false
                    }
                ) {
                    dist = checked((Allowed::ZeroOrMore, "a number of parsecs, 0 or more"))?
                }
            }
            Col::Kind => {
                if !s.is_empty() {
                    // Our own files hold the exact names: no allocation then.
                    let parsed = StarKind::parse(s).or_else(|| {
                        StarKind::parse(&s.to_ascii_lowercase().replace(['_', ' '], "-"))
                    });
                    kind = Some(parsed.ok_or_else(|| {
                        (
                            layout.names[k].clone(),
                            format!("'{s}' is not a kind; use one of {}", StarKind::names()),
                        )
                    })?);
                }
            }
            Col::Class => {
                if !s.is_empty() {
                    class = Some(ClassCode::from_str_lossy(s))
                }
            }
            Col::Mass => num[0] = physical(0)?,
            Col::InitialMass => num[1] = physical(1)?,
            Col::Radius => num[2] = physical(2)?,
            Col::Lum => num[3] = physical(3)?,
            Col::Teff => num[4] = physical(4)?,
            Col::Age => num[5] = physical(5)?,
            Col::Lifetime => num[6] = physical(6)?,
            Col::HzIn => num[7] = physical(7)?,
            Col::HzOut => num[8] = physical(8)?,
            Col::AbsMag => num[9] = physical(9)?,
            Col::Sep => num[10] = physical(10)?,
            Col::Period => num[11] = physical(11)?,
            Col::Colour => {
                if !s.is_empty() {
                    colour = Some(parse_hex_colour(s).ok_or_else(|| bad("a colour like #ffcc88"))?);
                }
            }
            Col::Habitable => {
                if !s.is_empty() {
                    habitable = Some(parse_bool(s).ok_or_else(|| bad("true or false"))?);
                }
            }
            Col::Origin => {
                if !s.is_empty() {
                    origin =
                        Origin::parse(s).ok_or_else(|| bad("generated, imported or hipparcos"))?;
                }
            }
            Col::Ignored => {}
        }
    }
    let position = match layout.positions {
        Positions::Ly => xyz,
        Positions::Pc => [xyz[0] * LY_PER_PC, xyz[1] * LY_PER_PC, xyz[2] * LY_PER_PC],
        Positions::Sky { distance_in_pc } => {
            let d = if distance_in_pc {
                dist * LY_PER_PC
            } else {
                dist
            };
            if !(d.is_finite() && d >= 0.0) {
                let col = if distance_in_pc {
                    "distance_pc"
                } else {
                    "distance_ly"
                };
                return Err((
                    col.into(),
                    "the distance must be a number of 0 or more".into(),
                ));
            }
            crate::coords::icrs_to_galactic_cartesian(ra, dec, d)
        }
    };
    for (axis, v) in position.iter().enumerate() {
        if !v.is_finite() {
            let col = match layout.positions {
                Positions::Ly => ["x_ly", "y_ly", "z_ly"][axis],
                Positions::Pc => ["x_pc", "y_pc", "z_pc"][axis],
                Positions::Sky { .. } => ["ra_deg", "dec_deg", "dec_deg"][axis],
            };
            return Err((col.into(), "a position is required on every row".into()));
        }
    }
    store_row(
        layout.wanted,
        &RowValues {
            id,
            system,
            name,
            position,
            kind,
            class,
            num,
            colour,
            habitable,
            origin,
        },
        out,
    )
}

/// One row's values as read: `None` or NaN where the file left a field
/// empty or the column is not read.
#[derive(Clone, Copy)]
struct RowValues<'f> {
    id: Option<u64>,
    system: Option<u64>,
    name: &'f str,
    /// Galactic cartesian, ly (finite).
    position: [f64; 3],
    kind: Option<StarKind>,
    class: Option<ClassCode>,
    /// Mass, initial mass, radius, luminosity, Teff, age, lifetime, the
    /// two habitable-zone edges, M_V, separation and period, in the
    /// catalogue's units.
    num: [f64; 12],
    colour: Option<[u8; 3]>,
    habitable: Option<bool>,
    origin: Origin,
}

/// The values a numeric column allows besides an empty field: every
/// value must be finite, and physical quantities have a lower bound.
#[derive(Clone, Copy)]
enum Allowed {
    /// Any finite number (a magnitude, a coordinate).
    Finite,
    /// Zero or more: starloom itself writes 0 for the luminosity, Teff and
    /// habitable zone of a black hole, the lifetime of a brown dwarf, and
    /// the separation and period of a single star.
    ZeroOrMore,
    /// Above zero (masses and radii, which starloom never writes as 0).
    Positive,
}

impl Allowed {
    /// True when `v` is finite and within the bound.
    fn admits(self, v: f64) -> bool {
        v.is_finite()
            && match self {
                Allowed::Finite => true,
                Allowed::ZeroOrMore => v >= 0.0,
                Allowed::Positive => v > 0.0,
            }
    }

    /// The quick form of [`Allowed::admits`] for the fixed-order decoder.
    const fn bits(self) -> AllowedBits {
        // The bits of +inf; every finite value of either sign is below it
        // once the sign bit is cleared.
        const INF: u64 = 0x7ff0_0000_0000_0000;
        match self {
            Allowed::Finite => AllowedBits {
                mask: !(1 << 63),
                low: 0,
                span: INF,
            },
            Allowed::ZeroOrMore => AllowedBits {
                mask: !0,
                low: 0,
                span: INF,
            },
            Allowed::Positive => AllowedBits {
                mask: !0,
                low: 1,
                span: INF - 1,
            },
        }
    }
}

/// An [`Allowed`] as a window of the bits of a double: `v` is admitted
/// when `(bits & mask) - low` (wrapping) is below `span`. Positive finite
/// doubles are the bit patterns from 1 up to below +inf, in order, and the
/// sign bit makes every negative value (and -0) land above them.
///
/// # Guarantees
/// Admits only values that [`Allowed::admits`] admits; it refuses -0 in
/// a column of 0 or more, which the general reader then takes.
///
/// # Speed
/// One `and`, one subtraction and one comparison, with no branch: the
/// decoder tests every value of a row and branches once.
#[derive(Clone, Copy)]
struct AllowedBits {
    mask: u64,
    low: u64,
    span: u64,
}

impl AllowedBits {
    #[inline(always)]
    fn admits(self, v: f64) -> bool {
        (v.to_bits() & self.mask).wrapping_sub(self.low) < self.span
    }
}

/// What each slot of [`RowValues::num`] allows, and that as a clause for
/// the message of a value outside it.
const NUM_ALLOWED: [(Allowed, &str); 12] = [
    (Allowed::Positive, "a positive number of solar masses"),
    (Allowed::Positive, "a positive number of solar masses"),
    (Allowed::Positive, "a positive number of solar radii"),
    (
        Allowed::ZeroOrMore,
        "a number of solar luminosities, 0 or more",
    ),
    (Allowed::ZeroOrMore, "a number of kelvin, 0 or more"),
    (Allowed::ZeroOrMore, "a number of gigayears, 0 or more"),
    (Allowed::ZeroOrMore, "a number of gigayears, 0 or more"),
    (Allowed::ZeroOrMore, "a number of au, 0 or more"),
    (Allowed::ZeroOrMore, "a number of au, 0 or more"),
    (Allowed::Finite, "a finite number"),
    (Allowed::ZeroOrMore, "a number of au, 0 or more"),
    (Allowed::ZeroOrMore, "a number of days, 0 or more"),
];

/// Appends one row's values to the `wanted` columns of `out`, with its
/// flags of what the file left out.
#[inline(always)]
fn store_row(
    w: Columns,
    v: &RowValues<'_>,
    out: &mut Partial,
) -> std::result::Result<(), (String, String)> {
    let RowValues {
        id,
        system,
        name,
        position,
        kind,
        class,
        num,
        colour,
        habitable,
        origin,
    } = *v;
    let mut missing = 0u8;
    if kind.is_none() {
        missing |= MISSING_KIND;
    }
    if class.is_none() {
        missing |= MISSING_CLASS;
    }
    if colour.is_none() {
        missing |= MISSING_COLOUR;
    }
    if habitable.is_none() {
        missing |= MISSING_HABITABLE;
    }
    if w != Columns::ALL {
        // A projected read derives nothing: a wanted value the row left
        // empty sends the whole file through the full read.
        // `&` and `|` rather than `&&` and `||`: every test is cheap, and
        // one combined flag is one well-predicted branch instead of a chain.
        let derivable = (w.contains(Columns::KIND) & kind.is_none())
            | (w.contains(Columns::CLASS) & class.is_none())
            | (w.contains(Columns::COLOUR) & colour.is_none())
            | (w.contains(Columns::HABITABLE_HOST) & habitable.is_none())
            | (w.contains(Columns::INITIAL_MASS) & num[1].is_nan())
            | (w.contains(Columns::RADIUS) & num[2].is_nan())
            | (w.contains(Columns::LUMINOSITY) & num[3].is_nan())
            | (w.contains(Columns::TEFF) & num[4].is_nan())
            | (w.contains(Columns::LIFETIME) & num[6].is_nan())
            | (w.contains(Columns::HABITABLE_ZONE) & (num[7].is_nan() | num[8].is_nan()))
            | (w.contains(Columns::ABS_MAG_V) & num[9].is_nan());
        if derivable {
            return Err((String::new(), NEEDS_FULL_READ.into()));
        }
    }
    let c = &mut out.cat;
    c.id.push(id.unwrap_or(0));
    c.system.push(system.unwrap_or(0));
    c.x_ly.push(position[0]);
    c.y_ly.push(position[1]);
    c.z_ly.push(position[2]);
    let put = |set: Columns, col: &mut Vec<f64>, v: f64| {
        if w.contains(set) {
            col.push(v)
        }
    };
    put(Columns::MASS, &mut c.mass_msun, num[0]);
    put(Columns::INITIAL_MASS, &mut c.initial_mass_msun, num[1]);
    put(Columns::RADIUS, &mut c.radius_rsun, num[2]);
    put(Columns::LUMINOSITY, &mut c.luminosity_lsun, num[3]);
    put(Columns::TEFF, &mut c.teff_k, num[4]);
    put(Columns::AGE, &mut c.age_gyr, num[5]);
    put(Columns::LIFETIME, &mut c.lifetime_gyr, num[6]);
    put(Columns::HABITABLE_ZONE, &mut c.hz_inner_au, num[7]);
    put(Columns::HABITABLE_ZONE, &mut c.hz_outer_au, num[8]);
    put(Columns::ABS_MAG_V, &mut c.abs_mag_v, num[9]);
    put(Columns::SEPARATION, &mut c.separation_au, num[10]);
    put(Columns::PERIOD, &mut c.period_days, num[11]);
    if w.contains(Columns::NAME) {
        c.name.push(name);
    }
    if w.contains(Columns::KIND) {
        c.kind.push(kind.unwrap_or(StarKind::MainSequence));
    }
    if w.contains(Columns::CLASS) {
        c.class
            .push(class.unwrap_or_else(|| ClassCode::from_str_lossy("")));
    }
    if w.contains(Columns::COLOUR) {
        c.color_rgb.push(colour.unwrap_or([255, 255, 255]));
    }
    if w.contains(Columns::HABITABLE_HOST) {
        c.habitable_host.push(habitable.unwrap_or(false));
    }
    if w.contains(Columns::ORIGIN) {
        c.origin.push(origin);
    }
    out.missing.push(missing);
    out.no_id.push(id.is_none());
    out.no_system.push(system.is_none());
    Ok(())
}

/// The index of `name` in starloom's own header
/// ([`super::csv_format::COLUMNS`]); evaluated at compile time, so a name
/// the header lacks stops the build.
const fn own_column(name: &str) -> usize {
    const fn same(a: &[u8], b: &[u8]) -> bool {
        if a.len() != b.len() {
            return false;
        }
        let mut i = 0;
        while i < a.len() {
            if a[i] != b[i] {
                return false;
            }
            i += 1;
        }
        true
    }
    let cols = &super::csv_format::COLUMNS;
    let mut i = 0;
    while i < cols.len() {
        if same(cols[i].as_bytes(), name.as_bytes()) {
            return i;
        }
        i += 1;
    }
    panic!("not a column of starloom's own header")
}

/// Field indices in starloom's own header.
mod own {
    use super::own_column;
    pub const ID: usize = own_column("id");
    pub const SYSTEM: usize = own_column("system");
    pub const NAME: usize = own_column("name");
    pub const XYZ: [usize; 3] = [own_column("x_ly"), own_column("y_ly"), own_column("z_ly")];
    pub const KIND: usize = own_column("kind");
    pub const CLASS: usize = own_column("class");
    pub const COLOUR: usize = own_column("colour_hex");
    pub const HABITABLE: usize = own_column("habitable_host");
    pub const ORIGIN: usize = own_column("origin");
}

/// The numeric columns of starloom's own header: field index, the column
/// set that reads it, its slot in [`RowValues::num`] and the values it
/// allows.
const OWN_NUMBERS: [(usize, Columns, usize, AllowedBits); 12] = {
    const fn at(name: &str, set: Columns, slot: usize) -> (usize, Columns, usize, AllowedBits) {
        (own_column(name), set, slot, NUM_ALLOWED[slot].0.bits())
    }
    [
        at("mass_msun", Columns::MASS, 0),
        at("initial_mass_msun", Columns::INITIAL_MASS, 1),
        at("radius_rsun", Columns::RADIUS, 2),
        at("luminosity_lsun", Columns::LUMINOSITY, 3),
        at("teff_k", Columns::TEFF, 4),
        at("age_gyr", Columns::AGE, 5),
        at("lifetime_gyr", Columns::LIFETIME, 6),
        at("hz_inner_au", Columns::HABITABLE_ZONE, 7),
        at("hz_outer_au", Columns::HABITABLE_ZONE, 8),
        at("abs_mag_v", Columns::ABS_MAG_V, 9),
        at("separation_au", Columns::SEPARATION, 10),
        at("period_days", Columns::PERIOD, 11),
    ]
};

/// [`parse_fields`] for a row of starloom's own header, whose separators
/// are `row` (the line starts at `line_start` in `chunk`): the read fields
/// are taken as bytes in a fixed order with no per-column dispatch. A row
/// this cannot take whole (an empty or unusual field) goes to
/// [`parse_fields`], so values, flags and errors are the same either way.
#[inline]
fn parse_own_fields<'f>(
    layout: &Layout,
    chunk: &'f str,
    line_start: usize,
    row: &[u32],
    out: &mut Partial,
) -> std::result::Result<(), (String, String)> {
    let w = layout.wanted;
    let b = chunk.as_bytes();
    let from = |k: usize| field_start(line_start, row, k);
    let end = |k: usize| field_end(row, k);
    let t = |k: usize| b[from(k)..end(k)].trim_ascii();
    let plain = || -> Option<RowValues<'f>> {
        let id_text = t(own::ID);
        let id = parse_u64_bytes(id_text)?;
        let system_text = t(own::SYSTEM);
        let system = if system_text == id_text {
            id
        } else {
            parse_u64_bytes(system_text)?
        };
        let mut position = [0.0; 3];
        // Numbers are not trimmed here: a padded one fails the fast
        // parsers and sends the row to the trimming reader.
        let number = |k: usize| parse_f64_at(b, from(k), end(k));
        for (p, k) in position.iter_mut().zip(own::XYZ) {
            *p = number(k).filter(|v| v.is_finite())?;
        }
        let mut num = [f64::NAN; 12];
        for (k, set, slot, _) in OWN_NUMBERS {
            if w.contains(set) {
                num[slot] = number(k)?;
            }
        }
        let read = |set: Columns| w.contains(set).then_some(());
        Some(RowValues {
            id: Some(id),
            system: Some(system),
            name: match read(Columns::NAME) {
                // Cut from the `str` itself (at ASCII commas), so not
                // checked as UTF-8 again.
                Some(()) => chunk[from(own::NAME)..end(own::NAME)].trim_ascii(),
                None => "",
            },
            position,
            kind: match read(Columns::KIND) {
                Some(()) => Some(StarKind::parse_bytes(t(own::KIND))?),
                None => None,
            },
            class: match read(Columns::CLASS) {
                Some(()) => {
                    let s = t(own::CLASS);
                    if s.is_empty() || s.len() > 15 || !s.is_ascii() {
                        return None;
                    }
                    // What `from_str_lossy` keeps of short ASCII text: all of it.
                    Some(ClassCode::from_ascii(s))
                }
                None => None,
            },
            num,
            colour: match read(Columns::COLOUR) {
                Some(()) => Some(parse_hex_colour_bytes(t(own::COLOUR))?),
                None => None,
            },
            habitable: match read(Columns::HABITABLE_HOST) {
                Some(()) => Some(parse_bool_bytes(t(own::HABITABLE))?),
                None => None,
            },
            origin: match read(Columns::ORIGIN) {
                Some(()) => Origin::parse_bytes(t(own::ORIGIN))?,
                None => Origin::Imported,
            },
        })
    };
    match plain() {
        Some(v) if own_numbers_admitted(w, &v.num) => store_row(w, &v, out),
        _ => parse_fields(layout, |k| &chunk[from(k)..end(k)], out),
    }
}

/// True when every read value of `num`, as [`parse_own_fields`] fills it,
/// is one its column allows; a row with a value out of range (rare) goes
/// to the general reader, which names it.
///
/// # Speed
/// One flag for the whole row, one branch. Checked here rather than
/// inside the decoder's closure, where the extra exit made the compiler
/// copy each row's values through memory: that read 8-10 % more
/// instructions than no check, this 2-4 % (callgrind, one thread, 3·10^5
/// rows of a starloom catalogue, every column and the map's).
#[inline(always)]
fn own_numbers_admitted(w: Columns, num: &[f64; 12]) -> bool {
    OWN_NUMBERS
        .iter()
        .fold(true, |ok, &(_, set, slot, allowed)| {
            ok & (!w.contains(set) | allowed.admits(num[slot]))
        })
}

/// Parses the rows of `chunk` (whole lines of the body).
///
/// # Speed
/// One pass over the chunk ([`find_separators`]) lists both the line ends
/// and the commas, so each row is cut into fields without searching it
/// again.
fn parse_chunk(layout: &Layout, chunk: &str) -> std::result::Result<Partial, RowError> {
    let mut out = Partial::new(layout.wanted);
    parse_chunk_into(layout, chunk, &mut out)?;
    Ok(out)
}

/// [`parse_chunk`] into `out` (empty, for `layout.wanted`), whose
/// allocations may be reused from an earlier chunk.
fn parse_chunk_into(
    layout: &Layout,
    chunk: &str,
    out: &mut Partial,
) -> std::result::Result<(), RowError> {
    debug_assert!(out.cat.id.is_empty() && out.wanted == layout.wanted);
    let b = chunk.as_bytes();
    if b.len() >= SEP_NEWLINE as usize {
        // Offsets would not fit beside the flag: cut the chunk at a line end.
        let half = b.len() / 2;
        let mid = memchr::memrchr(b'\n', &b[..half])
            .or_else(|| memchr::memchr(b'\n', &b[half..]).map(|i| half + i))
            .map_or(b.len(), |i| i + 1);
        if mid >= b.len() {
            if memchr::memchr(b'"', b).is_some() {
                return Err(quoted_chunk());
            }
            // One line: there is nothing to list.
            let mut fields = Vec::new();
            let line = chunk.strip_suffix('\n').unwrap_or(chunk);
            return odd_row(layout, line, &mut fields, out).map_err(|(column, message)| RowError {
                line_in_chunk: 0,
                column,
                message,
            });
        }
        parse_chunk_into(layout, &chunk[..mid], out)?;
        let lines_before = memchr::memchr_iter(b'\n', &b[..mid]).count() as u64;
        let mut rest = Partial::new(layout.wanted);
        parse_chunk_into(layout, &chunk[mid..], &mut rest).map_err(|mut e| {
            e.line_in_chunk += lines_before;
            e
        })?;
        append_partials(out, &mut [rest]);
        return Ok(());
    }
    let mut seps = std::mem::take(&mut out.seps);
    let result = if find_separators(b, &mut seps) {
        Err(quoted_chunk())
    } else {
        parse_rows(layout, chunk, &seps, out)
    };
    out.seps = seps;
    result
}

/// The message of a chunk that holds a double quote, which only the
/// quoting reader splits correctly.
const HAS_QUOTES: &str = "has quoted fields";

fn quoted_chunk() -> RowError {
    RowError {
        line_in_chunk: 0,
        column: String::new(),
        message: HAS_QUOTES.into(),
    }
}

/// The flag on a separator offset that marks a line end (the others are
/// commas).
const SEP_NEWLINE: u32 = 1 << 31;

/// Where field `k` of a well-formed row starts: the row starts at
/// `line_start` and its separators are `row`.
#[inline(always)]
fn field_start(line_start: usize, row: &[u32], k: usize) -> usize {
    if k == 0 {
        line_start
    } else {
        (row[k - 1] & !SEP_NEWLINE) as usize + 1
    }
}

/// Where field `k` of a well-formed row with separators `row` ends (at its
/// separator). Cutting at ASCII bytes keeps every piece of a `str` valid
/// UTF-8; a carriage return before the line end is left for the field's
/// trimming.
#[inline(always)]
fn field_end(row: &[u32], k: usize) -> usize {
    (row[k] & !SEP_NEWLINE) as usize
}

/// Fills `seps` with the offset of every comma and line end in `b`, in
/// order, line ends flagged with [`SEP_NEWLINE`] (`b` is under 2 GiB);
/// true when `b` holds a double quote.
///
/// # Speed
/// Sixty-four bytes at a time: four 16-byte vector compares per byte kind
/// (SSE2 on x86-64, NEON on AArch64, plain code elsewhere, through `wide`)
/// give a bit mask of the block, whose set bits are then listed. The
/// quote test rides along, so the chunk is not searched a second time.
fn find_separators(b: &[u8], seps: &mut Vec<u32>) -> bool {
    use wide::u8x16;
    let (comma, newline, quote) = (u8x16::splat(b','), u8x16::splat(b'\n'), u8x16::splat(b'"'));
    seps.clear();
    let mut quotes = u8x16::splat(0);
    let mut pos = 0usize;
    while pos + 64 <= b.len() {
        let (mut commas, mut ends) = (0u64, 0u64);
        for (q, lane) in b[pos..pos + 64].chunks_exact(16).enumerate() {
            let v = u8x16::new(lane.try_into().expect("16 bytes"));
            commas |= u64::from(v.simd_eq(comma).to_bitmask()) << (16 * q);
            ends |= u64::from(v.simd_eq(newline).to_bitmask()) << (16 * q);
            quotes |= v.simd_eq(quote);
        }
        let mut bits = commas | ends;
        while bits != 0 {
            let tz = bits.trailing_zeros();
            seps.push((pos as u32 + tz) | (((ends >> tz) as u32 & 1) * SEP_NEWLINE));
            bits &= bits - 1;
        }
        pos += 64;
    }
    let mut quoted = quotes.to_bitmask() != 0;
    for (at, &c) in b.iter().enumerate().skip(pos) {
        match c {
            b',' => seps.push(at as u32),
            b'\n' => seps.push(at as u32 | SEP_NEWLINE),
            b'"' => quoted = true,
            _ => {}
        }
    }
    quoted
}

/// Parses the rows of `chunk`, whose separators are `seps`.
fn parse_rows(
    layout: &Layout,
    chunk: &str,
    seps: &[u32],
    out: &mut Partial,
) -> std::result::Result<(), RowError> {
    let b = chunk.as_bytes();
    let ncols = layout.cols.len();
    // Exact when every row is well formed; a hint otherwise.
    out.reserve(seps.len() / ncols + 1);
    let off = |s: u32| (s & !SEP_NEWLINE) as usize;
    let mut fields: Vec<&str> = Vec::with_capacity(ncols + 1);
    let mut line_no = 0u64;
    let mut line_start = 0usize;
    let mut i = 0usize;
    let at_line = |line_no: u64| {
        move |(column, message)| RowError {
            line_in_chunk: line_no,
            column,
            message,
        }
    };
    while i < seps.len() {
        // A well-formed row: exactly `ncols - 1` commas, then its line end.
        if let Some(row) = seps.get(i..i + ncols)
            && row[ncols - 1] & SEP_NEWLINE != 0
            && row[..ncols - 1].iter().fold(0, |a, &s| a | s) & SEP_NEWLINE == 0
        {
            if layout.own_format {
                parse_own_fields(layout, chunk, line_start, row, out)
            } else {
                parse_fields(
                    layout,
                    |k| &chunk[field_start(line_start, row, k)..field_end(row, k)],
                    out,
                )
            }
            .map_err(at_line(line_no))?;
            line_start = off(row[ncols - 1]) + 1;
            i += ncols;
        } else {
            let j = seps[i..]
                .iter()
                .position(|&s| s & SEP_NEWLINE != 0)
                .map(|p| i + p);
            let end = j.map_or(b.len(), |j| off(seps[j]));
            odd_row(layout, &chunk[line_start..end], &mut fields, out).map_err(at_line(line_no))?;
            line_start = end + 1;
            i = j.map_or(seps.len(), |j| j + 1);
        }
        line_no += 1;
    }
    if line_start < b.len() {
        odd_row(layout, &chunk[line_start..], &mut fields, out).map_err(at_line(line_no))?;
    }
    Ok(())
}

/// A line that is not a well-formed row with its line end: blank (skipped),
/// the last line without a line end, or one with the wrong field count
/// (split plainly, so the error names the right column).
fn odd_row<'c>(
    layout: &Layout,
    line: &'c str,
    fields: &mut Vec<&'c str>,
    out: &mut Partial,
) -> std::result::Result<(), (String, String)> {
    let line = line.strip_suffix('\r').unwrap_or(line);
    if line.trim().is_empty() {
        return Ok(());
    }
    fields.clear();
    fields.extend(line.split(','));
    parse_record(layout, fields, out)
}

/// Reads a catalogue file, choosing the format by extension (`.jsonl`
/// as JSON Lines, anything else as CSV).
pub fn read_catalogue(path: &Path) -> Result<Catalogue> {
    read_catalogue_columns(path, Columns::ALL)
}

/// Reads a catalogue file like [`read_catalogue`], parsing only the
/// columns in `wanted` (ids, systems and positions always). The other
/// columns hold "not read" placeholders (see [`Columns`]).
///
/// # Guarantees
/// The wanted columns hold exactly what [`read_catalogue`] would give:
/// when a file leaves a wanted value to be derived, the whole file is read.
pub fn read_catalogue_columns(path: &Path, wanted: Columns) -> Result<Catalogue> {
    let mut partial = read_partial(path, wanted)?;
    let wanted = partial.wanted;
    finish(&mut partial);
    let mut cat = partial.cat;
    fill_unread(&mut cat, wanted);
    cat.meta = read_sidecar_meta(path);
    Ok(cat)
}

/// Parses a catalogue file into rows not yet finished (no ids filled in,
/// nothing derived).
fn read_partial(path: &Path, wanted: Columns) -> Result<Partial> {
    let missing = |e: std::io::Error| Error::MissingInput {
        path: path.to_path_buf(),
        message: e.to_string(),
    };
    let is_jsonl = path
        .extension()
        .and_then(|e| e.to_str())
        .is_some_and(|e| e.eq_ignore_ascii_case("jsonl") || e.eq_ignore_ascii_case("ndjson"));
    let empty_from_populate = std::fs::metadata(path).is_ok_and(|m| m.is_file() && m.len() == 0)
        && crate::spec::sidecar_path(path).is_file();
    let partial = if empty_from_populate {
        // `populate` writes a 0-byte file for a shard after the first
        // that holds no stars: an empty catalogue, as its sidecar shows.
        Partial::new(wanted)
    } else if is_jsonl {
        let bytes = read_bytes_parallel(path).map_err(missing)?;
        let text = std::str::from_utf8(&bytes).map_err(|e| not_utf8(path, e.valid_up_to()))?;
        read_jsonl(path, text)?
    } else {
        match read_csv_streamed(path, wanted)? {
            Some(partial) => partial,
            None => read_csv_bytes(path, &read_bytes_parallel(path).map_err(missing)?, wanted)?,
        }
    };
    Ok(partial)
}

/// Bytes per piece when a file is read or checked in parallel.
const PIECE_BYTES: usize = 8 << 20;

/// Reads a whole file; large files in pieces on several threads, so the
/// copy out of the page cache and the first touch of the buffer's pages
/// (together about a third of the reader's time for a 270 MB catalogue
/// when done on one thread) are shared between cores.
fn read_bytes_parallel(path: &Path) -> std::io::Result<Vec<u8>> {
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileExt;
        let file = std::fs::File::open(path)?;
        let len = file.metadata()?.len() as usize;
        if len > 2 * PIECE_BYTES {
            let mut bytes = vec![0u8; len];
            bytes
                .par_chunks_mut(PIECE_BYTES)
                .enumerate()
                .try_for_each(|(k, piece)| file.read_exact_at(piece, (k * PIECE_BYTES) as u64))?;
            // A file that grew while being read is read again whole.
            if file.metadata()?.len() as usize == len {
                return Ok(bytes);
            }
        }
    }
    std::fs::read(path)
}

/// Offsets that cut `bytes` into about `pieces` parts, each cut just after
/// a newline; the first is 0 and the last `bytes.len()`.
fn line_aligned_cuts(bytes: &[u8], pieces: usize) -> Vec<usize> {
    let mut cuts = vec![0usize];
    for k in 1..pieces {
        let mut at = bytes.len() * k / pieces;
        match bytes[at..].iter().position(|&b| b == b'\n') {
            Some(off) => at += off + 1,
            None => at = bytes.len(),
        }
        if at > *cuts.last().unwrap_or(&0) && at < bytes.len() {
            cuts.push(at);
        }
    }
    cuts.push(bytes.len());
    cuts
}

fn not_utf8(path: &Path, byte: usize) -> Error {
    Error::BadFile {
        path: path.to_path_buf(),
        message: format!("the file is not UTF-8 text (byte {byte})"),
    }
}

/// Why a chunk of a CSV body failed.
enum ChunkError {
    /// Not UTF-8 at this offset within the chunk.
    Utf8(usize),
    /// A row that does not parse.
    Row(RowError),
}

/// The header of a CSV file: its layout, the length of a byte-order mark
/// and where the body starts. `None` when `bytes` holds no complete header
/// line and more of the file follows.
fn parse_header(
    path: &Path,
    bytes: &[u8],
    whole_file: bool,
    wanted: Columns,
) -> Result<Option<(Layout, usize, usize)>> {
    let bom = if bytes.starts_with(b"\xEF\xBB\xBF") {
        3
    } else {
        0
    };
    let header_end = match memchr::memchr(b'\n', &bytes[bom..]) {
        Some(i) => bom + i,
        None if whole_file => bytes.len(),
        None => return Ok(None),
    };
    let header = std::str::from_utf8(&bytes[bom..header_end])
        .map_err(|e| not_utf8(path, bom + e.valid_up_to()))?
        .trim_end_matches('\r');
    if header.trim().is_empty() {
        return Err(Error::BadFile {
            path: path.to_path_buf(),
            message: "the file is empty; it needs a header row such as name,x_ly,y_ly,z_ly".into(),
        });
    }
    let names: Vec<String> = header
        .split(',')
        .map(|n| n.trim().trim_matches('"').to_string())
        .collect();
    if names[0].parse::<f64>().is_ok() {
        // A number is no column name: the first line is a data row.
        let shard_hint = if names.len() == super::csv_format::COLUMNS.len() {
            "; it looks like a shard after the first (those have no header row), so prepend the first shard's header line"
        } else {
            "; add a header row such as name,x_ly,y_ly,z_ly"
        };
        return Err(Error::BadFile {
            path: path.to_path_buf(),
            message: format!("the file has no header row: its first line is data{shard_hint}"),
        });
    }
    let layout = make_layout(path, names, wanted)?;
    Ok(Some((layout, bom, (header_end + 1).min(bytes.len()))))
}

fn read_csv_bytes(path: &Path, bytes: &[u8], wanted: Columns) -> Result<Partial> {
    let (layout, bom, body_start) =
        parse_header(path, bytes, true, wanted)?.expect("a whole file has a header");
    // Offsets below count from after the byte-order mark.
    let body_start = body_start - bom;
    let bytes = &bytes[bom..];
    let body = &bytes[body_start..];
    if body.contains(&b'"') {
        let text = std::str::from_utf8(body)
            .map_err(|e| not_utf8(path, bom + body_start + e.valid_up_to()))?;
        return read_quoted(path, &layout.all_columns(), text);
    }
    // Line-aligned chunks of about 1 MB, checked for UTF-8 and parsed in parallel.
    let bounds = line_aligned_cuts(body, (body.len() >> 20).clamp(1, 256));
    let parse_all = |layout: &Layout| -> Vec<std::result::Result<Partial, ChunkError>> {
        bounds
            .par_windows(2)
            .map(|w| {
                let chunk = std::str::from_utf8(&body[w[0]..w[1]])
                    .map_err(|e| ChunkError::Utf8(e.valid_up_to()))?;
                parse_chunk(layout, chunk).map_err(ChunkError::Row)
            })
            .collect()
    };
    let mut results = parse_all(&layout);
    let needs_full = results
        .iter()
        .any(|r| matches!(r, Err(ChunkError::Row(e)) if e.message == NEEDS_FULL_READ));
    if needs_full {
        results = parse_all(&layout.all_columns());
    }
    let mut parts = Vec::with_capacity(results.len());
    for (k, r) in results.into_iter().enumerate() {
        match r {
            Ok(p) => parts.push(p),
            Err(ChunkError::Utf8(at)) => {
                return Err(not_utf8(path, bom + body_start + bounds[k] + at));
            }
            Err(ChunkError::Row(e)) => {
                let before = memchr::memchr_iter(b'\n', &body[..bounds[k]]).count() as u64;
                return Err(Error::BadRow {
                    path: path.to_path_buf(),
                    line: 2 + before + e.line_in_chunk,
                    column: e.column,
                    message: e.message,
                });
            }
        }
    }
    Ok(concat_partials(parts))
}

/// Body bytes per piece in a streamed read.
const STREAM_PIECE_BYTES: usize = 4 << 20;
/// Bytes read past a piece's end to finish its last line (grown if a line
/// is longer).
const STREAM_TAIL_BYTES: usize = 64 << 10;

/// Why a piece of a streamed read failed.
enum PieceError {
    Io(std::io::Error),
    /// Not UTF-8 at this offset in the file.
    Utf8(u64),
    /// The piece holds a double quote: the file needs the quoting reader.
    Quoted,
    /// A row that does not parse, in the piece whose lines start at this
    /// offset in the file.
    Row(u64, RowError),
}

/// Reads a large CSV file in line-aligned pieces, each read into a reused
/// buffer and parsed on a worker thread, so no copy of the whole file is
/// ever held. `Ok(None)` when the file is small, has quoted fields or an
/// overlong header: the caller then reads it whole.
fn read_csv_streamed(path: &Path, wanted: Columns) -> Result<Option<Partial>> {
    read_csv_streamed_in(path, wanted, STREAM_PIECE_BYTES, STREAM_TAIL_BYTES)
}

/// [`read_csv_streamed`] with a given piece and tail size (small in tests,
/// to cross many piece boundaries); files under four pieces are left to
/// the caller.
fn read_csv_streamed_in(
    path: &Path,
    wanted: Columns,
    piece_bytes: usize,
    tail_bytes: usize,
) -> Result<Option<Partial>> {
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileExt;
        let missing = |e: std::io::Error| Error::MissingInput {
            path: path.to_path_buf(),
            message: e.to_string(),
        };
        let file = std::fs::File::open(path).map_err(missing)?;
        let meta = file.metadata().map_err(missing)?;
        let len = meta.len() as usize;
        if !meta.is_file() || len < 4 * piece_bytes {
            return Ok(None);
        }
        let mut head = vec![0u8; STREAM_TAIL_BYTES.max(tail_bytes).min(len)];
        file.read_exact_at(&mut head, 0).map_err(missing)?;
        let Some((layout, _, body_start)) = parse_header(path, &head, false, wanted)? else {
            return Ok(None);
        };
        let pieces = (len - body_start).div_ceil(piece_bytes);
        // Piece buffers and parsed pieces go back to pools, so that only a
        // batch's worth of them is ever allocated (and its pages first
        // touched); the rows are appended to `all` batch by batch.
        let pool = std::sync::Mutex::new(Vec::<Vec<u8>>::new());
        let parsed_pool = std::sync::Mutex::new(Vec::<Partial>::new());
        let batch = (4 * rayon::current_num_threads()).max(8);
        let mut layout = layout;
        let mut restarted = false;
        let mut all = Partial::new(layout.wanted);
        let mut k0 = 0;
        while k0 < pieces {
            let k1 = (k0 + batch).min(pieces);
            let layout_now = &layout;
            let results: Vec<std::result::Result<Partial, PieceError>> = (k0..k1)
                .into_par_iter()
                .map(|k| {
                    let piece = Piece {
                        start: body_start + k * piece_bytes,
                        first: k == 0,
                        piece_bytes,
                        tail_bytes,
                    };
                    let mut buf = pool
                        .lock()
                        .map(|mut p| p.pop())
                        .unwrap_or_default()
                        .unwrap_or_default();
                    let mut out = parsed_pool
                        .lock()
                        .map(|mut p| p.pop())
                        .unwrap_or_default()
                        .unwrap_or_else(|| Partial::new(layout_now.wanted));
                    let parsed = read_piece(&file, len, &piece, &mut buf)
                        .and_then(|(from, lines)| parse_piece(layout_now, from, lines, &mut out));
                    if let Ok(mut p) = pool.lock() {
                        p.push(buf);
                    }
                    parsed.map(|()| out)
                })
                .collect();
            let needs_full = results
                .iter()
                .any(|r| matches!(r, Err(PieceError::Row(_, e)) if e.message == NEEDS_FULL_READ));
            if needs_full && !restarted {
                // A derivable column is missing somewhere: read every
                // column of every row, from the start.
                restarted = true;
                layout = layout.all_columns();
                all = Partial::new(layout.wanted);
                if let Ok(mut p) = parsed_pool.lock() {
                    p.clear();
                }
                k0 = 0;
                continue;
            }
            let mut parts = Vec::with_capacity(results.len());
            for r in results {
                match r {
                    Ok(p) => parts.push(p),
                    Err(PieceError::Quoted) => return Ok(None),
                    Err(PieceError::Io(e)) => return Err(missing(e)),
                    Err(PieceError::Utf8(at)) => return Err(not_utf8(path, at as usize)),
                    Err(PieceError::Row(start, e)) => {
                        let bytes = std::fs::read(path).map_err(missing)?;
                        let end = (start as usize).min(bytes.len());
                        let before = memchr::memchr_iter(b'\n', &bytes[body_start..end]).count();
                        return Err(Error::BadRow {
                            path: path.to_path_buf(),
                            line: 2 + before as u64 + e.line_in_chunk,
                            column: e.column,
                            message: e.message,
                        });
                    }
                }
            }
            append_partials(&mut all, &mut parts);
            if let Ok(mut p) = parsed_pool.lock() {
                p.extend(parts);
            }
            k0 = k1;
        }
        Ok(Some(all))
    }
    #[cfg(not(unix))]
    {
        let _ = (path, wanted, piece_bytes, tail_bytes);
        Ok(None)
    }
}

/// Where one piece of a streamed read lies.
#[cfg(unix)]
struct Piece {
    /// File offset of the piece.
    start: usize,
    /// The first piece starts at a line start (the body's first line).
    first: bool,
    piece_bytes: usize,
    tail_bytes: usize,
}

/// Reads the lines that start inside `piece` into `buf`; returns the file
/// offset of the first such line and the lines.
#[cfg(unix)]
fn read_piece<'b>(
    file: &std::fs::File,
    len: usize,
    piece: &Piece,
    buf: &'b mut Vec<u8>,
) -> std::result::Result<(u64, &'b [u8]), PieceError> {
    use std::os::unix::fs::FileExt;
    let (start, first_piece) = (piece.start, piece.first);
    let end = (start + piece.piece_bytes).min(len);
    // One byte before the piece tells whether a line starts at `start`.
    let from = if first_piece { start } else { start - 1 };
    let mut to = (end + piece.tail_bytes).min(len);
    loop {
        buf.resize(to - from, 0);
        file.read_exact_at(buf, from as u64)
            .map_err(PieceError::Io)?;
        let first = if first_piece {
            Some(0)
        } else {
            memchr::memchr(b'\n', buf).map(|i| i + 1)
        };
        let rel_end = end - from;
        let lines_end = match first {
            Some(f) if f >= rel_end => return Ok((0, &buf[..0])),
            Some(_) => memchr::memchr(b'\n', &buf[rel_end - 1..])
                .map(|j| rel_end + j)
                .or((to == len).then_some(buf.len())),
            None if to == len => return Ok((0, &buf[..0])),
            None => None,
        };
        match (first, lines_end) {
            (Some(f), Some(e)) => return Ok(((from + f) as u64, &buf[f..e])),
            _ => to = (to + (to - end).max(piece.tail_bytes)).min(len),
        }
    }
}

/// Parses one piece's lines, which start at file offset `from`.
fn parse_piece(
    layout: &Layout,
    from: u64,
    lines: &[u8],
    out: &mut Partial,
) -> std::result::Result<(), PieceError> {
    let text =
        std::str::from_utf8(lines).map_err(|e| PieceError::Utf8(from + e.valid_up_to() as u64))?;
    parse_chunk_into(layout, text, out).map_err(|e| {
        if e.message == HAS_QUOTES {
            PieceError::Quoted
        } else {
            PieceError::Row(from, e)
        }
    })
}

/// Appends the rows of `parts`, in order, to `all` (same wanted columns),
/// columns in parallel, and leaves each part empty with its allocations
/// kept for reuse.
fn append_partials(all: &mut Partial, parts: &mut [Partial]) {
    fn add<T: Clone + Send + Sync>(
        out: &mut Vec<T>,
        parts: &[Partial],
        col: impl Fn(&Partial) -> &Vec<T>,
    ) {
        out.reserve(parts.iter().map(|p| col(p).len()).sum());
        for p in parts {
            out.extend_from_slice(col(p));
        }
    }
    let ps = &*parts;
    let c = &mut all.cat;
    rayon::scope(|s| {
        s.spawn(|_| add(&mut c.id, ps, |p| &p.cat.id));
        s.spawn(|_| add(&mut c.system, ps, |p| &p.cat.system));
        s.spawn(|_| add(&mut c.x_ly, ps, |p| &p.cat.x_ly));
        s.spawn(|_| add(&mut c.y_ly, ps, |p| &p.cat.y_ly));
        s.spawn(|_| add(&mut c.z_ly, ps, |p| &p.cat.z_ly));
        s.spawn(|_| add(&mut c.kind, ps, |p| &p.cat.kind));
        s.spawn(|_| add(&mut c.class, ps, |p| &p.cat.class));
        s.spawn(|_| add(&mut c.mass_msun, ps, |p| &p.cat.mass_msun));
        s.spawn(|_| add(&mut c.initial_mass_msun, ps, |p| &p.cat.initial_mass_msun));
        s.spawn(|_| add(&mut c.radius_rsun, ps, |p| &p.cat.radius_rsun));
        s.spawn(|_| add(&mut c.luminosity_lsun, ps, |p| &p.cat.luminosity_lsun));
        s.spawn(|_| add(&mut c.teff_k, ps, |p| &p.cat.teff_k));
        s.spawn(|_| add(&mut c.age_gyr, ps, |p| &p.cat.age_gyr));
        s.spawn(|_| add(&mut c.lifetime_gyr, ps, |p| &p.cat.lifetime_gyr));
        s.spawn(|_| add(&mut c.hz_inner_au, ps, |p| &p.cat.hz_inner_au));
        s.spawn(|_| add(&mut c.hz_outer_au, ps, |p| &p.cat.hz_outer_au));
        s.spawn(|_| add(&mut c.color_rgb, ps, |p| &p.cat.color_rgb));
        s.spawn(|_| add(&mut c.abs_mag_v, ps, |p| &p.cat.abs_mag_v));
        s.spawn(|_| add(&mut c.separation_au, ps, |p| &p.cat.separation_au));
        s.spawn(|_| add(&mut c.period_days, ps, |p| &p.cat.period_days));
        s.spawn(|_| add(&mut c.habitable_host, ps, |p| &p.cat.habitable_host));
        s.spawn(|_| add(&mut c.origin, ps, |p| &p.cat.origin));
    });
    add(&mut all.missing, ps, |p| &p.missing);
    add(&mut all.no_id, ps, |p| &p.no_id);
    add(&mut all.no_system, ps, |p| &p.no_system);
    // Names move (no copy of the strings).
    all.cat.name.reserve(
        parts.iter().map(|p| p.cat.name.len()).sum(),
        parts.iter().map(|p| p.cat.name.text_len()).sum(),
    );
    for p in parts.iter_mut() {
        all.cat.name.append(&mut p.cat.name);
        p.clear();
    }
}

/// Joins chunk results in order, each column copied once into a vector of
/// the final size.
fn concat_partials(mut parts: Vec<Partial>) -> Partial {
    let mut all = Partial::new(parts.first().map_or(Columns::ALL, |p| p.wanted));
    append_partials(&mut all, &mut parts);
    all
}

fn read_quoted(path: &Path, layout: &Layout, body: &str) -> Result<Partial> {
    let mut out = Partial::new(layout.wanted);
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .from_reader(body.as_bytes());
    let mut record = csv::StringRecord::new();
    loop {
        let line = reader.position().line() + 1;
        match reader.read_record(&mut record) {
            Ok(false) => break,
            Ok(true) => {
                if record.iter().all(|f| f.trim().is_empty()) {
                    continue;
                }
                let fields: Vec<&str> = record.iter().collect();
                parse_record(layout, &fields, &mut out).map_err(|(column, message)| {
                    Error::BadRow {
                        path: path.to_path_buf(),
                        line: record.position().map(|p| p.line() + 1).unwrap_or(line),
                        column,
                        message,
                    }
                })?;
            }
            Err(e) => {
                return Err(Error::BadFile {
                    path: path.to_path_buf(),
                    message: format!("malformed CSV near line {}: {e}", line),
                });
            }
        }
    }
    Ok(out)
}

fn read_jsonl(path: &Path, text: &str) -> Result<Partial> {
    let mut out = Partial::new(Columns::ALL);
    let mut layout: Option<Layout> = None;
    for (n, line) in text.lines().enumerate() {
        if line.trim().is_empty() {
            continue;
        }
        let bad_line = |message: String| Error::BadRow {
            path: path.to_path_buf(),
            line: n as u64 + 1,
            column: "(object)".into(),
            message,
        };
        let value: serde_json::Value =
            serde_json::from_str(line).map_err(|e| bad_line(format!("not a JSON object: {e}")))?;
        let obj = value
            .as_object()
            .ok_or_else(|| bad_line("not a JSON object".into()))?;
        if layout.is_none() {
            layout = Some(make_layout(
                path,
                obj.keys().cloned().collect(),
                Columns::ALL,
            )?);
        }
        let l = layout.as_ref().expect("set above");
        let texts: Vec<String> = l
            .names
            .iter()
            .map(|k| match obj.get(k) {
                None | Some(serde_json::Value::Null) => String::new(),
                Some(serde_json::Value::String(s)) => s.clone(),
                Some(v) => v.to_string(),
            })
            .collect();
        let fields: Vec<&str> = texts.iter().map(String::as_str).collect();
        parse_record(l, &fields, &mut out).map_err(|(column, message)| Error::BadRow {
            path: path.to_path_buf(),
            line: n as u64 + 1,
            column,
            message,
        })?;
    }
    // No objects at all is an empty catalogue (an empty shard, or a volume
    // too small to hold a star), not an error.
    Ok(out)
}

/// Fills ids, systems and (in a full read) the physical values a user's
/// file left out.
fn finish(p: &mut Partial) {
    let c = &mut p.cat;
    for i in 0..c.len() {
        if p.no_id[i] {
            c.id[i] = i as u64 + 1;
        }
    }
    for i in 0..c.len() {
        if p.no_system[i] {
            c.system[i] = c.id[i];
        }
    }
    if p.wanted != Columns::ALL {
        // A projected read only finishes when no wanted value needs deriving.
        return;
    }
    let needs_physics = |i: usize, c: &Catalogue| {
        p.missing[i] & (MISSING_KIND | MISSING_CLASS | MISSING_COLOUR) != 0
            || c.radius_rsun[i].is_nan()
            || c.luminosity_lsun[i].is_nan()
            || c.teff_k[i].is_nan()
            || c.abs_mag_v[i].is_nan()
            || c.hz_inner_au[i].is_nan()
    };
    for i in 0..c.len() {
        if needs_physics(i, c) {
            derive_row(c, i, p.missing[i]);
        }
    }
}

/// Gives the columns a projected read skipped their "not read" placeholders, so that
/// every column has `len()` entries; columns in parallel.
fn fill_unread(c: &mut Catalogue, wanted: Columns) {
    let n = c.len();
    let w = |set: Columns| !wanted.contains(set);
    // Zeros, not NaN: a zeroed allocation is never touched, so columns
    // nobody reads cost no memory traffic (NaN would write 8 bytes a row).
    let nan = |col: &mut Vec<f64>| *col = vec![0.0; n];
    rayon::scope(|s| {
        if w(Columns::NAME) {
            s.spawn(|_| c.name = NameColumn::empty_names(n));
        }
        if w(Columns::KIND) {
            s.spawn(|_| c.kind = vec![StarKind::MainSequence; n]);
        }
        if w(Columns::CLASS) {
            s.spawn(|_| c.class = vec![ClassCode::from_str_lossy(""); n]);
        }
        if w(Columns::MASS) {
            s.spawn(|_| nan(&mut c.mass_msun));
        }
        if w(Columns::INITIAL_MASS) {
            s.spawn(|_| nan(&mut c.initial_mass_msun));
        }
        if w(Columns::RADIUS) {
            s.spawn(|_| nan(&mut c.radius_rsun));
        }
        if w(Columns::LUMINOSITY) {
            s.spawn(|_| nan(&mut c.luminosity_lsun));
        }
        if w(Columns::TEFF) {
            s.spawn(|_| nan(&mut c.teff_k));
        }
        if w(Columns::AGE) {
            s.spawn(|_| nan(&mut c.age_gyr));
        }
        if w(Columns::LIFETIME) {
            s.spawn(|_| nan(&mut c.lifetime_gyr));
        }
        if w(Columns::HABITABLE_ZONE) {
            s.spawn(|_| nan(&mut c.hz_inner_au));
            s.spawn(|_| nan(&mut c.hz_outer_au));
        }
        if w(Columns::COLOUR) {
            s.spawn(|_| c.color_rgb = vec![[255, 255, 255]; n]);
        }
        if w(Columns::ABS_MAG_V) {
            s.spawn(|_| nan(&mut c.abs_mag_v));
        }
        if w(Columns::SEPARATION) {
            s.spawn(|_| nan(&mut c.separation_au));
        }
        if w(Columns::PERIOD) {
            s.spawn(|_| nan(&mut c.period_days));
        }
        if w(Columns::HABITABLE_HOST) {
            s.spawn(|_| c.habitable_host = vec![false; n]);
        }
        if w(Columns::ORIGIN) {
            s.spawn(|_| c.origin = vec![Origin::Imported; n]);
        }
    });
}

fn derive_row(c: &mut Catalogue, i: usize, missing: u8) {
    let mass = c.mass_msun[i];
    if missing & MISSING_KIND != 0 {
        c.kind[i] = match c.class[i].letter() {
            'D' => StarKind::WhiteDwarf,
            'L' | 'T' | 'Y' => StarKind::BrownDwarf,
            _ if mass < 0.075 => StarKind::BrownDwarf,
            _ => StarKind::MainSequence,
        };
    }
    let (r, l, t) = (c.radius_rsun[i], c.luminosity_lsun[i], c.teff_k[i]);
    let known = [r, l, t].iter().filter(|v| v.is_finite()).count();
    if known == 0 && mass.is_finite() && mass > 0.0 {
        // A mass alone gives the whole profile of the given kind.
        let age = c.age_gyr[i];
        let request = StarRequest {
            mass: SolarMasses::new(mass).expect("checked positive and finite"),
            age: Gigayears::new(if age.is_finite() {
                age.clamp(0.0, 13.8)
            } else {
                4.57
            })
            .expect("clamped into range"),
            kind: KindChoice::Explicit(c.kind[i]),
        };
        let prof = star_profile(&request, crate::physics::Fidelity::Fitted);
        let fill = |v: &mut f64, w: f64| {
            if v.is_nan() {
                *v = w
            }
        };
        fill(&mut c.radius_rsun[i], prof.radius_rsun);
        fill(&mut c.luminosity_lsun[i], prof.luminosity_lsun);
        fill(&mut c.teff_k[i], prof.teff_k);
        fill(&mut c.initial_mass_msun[i], prof.initial_mass_msun);
        fill(&mut c.lifetime_gyr[i], prof.lifetime_gyr);
        fill(&mut c.hz_inner_au[i], prof.hz.inner_au);
        fill(&mut c.hz_outer_au[i], prof.hz.outer_au);
        fill(&mut c.abs_mag_v[i], prof.abs_mag_v);
        if missing & MISSING_CLASS != 0 {
            c.class[i] = prof.class;
        }
        if missing & MISSING_COLOUR != 0 {
            c.color_rgb[i] = prof.color_rgb;
        }
        if missing & MISSING_HABITABLE != 0 {
            c.habitable_host[i] = prof.habitable_host;
        }
        return;
    }
    if known == 0 && missing & MISSING_CLASS == 0 {
        // A dwarf class alone gives the mean dwarf sequence's Teff, L and R.
        let code = c.class[i];
        if let Some(row) = DWARF_SEQUENCE
            .iter()
            .find(|row| row.spectral_type == code.as_str())
        {
            c.teff_k[i] = row.teff_k;
            c.luminosity_lsun[i] = 10f64.powf(row.log_luminosity_lsun);
            c.radius_rsun[i] = row.radius_rsun;
        }
    }
    if known == 2 {
        // Stefan–Boltzmann in solar units: L = R² (Teff / 5772 K)⁴
        // (IAU 2015 B3 nominal solar values).
        if r.is_nan() {
            c.radius_rsun[i] = l.sqrt() / (t / TEFF_SUN_K).powi(2);
        } else if l.is_nan() {
            c.luminosity_lsun[i] = r * r * (t / TEFF_SUN_K).powi(4);
        } else {
            c.teff_k[i] = TEFF_SUN_K * (l / (r * r)).powf(0.25);
        }
    }
    fill_light(c, i, missing);
}

/// Fills what the light functions give from Teff (class, colour) and from
/// Teff with L (habitable zone, absolute visual magnitude), leaving the
/// values the file gave.
fn fill_light(c: &mut Catalogue, i: usize, missing: u8) {
    let (t, l, kind) = (c.teff_k[i], c.luminosity_lsun[i], c.kind[i]);
    if !(t.is_finite() && t > 0.0) {
        return;
    }
    if missing & MISSING_CLASS != 0 {
        c.class[i] = spectral_class::classify(kind, t, l, c.mass_msun[i]);
    }
    if missing & MISSING_COLOUR != 0 {
        c.color_rgb[i] = blackbody_color::color_rgb(t);
    }
    if l.is_finite() && l > 0.0 {
        if c.hz_inner_au[i].is_nan() && c.hz_outer_au[i].is_nan() {
            let hz = habitable_zone::habitable_zone(t, l);
            c.hz_inner_au[i] = hz.inner_au;
            c.hz_outer_au[i] = hz.outer_au;
        }
        if c.abs_mag_v[i].is_nan() {
            c.abs_mag_v[i] = photometry::abs_mag_v(kind, t, l);
        }
    }
}

/// Title and seed from the sidecar `PATH.toml`, when it exists and parses.
pub fn read_sidecar_meta(path: &Path) -> CatalogueMeta {
    let side = crate::spec::sidecar_path(path);
    match std::fs::read_to_string(&side)
        .ok()
        .and_then(|t| crate::spec::SpecFile::parse(&t, &side).ok())
    {
        Some(spec) => {
            // The sector's centre as `populate --spec` resolves it: the
            // origin when the file gives a shape but no centre.
            let centre_ly = (spec.centre_ly.is_some() || spec.shape.is_some())
                .then(|| spec.centre().ok())
                .flatten();
            CatalogueMeta {
                title: spec.title,
                seed: spec.seed,
                centre_ly,
            }
        }
        None => CatalogueMeta::default(),
    }
}

/// Reads pinned systems (`--pin FILE.csv`) in the import format, through
/// the same parser and derivation as [`read_catalogue`], so a pin row means
/// what `summary` shows for it. A position is required; names default to
/// `Pin N`. Then, for the pins only:
///
/// - A row that gives nothing about the star but `mass_msun` and
///   `age_gyr` (both optional) is a star to evolve, like a generated one:
///   initial mass `mass_msun` (default 1), age `age_gyr` (default 4.57, a
///   sun-like star, Bonanno et al. 2002, A&A 390, 1115).
/// - A row that gives a `kind` and neither a mass nor any of class,
///   `teff_k`, `luminosity_lsun` and `radius_rsun` is given 1 solar mass,
///   moved into that kind's allowed range (a neutron star 1.1, a black
///   hole 3), so the physics builds the whole object.
/// - Every other row is taken as the reader completes it.
pub fn read_pins(path: &Path) -> Result<Vec<crate::spec::PinnedSystem>> {
    use crate::spec::PinnedStar;
    let mut partial = read_partial(path, Columns::ALL)?;
    let n = partial.cat.len();
    let mut evolved = vec![false; n];
    for (i, evolve) in evolved.iter_mut().enumerate() {
        let c = &mut partial.cat;
        let line = i as u64 + 2;
        // The reader has refused masses that are not positive and ages
        // below 0; a pin's age must also lie within the universe's.
        let (mass, age) = (c.mass_msun[i], c.age_gyr[i]);
        if !(age.is_nan() || (0.0..=13.8).contains(&age)) {
            return Err(Error::BadRow {
                path: path.to_path_buf(),
                line,
                column: "age_gyr".into(),
                message: format!("'{age}' must be an age from 0 to 13.8 Gyr"),
            });
        }
        let missing = partial.missing[i];
        let no_light = [c.radius_rsun[i], c.luminosity_lsun[i], c.teff_k[i]]
            .iter()
            .all(|v| v.is_nan());
        let all_missing = MISSING_KIND | MISSING_CLASS | MISSING_COLOUR | MISSING_HABITABLE;
        *evolve = missing & all_missing == all_missing
            && no_light
            && [
                c.initial_mass_msun[i],
                c.lifetime_gyr[i],
                c.hz_inner_au[i],
                c.hz_outer_au[i],
                c.abs_mag_v[i],
            ]
            .iter()
            .all(|v| v.is_nan());
        let kind_only = missing & MISSING_KIND == 0
            && missing & MISSING_CLASS != 0
            && no_light
            && mass.is_nan();
        if kind_only {
            let (lo, hi) = crate::physics::allowed_mass_range(KindChoice::Explicit(c.kind[i]));
            c.mass_msun[i] = 1f64.clamp(lo, hi);
        }
    }
    finish(&mut partial);
    let cat = partial.cat;
    let mut pins = Vec::with_capacity(n);
    for (i, &evolve) in evolved.iter().enumerate() {
        let star = if evolve {
            let (mass, age) = (cat.mass_msun[i], cat.age_gyr[i]);
            PinnedStar::Evolved {
                initial_mass_msun: if mass.is_nan() { 1.0 } else { mass },
                age_gyr: if age.is_nan() { 4.57 } else { age },
            }
        } else {
            PinnedStar::Described(cat.profile(i))
        };
        pins.push(crate::spec::PinnedSystem {
            name: if cat.name[i].is_empty() {
                format!("Pin {}", i + 1)
            } else {
                cat.name[i].to_string()
            },
            position_ly: cat.position_ly(i),
            star,
        });
    }
    Ok(pins)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn temp(name: &str, body: &str) -> std::path::PathBuf {
        let dir = std::env::temp_dir().join(format!("starloom-reader-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let p = dir.join(name);
        std::fs::write(&p, body).unwrap();
        p
    }

    #[test]
    fn fast_decimal_parser_is_exact() {
        for s in [
            "0",
            "-12.345",
            "123456.789",
            "1e5",
            "-0.001",
            "7.",
            "3.14159265358979",
        ] {
            assert_eq!(parse_f64(s), s.parse::<f64>().ok(), "{s}");
        }
        assert_eq!(parse_f64("abc"), None);
        assert_eq!(parse_f64("-"), None);
    }

    #[test]
    fn minimal_hand_made_csv() {
        let p = temp(
            "min.csv",
            "name,x_ly,y_ly,z_ly\nHearth,0,0,0\n\nFar Light, -4.2 ,1,2.5\n",
        );
        let cat = read_catalogue(&p).unwrap();
        assert_eq!(cat.len(), 2);
        assert_eq!(cat.id, vec![1, 2]);
        assert_eq!(cat.system, vec![1, 2]);
        assert_eq!(&cat.name[1], "Far Light");
        assert_eq!(cat.position_ly(1), [-4.2, 1.0, 2.5]);
        assert!(cat.teff_k[0].is_nan());
        assert_eq!(cat.origin[0], Origin::Imported);
    }

    #[test]
    fn parsecs_sky_positions_and_stefan_boltzmann() {
        let p = temp(
            "pc.csv",
            "x_pc,y_pc,z_pc,radius_rsun,luminosity_lsun\n1,0,0,1,1\n",
        );
        let cat = read_catalogue(&p).unwrap();
        assert!((cat.x_ly[0] - LY_PER_PC).abs() < 1e-12);
        // L = R = 1 gives the nominal solar Teff, 5772 K (IAU 2015 B3).
        assert!((cat.teff_k[0] - 5772.0).abs() < 1e-9);
        // The north Galactic pole (ICRS 192.85948, +27.12825; light-and-maps
        // §6.1, astropy check value) at 10 pc lies on +z.
        let p = temp(
            "sky.csv",
            "ra_deg,dec_deg,distance_pc\n192.85948,27.12825,10\n",
        );
        let cat = read_catalogue(&p).unwrap();
        assert!(
            (cat.z_ly[0] - 10.0 * LY_PER_PC).abs() < 1e-4,
            "{}",
            cat.z_ly[0]
        );
        assert!(cat.x_ly[0].abs() < 1e-3);
    }

    #[test]
    fn errors_name_the_file_line_and_column() {
        let p = temp("bad.csv", "name,x_ly,y_ly,z_ly\nA,1,2,3\nB,1,oops,3\n");
        let err = read_catalogue(&p).unwrap_err().to_string();
        assert!(
            err.contains("bad.csv") && err.contains("line 3") && err.contains("y_ly"),
            "{err}"
        );
        let p = temp("nopos.csv", "name,teff_k\nA,5000\n");
        let err = read_catalogue(&p).unwrap_err().to_string();
        assert!(err.contains("x_ly"), "{err}");
        let p = temp("short.csv", "name,x_ly,y_ly,z_ly\nA,1,2\n");
        let err = read_catalogue(&p).unwrap_err().to_string();
        assert!(err.contains("line 2") && err.contains("z_ly"), "{err}");
    }

    #[test]
    fn light_columns_are_derived_from_teff_and_luminosity() {
        let p = temp(
            "light.csv",
            "name,x_ly,y_ly,z_ly,teff_k,luminosity_lsun,class\nSunlike,1,0,0,5772,1,\nWarm,2,0,0,4440,,\nTyped,3,0,0,,,K5V\n",
        );
        let cat = read_catalogue(&p).unwrap();
        // Pecaut & Mamajek 2013, ApJS 208, 9, Table 5 (Mamajek's mean dwarf
        // sequence): G2V at 5770 K, K5V at 4440 K.
        assert_eq!(cat.class[0].as_str(), "G2V");
        assert_eq!(cat.class[1].as_str(), "K5V");
        // The Sun's absolute visual magnitude, 4.81 (Willmer 2018, ApJS 236,
        // 47, Table 3); the bolometric corrections used are good to a few
        // hundredths of a magnitude.
        assert!(
            (cat.abs_mag_v[0] - 4.81).abs() < 0.05,
            "{}",
            cat.abs_mag_v[0]
        );
        // Kopparapu et al. 2013 (ApJ 765, 131) conservative zone of the Sun:
        // 0.99 au (moist greenhouse) to 1.70 au (maximum greenhouse).
        assert!(
            (cat.hz_inner_au[0] - 0.99).abs() < 0.01,
            "{}",
            cat.hz_inner_au[0]
        );
        assert!(
            (cat.hz_outer_au[0] - 1.70).abs() < 0.01,
            "{}",
            cat.hz_outer_au[0]
        );
        // A Teff alone gives class and colour (a warm, orange-white blackbody:
        // red above blue), not the luminosity-dependent columns.
        let [r, _, b] = cat.color_rgb[1];
        assert!(r > b, "{:?}", cat.color_rgb[1]);
        assert!(cat.abs_mag_v[1].is_nan() && cat.hz_inner_au[1].is_nan());
        // A dwarf class alone gives the sequence's Teff and luminosity
        // (K5V: 4440 K, log L = -0.764, same table).
        assert_eq!(cat.teff_k[2], 4440.0);
        assert!((cat.luminosity_lsun[2].log10() + 0.764).abs() < 1e-9);
        assert!(cat.abs_mag_v[2].is_finite() && cat.hz_outer_au[2].is_finite());
    }

    #[test]
    fn quoted_names_use_the_csv_crate() {
        let p = temp(
            "q.csv",
            "name,x_ly,y_ly,z_ly\n\"Rest, the\",1,2,3\n\"Bad\",x,2,3\n",
        );
        let err = read_catalogue(&p).unwrap_err().to_string();
        assert!(err.contains("line 3") && err.contains("x_ly"), "{err}");
        let p = temp("q2.csv", "name,x_ly,y_ly,z_ly\n\"Rest, the\",1,2,3\n");
        let cat = read_catalogue(&p).unwrap();
        assert_eq!(&cat.name[0], "Rest, the");
    }

    #[test]
    fn fast_parser_matches_the_standard_parser_with_exponents() {
        // The standard library's parser is correctly rounded; the fast path
        // must give the same bits.
        for s in [
            "2.3142e-5",
            "1.5E+3",
            "-7.25e-12",
            "9.99999e22",
            "1e-22",
            "123456789012345e-22",
            "1e23",
            "4.2e-300",
            "0.000012345",
            "1234567890123456",
        ] {
            assert_eq!(parse_f64(s), s.parse::<f64>().ok(), "{s}");
        }
        for s in [
            "1e",
            "1e+",
            "e5",
            "1.2.3",
            "1e5x",
            "--1",
            ".5",
            "5.",
            ".",
            "-.5",
            "+3.25",
            "00012.500",
            "-0.0",
            "-344.573",
            "12345678901234567890",
            "1..2",
            "1.e3",
            "",
        ] {
            assert_eq!(parse_f64(s), s.parse::<f64>().ok(), "{s}");
        }
    }

    #[test]
    fn word_parser_matches_the_standard_parser() {
        // Every string is read inside a line, after 0 to 30 bytes that look
        // like numbers, points and commas.
        let mut texts: Vec<String> = [
            "-344.573",
            "0.0078239",
            "3402",
            "678.2",
            "0",
            "-0",
            "-0.0",
            "5.",
            ".5",
            "-.5",
            ".",
            "-",
            "-.",
            "1.2.3",
            "12..3",
            "1e5",
            "+3.25",
            " 1.5",
            "1.5 ",
            "1,5",
            "--1",
            "0.1",
            "9007199254740991",
            "9007199254740992",
            "9007199254740993",
            "1234567890123456",
            "123456789012345.6",
            "12345678901234567",
            "0.000000000000001",
            "999999999999999.",
            "00012.500",
            "1x",
            "x1",
            "12345678.12345678",
            "1234567.12345678",
            "-1234567.1234567",
            "1.2345e-5",
            "1.2345E-05",
            "-9.9999e-22",
            "4e-22",
            "4e-23",
            "1e22",
            "1e23",
            "9007199254740992e1",
            "9007199254740993e0",
            "9007199254740993e-1",
            "1.5e+3",
            "1.5e",
            "1.5e+",
            "1.5e-",
            "e5",
            "-e5",
            ".e5",
            "1.e5",
            ".5e1",
            "1e0005",
            "1e-400",
            "1e400",
            "1.2e3.4",
            "1.2e-3x",
            "1.5ee3",
            "1.5e--3",
            "1.5e3e3",
            "12345678.12345678e-3",
            "123456789012345.6e-7",
            "0e-5",
            "-0e5",
        ]
        .map(String::from)
        .to_vec();
        // Edge digits and lengths 1 to 17 with the point at every place.
        for len in 1..=17usize {
            for point in 0..=len {
                for digit in ["0", "1", "5", "9"] {
                    let mut t = digit.repeat(len);
                    if point < len {
                        t.insert(point, '.');
                    }
                    texts.push(t.clone());
                    texts.push(format!("-{t}"));
                }
            }
        }
        use rand::{RngExt, SeedableRng};
        let mut rng = crate::seed::StarRng::seed_from_u64(1);
        for _ in 0..20_000 {
            let v: f64 = rng.random_range(-1000.0..1000.0) * 10f64.powi(rng.random_range(-6..6));
            texts.push(format!("{v:.*}", rng.random_range(0..12)));
            texts.push(format!("{v}"));
            // Scientific notation as the writer and other tools write it.
            let sig = rng.random_range(0..16);
            texts.push(format!("{v:.sig$e}"));
            texts.push(
                format!("{v:.sig$E}")
                    .replace("E", "E+")
                    .replace("E+-", "E-"),
            );
        }
        for t in &texts {
            for junk in [0usize, 3, 15, 16, 17, 30] {
                let line = format!(
                    "{}{t},7.5\n",
                    "9.,-".chars().cycle().take(junk).collect::<String>()
                );
                let (from, to) = (junk, junk + t.len());
                let got = parse_f64_at(line.as_bytes(), from, to);
                let want = t.parse::<f64>().ok();
                assert_eq!(
                    got.map(f64::to_bits),
                    want.map(f64::to_bits),
                    "{t:?} after {junk} bytes"
                );
            }
        }
    }

    #[test]
    fn hex_colours_parse_as_the_standard_radix_parser_does() {
        for a in 0u8..=127 {
            for b in 0u8..=127 {
                let pair = [a, b];
                let Ok(p) = std::str::from_utf8(&pair) else {
                    continue;
                };
                let want = pair
                    .iter()
                    .all(u8::is_ascii_hexdigit)
                    .then(|| u8::from_str_radix(p, 16).ok())
                    .flatten();
                let text = format!("#{p}a0{p}");
                assert_eq!(
                    parse_hex_colour(&text),
                    want.map(|v| [v, 0xa0, v]),
                    "{text:?}"
                );
            }
        }
        assert_eq!(parse_hex_colour("ffcc88"), Some([0xff, 0xcc, 0x88]));
        assert_eq!(parse_hex_colour("#FFcC8"), None);
        assert_eq!(parse_hex_colour("#ffcc880"), None);
    }

    #[test]
    fn separators_match_a_plain_search() {
        let line = b"a,,bc,defghijk,lmnopqrstu,v,w,xyz0123456789,,end\n+-\xac\x2c\xc3\xa9,\n\n";
        let mut text: Vec<u8> = line.iter().copied().cycle().take(5 * line.len()).collect();
        // One double quote, so that some windows hold it and some do not.
        let quote_at = 2 * line.len() + 7;
        text[quote_at] = b'"';
        let mut seps = Vec::new();
        for start in 0..text.len() {
            for end in [text.len(), start + 63, start + 64, start + 65, start + 130] {
                let b = &text[start..end.min(text.len())];
                let want: Vec<u32> = (0..b.len())
                    .filter_map(|i| match b[i] {
                        b',' => Some(i as u32),
                        b'\n' => Some(i as u32 | SEP_NEWLINE),
                        _ => None,
                    })
                    .collect();
                let quoted = find_separators(b, &mut seps);
                assert_eq!(seps, want, "{start}..{end}");
                assert_eq!(quoted, b.contains(&b'"'), "{start}..{end}");
            }
        }
    }

    #[test]
    fn chunks_cut_lines_as_a_plain_split_does() {
        let layout = make_layout(
            Path::new("t.csv"),
            ["name", "x_ly", "y_ly", "z_ly"].map(String::from).to_vec(),
            Columns::ALL,
        )
        .unwrap();
        for text in [
            "",
            "\n",
            "a,1,2,3",
            "a,1,2,3\n",
            "a,1,2,3\r\n\n  \nbcdefghijkl,4,5,6\r\nc,7,8,9",
            "\n\n\nlong name here,1.5,2.5,3.5\n",
        ] {
            let p = parse_chunk(&layout, text).ok().expect("parses");
            let want: Vec<&str> = text
                .split_terminator('\n')
                .map(|l| l.strip_suffix('\r').unwrap_or(l))
                .filter(|l| !l.trim().is_empty())
                .map(|l| l.split(',').next().unwrap())
                .collect();
            assert_eq!(p.cat.name.iter().collect::<Vec<_>>(), want, "{text:?}");
        }
        // A short row is reported on its own line of the chunk.
        let e = parse_chunk(&layout, "a,1,2,3\n\nb,1,2\n")
            .err()
            .expect("fails");
        assert_eq!(e.line_in_chunk, 2);
        assert_eq!(e.column, "z_ly");
    }

    #[test]
    fn whole_numbers_parse_as_the_standard_parser_does() {
        for s in [
            "0",
            "007",
            "+5",
            "-5",
            "18446744073709551615",
            "18446744073709551616",
            "9999999999999999999",
            "1 2",
            "1.0",
            "",
            "12345678",
            "1234567:",
            "/2345678",
            "12345678 ",
            "9213660993389527040",
            "921366099338952704a",
            "92136609933895270@0",
            "1234567890123456789",
            "0000000000000000001",
        ] {
            assert_eq!(parse_u64(s), s.parse::<u64>().ok(), "{s}");
        }
        // Every byte value in every position of an eight-digit group.
        for at in 0..16 {
            for byte in 0..=255u8 {
                let mut b = *b"9213660993389527";
                b[at] = byte;
                if let Ok(s) = std::str::from_utf8(&b) {
                    assert_eq!(parse_u64(s), s.parse::<u64>().ok(), "{s:?}");
                }
            }
        }
    }

    proptest::proptest! {
        #[test]
        fn whole_numbers_match_the_standard_parser_for_any_u64(v: u64, pad in 0usize..4) {
            let s = format!("{}{v}", "0".repeat(pad));
            proptest::prop_assert_eq!(parse_u64(&s), s.parse::<u64>().ok());
        }
    }

    /// A catalogue in our own format, several kinds, with exponents.
    fn own_format_csv(rows: usize) -> String {
        let mut text = String::from(
            "id,system,designation,name,x_ly,y_ly,z_ly,kind,class,mass_msun,initial_mass_msun,radius_rsun,luminosity_lsun,teff_k,age_gyr,lifetime_gyr,hz_inner_au,hz_outer_au,colour_hex,abs_mag_v,separation_au,period_days,habitable_host,origin\n",
        );
        for i in 0..rows {
            let (kind, class, lum) = match i % 3 {
                0 => ("main-sequence", "M3V", "0.0078239"),
                1 => ("brown-dwarf", "T1", "2.3142e-5"),
                _ => ("white-dwarf", "DA5.2", "0.00031"),
            };
            let sys = i - i % 2;
            text.push_str(&format!(
                "{i},{sys},d/{i},Star {i},{}.5,-{}.25,{},{kind},{class},0.23,0.23,0.25,{lum},3402,2.7,678.2,0.095,0.18,#ffc486,11.997,{},{},{},generated\n",
                sys % 97,
                sys % 13,
                sys % 7,
                i % 2,
                (i % 2) * 3,
                i % 5 == 0
            ));
        }
        text
    }

    fn same_columns(a: &Catalogue, b: &Catalogue, wanted: Columns) {
        assert_eq!(a.len(), b.len());
        assert_eq!(a.id, b.id);
        assert_eq!(a.system, b.system);
        assert_eq!((&a.x_ly, &a.y_ly, &a.z_ly), (&b.x_ly, &b.y_ly, &b.z_ly));
        let bits = |v: &[f64]| v.iter().map(|x| x.to_bits()).collect::<Vec<_>>();
        if wanted.contains(Columns::NAME) {
            assert_eq!(a.name, b.name);
        }
        if wanted.contains(Columns::KIND) {
            assert_eq!(a.kind, b.kind);
        }
        if wanted.contains(Columns::CLASS) {
            assert_eq!(a.class, b.class);
        }
        if wanted.contains(Columns::LUMINOSITY) {
            assert_eq!(bits(&a.luminosity_lsun), bits(&b.luminosity_lsun));
        }
        if wanted.contains(Columns::TEFF) {
            assert_eq!(bits(&a.teff_k), bits(&b.teff_k));
        }
        if wanted.contains(Columns::COLOUR) {
            assert_eq!(a.color_rgb, b.color_rgb);
        }
        if wanted.contains(Columns::HABITABLE_HOST) {
            assert_eq!(a.habitable_host, b.habitable_host);
        }
        if wanted.contains(Columns::ORIGIN) {
            assert_eq!(a.origin, b.origin);
        }
        if wanted.contains(Columns::SEPARATION) {
            assert_eq!(bits(&a.separation_au), bits(&b.separation_au));
        }
    }

    /// Every column of two partial reads, bit for bit, with their flags.
    fn same_partials(a: &Partial, b: &Partial) {
        same_columns(&a.cat, &b.cat, a.wanted);
        let bits = |v: &[f64]| v.iter().map(|x| x.to_bits()).collect::<Vec<_>>();
        let (x, y) = (&a.cat, &b.cat);
        for (p, q) in [
            (&x.mass_msun, &y.mass_msun),
            (&x.initial_mass_msun, &y.initial_mass_msun),
            (&x.radius_rsun, &y.radius_rsun),
            (&x.age_gyr, &y.age_gyr),
            (&x.lifetime_gyr, &y.lifetime_gyr),
            (&x.hz_inner_au, &y.hz_inner_au),
            (&x.hz_outer_au, &y.hz_outer_au),
            (&x.abs_mag_v, &y.abs_mag_v),
            (&x.period_days, &y.period_days),
        ] {
            assert_eq!(bits(p), bits(q));
        }
        assert_eq!(a.missing, b.missing);
        assert_eq!((&a.no_id, &a.no_system), (&b.no_id, &b.no_system));
    }

    #[test]
    fn own_layout_rows_read_as_the_general_reader_reads_them() {
        let mut lines: Vec<String> = own_format_csv(40).lines().map(String::from).collect();
        // Rows the fast decoder must hand to the general one: padding,
        // empty fields, other spellings, exponents, a carriage return.
        let edits: [(usize, usize, &str); 14] = [
            (1, 0, " 7"),
            (2, 1, ""),
            (3, 4, " 1.5 "),
            (4, 5, "2e1"),
            (5, 7, "White_Dwarf"),
            (6, 8, ""),
            (7, 9, ""),
            (8, 12, "+1.25"),
            (9, 18, "#FFC486"),
            (10, 18, ""),
            (11, 22, "yes"),
            (12, 23, "hipparcos\r"),
            (13, 3, "  Padded name "),
            (14, 12, "0.00000000000000001234"),
        ];
        for (row, field, text) in edits {
            let mut f: Vec<String> = lines[row].split(',').map(String::from).collect();
            f[field] = text.to_string();
            lines[row] = f.join(",");
        }
        let text = lines.join("\n") + "\n";
        let (header, body) = text.split_once('\n').unwrap();
        let names: Vec<String> = header.split(',').map(String::from).collect();
        for wanted in [
            Columns::ALL,
            crate::map::CATALOGUE_COLUMNS,
            crate::routes::CATALOGUE_COLUMNS,
            Columns::POSITIONS,
        ] {
            let own = make_layout(Path::new("t.csv"), names.clone(), wanted).unwrap();
            assert!(own.own_format);
            let mut general = make_layout(Path::new("t.csv"), names.clone(), wanted).unwrap();
            general.own_format = false;
            match (parse_chunk(&own, body), parse_chunk(&general, body)) {
                (Ok(a), Ok(b)) => same_partials(&a, &b),
                (Err(a), Err(b)) => {
                    assert_eq!(
                        (a.line_in_chunk, a.column, a.message),
                        (b.line_in_chunk, b.column, b.message)
                    );
                }
                _ => panic!("one reader failed and the other did not, for {wanted:?}"),
            }
        }
        // And a row that is wrong: the same error from both.
        let bad = body.replacen("#ffc486", "#ffc48g", 1);
        let own = make_layout(Path::new("t.csv"), names.clone(), Columns::ALL).unwrap();
        let mut general = make_layout(Path::new("t.csv"), names, Columns::ALL).unwrap();
        general.own_format = false;
        let (a, b) = (parse_chunk(&own, &bad), parse_chunk(&general, &bad));
        let (Err(a), Err(b)) = (a, b) else {
            panic!("a bad colour must fail")
        };
        assert_eq!((a.line_in_chunk, &a.column), (b.line_in_chunk, &b.column));
        assert_eq!(a.column, "colour_hex");
    }

    #[test]
    fn bit_windows_admit_what_the_float_checks_admit() {
        let mut values = vec![
            0.0,
            -0.0,
            f64::MIN_POSITIVE,
            -f64::MIN_POSITIVE,
            5e-324,
            -5e-324,
            f64::MAX,
            f64::MIN,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::NAN,
            -f64::NAN,
            1.0,
            -1.0,
            3402.0,
            -2.3142e-5,
        ];
        use rand::{RngExt, SeedableRng};
        let mut rng = crate::seed::StarRng::seed_from_u64(2);
        values.extend((0..10_000).map(|_| f64::from_bits(rng.random())));
        for allowed in [Allowed::Finite, Allowed::ZeroOrMore, Allowed::Positive] {
            for &v in &values {
                // The same answer, except that the quick test hands -0 in
                // a column of 0 or more to the general reader.
                let quick = allowed.bits().admits(v);
                let exact = allowed.admits(v);
                let minus_zero = matches!(allowed, Allowed::ZeroOrMore) && v.to_bits() == 1 << 63;
                assert_eq!(quick, exact && !minus_zero, "{v:e} ({:#x})", v.to_bits());
            }
        }
    }

    #[test]
    fn out_of_range_values_are_refused_alike_by_every_path() {
        let text = own_format_csv(400);
        let header: Vec<&str> = text.lines().next().unwrap().split(',').collect();
        let (_, body) = text.split_once('\n').unwrap();
        // Row 300 of the body is line 302 of the file (the header is line 1).
        let row = 300;
        let line_start = body.match_indices('\n').nth(row - 1).unwrap().0 + 1;
        for (column, value, message) in [
            (
                "mass_msun",
                "-0.23",
                "'-0.23' must be a positive number of solar masses",
            ),
            (
                "initial_mass_msun",
                "0",
                "'0' must be a positive number of solar masses",
            ),
            (
                "radius_rsun",
                "-0",
                "'-0' must be a positive number of solar radii",
            ),
            (
                "luminosity_lsun",
                "-2.3142e-5",
                "'-2.3142e-5' must be a number of solar luminosities, 0 or more",
            ),
            (
                "teff_k",
                "-3402",
                "'-3402' must be a number of kelvin, 0 or more",
            ),
            (
                "age_gyr",
                "-2.7",
                "'-2.7' must be a number of gigayears, 0 or more",
            ),
            (
                "lifetime_gyr",
                "-678.2",
                "'-678.2' must be a number of gigayears, 0 or more",
            ),
            (
                "hz_inner_au",
                "-0.095",
                "'-0.095' must be a number of au, 0 or more",
            ),
            (
                "hz_outer_au",
                "-0.18",
                "'-0.18' must be a number of au, 0 or more",
            ),
            ("abs_mag_v", "inf", "'inf' is not a finite number"),
            (
                "separation_au",
                "-1",
                "'-1' must be a number of au, 0 or more",
            ),
            (
                "period_days",
                "-3",
                "'-3' must be a number of days, 0 or more",
            ),
            ("teff_k", "NaN", "'NaN' is not a finite number"),
            ("x_ly", "-inf", "'-inf' is not a finite number"),
            ("mass_msun", "1e400", "'1e400' is not a finite number"),
        ] {
            let at = header.iter().position(|&h| h == column).unwrap();
            let line_end = line_start + body[line_start..].find('\n').unwrap();
            let mut fields: Vec<&str> = body[line_start..line_end].split(',').collect();
            fields[at] = value;
            let bad_body = format!(
                "{}{}{}",
                &body[..line_start],
                fields.join(","),
                &body[line_end..]
            );
            let want = (row as u64, column.to_string(), message.to_string());
            // The fixed-order decoder and the general one, on one chunk.
            let names: Vec<String> = header.iter().map(|h| h.to_string()).collect();
            let own = make_layout(Path::new("t.csv"), names.clone(), Columns::ALL).unwrap();
            let mut general = make_layout(Path::new("t.csv"), names, Columns::ALL).unwrap();
            general.own_format = false;
            for layout in [&own, &general] {
                let e = parse_chunk(layout, &bad_body).err().expect("refused");
                assert_eq!((e.line_in_chunk, e.column, e.message), want);
            }
            // The whole-file read and the streamed read, across pieces.
            let bad_text = format!("{}\n{bad_body}", header.join(","));
            let p = temp("range.csv", &bad_text);
            let want = format!("{}, line 302, column '{column}': {message}", p.display());
            let whole = read_csv_bytes(&p, bad_text.as_bytes(), Columns::ALL).err();
            assert_eq!(whole.expect("refused").to_string(), want);
            let streamed = read_csv_streamed_in(&p, Columns::ALL, 512, 16).err();
            assert_eq!(streamed.expect("refused").to_string(), want);
        }
    }

    #[test]
    fn projected_reads_give_the_wanted_columns_of_the_full_read() {
        let p = temp("own.csv", &own_format_csv(300));
        let full = read_catalogue(&p).unwrap();
        assert_eq!(full.kind[1], StarKind::BrownDwarf);
        assert_eq!(full.luminosity_lsun[1], 2.3142e-5);
        let wanted = Columns::NAME | Columns::KIND | Columns::LUMINOSITY | Columns::ORIGIN;
        let part = read_catalogue_columns(&p, wanted).unwrap();
        same_columns(&full, &part, wanted);
        // Columns left out hold "not read" placeholders, one per row.
        assert_eq!(part.mass_msun.len(), 300);
        assert!(part.mass_msun.iter().all(|&m| m == 0.0));
        assert!(part.class.iter().all(|c| c.as_str().is_empty()));
        // A wanted column the file lacks is derived, as in the full read.
        let p = temp(
            "few.csv",
            "name,x_ly,y_ly,z_ly,teff_k,luminosity_lsun\nSunlike,1,0,0,5772,1\n",
        );
        let part = read_catalogue_columns(&p, Columns::CLASS).unwrap();
        assert_eq!(part.class[0].as_str(), "G2V");
        // So is a wanted value a row leaves empty.
        let p = temp(
            "gap.csv",
            "name,x_ly,y_ly,z_ly,teff_k,luminosity_lsun,class\nA,1,0,0,5772,1,\nB,2,0,0,4440,0.2,K5V\n",
        );
        let part = read_catalogue_columns(&p, Columns::CLASS).unwrap();
        assert_eq!(part.class[0].as_str(), "G2V");
        assert_eq!(part.class[1].as_str(), "K5V");
    }

    #[test]
    fn streamed_reads_match_the_whole_file_read_across_piece_edges() {
        let text = own_format_csv(400);
        let p = temp("stream.csv", &text);
        let whole = read_csv_bytes(&p, text.as_bytes(), Columns::ALL).unwrap();
        // Pieces smaller than a line and tails smaller than a line make
        // every boundary case occur (line starting exactly at a piece, line
        // longer than the tail, last line without a newline).
        for (piece, tail) in [(97, 13), (200, 200), (1000, 7), (4096, 64)] {
            for wanted in [Columns::ALL, crate::map::CATALOGUE_COLUMNS] {
                let streamed = read_csv_streamed_in(&p, wanted, piece, tail)
                    .unwrap()
                    .expect("large enough to stream");
                same_columns(&whole.cat, &streamed.cat, wanted);
            }
        }
        let trimmed = temp("stream2.csv", text.trim_end());
        let streamed = read_csv_streamed_in(&trimmed, Columns::ALL, 333, 5)
            .unwrap()
            .unwrap();
        same_columns(&whole.cat, &streamed.cat, Columns::ALL);
        // A bad row deep in the file is reported with its line number.
        let mut bad = text.clone();
        let at = bad.match_indices('\n').nth(250).unwrap().0 + 1;
        bad.insert_str(at, "1,1,x,Broken,1,oops,3,main-sequence,G2V,1,1,1,1,5772,1,10,1,2,#ffffff,4.8,0,0,true,generated\n");
        let p = temp("stream_bad.csv", &bad);
        let err = match read_csv_streamed_in(&p, Columns::ALL, 512, 16) {
            Err(e) => e.to_string(),
            Ok(_) => panic!("a bad row must fail"),
        };
        assert!(err.contains("line 252") && err.contains("y_ly"), "{err}");
        // A derivable column left empty in a row of a late batch: the
        // streamed read starts again with every column and still matches.
        let mut lines: Vec<String> = text.lines().map(str::to_string).collect();
        let mut fields: Vec<&str> = lines[350].split(',').collect();
        let class_at = lines[0].split(',').position(|h| h == "class").unwrap();
        fields[class_at] = "";
        lines[350] = fields.join(",");
        let blank = lines.join("\n") + "\n";
        let p = temp("stream_blank.csv", &blank);
        let whole = read_csv_bytes(&p, blank.as_bytes(), Columns::ALL).unwrap();
        let streamed = read_csv_streamed_in(&p, crate::map::CATALOGUE_COLUMNS, 97, 13)
            .unwrap()
            .expect("large enough to stream");
        assert_eq!(
            streamed.wanted,
            Columns::ALL,
            "read again with every column"
        );
        same_columns(&whole.cat, &streamed.cat, crate::map::CATALOGUE_COLUMNS);
        // Quoted fields hand the file back to the whole-file reader.
        let quoted = text.replacen("Star 5,", "\"Star, 5\",", 1);
        let p = temp("stream_q.csv", &quoted);
        assert!(
            read_csv_streamed_in(&p, Columns::ALL, 512, 16)
                .unwrap()
                .is_none()
        );
        assert_eq!(&read_catalogue(&p).unwrap().name[5], "Star, 5");
    }
}
