//! Star ids and designations from (cell, index within the cell, member).
//!
//! An id packs the cell's integer coordinates (16 bits each, offset by
//! 2^15), the system's index within the cell (13 bits) and the member
//! slot (3 bits) into 64 bits, so ids are unique by construction and the
//! same whatever region is generated. The designation spells the same
//! fields out: `12.-3.1/4b` is cell (12, −3, 1), system 4, member b.

use super::text_buffer::TextSink;

/// Bits of the system index within a cell.
pub const INDEX_BITS: u32 = 13;
/// Bits of the member slot within a system.
pub const SLOT_BITS: u32 = 3;
/// Offset added to each cell coordinate before packing.
const CELL_OFFSET: i64 = 1 << 15;

/// The 48-bit key of cell (cx, cy, cz); each coordinate in −32768..=32767.
#[inline]
pub fn cell_key(cell: [i64; 3]) -> u64 {
    let c = |v: i64| ((v + CELL_OFFSET) as u64) & 0xFFFF;
    (c(cell[0]) << 32) | (c(cell[1]) << 16) | c(cell[2])
}

/// The cell coordinates of a cell key.
#[inline]
pub fn cell_of_key(key: u64) -> [i64; 3] {
    let c = |v: u64| (v & 0xFFFF) as i64 - CELL_OFFSET;
    [c(key >> 32), c(key >> 16), c(key)]
}

/// The key of system `index` in a cell: also the seed key of its draws.
#[inline]
pub fn system_key(cell_key: u64, index: u64) -> u64 {
    (cell_key << INDEX_BITS) | (index & ((1 << INDEX_BITS) - 1))
}

/// The star id of member `slot` of a system.
#[inline]
pub fn star_id(system_key: u64, slot: u8) -> u64 {
    (system_key << SLOT_BITS) | (slot as u64 & ((1 << SLOT_BITS) - 1))
}

/// Splits a star id into (cell, index, slot).
pub fn split_id(id: u64) -> ([i64; 3], u64, u8) {
    let slot = (id & ((1 << SLOT_BITS) - 1)) as u8;
    let system = id >> SLOT_BITS;
    let index = system & ((1 << INDEX_BITS) - 1);
    (cell_of_key(system >> INDEX_BITS), index, slot)
}

/// Appends the designation of a generated star id (`12.-3.1/4b`).
#[inline]
pub fn push_designation<S: TextSink>(buf: &mut S, id: u64) {
    use super::number_format::{push_i64, push_u64};
    let (cell, index, slot) = split_id(id);
    push_i64(buf, cell[0]);
    buf.push_byte(b'.');
    push_i64(buf, cell[1]);
    buf.push_byte(b'.');
    push_i64(buf, cell[2]);
    buf.push_byte(b'/');
    push_u64(buf, index);
    buf.push_byte(b'a' + slot);
}

/// Writes the designation of a generated star id at `out[pos..]` and
/// returns the position after it; needs 112 bytes of room.
#[inline(always)]
pub fn put_designation(out: &mut [u8], pos: usize, id: u64) -> usize {
    use super::number_format::{put_i64, put_u64};
    let (cell, index, slot) = split_id(id);
    let mut pos = put_i64(out, pos, cell[0]);
    out[pos] = b'.';
    pos = put_i64(out, pos + 1, cell[1]);
    out[pos] = b'.';
    pos = put_i64(out, pos + 1, cell[2]);
    out[pos] = b'/';
    pos = put_u64(out, pos + 1, index);
    out[pos] = b'a' + slot;
    pos + 1
}

/// The designation of a generated star id as text.
pub fn designation(id: u64) -> String {
    let mut b = Vec::with_capacity(24);
    push_designation(&mut b, id);
    String::from_utf8(b).unwrap_or_default()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ids_round_trip() {
        let key = cell_key([12, -3, 1]);
        assert_eq!(cell_of_key(key), [12, -3, 1]);
        let id = star_id(system_key(key, 4), 1);
        assert_eq!(split_id(id), ([12, -3, 1], 4, 1));
        assert_eq!(designation(id), "12.-3.1/4b");
        assert_eq!(
            cell_of_key(cell_key([-32768, 32767, 0])),
            [-32768, 32767, 0]
        );
    }
}
