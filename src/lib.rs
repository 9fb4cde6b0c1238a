//! # starloom
//!
//! Brief overview: a [`SectorSpec`](spec) describes a volume of space; the
//! [`sampler`] decides where systems are, cell by cell, from the seed
//! alone; [`population`] draws each system's members, masses and ages and
//! evolves them through [`physics`]; the result is a [`Catalogue`] (one
//! `Vec` per column) that `routes`, [`render`] and `sky` consume.
//!
//! ```
//! use starloom::physics::{star_profile, Fidelity, KindChoice, StarRequest};
//! use starloom::units::{Gigayears, SolarMasses};
//!
//! let sun = star_profile(
//!     &StarRequest {
//!         mass: SolarMasses::new(1.0).unwrap(),
//!         age: Gigayears::new(4.6).unwrap(),
//!         kind: KindChoice::Auto,
//!     },
//!     Fidelity::Fitted,
//! );
//! assert!(sun.teff_k > 5000.0 && sun.teff_k < 6500.0);
//! ```
//!
//! Starloom is a fiction and game tool: habitability figures are
//! simplified models, not guidance for real-world decisions.

#![forbid(unsafe_code)]
#![deny(missing_docs)]
#![warn(missing_debug_implementations)]

pub mod atomic_file;
pub mod catalogue;
pub mod cli;
pub mod coords;
pub mod demo;
pub mod error;
pub mod physics;
pub mod population;
pub mod render;
pub mod report;
pub mod routes;
pub mod sampler;
pub mod seed;
pub mod sky;
pub mod spec;
pub mod units;

pub use catalogue::Catalogue;
pub use error::{Error, Result};
pub use sampler::{generate, write_sector};
pub use spec::SectorSpec;
