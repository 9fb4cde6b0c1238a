//! Library use: evolve one star through its life and print how it changes.
//!
//! Run with `cargo run --example star_profiles -- 2.0` (initial mass in
//! solar masses; default 1.0).

use starloom::physics::{Fidelity, KindChoice, StarRequest, star_profile};
use starloom::units::{Gigayears, SolarMasses};

fn main() {
    let mass_msun: f64 = std::env::args()
        .nth(1)
        .and_then(|a| a.parse().ok())
        .unwrap_or(1.0);
    let Some(mass) = SolarMasses::new(mass_msun) else {
        eprintln!("the mass must be a positive number of solar masses");
        std::process::exit(2);
    };
    println!("age_gyr  kind              class     L_lsun      R_rsun      Teff_K  colour");
    for step in 0..=27 {
        let age_gyr = 0.5 * f64::from(step);
        let Some(age) = Gigayears::new(age_gyr) else {
            continue;
        };
        let request = StarRequest {
            mass,
            age,
            kind: KindChoice::Auto,
        };
        let p = star_profile(&request, Fidelity::Fitted);
        println!(
            "{age_gyr:>7.1}  {:<16}  {:<8}  {:>10.4e}  {:>10.4e}  {:>6.0}  {}",
            p.kind.as_str(),
            p.class.as_str(),
            p.luminosity_lsun,
            p.radius_rsun,
            p.teff_k,
            p.color_hex()
        );
    }
}
