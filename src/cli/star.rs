//! The `star` command: the profile of one star from its mass and age.

use crate::error::Error;
use crate::physics::{
    Fidelity, KindChoice, StarKind, StarProfile, StarRequest, allowed_mass_range, star_profile,
    typical_age_gyr,
};
use crate::units::{Gigayears, SolarMasses, UNIVERSE_AGE_GYR};
use std::fmt::Write as _;
use std::process::ExitCode;

/// Arguments of `starloom star`.
#[derive(Debug, clap::Args)]
#[command(
    after_help = "Habitable zones and the habitable-host flag are simplified models for \
fiction and games, not guidance for any real-world decision."
)]
pub struct StarArgs {
    /// Mass in solar masses: the initial mass with --kind auto, the object's own mass otherwise.
    #[arg(long, allow_hyphen_values = true, value_name = "MSUN")]
    pub mass: String,
    /// Age in gigayears (default: a typical age for that mass and kind).
    #[arg(long, allow_hyphen_values = true, value_name = "GYR")]
    pub age: Option<String>,
    /// auto (follow evolution from mass and age), main-sequence, white-dwarf, neutron-star,
    /// black-hole, brown-dwarf, or an evolved stage (subgiant, giant, core-helium,
    /// asymptotic-giant, supergiant).
    #[arg(long, default_value = "auto", allow_hyphen_values = true)]
    pub kind: String,
    /// Fidelity of the physics: fitted (published fitting formulae) or rules (textbook power laws).
    #[arg(long, default_value = "fitted", allow_hyphen_values = true)]
    pub physics: String,
    /// Print one JSON object instead of the readable profile.
    #[arg(long)]
    pub json: bool,
}

/// Validated settings of `starloom star`.
#[derive(Debug, Clone, Copy)]
pub struct StarSettings {
    /// What to build.
    pub request: StarRequest,
    /// Which physics.
    pub fidelity: Fidelity,
}

impl StarArgs {
    /// Checks every value and turns it into settings.
    pub fn settings(&self) -> Result<StarSettings, Error> {
        let kind = parse_kind(&self.kind)?;
        let fidelity = Fidelity::parse(&self.physics).ok_or_else(|| {
            Error::invalid("--physics", &self.physics, "it must be fitted or rules")
        })?;
        let mass_value: f64 = self.mass.trim().parse().unwrap_or(f64::NAN);
        let mass = SolarMasses::new(mass_value).ok_or_else(|| {
            Error::invalid(
                "--mass",
                &self.mass,
                "it must be a finite positive number of solar masses",
            )
        })?;
        let (lo, hi) = allowed_mass_range(kind);
        if !(lo..=hi).contains(&mass.get()) {
            let kind_name = match kind {
                KindChoice::Auto => "auto".to_string(),
                KindChoice::Explicit(k) => k.as_str().to_string(),
            };
            return Err(Error::invalid(
                "--mass",
                &self.mass,
                format!("with --kind {kind_name} it must be between {lo} and {hi} solar masses"),
            ));
        }
        let age_value = match &self.age {
            None => typical_age_gyr(mass.get(), kind),
            Some(text) => text.trim().parse().unwrap_or(f64::NAN),
        };
        let age = Gigayears::new(age_value).ok_or_else(|| {
            Error::invalid(
                "--age",
                self.age.as_deref().unwrap_or(""),
                format!(
                    "it must be a number of gigayears from 0 to {UNIVERSE_AGE_GYR} \
                     (the age of the universe, Planck 2018)"
                ),
            )
        })?;
        Ok(StarSettings {
            request: StarRequest { mass, age, kind },
            fidelity,
        })
    }
}

fn parse_kind(text: &str) -> Result<KindChoice, Error> {
    if text == "auto" {
        return Ok(KindChoice::Auto);
    }
    StarKind::parse(text)
        .map(KindChoice::Explicit)
        .ok_or_else(|| {
            Error::invalid(
                "--kind",
                text,
                format!("it must be auto or one of {}", StarKind::names()),
            )
        })
}

/// Runs `starloom star`.
pub fn run(args: StarArgs) -> anyhow::Result<ExitCode> {
    let settings = args.settings()?;
    let profile = star_profile(&settings.request, settings.fidelity);
    let text = if args.json {
        let mut json = serde_json::to_string_pretty(&profile_json(&profile, settings.fidelity))?;
        json.push('\n');
        json
    } else {
        profile_text(&profile, settings.fidelity)
    };
    use std::io::Write;
    std::io::stdout().write_all(text.as_bytes())?;
    Ok(ExitCode::SUCCESS)
}

/// The note printed with every black hole.
pub const BLACK_HOLE_NOTE: &str = "non-rotating (Schwarzschild) hole: no stable orbit lies inside \
the innermost stable circular orbit (3 r_s); the photon sphere (1.5 r_s) holds only unstable light orbits";

/// The note on habitability figures.
pub const HABITABILITY_NOTE: &str =
    "habitable zone and habitable host are simplified models for fiction and games";

