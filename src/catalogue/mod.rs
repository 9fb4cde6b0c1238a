//! The star catalogue: one `Vec` per column, plus its readers and writers.
//!
//! **Architecture invariant:** `Catalogue` derives no serde; each file
//! format has its own row type.

pub mod table;

pub use table::{Catalogue, Origin, StarRow};
