//! A display list in page millimetres, the hand-over between what to draw
//! (map sheets, sky charts, HR diagrams) and how to write it (PNG, SVG, PDF).
//!
//! # Units
//! Positions and sizes in millimetres from the top-left corner of the page,
//! y down; text sizes in points (1 pt = 25.4/72 mm).

/// A colour with straight (not premultiplied) alpha.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Rgba {
    /// Red, 0–255.
    pub r: u8,
    /// Green, 0–255.
    pub g: u8,
    /// Blue, 0–255.
    pub b: u8,
    /// Alpha, 0 (transparent) – 255 (opaque).
    pub a: u8,
}

impl Rgba {
    /// An opaque colour.
    pub const fn rgb(r: u8, g: u8, b: u8) -> Rgba {
        Rgba { r, g, b, a: 255 }
    }
}

/// How text is placed relative to its anchor point.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Anchor {
    /// Anchor at the left end of the baseline.
    Start,
    /// Anchor at the middle of the baseline.
    Middle,
    /// Anchor at the right end of the baseline.
    End,
}

/// A stroke: colour, width and optional dash pattern (mm on, mm off).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Stroke {
    /// Line colour.
    pub color: Rgba,
    /// Line width, mm.
    pub width_mm: f32,
    /// Dash lengths (on, off), mm; `None` for a solid line.
    pub dash_mm: Option<(f32, f32)>,
}

/// Marker shapes for objects that must read in black-and-white print.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Shape {
    /// A filled disc.
    Disc,
    /// A ring with an open centre.
    Ring,
    /// A square.
    Square,
    /// A diamond (square on its point).
    Diamond,
    /// An upward triangle.
    Triangle,
    /// A four-pointed star.
    Cross,
}

/// One thing to draw.
#[derive(Debug, Clone, PartialEq)]
pub enum Item {
    /// A marker centred on a point.
    Marker {
        /// Centre, mm.
        centre_mm: [f32; 2],
        /// Radius, mm.
        radius_mm: f32,
        /// Outline shape.
        shape: Shape,
        /// Fill colour (`None` for outline only).
        fill: Option<Rgba>,
        /// Outline (`None` for none).
        stroke: Option<Stroke>,
    },
    /// Many small filled discs at once (the fast path for big catalogues):
    /// raster back ends may stamp pre-rasterised sprites.
    Stars {
        /// Centres, mm.
        centres_mm: Vec<[f32; 2]>,
        /// Radii, mm.
        radii_mm: Vec<f32>,
        /// Fill colours.
        fills: Vec<Rgba>,
        /// Shared outline, if any.
        outline: Option<Stroke>,
    },
    /// An open or closed polyline.
    Line {
        /// Vertices, mm.
        points_mm: Vec<[f32; 2]>,
        /// Join the last vertex to the first.
        closed: bool,
        /// The stroke.
        stroke: Stroke,
    },
    /// A filled polygon, optionally outlined.
    Polygon {
        /// Vertices, mm.
        points_mm: Vec<[f32; 2]>,
        /// Fill colour.
        fill: Rgba,
        /// Outline, if any.
        stroke: Option<Stroke>,
    },
    /// A line of text.
    Text {
        /// Anchor point on the baseline, mm.
        position_mm: [f32; 2],
        /// The text.
        text: String,
        /// Size, points.
        size_pt: f32,
        /// Colour.
        color: Rgba,
        /// Placement relative to the anchor.
        anchor: Anchor,
        /// Bold face.
        bold: bool,
        /// Rotation, degrees counter-clockwise.
        rotation_deg: f32,
    },
}

/// A page to draw: its size, background and items in drawing order.
#[derive(Debug, Clone, PartialEq)]
pub struct Scene {
    /// Page width, mm.
    pub width_mm: f32,
    /// Page height, mm.
    pub height_mm: f32,
    /// Paper colour.
    pub background: Rgba,
    /// Items, drawn first to last.
    pub items: Vec<Item>,
}
