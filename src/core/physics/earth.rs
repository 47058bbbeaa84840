//! A round Earth with refraction: the horizon, whether a target is in view, and the viewing
//! geometry (slant range, look and elevation angles, heights along the line of sight) between a
//! camera and a target on a sphere.
//!
//! Refraction bends a ray near the ground gently downwards, which is the same, for the geometry,
//! as straight rays over a sphere of larger radius k·R_E (the effective-Earth-radius model;
//! k = 4/3 for a standard atmosphere: Doerry, Sandia report SAND2012-10690, 2013; resolution-model
//! §10). Everything here works on that sphere, so k = 1 is the bare geometric Earth and a very
//! large k tends to the flat Earth of [`super::geometry`].
//!
//! Architecture invariant: every function is total. Heights below the ground are taken as the
//! ground, a negative ground distance as zero; an input that is not a number (or a result that
//! overflows) gives `None`, never NaN, infinity or a panic.

use std::f64::consts::PI;

/// The Earth's mean radius, 6371 km (IUGG mean radius R1, rounded to the kilometre as
/// resolution-model §10 uses it).
pub const EARTH_RADIUS_M: f64 = 6_371_000.0;

/// The refraction factor of a standard atmosphere, k = 4/3 (common practice; Doerry,
/// SAND2012-10690).
pub const STANDARD_REFRACTION_K: f64 = 4.0 / 3.0;

/// The largest refraction factor taken, 10¹²: a sphere of 6·10¹⁸ m is flat for any path here,
/// and its radius squared stays far from overflowing.
pub const MAX_REFRACTION_K: f64 = 1e12;

/// A height in metres as this module takes it: `None` when not a number, the ground (0) when
/// below it.
fn height(h: f64) -> Option<f64> {
    h.is_finite().then_some(h.max(0.0))
}

/// `x` when finite.
fn finite(x: f64) -> Option<f64> {
    x.is_finite().then_some(x)
}

/// A spherical Earth of effective radius k·R_E.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Earth {
    k: f64,
}

impl Default for Earth {
    /// The standard atmosphere's Earth, k = 4/3.
    fn default() -> Earth {
        Earth::STANDARD
    }
}

/// What a camera sees of a target: the camera `camera_height_m` above the ground below it, the
/// target `target_height_m` above the ground below it, the two ground points
/// `ground_distance_m` apart along the (curved) ground.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct SightInputs {
    pub camera_height_m: f64,
    pub ground_distance_m: f64,
    pub target_height_m: f64,
}

/// A camera `camera_height_m` above the ground looking at `look_angle_rad` from straight down,
/// at a target `target_height_m` above its ground (0 for the ground itself).
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct LookInputs {
    pub camera_height_m: f64,
    pub look_angle_rad: f64,
    pub target_height_m: f64,
}

/// The straight line of sight between a camera and a target on the sphere, all figures finite.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Sight {
    /// The camera's height above the ground below it (never negative).
    pub camera_height_m: f64,
    /// The target's height above the ground below it (never negative).
    pub target_height_m: f64,
    /// Distance along the ground between the points below camera and target, within [0, π·kR_E].
    pub ground_distance_m: f64,
    /// The angle at the Earth's centre between camera and target, g/(k·R_E).
    pub central_angle_rad: f64,
    /// Straight-line distance from camera to target, by the law of cosines.
    pub slant_range_m: f64,
    /// Angle at the camera between straight down and the target, in [0, π].
    pub look_angle_rad: f64,
    /// Angle at the target between its horizontal and the camera (negative when the camera is
    /// below the target's horizontal).
    pub elevation_rad: f64,
    /// Whether the straight line clears the sphere: the target is above the camera's horizon.
    pub visible: bool,
    /// The effective radius k·R_E the figures were found on.
    pub radius_m: f64,
}

impl Earth {
    /// The standard atmosphere, k = 4/3.
    pub const STANDARD: Earth = Earth {
        k: STANDARD_REFRACTION_K,
    };

    /// No refraction: the bare sphere, k = 1.
    pub const GEOMETRIC: Earth = Earth { k: 1.0 };

    /// An Earth with refraction factor `k`; `None` unless 0 < k ≤ [`MAX_REFRACTION_K`] (k < 0, a
    /// duct, bends rays more than the Earth curves and has no sphere to stand for it).
    pub fn with_refraction(k: f64) -> Option<Earth> {
        (k > 0.0 && k <= MAX_REFRACTION_K).then_some(Earth { k })
    }

