//! The catalogue's name column: every name in one shared text buffer.
//!
//! A million names as a million `String`s cost a million allocations and
//! about 56 bytes each; here they cost their text and one offset.

use std::ops::Index;

/// Names, row by row, stored end to end in one `String`.
///
/// # Guarantees
/// `names[i]` is exactly the text pushed as row `i`; `len()` counts rows,
/// empty names included.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct NameColumn {
    text: String,
    /// End of each row's name in `text` (its start is the previous end).
    ends: Vec<usize>,
}

impl NameColumn {
    /// An empty column.
    pub fn new() -> NameColumn {
        NameColumn::default()
    }

    /// `rows` empty names.
    pub fn empty_names(rows: usize) -> NameColumn {
        NameColumn {
            text: String::new(),
            ends: vec![0; rows],
        }
    }

    /// Number of rows.
    pub fn len(&self) -> usize {
        self.ends.len()
    }

    /// True when there are no rows.
    pub fn is_empty(&self) -> bool {
        self.ends.is_empty()
    }

    /// Room for `rows` more names of `bytes` bytes in all.
    pub fn reserve(&mut self, rows: usize, bytes: usize) {
        self.ends.reserve(rows);
        self.text.reserve(bytes);
    }

    /// Appends one name.
    pub fn push(&mut self, name: &str) {
        self.text.push_str(name);
        self.ends.push(self.text.len());
    }

    /// Row `i`'s name, if there is such a row.
    pub fn get(&self, i: usize) -> Option<&str> {
        let end = *self.ends.get(i)?;
        let start = if i == 0 { 0 } else { self.ends[i - 1] };
        Some(&self.text[start..end])
    }

    /// The names in row order.
    pub fn iter(&self) -> impl ExactSizeIterator<Item = &str> + '_ {
        let mut start = 0;
        self.ends.iter().map(move |&end| {
            let s = &self.text[start..end];
            start = end;
            s
        })
    }

    /// Copies every name of `other` to the end.
    pub fn extend_from(&mut self, other: &NameColumn) {
        let base = self.text.len();
        self.text.push_str(&other.text);
        self.ends.extend(other.ends.iter().map(|&e| base + e));
    }

    /// Moves every name of `other` to the end, leaving it empty.
    pub fn append(&mut self, other: &mut NameColumn) {
        self.extend_from(other);
        other.clear();
    }

    /// Removes every name, keeping the allocations.
    pub fn clear(&mut self) {
        self.text.clear();
        self.ends.clear();
    }

    /// Bytes of name text held.
    pub fn text_len(&self) -> usize {
        self.text.len()
    }
}

impl Index<usize> for NameColumn {
    type Output = str;

    /// Row `i`'s name.
    ///
    /// # Panics
    /// When there is no row `i`.
    fn index(&self, i: usize) -> &str {
        match self.get(i) {
            Some(s) => s,
            None => panic!("name row {i} of {}", self.len()),
        }
    }
}

impl<'a> IntoIterator for &'a NameColumn {
    type Item = &'a str;
    type IntoIter = Box<dyn ExactSizeIterator<Item = &'a str> + 'a>;

    fn into_iter(self) -> Self::IntoIter {
        Box::new(self.iter())
    }
}

impl<S: AsRef<str>> FromIterator<S> for NameColumn {
    fn from_iter<I: IntoIterator<Item = S>>(iter: I) -> NameColumn {
        let mut c = NameColumn::new();
        for s in iter {
            c.push(s.as_ref());
        }
        c
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rows_come_back_as_pushed_empty_ones_included() {
        let given = ["Quillon", "", "Ve Aster", "", "Ö-7"];
        let c: NameColumn = given.iter().collect();
        assert_eq!(c.len(), 5);
        for (i, g) in given.iter().enumerate() {
            assert_eq!(&c[i], *g);
            assert_eq!(c.get(i), Some(*g));
        }
        assert_eq!(c.get(5), None);
        assert_eq!(c.iter().collect::<Vec<_>>(), given);
        assert_eq!((&c).into_iter().len(), 5);
    }

    #[test]
    fn append_and_extend_keep_order_and_offsets() {
        let mut a: NameColumn = ["one", "two"].iter().collect();
        let mut b: NameColumn = ["", "three"].iter().collect();
        a.extend_from(&b);
        assert_eq!(a.iter().collect::<Vec<_>>(), ["one", "two", "", "three"]);
        a.append(&mut b);
        assert!(b.is_empty());
        assert_eq!(a.len(), 6);
        assert_eq!(&a[5], "three");
        assert_eq!(
            NameColumn::empty_names(3).iter().collect::<Vec<_>>(),
            ["", "", ""]
        );
    }
}
