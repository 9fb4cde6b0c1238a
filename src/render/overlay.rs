//! Route overlays for map sheets: what the routes module hands the
//! renderer (row indices into the catalogue, system primaries).

/// Lines to draw under the stars of a map sheet.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Overlay {
    /// Links of the jump network (or only its lanes), as pairs of row
    /// indices of the two systems' primaries.
    pub links: Vec<[usize; 2]>,
    /// A highlighted route, row indices of the primaries from start to end.
    pub route: Vec<usize>,
}