/// The profile as a JSON value with the documented field names.
pub fn profile_json(p: &StarProfile, fidelity: Fidelity) -> serde_json::Value {
    let mut map = serde_json::Map::new();
    let mut put = |key: &str, value: serde_json::Value| {
        map.insert(key.to_string(), value);
    };
    put("kind", p.kind.as_str().into());
    put("class", p.class.as_str().into());
    put("physics", fidelity.as_str().into());
    put("mass_msun", p.mass_msun.into());
    put("initial_mass_msun", p.initial_mass_msun.into());
    put("radius_rsun", p.radius_rsun.into());
    put("luminosity_lsun", p.luminosity_lsun.into());
    put("teff_k", p.teff_k.into());
    put("age_gyr", p.age_gyr.into());
    put("lifetime_gyr", p.lifetime_gyr.into());
    put("hz_inner_au", p.hz.inner_au.into());
    put("hz_outer_au", p.hz.outer_au.into());
    put("hz_optimistic_inner_au", p.hz.optimistic_inner_au.into());
    put("hz_optimistic_outer_au", p.hz.optimistic_outer_au.into());
    put("hz_teff_in_range", p.hz.teff_in_range.into());
    put("habitable_host", p.habitable_host.into());
    put("colour_hex", p.color_hex().into());
    put("abs_mag_v", p.abs_mag_v.into());
    put("circumference_km", p.circumference_km().into());
    put("surface_area_sun", p.surface_area_sun().into());
    put("volume_sun", p.volume_sun().into());
    put("mean_density_sun", p.mean_density_sun().into());
    put("surface_gravity_sun", p.surface_gravity_sun().into());
    match p.kind {
        StarKind::WhiteDwarf => put("radius_earth", p.radius_earth().into()),
        StarKind::NeutronStar => put("radius_km", p.radius_km().into()),
        StarKind::BlackHole => {
            put("schwarzschild_km", p.schwarzschild_km().into());
            put("photon_sphere_km", p.photon_sphere_km().into());
            put("isco_km", p.isco_km().into());
            put("note", BLACK_HOLE_NOTE.into());
        }
        _ => {}
    }
    put("habitability_note", HABITABILITY_NOTE.into());
    serde_json::Value::Object(map)
}

fn sig(value: f64) -> String {
    if value == 0.0 || !value.is_finite() {
        return format!("{value}");
    }
    let magnitude = value.abs().log10();
    if !(-3.0..6.0).contains(&magnitude) {
        format!("{value:.3e}")
    } else {
        let decimals = (3.0 - magnitude.floor()).clamp(0.0, 6.0) as usize;
        format!("{value:.decimals$}")
    }
}

/// The profile as readable text with units.
pub fn profile_text(p: &StarProfile, fidelity: Fidelity) -> String {
    let mut out = String::new();
    let mut line = |label: &str, value: String| {
        let _ = writeln!(out, "  {label:<26} {value}");
    };
    line("kind", p.kind.as_str().to_string());
    line("spectral class", p.class.as_str().to_string());
    line("physics", fidelity.as_str().to_string());
    line("mass", format!("{} Msun", sig(p.mass_msun)));
    line("initial mass", format!("{} Msun", sig(p.initial_mass_msun)));
    line("age", format!("{} Gyr", sig(p.age_gyr)));
    line(
        "main-sequence lifetime",
        format!("{} Gyr", sig(p.lifetime_gyr)),
    );
    match p.kind {
        StarKind::BlackHole => {
            line(
                "Schwarzschild radius",
                format!("{} km", sig(p.schwarzschild_km())),
            );
            line("photon sphere", format!("{} km", sig(p.photon_sphere_km())));
            line("innermost stable orbit", format!("{} km", sig(p.isco_km())));
            line("note", BLACK_HOLE_NOTE.to_string());
            return format!("Black hole of {} Msun\n{out}", sig(p.mass_msun));
        }
        StarKind::NeutronStar => line("radius", format!("{} km", sig(p.radius_km()))),
        StarKind::WhiteDwarf => line(
            "radius",
            format!(
                "{} Rsun ({} Earth radii)",
                sig(p.radius_rsun),
                sig(p.radius_earth())
            ),
        ),
        _ => line("radius", format!("{} Rsun", sig(p.radius_rsun))),
    }
    line("luminosity", format!("{} Lsun", sig(p.luminosity_lsun)));
    line("effective temperature", format!("{:.0} K", p.teff_k));
    line("colour", p.color_hex());
    line("absolute magnitude (V)", format!("{:.2}", p.abs_mag_v));
    line("circumference", format!("{} km", sig(p.circumference_km())));
    line(
        "surface area",
        format!("{} x Sun", sig(p.surface_area_sun())),
    );
    line("volume", format!("{} x Sun", sig(p.volume_sun())));
    line(
        "mean density",
        format!("{} x Sun", sig(p.mean_density_sun())),
    );
    line(
        "surface gravity",
        format!("{} x Sun", sig(p.surface_gravity_sun())),
    );
    if p.luminosity_lsun > 0.0 && p.kind != StarKind::NeutronStar {
        let flag = if p.hz.teff_in_range {
            ""
        } else {
            " (Teff outside 2600-7200 K: fit extrapolated, treat as rough)"
        };
        line(
            "habitable zone",
            format!(
                "{}-{} au conservative{flag}",
                sig(p.hz.inner_au),
                sig(p.hz.outer_au)
            ),
        );
        line(
            "habitable zone, optimistic",
            format!(
                "{}-{} au",
                sig(p.hz.optimistic_inner_au),
                sig(p.hz.optimistic_outer_au)
            ),
        );
    }
    line(
        "habitable host",
        if p.habitable_host { "yes" } else { "no" }.to_string(),
    );
    line("note", HABITABILITY_NOTE.to_string());
    let title = p.kind.as_str().replace('-', " ");
    let title = format!("{}{}", title[..1].to_uppercase(), &title[1..]);
    format!("{title}, {}\n{out}", p.class.as_str())
}
