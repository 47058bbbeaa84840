//! Light on the ground: the optical air mass and the daylight illuminance on a level surface for
//! the sun's elevation and the sky (the IES daylight availability model), in lux.

use std::f64::consts::PI;

/// The solar illuminance constant outside the atmosphere, 127.5 klx (IES RP-21, "Calculation of
/// daylight availability", J. Illuminating Engineering Society, 1984).
pub const SOLAR_ILLUMINANCE_LX: f64 = 127_500.0;

/// The sky over the scene.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum Sky {
    /// Clear: direct sun and a clear sky.
    #[default]
    Clear,
    /// Partly cloudy: direct sun through haze and cloud, a bright sky.
    PartlyCloudy,
    /// Overcast: no direct sun, sky light only.
    Overcast,
}

impl Sky {
    /// Extinction coefficient c of the direct beam, E_dn = E_xt·e^(−c·m): 0.21 clear, 0.80 partly
    /// cloudy, `None` overcast (no direct sun) (IES RP-21).
    pub fn extinction(self) -> Option<f64> {
        match self {
            Sky::Clear => Some(0.21),
            Sky::PartlyCloudy => Some(0.80),
            Sky::Overcast => None,
        }
    }

    /// (A, B, C) of the horizontal sky illuminance A + B·(sin h)^C, klx: (0.8, 15.5, 0.5) clear,
    /// (0.3, 45.0, 1.0) partly cloudy, (0.3, 21.0, 1.0) overcast (IES RP-21, as listed in
    /// resolution-model §9, from memory there).
    pub fn sky_terms_klx(self) -> (f64, f64, f64) {
        match self {
            Sky::Clear => (0.8, 15.5, 0.5),
            Sky::PartlyCloudy => (0.3, 45.0, 1.0),
            Sky::Overcast => (0.3, 21.0, 1.0),
        }
    }
}

/// The elevation in degrees held within 0–90°, a non-finite one counting as the horizon.
fn above_horizon_deg(elevation_deg: f64) -> f64 {
    if elevation_deg.is_finite() {
        elevation_deg.clamp(0.0, 90.0)
    } else {
        0.0
    }
}

/// Relative optical air mass for a sun `elevation_deg` above the horizon:
/// m = 1/[sin h + 0.50572·(h + 6.07995°)^(−1.6364)] (Kasten & Young, Appl. Opt. 28, 4735, 1989).
/// The elevation is held within 0–90° (a non-finite one counts as the horizon), so m lies
/// between about 1 (overhead) and 38 (horizon).
pub fn air_mass(elevation_deg: f64) -> f64 {
    let h = above_horizon_deg(elevation_deg);
    1.0 / (h.to_radians().sin() + 0.50572 * (h + 6.07995).powf(-1.6364))
}

/// Illuminance outside the atmosphere on a surface facing the sun, lux, for day of the year
/// `day_of_year` (1 on 1 January): E_xt = 127.5·[1 + 0.034·cos(2π(J − 2)/365)] klx (IES RP-21); a
/// non-finite day gives the mean, 127.5 klx.
pub fn extraterrestrial_illuminance_lx(day_of_year: f64) -> f64 {
    let swing = if day_of_year.is_finite() {
        0.034 * (2.0 * PI * (day_of_year - 2.0).rem_euclid(365.0) / 365.0).cos()
    } else {
        0.0
    };
    SOLAR_ILLUMINANCE_LX * (1.0 + swing)
}

/// Daylight on a level surface, lux.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Daylight {
    /// From the sun's disc: E_dn·sin h.
    pub direct_lx: f64,
    /// From the sky.
    pub sky_lx: f64,
}

impl Daylight {
    /// Direct plus sky, lux.
    pub fn total_lx(&self) -> f64 {
        self.direct_lx + self.sky_lx
    }
}

/// Daylight on a level surface for the sun's `elevation_deg`, the `sky` and the `day_of_year`
/// (IES RP-21): direct E_xt·e^(−c·m)·sin h with Kasten & Young's air mass m (the IES text uses
/// 1/sin h, which fails near the horizon), and sky A + B·(sin h)^C klx. The model has no twilight:
/// with the sun on or below the horizon (or a non-finite elevation) both terms are 0.
pub fn daylight(elevation_deg: f64, sky: Sky, day_of_year: f64) -> Daylight {
    if !(elevation_deg.is_finite() && elevation_deg > 0.0) {
        return Daylight {
            direct_lx: 0.0,
            sky_lx: 0.0,
        };
    }
    let sin_h = above_horizon_deg(elevation_deg).to_radians().sin();
    let direct_lx = sky.extinction().map_or(0.0, |c| {
        extraterrestrial_illuminance_lx(day_of_year) * (-c * air_mass(elevation_deg)).exp() * sin_h
    });
    let (a, b, c) = sky.sky_terms_klx();
    Daylight {
        direct_lx,
        sky_lx: 1000.0 * (a + b * sin_h.powf(c)),
    }
}
