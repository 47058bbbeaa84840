//! Viewing geometry: where the camera is relative to the target, in plain trigonometry.

/// The camera `height_m` above the ground at the target, and `ground_distance_m` horizontally
/// from the point below the camera to the target.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Geometry {
    pub height_m: f64,
    pub ground_distance_m: f64,
}

impl Geometry {
    /// A camera looking at `look_angle_rad` from straight down.
    pub fn tilted(height_m: f64, look_angle_rad: f64) -> Geometry {
        Geometry {
            height_m,
            ground_distance_m: height_m * look_angle_rad.tan(),
        }
    }

    /// Slant range R = √(h² + g²).
    pub fn slant_range_m(&self) -> f64 {
        self.height_m.hypot(self.ground_distance_m)
    }

    /// Look angle θ = atan2(g, h) from straight down, radians.
    pub fn look_angle_rad(&self) -> f64 {
        self.ground_distance_m.atan2(self.height_m)
    }
}
