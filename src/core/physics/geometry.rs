//! Viewing geometry: where the camera is relative to the target. On a round Earth with refraction
//! (`earth`, resolution-model §10) when its refraction factor is given; in plain trigonometry over
//! a flat Earth otherwise (the limit of a very large Earth, and what published worked examples of
//! short paths use).

use crate::core::physics::earth::{Earth, LookInputs, Sight, SightInputs};
use crate::core::physics::turbulence::SlantPath;

/// The camera `height_m` above the ground below it, the target `target_height_m` above the ground
/// below it, and `ground_distance_m` along the ground between the two; over an Earth whose
/// refraction factor is `earth_k` (4/3 for standard air), or a flat one when `earth_k` is not
/// finite (the default).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Geometry {
    pub height_m: f64,
    pub ground_distance_m: f64,
    pub target_height_m: f64,
    pub earth_k: f64,
}

impl Default for Geometry {
    /// A flat Earth, the target on the ground below the camera.
    fn default() -> Geometry {
        Geometry {
            height_m: 0.0,
            ground_distance_m: 0.0,
            target_height_m: 0.0,
            earth_k: f64::INFINITY,
        }
    }
}

impl Geometry {
    /// A camera looking at `look_angle_rad` from straight down at a target on flat ground.
    pub fn tilted(height_m: f64, look_angle_rad: f64) -> Geometry {
        Geometry {
            height_m,
            ground_distance_m: height_m * look_angle_rad.tan(),
            ..Geometry::default()
        }
    }

    /// A camera `height_m` up looking at `look_angle_rad` from straight down at a target
    /// `target_height_m` tall, on the Earth of refraction factor `earth_k`: the target is where the
    /// line of sight meets its height; a look above the horizon meets nothing, and is taken to the
    /// horizon (where the target is then out of view).
    pub fn tilted_over(height_m: f64, look_angle_rad: f64, target_height_m: f64, earth_k: f64) -> Geometry {
        let flat = Geometry {
            height_m,
            ground_distance_m: (height_m - target_height_m).max(0.0) * look_angle_rad.tan(),
            target_height_m,
            earth_k,
        };
        let Some(earth) = flat.earth() else {
            return flat;
        };
        let look = LookInputs {
            camera_height_m: height_m,
            look_angle_rad,
            target_height_m,
        };
        let ground_distance_m = match earth.sight_at_look_angle(&look) {
            Some(sight) => sight.ground_distance_m,
            None => earth.max_visible_ground_m(height_m, target_height_m).unwrap_or(0.0) * 1.000_001,
        };
        Geometry {
            ground_distance_m,
            ..flat
        }
    }

    /// The round Earth, when the refraction factor is given.
    pub fn earth(&self) -> Option<Earth> {
        if self.earth_k.is_finite() {
            Earth::with_refraction(self.earth_k)
        } else {
            None
        }
    }

    /// The line of sight on the round Earth (`None` on a flat one, or for inputs that are not
    /// numbers).
    pub fn sight(&self) -> Option<Sight> {
        self.earth()?.sight(&SightInputs {
            camera_height_m: self.height_m,
            ground_distance_m: self.ground_distance_m,
            target_height_m: self.target_height_m,
        })
    }

    /// Everything the engine takes from the geometry, worked out once (one sight on the sphere).
    pub fn view(&self) -> View {
        let (slant_range_m, look_angle_rad, elevation_rad, visible, sag_m) = match self.sight() {
            Some(s) => {
                let straight = 0.5 * (s.camera_height_m + s.target_height_m);
                let sag = (straight - s.height_along_path_m(0.5)).max(0.0);
                (s.slant_range_m, s.look_angle_rad, s.elevation_rad, s.visible, sag)
            }
            None => {
                let rise = self.height_m - self.target_height_m;
                let look = self.ground_distance_m.atan2(rise);
                (
                    rise.hypot(self.ground_distance_m),
                    look,
                    std::f64::consts::FRAC_PI_2 - look,
                    true,
                    0.0,
                )
            }
        };
        View {
            slant_range_m,
            look_angle_rad,
            elevation_rad,
            visible,
            path: SlantPath {
                camera_altitude_m: self.height_m,
                length_m: if slant_range_m.is_finite() { slant_range_m } else { 0.0 },
                target_altitude_m: self.target_height_m.max(0.0),
                sag_m,
            },
        }
    }

    /// Slant range R: the straight line from the camera to the target (√(Δh² + g²) when flat).
    pub fn slant_range_m(&self) -> f64 {
        self.view().slant_range_m
    }

    /// Look angle θ from straight down at the camera, radians (atan2(g, Δh) when flat).
    pub fn look_angle_rad(&self) -> f64 {
        self.view().look_angle_rad
    }

    /// The camera's elevation above the target's horizontal, radians (90° − θ when flat; less by
    /// the angle of Earth between them when round).
    pub fn elevation_rad(&self) -> f64 {
        self.view().elevation_rad
    }

    /// Whether the target is above the horizon (always on a flat Earth).
    pub fn visible(&self) -> bool {
        self.view().visible
    }

    /// The path that the turbulence integral follows: its length, the heights at its ends, and how
    /// far the straight line of sight sags below the straight rise between them at its middle over
    /// the round Earth.
    pub fn slant_path(&self) -> SlantPath {
        self.view().path
    }
}

/// The geometry as the engine uses it, worked out once per evaluation ([`Geometry::view`]).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct View {
    pub slant_range_m: f64,
    pub look_angle_rad: f64,
    /// The camera's elevation above the target's horizontal.
    pub elevation_rad: f64,
    /// Whether the target is above the horizon.
    pub visible: bool,
    /// The path the turbulence integral follows.
    pub path: SlantPath,
}
