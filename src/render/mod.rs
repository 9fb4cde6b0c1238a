//! Drawing: projections from light years to page millimetres, a display
//! list ([`scene::Scene`]) and back ends that turn it into PNG, SVG or PDF.
//!
//! **Architecture invariant:** render never calls physics; it reads the
//! catalogue's resolved columns.

pub mod hr_diagram;
pub mod output;
pub mod overlay;
pub mod paper;
pub mod pdf;
pub mod raster;
pub mod scene;
pub mod svg;
pub mod text;
