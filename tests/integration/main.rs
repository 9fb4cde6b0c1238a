//! Integration tests, compiled as one binary: one module per area.

mod util;
mod tidy;
