//! Where formatted text goes: any [`TextSink`] (a plain `Vec<u8>`, or a
//! [`TextBuffer`] for the long runs of rows `populate` writes).
//!
//! Fields are laid out by fixed-length stores into a window of writable
//! bytes just past the text, then the text is extended by their real
//! length ([`TextSink::put`]). On a `Vec<u8>` the window is zero-filled
//! each time; a [`TextBuffer`] keeps its spare room initialised once, so
//! a window costs one room check. A CSV row is one window
//! (`csv_format::push_row`), written with the write position in a
//! register rather than a length field in memory.

/// Bytes of the window one number field is laid out in: a sign, 19
/// integer digits, a point and a 24-byte copy of the decimals fit.
pub const FIELD: usize = 48;

/// A growable byte sink for formatted text.
pub trait TextSink {
    /// Calls `put` with at least `room` writable bytes just past the text
    /// (their contents unspecified); the first `n` of them become text
    /// when `put` returns `Some(n)` (`n <= room`), none when it returns
    /// `None`. Returns what `put` returned.
    fn put<F: FnOnce(&mut [u8]) -> Option<usize>>(&mut self, room: usize, put: F) -> Option<usize>;
    /// Appends one byte.
    fn push_byte(&mut self, b: u8);
    /// Appends bytes.
    fn push_bytes(&mut self, bytes: &[u8]);
}

impl TextSink for Vec<u8> {
    #[inline]
    fn put<F: FnOnce(&mut [u8]) -> Option<usize>>(&mut self, room: usize, put: F) -> Option<usize> {
        let start = self.len();
        self.resize(start + room, 0);
        let written = put(&mut self[start..]);
        self.truncate(start + written.unwrap_or(0).min(room));
        written
    }

    #[inline]
    fn push_byte(&mut self, b: u8) {
        self.push(b);
    }

    #[inline]
    fn push_bytes(&mut self, bytes: &[u8]) {
        self.extend_from_slice(bytes);
    }
}

/// A byte buffer whose spare room stays initialised between uses, so
/// formatting into it never zero-fills: the text is `bytes[..len]`, and
/// the bytes after it are room (old text or zeros).
#[derive(Debug, Default, Clone)]
pub struct TextBuffer {
    bytes: Vec<u8>,
    len: usize,
}

impl TextBuffer {
    /// An empty buffer with `capacity` bytes of room (zero-filled once).
    pub fn with_capacity(capacity: usize) -> TextBuffer {
        TextBuffer {
            bytes: vec![0; capacity.max(FIELD)],
            len: 0,
        }
    }

    /// The text so far.
    #[inline]
    pub fn as_bytes(&self) -> &[u8] {
        &self.bytes[..self.len]
    }

    /// Length of the text, bytes.
    #[inline]
    pub fn len(&self) -> usize {
        self.len
    }

    /// Whether no text has been written.
    #[inline]
    pub fn is_empty(&self) -> bool {
        self.len == 0
    }

    /// Empties the text; the room is kept.
    #[inline]
    pub fn clear(&mut self) {
        self.len = 0;
    }

    /// Makes sure `n` bytes of room follow the text.
    #[inline]
    fn reserve(&mut self, n: usize) {
        if self.bytes.len() - self.len < n {
            self.grow(n);
        }
    }

    #[cold]
    #[inline(never)]
    fn grow(&mut self, n: usize) {
        let want = (self.len + n).max(2 * self.bytes.len());
        self.bytes.resize(want, 0);
    }
}

impl TextSink for TextBuffer {
    #[inline]
    fn put<F: FnOnce(&mut [u8]) -> Option<usize>>(&mut self, room: usize, put: F) -> Option<usize> {
        self.reserve(room);
        let written = put(&mut self.bytes[self.len..]);
        self.len += written.unwrap_or(0).min(room);
        written
    }

    #[inline]
    fn push_byte(&mut self, b: u8) {
        self.reserve(1);
        self.bytes[self.len] = b;
        self.len += 1;
    }

    #[inline]
    fn push_bytes(&mut self, bytes: &[u8]) {
        self.reserve(bytes.len() + 32);
        self.len = put_bytes(&mut self.bytes, self.len, bytes);
    }
}

/// Writes `bytes` at `out[pos..]` and returns the position after them.
/// Up to 32 bytes are copied by two overlapping fixed-length copies (no
/// call to `memcpy`), which may also write up to 32 bytes past them: the
/// caller leaves `pos + bytes.len().max(32)` bytes of room.
#[inline(always)]
pub fn put_bytes(out: &mut [u8], pos: usize, bytes: &[u8]) -> usize {
    let n = bytes.len();
    let to = &mut out[pos..];
    if !(4..=32).contains(&n) {
        to[..n].copy_from_slice(bytes);
    } else if n >= 16 {
        to[..16].copy_from_slice(&bytes[..16]);
        to[n - 16..n].copy_from_slice(&bytes[n - 16..]);
    } else if n >= 8 {
        to[..8].copy_from_slice(&bytes[..8]);
        to[n - 8..n].copy_from_slice(&bytes[n - 8..]);
    } else {
        to[..4].copy_from_slice(&bytes[..4]);
        to[n - 4..n].copy_from_slice(&bytes[n - 4..]);
    }
    pos + n
}

#[cfg(test)]
mod tests {
    use super::*;

    fn fill<S: TextSink>(s: &mut S) {
        s.push_bytes(b"ab");
        let n = s.put(FIELD, |w| {
            w[..3].copy_from_slice(b"xyz");
            Some(2)
        });
        assert_eq!(n, Some(2));
        assert_eq!(
            s.put(FIELD, |w| {
                w[0] = b'?';
                None
            }),
            None
        );
        s.push_byte(b'!');
        for text in [
            &b"0123456789abcdefghijklmnopqrstuvwxyz"[..],
            b"0123456789abcdefghijk",
            b"0123456789abcdef",
            b"0123456789ab",
            b"01234567",
            b"0123456",
            b"0123",
            b"012",
            b"",
        ] {
            s.push_bytes(text);
            s.push_byte(b'|');
        }
    }

    #[test]
    fn both_sinks_hold_the_same_text_and_the_buffer_grows() {
        let mut v = Vec::new();
        fill(&mut v);
        let expected: &[u8] = b"abxy!0123456789abcdefghijklmnopqrstuvwxyz|\
0123456789abcdefghijk|0123456789abcdef|0123456789ab|01234567|0123456|0123|012||";
        assert_eq!(v, expected);
        let mut t = TextBuffer::with_capacity(0);
        for _ in 0..100 {
            fill(&mut t);
        }
        assert_eq!(t.len(), 100 * expected.len());
        assert_eq!(&t.as_bytes()[99 * expected.len()..], expected);
        t.clear();
        assert!(t.is_empty());
        fill(&mut t);
        assert_eq!(t.as_bytes(), expected);
    }
}
