//! The CSV catalogue format: a header row with units in the column names,
//! then one star per line, rows in catalogue order.
//!
//! The writer formats straight into a byte buffer (no per-field
//! allocation). Missing values are empty fields. Names that hold a comma
//! or a quote are quoted as RFC 4180 says; the reader has a fast path for
//! unquoted files (parallel, hand-split fields) and uses the `csv` crate
//! when a file has quotes.

use super::designations::{push_designation, put_designation};
use super::number_format::{push_fixed, push_sig, push_u64, put_fixed, put_sig, put_u64};
use super::table::{Origin, RowView};
use super::text_buffer::{FIELD, TextSink, put_bytes};

/// The columns starloom writes, in order.
pub const COLUMNS: [&str; 24] = [
    "id",
    "system",
    "designation",
    "name",
    "x_ly",
    "y_ly",
    "z_ly",
    "kind",
    "class",
    "mass_msun",
    "initial_mass_msun",
    "radius_rsun",
    "luminosity_lsun",
    "teff_k",
    "age_gyr",
    "lifetime_gyr",
    "hz_inner_au",
    "hz_outer_au",
    "colour_hex",
    "abs_mag_v",
    "separation_au",
    "period_days",
    "habitable_host",
    "origin",
];

/// Appends the header line.
pub fn push_header(buf: &mut Vec<u8>) {
    buf.extend_from_slice(COLUMNS.join(",").as_bytes());
    buf.push(b'\n');
}

/// Appends a text field, quoting it when it holds `,`, `"` or a line break.
#[inline]
pub fn push_text_field<S: TextSink>(buf: &mut S, text: &str) {
    if needs_quotes(text.as_bytes()) {
        buf.push_byte(b'"');
        for b in text.bytes() {
            if b == b'"' {
                buf.push_byte(b'"');
            }
            buf.push_byte(b);
        }
        buf.push_byte(b'"');
    } else {
        buf.push_bytes(text.as_bytes());
    }
}

/// Writes `#rrggbb` at `out[pos..]`; needs 7 bytes of room.
#[inline(always)]
fn put_hex_colour(out: &mut [u8], pos: usize, rgb: [u8; 3]) -> usize {
    const HEX: &[u8; 16] = b"0123456789abcdef";
    let f = &mut out[pos..pos + 7];
    f[0] = b'#';
    for (i, c) in rgb.into_iter().enumerate() {
        f[1 + 2 * i] = HEX[(c >> 4) as usize];
        f[2 + 2 * i] = HEX[(c & 15) as usize];
    }
    pos + 7
}

/// Appends `#rrggbb`.
#[inline]
pub fn push_hex_colour<S: TextSink>(buf: &mut S, rgb: [u8; 3]) {
    buf.put(FIELD, |out| Some(put_hex_colour(out, 0, rgb)));
}

/// Room a row needs in [`put_row`], besides twice its name's length: 24
/// fields of at most [`FIELD`] bytes each (the widest a field's window is).
const ROW_ROOM: usize = 24 * FIELD + 64;

/// Writes a field `len` bytes long that starts at `from` (< `pos`) again
/// at `pos`, by one fixed-length copy of up to 32 bytes.
#[inline(always)]
fn put_again(out: &mut [u8], pos: usize, from: usize, len: usize) -> usize {
    if len > 32 {
        out.copy_within(from..from + len, pos);
    } else {
        let mut word = [0u8; 32];
        word.copy_from_slice(&out[from..from + 32]);
        out[pos..pos + 32].copy_from_slice(&word);
    }
    pos + len
}

