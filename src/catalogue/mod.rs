//! The star catalogue: one `Vec` per column, plus its readers and writers.
//!
//! **Architecture invariant:** `Catalogue` derives no serde; each file
//! format has its own row type.

pub mod table;

pub mod reader;

pub use reader::read_catalogue;
pub use table::{Catalogue, CatalogueMeta, Origin, StarRow};
