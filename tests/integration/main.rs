//! Integration tests, compiled as one binary: one module per area.

mod cli_routes;
mod cli_star;
mod routes;
mod tidy;
mod util;