/// Writes one row as a CSV line at `out[0..]` and returns its length;
/// needs [`ROW_ROOM`] plus twice the name's length of room. `None`
/// (nothing kept) for the rare rows [`push_row_general`] writes: a name
/// to quote, or a number too large for the integer path.
///
/// The write position lives in a register and every field is a few
/// fixed-length stores.
#[inline(never)]
fn put_row(out: &mut [u8], row: &RowView<'_>) -> Option<usize> {
    let name = row.name.as_bytes();
    if needs_quotes(name) {
        return None;
    }
    let p = row.profile;
    let mut pos = put_u64(out, 0, row.id);
    let id_len = pos;
    out[pos] = b',';
    pos += 1;
    pos = if row.system == row.id {
        // A primary: the system id is its own id, already written.
        put_again(out, pos, 0, id_len)
    } else {
        put_u64(out, pos, row.system)
    };
    out[pos] = b',';
    pos += 1;
    if row.origin == Origin::Generated {
        pos = put_designation(out, pos, row.id);
    }
    out[pos] = b',';
    pos = put_bytes(out, pos + 1, name);
    for v in row.position_ly {
        out[pos] = b',';
        pos = put_fixed(out, pos + 1, v, 3)?;
    }
    out[pos] = b',';
    pos = put_bytes(out, pos + 1, p.kind.as_str().as_bytes());
    out[pos] = b',';
    let class = p.class.as_bytes();
    if needs_quotes(class) {
        return None;
    }
    pos = put_bytes(out, pos + 1, class);
    out[pos] = b',';
    let mass_at = pos + 1;
    pos = put_sig(out, mass_at, p.mass_msun, 5)?;
    let mass_len = pos - mass_at;
    out[pos] = b',';
    pos = if p.initial_mass_msun.to_bits() == p.mass_msun.to_bits() {
        // Most stars have lost no mass: the same value, already written.
        put_again(out, pos + 1, mass_at, mass_len)
    } else {
        put_sig(out, pos + 1, p.initial_mass_msun, 5)?
    };
    for v in [p.radius_rsun, p.luminosity_lsun] {
        out[pos] = b',';
        pos = put_sig(out, pos + 1, v, 5)?;
    }
    out[pos] = b',';
    pos = put_fixed(out, pos + 1, p.teff_k, 0)?;
    for v in [p.age_gyr, p.lifetime_gyr, p.hz.inner_au, p.hz.outer_au] {
        out[pos] = b',';
        pos = put_sig(out, pos + 1, v, 5)?;
    }
    out[pos] = b',';
    pos = put_hex_colour(out, pos + 1, p.color_rgb);
    out[pos] = b',';
    pos = put_fixed(out, pos + 1, p.abs_mag_v, 3)?;
    for v in [row.separation_au, row.period_days] {
        out[pos] = b',';
        pos = put_sig(out, pos + 1, v, 5)?;
    }
    out[pos] = b',';
    let host: &[u8] = if p.habitable_host { b"true" } else { b"false" };
    pos = put_bytes(out, pos + 1, host);
    out[pos] = b',';
    pos = put_bytes(out, pos + 1, row.origin.as_str().as_bytes());
    out[pos] = b'\n';
    Some(pos + 1)
}

/// Whether a text field holds `,`, `"` or a line break.
#[inline(always)]
fn needs_quotes(text: &[u8]) -> bool {
    text.iter()
        .any(|&b| matches!(b, b',' | b'"' | b'\n' | b'\r'))
}

/// Appends one row as a CSV line.
///
/// # Allocations
/// None beyond growing `buf`.
#[inline]
pub fn push_row<S: TextSink>(buf: &mut S, row: &RowView<'_>) {
    let room = ROW_ROOM + 2 * row.name.len();
    if buf.put(room, |out| put_row(out, row)).is_none() {
        push_row_general(buf, row);
    }
}

