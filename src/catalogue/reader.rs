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
//! # Speed
//! The file is read into memory, cut into line-aligned chunks and the
//! chunks are parsed in parallel with hand-split fields and a fast decimal
//! parser; files with quoted fields go through the `csv` crate instead.

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
    names: Vec<String>,
    positions: Positions,
}

fn make_layout(path: &Path, names: Vec<String>) -> Result<Layout> {
    let cols: Vec<Col> = names.iter().map(|n| column_of(n)).collect();
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
        cols,
        names,
        positions,
    })
}

/// Powers of ten that are exact in binary.
const POW10: [f64; 16] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
];

/// Parses a decimal number quickly: exact (correctly rounded) for up to
/// 15 significant digits without an exponent, else the standard parser.
#[inline]
fn parse_f64(s: &str) -> Option<f64> {
    let b = s.as_bytes();
    let (neg, digits) = match b.first() {
        Some(b'-') => (true, &b[1..]),
        Some(b'+') => (false, &b[1..]),
        _ => (false, b),
    };
    let mut mantissa: u64 = 0;
    let mut n_digits = 0;
    let mut decimals = 0i32;
    let mut seen_point = false;
    let mut ok = !digits.is_empty();
    for &c in digits {
        match c {
            b'0'..=b'9' => {
                mantissa = mantissa * 10 + (c - b'0') as u64;
                n_digits += 1;
                if seen_point {
                    decimals += 1;
                }
            }
            b'.' if !seen_point => seen_point = true,
            _ => {
                ok = false;
                break;
            }
        }
    }
    if ok && n_digits > 0 && n_digits <= 15 {
        // Both operands are exact, so the division is correctly rounded.
        let v = mantissa as f64 / POW10[decimals as usize];
        return Some(if neg { -v } else { v });
    }
    s.parse::<f64>().ok()
}

struct Partial {
    cat: Catalogue,
    missing: Vec<u8>,
    /// Rows whose id / system the file did not give.
    no_id: Vec<bool>,
    no_system: Vec<bool>,
}

impl Partial {
    fn new() -> Partial {
        Partial {
            cat: Catalogue::default(),
            missing: Vec::new(),
            no_id: Vec::new(),
            no_system: Vec::new(),
        }
    }
}

struct RowError {
    /// Line within the chunk, 0-based.
    line_in_chunk: u64,
    column: String,
    message: String,
}

fn parse_hex_colour(s: &str) -> Option<[u8; 3]> {
    let h = s.strip_prefix('#').unwrap_or(s);
    if h.len() != 6 || !h.is_ascii() {
        return None;
    }
    let byte = |i: usize| u8::from_str_radix(&h[i..i + 2], 16).ok();
    Some([byte(0)?, byte(2)?, byte(4)?])
}

