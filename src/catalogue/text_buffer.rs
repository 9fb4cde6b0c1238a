//! Where formatted text goes: any [`TextSink`] (a plain `Vec<u8>`, or a
//! [`TextBuffer`] for the long runs of rows `populate` writes).
//!
//! Number fields are laid out by fixed-length stores into a
//! [`FIELD`]-byte window at the end of the text and then cut to their real
//! length. On a `Vec<u8>` that window is zero-filled for every field; a
//! [`TextBuffer`] keeps its spare room initialised once, so a field costs
//! one room check and the stores themselves.

/// Bytes of the window a number field is laid out in: a sign, 19 integer
/// digits, a point and a 24-byte copy of the decimals fit.
pub const FIELD: usize = 48;

/// A growable byte sink for formatted text.
pub trait TextSink {
    /// A window of [`FIELD`] writable bytes just past the text; its
    /// contents are unspecified. Follow it with [`TextSink::commit`]
    /// before any other call.
    fn field(&mut self) -> &mut [u8; FIELD];
    /// Keeps the first `len` (at most [`FIELD`]) bytes of the window from
    /// [`TextSink::field`] as text and drops the rest.
    fn commit(&mut self, len: usize);
    /// Appends one byte.
    fn push_byte(&mut self, b: u8);
    /// Appends bytes.
    fn push_bytes(&mut self, bytes: &[u8]);
    /// Length of the text so far, bytes.
    fn text_len(&self) -> usize;
    /// Appends a copy of the text's bytes `start..start + len` (a field
    /// written earlier).
    fn push_copy(&mut self, start: usize, len: usize);
}

impl TextSink for Vec<u8> {
    #[inline]
    fn field(&mut self) -> &mut [u8; FIELD] {
        let start = self.len();
        self.resize(start + FIELD, 0);
        (&mut self[start..]).try_into().expect("FIELD bytes were added")
    }

    #[inline]
    fn commit(&mut self, len: usize) {
        let keep = self.len() - FIELD + len.min(FIELD);
        self.truncate(keep);
    }

    #[inline]
    fn push_byte(&mut self, b: u8) {
        self.push(b);
    }

    #[inline]
    fn push_bytes(&mut self, bytes: &[u8]) {
        self.extend_from_slice(bytes);
    }

    #[inline]
    fn text_len(&self) -> usize {
        self.len()
    }

    #[inline]
    fn push_copy(&mut self, start: usize, len: usize) {
        self.extend_from_within(start..start + len);
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
    fn field(&mut self) -> &mut [u8; FIELD] {
        self.reserve(FIELD);
        let start = self.len;
        (&mut self.bytes[start..start + FIELD])
            .try_into()
            .expect("a FIELD-long range")
    }

    #[inline]
    fn commit(&mut self, len: usize) {
        self.len += len.min(FIELD);
    }

    #[inline]
    fn push_byte(&mut self, b: u8) {
        self.reserve(1);
        self.bytes[self.len] = b;
        self.len += 1;
    }

    #[inline]
    fn push_bytes(&mut self, bytes: &[u8]) {
        let n = bytes.len();
        self.reserve(n.max(16));
        let to = &mut self.bytes[self.len..];
        // Short texts (names, kinds, classes) by two overlapping
        // fixed-length copies instead of a call to `memcpy`.
        if (8..=16).contains(&n) {
            to[..8].copy_from_slice(&bytes[..8]);
            to[n - 8..n].copy_from_slice(&bytes[n - 8..]);
        } else if (4..8).contains(&n) {
            to[..4].copy_from_slice(&bytes[..4]);
            to[n - 4..n].copy_from_slice(&bytes[n - 4..]);
        } else {
            to[..n].copy_from_slice(bytes);
        }
        self.len += n;
    }

    #[inline]
    fn text_len(&self) -> usize {
        self.len
    }

    #[inline]
    fn push_copy(&mut self, start: usize, len: usize) {
        self.reserve(len);
        self.bytes.copy_within(start..start + len, self.len);
        self.len += len;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn fill<S: TextSink>(s: &mut S) {
        s.push_bytes(b"ab");
        let f = s.field();
        f[..3].copy_from_slice(b"xyz");
        s.commit(2);
        s.push_byte(b'!');
        let at = s.text_len();
        s.push_bytes(b"0123456789abc");
        s.push_copy(at + 1, 3);
        s.push_bytes(b"xyzw-");
        s.push_bytes(b"");
        s.push_bytes(b"q");
    }

    #[test]
    fn both_sinks_hold_the_same_text_and_the_buffer_grows() {
        let mut v = Vec::new();
        fill(&mut v);
        assert_eq!(v, b"abxy!0123456789abc123xyzw-q");
        let mut t = TextBuffer::with_capacity(0);
        for _ in 0..100 {
            fill(&mut t);
        }
        assert_eq!(t.len(), 2700);
        assert_eq!(&t.as_bytes()[2673..], v.as_slice());
        t.clear();
        assert!(t.is_empty());
        fill(&mut t);
        assert_eq!(t.as_bytes(), v.as_slice());
    }
}