/// [`push_row`] field by field, for any row (quoted names, numbers beyond
/// the integer path); the same bytes as [`put_row`] where both apply.
#[inline(never)]
fn push_row_general<S: TextSink>(buf: &mut S, row: &RowView<'_>) {
    let p = row.profile;
    push_u64(buf, row.id);
    buf.push_byte(b',');
    push_u64(buf, row.system);
    buf.push_byte(b',');
    if row.origin == Origin::Generated {
        push_designation(buf, row.id);
    }
    buf.push_byte(b',');
    push_text_field(buf, row.name);
    for v in row.position_ly {
        buf.push_byte(b',');
        push_fixed(buf, v, 3);
    }
    buf.push_byte(b',');
    buf.push_bytes(p.kind.as_str().as_bytes());
    buf.push_byte(b',');
    push_text_field(buf, p.class.as_str());
    for v in [
        p.mass_msun,
        p.initial_mass_msun,
        p.radius_rsun,
        p.luminosity_lsun,
    ] {
        buf.push_byte(b',');
        push_sig(buf, v, 5);
    }
    buf.push_byte(b',');
    push_fixed(buf, p.teff_k, 0);
    for v in [p.age_gyr, p.lifetime_gyr, p.hz.inner_au, p.hz.outer_au] {
        buf.push_byte(b',');
        push_sig(buf, v, 5);
    }
    buf.push_byte(b',');
    push_hex_colour(buf, p.color_rgb);
    buf.push_byte(b',');
    push_fixed(buf, p.abs_mag_v, 3);
    buf.push_byte(b',');
    push_sig(buf, row.separation_au, 5);
    buf.push_byte(b',');
    push_sig(buf, row.period_days, 5);
    buf.push_byte(b',');
    buf.push_bytes(if p.habitable_host { b"true" } else { b"false" });
    buf.push_byte(b',');
    buf.push_bytes(row.origin.as_str().as_bytes());
    buf.push_byte(b'\n');
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::catalogue::TextBuffer;

    #[test]
    fn quoting_follows_rfc_4180() {
        let mut b = Vec::new();
        push_text_field(&mut b, "plain name");
        b.push(b'|');
        push_text_field(&mut b, "a, \"b\"");
        assert_eq!(String::from_utf8(b).unwrap(), "plain name|\"a, \"\"b\"\"\"");
        let mut c = Vec::new();
        push_hex_colour(&mut c, [255, 16, 0]);
        assert_eq!(c, b"#ff1000");
    }

    /// The one-window writer and the field-by-field one give the same
    /// bytes, on generated rows and on rows that stress every field.
    #[test]
    fn the_fast_row_writer_matches_the_general_one() {
        use crate::spec::{SectorSpec, Shape};
        let spec = SectorSpec::new(3, Shape::Sphere { radius_ly: 40.0 }, [0.0; 3]);
        let cat = crate::sampler::generate(&spec, &|_, _| {}).unwrap();
        assert!(cat.len() > 500);
        let mut profiles = Vec::new();
        for i in 0..cat.len() {
            profiles.push(cat.profile(i));
        }
        let mut edge = profiles[0];
        let odd = [
            0.0,
            -0.0,
            1e-300,
            -2.5e-5,
            9.99996e-5,
            0.5,
            99999.5,
            1e15,
            -3e18,
            1e300,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
        ];
        for (k, &v) in odd.iter().enumerate() {
            edge.mass_msun = v;
            edge.initial_mass_msun = odd[(k + 3) % odd.len()];
            edge.radius_rsun = odd[(k + 5) % odd.len()];
            edge.luminosity_lsun = -v;
            edge.teff_k = odd[(k + 7) % odd.len()];
            edge.age_gyr = v * 3.0;
            edge.lifetime_gyr = odd[(k + 1) % odd.len()];
            edge.hz.inner_au = v;
            edge.hz.outer_au = -v;
            edge.abs_mag_v = odd[(k + 9) % odd.len()];
            profiles.push(edge);
        }
        let names = [
            "",
            "A",
            "Name, with comma",
            "Quote \"q\"",
            "Averyveryverylongnamethatkeepsgoingpastthirtytwobytes",
        ];
        let (mut fast, mut general) = (TextBuffer::with_capacity(64), Vec::new());
        let mut fast_rows = 0;
        for (i, p) in profiles.iter().enumerate() {
            let j = i.min(cat.len() - 1);
            let odd_row = i >= cat.len();
            let k = i - j;
            let row = RowView {
                id: cat.id[j],
                system: if odd_row {
                    cat.id[j] + 1
                } else {
                    cat.system[j]
                },
                name: if odd_row {
                    names[k % names.len()]
                } else {
                    &cat.name[j]
                },
                position_ly: if odd_row {
                    [
                        odd[k % odd.len()],
                        odd[(k + 2) % odd.len()],
                        if k % 3 == 0 { -1e16 } else { 12.5 },
                    ]
                } else {
                    cat.position_ly(j)
                },
                profile: p,
                separation_au: if odd_row {
                    odd[(k + 4) % odd.len()]
                } else {
                    cat.separation_au[j]
                },
                period_days: if odd_row {
                    odd[(k + 6) % odd.len()]
                } else {
                    cat.period_days[j]
                },
                origin: if odd_row && k % 2 == 1 {
                    Origin::Imported
                } else {
                    cat.origin[j]
                },
            };
            fast.clear();
            general.clear();
            push_row(&mut fast, &row);
            push_row_general(&mut general, &row);
            assert_eq!(
                String::from_utf8_lossy(fast.as_bytes()),
                String::from_utf8_lossy(&general),
                "row {i}"
            );
            // The fast path alone, on a window of exactly the room it asks.
            let mut out = vec![0u8; ROW_ROOM + 2 * row.name.len()];
            match put_row(&mut out, &row) {
                Some(n) => {
                    assert_eq!(&out[..n], general.as_slice(), "row {i}");
                    fast_rows += 1;
                }
                None => assert!(odd_row, "generated row {i} took the general path"),
            }
        }
        // Some of the stress rows went through the fast path too.
        assert!(fast_rows > cat.len(), "{fast_rows}");
    }
}