fn parse_bool(s: &str) -> Option<bool> {
    match s.to_ascii_lowercase().as_str() {
        "true" | "1" | "yes" | "y" => Some(true),
        "false" | "0" | "no" | "n" => Some(false),
        _ => None,
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
    let nan = f64::NAN;
    let (mut id, mut system) = (None, None);
    let mut name = "";
    let mut xyz = [nan; 3];
    let (mut ra, mut dec, mut dist) = (nan, nan, nan);
    let mut kind = None;
    let mut class = None;
    let mut num = [nan; 13];
    let mut colour = None;
    let mut habitable = None;
    let mut origin = Origin::Imported;
    for (k, raw) in fields.iter().enumerate() {
        let col = layout.cols[k];
        if col == Col::Ignored {
            continue;
        }
        let s = raw.trim();
        let bad = |what: &str| (layout.names[k].clone(), format!("'{s}' is not {what}"));
        let number = || -> std::result::Result<f64, (String, String)> {
            if s.is_empty() {
                Ok(nan)
            } else {
                parse_f64(s).ok_or_else(|| bad("a number"))
            }
        };
        match col {
            Col::Id | Col::System => {
                if !s.is_empty() {
                    let v: u64 = s.parse().map_err(|_| bad("a whole number of 0 or more"))?;
                    if col == Col::Id {
                        id = Some(v)
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
            Col::DistLy => dist = number()?,
            Col::DistPc => {
                if !matches!(
                    layout.positions,
                    Positions::Sky {
                        distance_in_pc: false
                    }
                ) {
                    dist = number()?
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
            Col::Mass => num[0] = number()?,
            Col::InitialMass => num[1] = number()?,
            Col::Radius => num[2] = number()?,
            Col::Lum => num[3] = number()?,
            Col::Teff => num[4] = number()?,
            Col::Age => num[5] = number()?,
            Col::Lifetime => num[6] = number()?,
            Col::HzIn => num[7] = number()?,
            Col::HzOut => num[8] = number()?,
            Col::AbsMag => num[9] = number()?,
            Col::Sep => num[10] = number()?,
            Col::Period => num[11] = number()?,
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
    let c = &mut out.cat;
    c.id.push(id.unwrap_or(0));
    c.system.push(system.unwrap_or(0));
    c.name.push(name.to_string());
    c.x_ly.push(position[0]);
    c.y_ly.push(position[1]);
    c.z_ly.push(position[2]);
    c.kind.push(kind.unwrap_or(StarKind::MainSequence));
    c.class.push(class.unwrap_or(ClassCode::from_str_lossy("")));
    c.mass_msun.push(num[0]);
    c.initial_mass_msun.push(num[1]);
    c.radius_rsun.push(num[2]);
    c.luminosity_lsun.push(num[3]);
    c.teff_k.push(num[4]);
    c.age_gyr.push(num[5]);
    c.lifetime_gyr.push(num[6]);
    c.hz_inner_au.push(num[7]);
    c.hz_outer_au.push(num[8]);
    c.color_rgb.push(colour.unwrap_or([255, 255, 255]));
    c.abs_mag_v.push(num[9]);
    c.separation_au.push(num[10]);
    c.period_days.push(num[11]);
    c.habitable_host.push(habitable.unwrap_or(false));
    c.origin.push(origin);
    out.missing.push(missing);
    out.no_id.push(id.is_none());
    out.no_system.push(system.is_none());
    Ok(())
}

fn parse_chunk(layout: &Layout, chunk: &str) -> std::result::Result<Partial, RowError> {
    let mut out = Partial::new();
    let mut fields: Vec<&str> = Vec::with_capacity(layout.cols.len() + 1);
    for (n, line) in chunk.split('\n').enumerate() {
        let line = line.strip_suffix('\r').unwrap_or(line);
        if line.trim().is_empty() {
            continue;
        }
        fields.clear();
        fields.extend(line.split(','));
        parse_record(layout, &fields, &mut out).map_err(|(column, message)| RowError {
            line_in_chunk: n as u64,
            column,
            message,
        })?;
    }
    Ok(out)
}

/// Reads a catalogue file, choosing the format by extension (`.jsonl`
/// as JSON Lines, anything else as CSV).
pub fn read_catalogue(path: &Path) -> Result<Catalogue> {
    let bytes = read_bytes_parallel(path).map_err(|e| Error::MissingInput {
        path: path.to_path_buf(),
        message: e.to_string(),
    })?;
    let is_jsonl = path
        .extension()
        .and_then(|e| e.to_str())
        .is_some_and(|e| e.eq_ignore_ascii_case("jsonl") || e.eq_ignore_ascii_case("ndjson"));
    let mut partial = if is_jsonl {
        let text = std::str::from_utf8(&bytes).map_err(|e| not_utf8(path, e.valid_up_to()))?;
        read_jsonl(path, text)?
    } else {
        read_csv_bytes(path, &bytes)?
    };
    finish(&mut partial);
    let mut cat = partial.cat;
    cat.meta = read_sidecar_meta(path);
    Ok(cat)
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

fn read_csv_bytes(path: &Path, bytes: &[u8]) -> Result<Partial> {
    let bom = if bytes.starts_with(b"\xEF\xBB\xBF") {
        3
    } else {
        0
    };
    let bytes = &bytes[bom..];
    let header_end = bytes
        .iter()
        .position(|&b| b == b'\n')
        .unwrap_or(bytes.len());
    let header = std::str::from_utf8(&bytes[..header_end])
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
    let layout = make_layout(path, names)?;
    let body_start = (header_end + 1).min(bytes.len());
    let body = &bytes[body_start..];
    if body.contains(&b'"') {
        let text = std::str::from_utf8(body)
            .map_err(|e| not_utf8(path, bom + body_start + e.valid_up_to()))?;
        return read_quoted(path, &layout, text);
    }
    // Line-aligned chunks of about 1 MB, checked for UTF-8 and parsed in parallel.
    let bounds = line_aligned_cuts(body, (body.len() >> 20).clamp(1, 256));
    let results: Vec<std::result::Result<Partial, ChunkError>> = bounds
        .par_windows(2)
        .map(|w| {
            let chunk = std::str::from_utf8(&body[w[0]..w[1]])
                .map_err(|e| ChunkError::Utf8(e.valid_up_to()))?;
            parse_chunk(&layout, chunk).map_err(ChunkError::Row)
        })
        .collect();
    let mut parts = Vec::with_capacity(results.len());
    for (k, r) in results.into_iter().enumerate() {
        match r {
            Ok(p) => parts.push(p),
            Err(ChunkError::Utf8(at)) => {
                return Err(not_utf8(path, bom + body_start + bounds[k] + at));
            }
            Err(ChunkError::Row(e)) => {
                let before = body[..bounds[k]].iter().filter(|&&b| b == b'\n').count() as u64;
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

/// Joins chunk results in order, each column copied once into a vector of
/// the final size, columns in parallel.
fn concat_partials(parts: Vec<Partial>) -> Partial {
    fn cat<T: Clone + Send + Sync>(parts: &[Partial], col: impl Fn(&Partial) -> &Vec<T>) -> Vec<T> {
        let n = parts.iter().map(|p| col(p).len()).sum();
        let mut out = Vec::with_capacity(n);
        for p in parts {
            out.extend_from_slice(col(p));
        }
        out
    }
    let mut all = Partial::new();
    let ps = &parts[..];
    let c = &mut all.cat;
    rayon::scope(|s| {
        s.spawn(|_| c.id = cat(ps, |p| &p.cat.id));
        s.spawn(|_| c.system = cat(ps, |p| &p.cat.system));
        s.spawn(|_| c.x_ly = cat(ps, |p| &p.cat.x_ly));
        s.spawn(|_| c.y_ly = cat(ps, |p| &p.cat.y_ly));
        s.spawn(|_| c.z_ly = cat(ps, |p| &p.cat.z_ly));
        s.spawn(|_| c.kind = cat(ps, |p| &p.cat.kind));
        s.spawn(|_| c.class = cat(ps, |p| &p.cat.class));
        s.spawn(|_| c.mass_msun = cat(ps, |p| &p.cat.mass_msun));
        s.spawn(|_| c.initial_mass_msun = cat(ps, |p| &p.cat.initial_mass_msun));
        s.spawn(|_| c.radius_rsun = cat(ps, |p| &p.cat.radius_rsun));
        s.spawn(|_| c.luminosity_lsun = cat(ps, |p| &p.cat.luminosity_lsun));
        s.spawn(|_| c.teff_k = cat(ps, |p| &p.cat.teff_k));
        s.spawn(|_| c.age_gyr = cat(ps, |p| &p.cat.age_gyr));
        s.spawn(|_| c.lifetime_gyr = cat(ps, |p| &p.cat.lifetime_gyr));
        s.spawn(|_| c.hz_inner_au = cat(ps, |p| &p.cat.hz_inner_au));
        s.spawn(|_| c.hz_outer_au = cat(ps, |p| &p.cat.hz_outer_au));
        s.spawn(|_| c.color_rgb = cat(ps, |p| &p.cat.color_rgb));
        s.spawn(|_| c.abs_mag_v = cat(ps, |p| &p.cat.abs_mag_v));
        s.spawn(|_| c.separation_au = cat(ps, |p| &p.cat.separation_au));
        s.spawn(|_| c.period_days = cat(ps, |p| &p.cat.period_days));
        s.spawn(|_| c.habitable_host = cat(ps, |p| &p.cat.habitable_host));
        s.spawn(|_| c.origin = cat(ps, |p| &p.cat.origin));
    });
    all.missing = cat(ps, |p| &p.missing);
    all.no_id = cat(ps, |p| &p.no_id);
    all.no_system = cat(ps, |p| &p.no_system);
    // Names move (no copy of the strings).
    let n = parts.iter().map(|p| p.cat.name.len()).sum();
    all.cat.name.reserve_exact(n);
    for mut p in parts {
        all.cat.name.append(&mut p.cat.name);
    }
    all
}

fn read_quoted(path: &Path, layout: &Layout, body: &str) -> Result<Partial> {
    let mut out = Partial::new();
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
    let mut out = Partial::new();
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
            layout = Some(make_layout(path, obj.keys().cloned().collect())?);
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
    if layout.is_none() {
        return Err(Error::BadFile {
            path: path.to_path_buf(),
            message: "the file holds no JSON objects".into(),
        });
    }
    Ok(out)
}

/// Fills ids, systems and the physical values a user's file left out.
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
        Some(spec) => CatalogueMeta {
            title: spec.title,
            seed: spec.seed,
        },
        None => CatalogueMeta::default(),
    }
}

/// Reads pinned systems (`--pin FILE.csv`) in the import format: a
/// position is required; `mass_msun` defaults to 1 and `age_gyr` to 4.57
/// (a sun-like star, Bonanno et al. 2002, A&A 390, 1115), names to `Pin N`.
pub fn read_pins(path: &Path) -> Result<Vec<crate::spec::PinnedSystem>> {
    let cat = read_catalogue(path)?;
    let mut pins = Vec::with_capacity(cat.len());
    for i in 0..cat.len() {
        let mass = cat.mass_msun[i];
        let age = cat.age_gyr[i];
        if !(mass.is_nan() || (mass > 0.0 && mass.is_finite())) {
            return Err(Error::BadRow {
                path: path.to_path_buf(),
                line: i as u64 + 2,
                column: "mass_msun".into(),
                message: format!("'{mass}' must be a positive number of solar masses"),
            });
        }
        if !(age.is_nan() || (0.0..=13.8).contains(&age)) {
            return Err(Error::BadRow {
                path: path.to_path_buf(),
                line: i as u64 + 2,
                column: "age_gyr".into(),
                message: format!("'{age}' must be an age from 0 to 13.8 Gyr"),
            });
        }
        pins.push(crate::spec::PinnedSystem {
            name: if cat.name[i].is_empty() {
                format!("Pin {}", i + 1)
            } else {
                cat.name[i].clone()
            },
            position_ly: cat.position_ly(i),
            mass_msun: if mass.is_nan() { 1.0 } else { mass },
            age_gyr: if age.is_nan() { 4.57 } else { age },
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
        assert_eq!(cat.name[1], "Far Light");
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
        assert_eq!(cat.name[0], "Rest, the");
    }
}