    /// The refraction factor k.
    pub fn k(&self) -> f64 {
        self.k
    }

    /// The effective radius k·R_E, metres.
    pub fn radius_m(&self) -> f64 {
        self.k * EARTH_RADIUS_M
    }

    /// Distance to the horizon from `height_m`, the small-height form d = √(2·k·R_E·h)
    /// (resolution-model §10; Doerry, SAND2012-10690). It drops h² against 2kR_E·h, so it lies
    /// between the exact ground distance ([`Earth::horizon_arc_m`]) and the exact straight line
    /// ([`Earth::horizon_tangent_m`]); all three agree to 1 part in 10⁵ below 40 km.
    pub fn horizon_distance_m(&self, height_m: f64) -> Option<f64> {
        finite((2.0 * self.radius_m() * height(height_m)?).sqrt())
    }

    /// The exact straight-line distance from `height_m` to the horizon (the tangent point):
    /// √(2·kR_E·h + h²).
    pub fn horizon_tangent_m(&self, height_m: f64) -> Option<f64> {
        let h = height(height_m)?;
        finite((h * (2.0 * self.radius_m() + h)).sqrt())
    }

    /// The exact distance along the ground from the point below `height_m` to the horizon:
    /// kR_E·arccos(kR_E/(kR_E + h)), found as kR_E·atan(√(h(2kR_E + h))/kR_E), which keeps its
    /// precision for heights far smaller than the radius.
    pub fn horizon_arc_m(&self, height_m: f64) -> Option<f64> {
        Some(self.radius_m() * self.horizon_angle(height(height_m)?))
    }

    /// The angle at the centre between the point below a height `h` (≥ 0) and its horizon.
    fn horizon_angle(&self, h: f64) -> f64 {
        let r = self.radius_m();
        // √(h(2r + h)) may overflow to +∞ for absurd heights; atan(∞) = π/2 is still the limit.
        (h * (2.0 * r + h)).sqrt().atan2(r)
    }

    /// The look angle from straight down at which a camera at `height_m` sees the horizon,
    /// arcsin(kR_E/(kR_E + h)); any larger angle looks over the Earth's edge.
    pub fn horizon_look_angle_rad(&self, height_m: f64) -> Option<f64> {
        let h = height(height_m)?;
        // Complement of the horizon's angle at the centre: the triangle centre, camera and
        // tangent point has its right angle at the tangent point.
        Some(PI / 2.0 - self.horizon_angle(h))
    }

    /// The greatest distance at which a target `target_height_m` tall is in view from
    /// `camera_height_m`, small-height form √(2kR_E·h) + √(2kR_E·h_t) (resolution-model §10).
    /// Symmetric in the two heights.
    pub fn max_visible_distance_m(&self, camera_height_m: f64, target_height_m: f64) -> Option<f64> {
        finite(self.horizon_distance_m(camera_height_m)? + self.horizon_distance_m(target_height_m)?)
    }

    /// The same limit exactly, as a distance along the ground: the sum of the two horizon arcs.
    /// Never more than [`Earth::max_visible_distance_m`]. Symmetric in the two heights.
    pub fn max_visible_ground_m(&self, camera_height_m: f64, target_height_m: f64) -> Option<f64> {
        finite(self.horizon_arc_m(camera_height_m)? + self.horizon_arc_m(target_height_m)?)
    }

    /// The line of sight from a camera to a target on this Earth. With r = kR_E, a = r + h the
    /// camera's and b = r + h_t the target's distance from the centre and φ = g/r the angle
    /// between them there, the slant range is L² = a² + b² − 2ab·cos φ (law of cosines), written
    /// (a − b)² + 4ab·sin²(φ/2) so that short paths keep their precision. The target is in view
    /// when φ is within the sum of the two horizon angles. The ground distance is taken as at
    /// most half the circumference. `None` when an input is not a number or a figure overflows.
    pub fn sight(&self, inputs: &SightInputs) -> Option<Sight> {
        let h = height(inputs.camera_height_m)?;
        let ht = height(inputs.target_height_m)?;
        let r = self.radius_m();
        let g = finite(inputs.ground_distance_m)?.clamp(0.0, PI * r);
        let phi = (g / r).min(PI);
        let (a, b) = (r + h, r + ht);
        let half = (0.5 * phi).sin();
        let versine = 2.0 * half * half; // 1 − cos φ
        let slant = ((h - ht).powi(2) + 4.0 * a * b * half * half).sqrt();
        // At the camera: the target's offset downwards (towards the centre) and across.
        let down = (h - ht) + b * versine;
        let across_at_camera = b * phi.sin();
        let look = across_at_camera.atan2(down);
        // At the target: the camera's offset upwards and across.
        let up = (h - ht) - a * versine;
        let across_at_target = a * phi.sin();
        let elevation = up.atan2(across_at_target);
        let reach = self.horizon_angle(h) + self.horizon_angle(ht);
        // A hair of tolerance so that a ray found to graze the horizon still counts as in view.
        let visible = phi <= reach * (1.0 + 1e-12) + 1e-15;
        let sight = Sight {
            camera_height_m: h,
            target_height_m: ht,
            ground_distance_m: g,
            central_angle_rad: phi,
            slant_range_m: slant,
            look_angle_rad: look,
            elevation_rad: elevation,
            visible,
            radius_m: r,
        };
        let all_finite = [slant, look, elevation, g, phi].iter().all(|x| x.is_finite());
        all_finite.then_some(sight)
    }

