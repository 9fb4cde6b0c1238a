//! Unit newtypes and the exact conversion factors between them.
//!
//! Every quantity that crosses a module boundary carries its unit in its
//! type (`SolarMasses`, `Gigayears`, `LightYears`) or in its name
//! (`mass_msun`, `distance_ly`). Conversions happen once, at the edge.
//!
//! # Source
//! Astronomical unit: IAU 2012 Resolution B2 (exact). Parsec: IAU 2015
//! Resolution B2, (648000/π) au (exact). Light year: c × 365.25 d × 86400 s
//! (exact, Julian year).

/// Metres in one astronomical unit (IAU 2012 B2, exact).
pub const METRES_PER_AU: f64 = 149_597_870_700.0;
/// Metres in one light year (Julian year × c, exact).
pub const METRES_PER_LY: f64 = 9_460_730_472_580_800.0;
/// Metres in one parsec, (648000/π) au (IAU 2015 B2).
pub const METRES_PER_PC: f64 = METRES_PER_AU * 648_000.0 / std::f64::consts::PI;
/// Light years in one parsec (derived from the two exact definitions).
pub const LY_PER_PC: f64 = METRES_PER_PC / METRES_PER_LY;
/// Astronomical units in one light year.
pub const AU_PER_LY: f64 = METRES_PER_LY / METRES_PER_AU;
/// Age of the universe, Planck Collaboration 2018 (A&A 641, A6): 13.8 Gyr.
pub const UNIVERSE_AGE_GYR: f64 = 13.8;

macro_rules! positive_quantity {
    ($(#[$doc:meta])* $name:ident, $unit:literal) => {
        $(#[$doc])*
        ///
        /// # Guarantees
        /// The value is finite and greater than zero; `new` refuses anything else.
        #[derive(Debug, Clone, Copy, PartialEq, PartialOrd)]
        #[repr(transparent)]
        pub struct $name(f64);

        impl $name {
            #[doc = concat!("A value in ", $unit, "; `None` unless finite and positive.")]
            pub fn new(value: f64) -> Option<Self> {
                (value.is_finite() && value > 0.0).then_some(Self(value))
            }

            #[doc = concat!("The value in ", $unit, ".")]
            pub fn get(self) -> f64 {
                self.0
            }
        }
    };
}

positive_quantity!(
    /// A mass in solar masses (nominal, IAU 2015 B3).
    SolarMasses,
    "solar masses"
);
positive_quantity!(
    /// A length in light years.
    LightYears,
    "light years"
);
positive_quantity!(
    /// A temperature in kelvin.
    Kelvin,
    "kelvin"
);
positive_quantity!(
    /// A luminosity in nominal solar luminosities (3.828e26 W).
    SolarLuminosities,
    "solar luminosities"
);
positive_quantity!(
    /// A radius in nominal solar radii (6.957e8 m).
    SolarRadii,
    "solar radii"
);

/// An age in gigayears (10^9 Julian years).
///
/// # Guarantees
/// The value is finite and in `0 ..= 13.8` (the age of the universe,
/// Planck 2018); `new` refuses anything else.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd)]
#[repr(transparent)]
pub struct Gigayears(f64);

impl Gigayears {
    /// An age in gigayears; `None` unless finite and within 0–13.8 Gyr.
    pub fn new(value: f64) -> Option<Self> {
        (value.is_finite() && (0.0..=UNIVERSE_AGE_GYR).contains(&value)).then_some(Self(value))
    }

    /// The value in gigayears.
    pub fn get(self) -> f64 {
        self.0
    }
}

/// Light years from parsecs.
pub fn pc_to_ly(pc: f64) -> f64 {
    pc * LY_PER_PC
}

/// Parsecs from light years.
pub fn ly_to_pc(ly: f64) -> f64 {
    ly / LY_PER_PC
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parsec_in_light_years() {
        // 1 pc = 3.261 563 777 ly (derived from the IAU 2015 Resolution B2 parsec,
        // the IAU 2012 B2 au and the Julian-year light year).
        assert!((LY_PER_PC - 3.261_563_777).abs() < 1e-9);
        // 1 pc = 206 264.806 247 au (IAU 2015 B2: 648000/π au).
        assert!((METRES_PER_PC / METRES_PER_AU - 206_264.806_247).abs() < 1e-6);
    }

    #[test]
    fn newtypes_refuse_bad_values() {
        assert!(SolarMasses::new(-1.0).is_none());
        assert!(SolarMasses::new(f64::NAN).is_none());
        assert!(SolarMasses::new(0.0).is_none());
        assert!(Gigayears::new(13.9).is_none());
        assert!(Gigayears::new(0.0).is_some());
    }
}
