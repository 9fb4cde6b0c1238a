//! The star catalogue: one `Vec` per column, plus its readers and writers.
//!
//! **Architecture invariant:** `Catalogue` derives no serde; each file
//! format has its own row code (`csv_format`, `jsonl`).

pub mod csv_format;
pub mod designations;
pub mod jsonl;
pub mod name_column;
pub mod names;
pub mod number_format;
pub mod reader;
pub mod table;
pub mod text_buffer;
pub mod writer;

pub use name_column::NameColumn;
pub use reader::read_catalogue;
pub use table::{Catalogue, CatalogueMeta, Origin, RowView, StarRow};
pub use text_buffer::{TextBuffer, TextSink};
pub use writer::{Format, write_catalogue};