    /// The inverse: where a camera looking at `look_angle_rad` from straight down meets the
    /// sphere of the target's height, and the line of sight to that point. The ray from the
    /// camera (a from the centre) meets the sphere of radius b at t = a·cos θ ∓ √(b² − a²·sin²θ)
    /// along it (the nearer meeting when the camera is above that sphere); `None` when it passes
    /// above the horizon, or an input is not a number. A negative angle is taken as its mirror. The
    /// line may still pass under the ground on its way (a camera below the target's height looking
    /// far off); the sight's `visible` says so.
    pub fn sight_at_look_angle(&self, inputs: &LookInputs) -> Option<Sight> {
        let h = height(inputs.camera_height_m)?;
        let ht = height(inputs.target_height_m)?;
        let theta = finite(inputs.look_angle_rad)?.abs();
        if theta > PI {
            return None;
        }
        let r = self.radius_m();
        let a = r + h;
        let (sin, cos) = theta.sin_cos();
        // a² − b² = (h − h_t)(2r + h + h_t), free of the cancellation of squaring two radii.
        let excess = (h - ht) * (2.0 * r + h + ht);
        let disc = (a * cos).powi(2) - excess;
        if disc.is_nan() || disc < 0.0 {
            return None;
        }
        let root = disc.sqrt();
        let t = if excess > 0.0 {
            // The camera is above the sphere: the nearer meeting, which must lie ahead.
            if cos <= 0.0 {
                return None;
            }
            excess / (a * cos + root)
        } else {
            // The camera is on or inside the sphere: the one meeting ahead of it.
            a * cos + root
        };
        let phi = (t * sin).atan2(a - t * cos);
        self.sight(&SightInputs {
            camera_height_m: h,
            ground_distance_m: r * phi,
            target_height_m: ht,
        })
    }
}

impl Sight {
    /// The height above the curved ground of the point a fraction `s` of the way along the
    /// straight line of sight from the target (s = 0) to the camera (s = 1), as the turbulence
    /// integral measures its path (`turbulence::integrate_unit_path`). With X(s) = Q + s(P − Q):
    /// |X|² − r² = h_t(2r + h_t) + 2s·b·v + s²L², v = a·cos φ − b the camera's rise above the
    /// target's horizontal, and the height is that over |X| + r. `s` is clamped to [0, 1] (not a
    /// number reads as 0); a line that dips below the ground, as one to a target out of view
    /// does, reads 0 there.
    pub fn height_along_path_m(&self, s: f64) -> f64 {
        let s = if s.is_nan() { 0.0 } else { s.clamp(0.0, 1.0) };
        let r = self.radius_m;
        let (h, ht) = (self.camera_height_m, self.target_height_m);
        let (a, b) = (r + h, r + ht);
        let half = (0.5 * self.central_angle_rad).sin();
        let rise = (h - ht) - 2.0 * a * half * half;
        let excess = ht * (2.0 * r + ht) + 2.0 * s * b * rise + s * s * self.slant_range_m * self.slant_range_m;
        let radius = (r * r + excess).max(0.0).sqrt();
        let height = excess / (radius + r);
        if height.is_finite() {
            height.max(0.0)
        } else {
            0.0
        }
    }

    /// The look angle's complement: how far below the camera's horizontal the target lies
    /// (negative when above it).
    pub fn depression_rad(&self) -> f64 {
        PI / 2.0 - self.look_angle_rad
    }
}
