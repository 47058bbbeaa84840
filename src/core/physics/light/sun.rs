//! The sun for a time and place: its position by the NREL Solar Position Algorithm (Reda & Andreas,
//! NREL/TP-560-34302, through the `solar-positioning` crate), its day (elevation sampled every ten
//! minutes, sunrise, the highest sun, sunset, the hours above an elevation), and the angle between
//! a camera's line of sight and the sun's mirror image in still water (glint).
//!
//! Times are UTC as Unix seconds (`f64`); a [`CivilTime`] turns a local date, time and offset into
//! them. UTC stands in for UT1 (they differ by less than 0.9 s, at most 0.004° of the sun's hour
//! angle).

use crate::core::physics::roots::last_not_negative;
use solar_positioning::time::JulianDate;
use solar_positioning::{Location, PreparedPositions, RefractionCorrection, SolarPositions};

/// Seconds in a day.
const DAY_S: f64 = 86_400.0;
/// Julian date of the Unix epoch, 1970-01-01 00:00 UTC (Meeus, *Astronomical Algorithms*, ch. 7).
const UNIX_EPOCH_JD: f64 = 2_440_587.5;
/// Days from 0000-03-01 to 1970-01-01 in the proleptic Gregorian calendar (Hinnant's day count).
const EPOCH_SHIFT_DAYS: i64 = 719_468;
/// Days in 400 Gregorian years.
const ERA_DAYS: i64 = 146_097;

/// Step between the samples of a [`SunDay`]: ten minutes.
pub const SAMPLE_STEP_S: f64 = 600.0;

/// Geometric elevation of the sun's centre at sunrise and sunset: −50′, the upper limb on a level
/// horizon after 34′ of standard refraction and 16′ of semi-diameter (the convention of the NREL
/// SPA report, h0′ = −0.8333°, and of the almanacs).
pub const SUNRISE_ELEVATION_DEG: f64 = -50.0 / 60.0;

/// Largest UTC offset accepted, in minutes (under a day, as ISO 8601 offsets are).
const MAX_OFFSET_MIN: i32 = 24 * 60 - 1;

/// A local date and time with its offset from UTC (the contract's `when`, ISO 8601).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CivilTime {
    /// Year of the proleptic Gregorian calendar (year 0 is 1 BCE).
    pub year: i32,
    /// Month, 1–12.
    pub month: u32,
    /// Day of the month, 1–31.
    pub day: u32,
    /// Hour, 0–23.
    pub hour: u32,
    /// Minute, 0–59.
    pub minute: u32,
    /// Second, 0 to below 61 (a leap second is taken as the next minute's first second).
    pub second: f64,
    /// Offset of local time from UTC in minutes, east positive (`+02:00` is 120).
    pub offset_minutes: i32,
}

impl CivilTime {
    /// The UTC instant as Unix seconds, or `None` when a field is out of its range.
    pub fn unix_s(&self) -> Option<f64> {
        let valid_day = (1..=12).contains(&self.month)
            && self.day >= 1
            && self.day <= days_in_month(self.year, self.month)
            && self.hour < 24
            && self.minute < 60
            && self.second.is_finite()
            && (0.0..61.0).contains(&self.second)
            && self.offset_minutes.abs() <= MAX_OFFSET_MIN;
        if !valid_day {
            return None;
        }
        let days = days_from_civil(i64::from(self.year), i64::from(self.month), i64::from(self.day));
        let minutes = i64::from(self.hour) * 60 + i64::from(self.minute) - i64::from(self.offset_minutes);
        Some(days as f64 * DAY_S + minutes as f64 * 60.0 + self.second)
    }

    /// The local date and time of the UTC instant `unix_s` at `offset_minutes` from UTC, or `None`
    /// for a non-finite instant, an offset of a day or more, or a year outside ±1 000 000.
    pub fn from_unix_s(unix_s: f64, offset_minutes: i32) -> Option<CivilTime> {
        let local_s = unix_s + f64::from(offset_minutes) * 60.0;
        if !local_s.is_finite() || offset_minutes.abs() > MAX_OFFSET_MIN || local_s.abs() > 3.0e13 {
            return None;
        }
        let mut days = (local_s / DAY_S).floor();
        let mut in_day_s = local_s - days * DAY_S;
        if in_day_s >= DAY_S {
            // Rounding of a time just before midnight.
            days += 1.0;
            in_day_s = 0.0;
        }
        let in_day_s = in_day_s.max(0.0);
        let (year, month, day) = civil_from_days(days as i64);
        let hour = ((in_day_s / 3600.0).floor() as u32).min(23);
        let minute = (((in_day_s - f64::from(hour) * 3600.0) / 60.0).floor() as u32).min(59);
        let second = (in_day_s - f64::from(hour) * 3600.0 - f64::from(minute) * 60.0).clamp(0.0, 60.0 - 1e-9);
        Some(CivilTime {
            year: i32::try_from(year).ok()?,
            month,
            day,
            hour,
            minute,
            second,
            offset_minutes,
        })
    }

    /// The start of this local day (00:00 at the same offset).
    pub fn day_start(&self) -> CivilTime {
        CivilTime {
            hour: 0,
            minute: 0,
            second: 0.0,
            ..*self
        }
    }

    /// Day of the year, 1 on 1 January (the J of the IES daylight model), or `None` for an invalid
    /// month or day.
    pub fn day_of_year(&self) -> Option<u32> {
        if !(1..=12).contains(&self.month) || self.day < 1 || self.day > days_in_month(self.year, self.month) {
            return None;
        }
        let year = i64::from(self.year);
        let days = days_from_civil(year, i64::from(self.month), i64::from(self.day)) - days_from_civil(year, 1, 1);
        u32::try_from(days + 1).ok()
    }
}

/// Days in `month` of `year`, Gregorian leap years.
fn days_in_month(year: i32, month: u32) -> u32 {
    match month {
        1 | 3 | 5 | 7 | 8 | 10 | 12 => 31,
        4 | 6 | 9 | 11 => 30,
        2 if year % 4 == 0 && (year % 100 != 0 || year % 400 == 0) => 29,
        2 => 28,
        _ => 0,
    }
}

/// Days since 1970-01-01 of a proleptic Gregorian date (H. Hinnant, "chrono-Compatible Low-Level
/// Date Algorithms", `days_from_civil`).
fn days_from_civil(year: i64, month: i64, day: i64) -> i64 {
    let year = if month <= 2 { year - 1 } else { year };
    let era = year.div_euclid(400);
    let year_of_era = year - era * 400;
    let month_from_march = (month + 9) % 12;
    let day_of_year = (153 * month_from_march + 2) / 5 + day - 1;
    let day_of_era = year_of_era * 365 + year_of_era / 4 - year_of_era / 100 + day_of_year;
    era * ERA_DAYS + day_of_era - EPOCH_SHIFT_DAYS
}

/// The proleptic Gregorian date of a day count since 1970-01-01 (Hinnant, `civil_from_days`).
fn civil_from_days(days: i64) -> (i64, u32, u32) {
    let z = days + EPOCH_SHIFT_DAYS;
    let era = z.div_euclid(ERA_DAYS);
    let day_of_era = z - era * ERA_DAYS;
    let year_of_era = (day_of_era - day_of_era / 1460 + day_of_era / 36_524 - day_of_era / 146_096) / 365;
    let day_of_year = day_of_era - (365 * year_of_era + year_of_era / 4 - year_of_era / 100);
    let month_from_march = (5 * day_of_year + 2) / 153;
    let day = (day_of_year - (153 * month_from_march + 2) / 5 + 1) as u32;
    let month = if month_from_march < 10 {
        month_from_march + 3
    } else {
        month_from_march - 9
    } as u32;
    let year = year_of_era + era * 400 + i64::from(month <= 2);
    (year, month, day)
}

/// ΔT = TT − UT in seconds for a Unix time: Espenak & Meeus's polynomial for 2005–2050 (NASA
/// eclipse site, "Polynomial expressions for Delta T", from memory), the year held within
/// 1990–2150. Ten seconds of ΔT move the sun by about 0.0001° (the sun's longitude gains 0.9856°
/// a day), so this is ample for planning; `sun_position_with` takes an exact ΔT.
pub fn delta_t_s(unix_s: f64) -> f64 {
    let year = 1970.0 + unix_s / (365.2425 * DAY_S);
    let t = if year.is_finite() {
        year.clamp(1990.0, 2150.0) - 2000.0
    } else {
        25.0
    };
    62.92 + 0.32217 * t + 0.005589 * t * t
}

/// A place on the Earth.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Place {
    /// Latitude, degrees north.
    pub latitude_deg: f64,
    /// Longitude, degrees east (any value; wrapped to −180…180).
    pub longitude_deg: f64,
    /// Height above sea level, metres (parallax only; a non-finite height counts as 0).
    pub height_m: f64,
}

impl Place {
    /// The crate's location, or `None` for a latitude outside ±90° or a non-finite coordinate.
    fn location(&self) -> Option<Location> {
        let lat = self.latitude_deg;
        let lon = self.longitude_deg;
        if !lat.is_finite() || !lon.is_finite() || lat.abs() > 90.0 {
            return None;
        }
        Some(Location {
            latitude: lat,
            longitude: ((lon + 180.0).rem_euclid(360.0) - 180.0).clamp(-180.0, 180.0),
        })
    }

    /// Height for the parallax: 0 when not finite.
    fn height(&self) -> f64 {
        if self.height_m.is_finite() {
            self.height_m
        } else {
            0.0
        }
    }
}

/// The air for the refraction correction.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Air {
    /// Pressure, hPa (mbar).
    pub pressure_hpa: f64,
    /// Temperature, °C.
    pub temperature_c: f64,
}

impl Air {
    /// The standard atmosphere at sea level: 1013.25 hPa, 15 °C (ISO 2533).
    pub const STANDARD: Air = Air {
        pressure_hpa: 1013.25,
        temperature_c: 15.0,
    };

    /// The crate's refraction correction; air it rejects (non-finite, pressure not in 0–2000 hPa,
    /// temperature not in −273–100 °C) counts as the standard atmosphere.
    fn refraction(&self) -> RefractionCorrection {
        RefractionCorrection::new(self.pressure_hpa, self.temperature_c).unwrap_or(RefractionCorrection::standard())
    }
}

/// Where the sun is, topocentric.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SunPosition {
    /// Elevation of the sun's centre above the horizon, degrees (90 − zenith angle).
    pub elevation_deg: f64,
    /// Azimuth, degrees clockwise from north, 0–360.
    pub azimuth_deg: f64,
}

/// Where a plan's sun comes from. The sun's position is a function of the instant and the place
/// alone, so it can be worked out elsewhere and told: natively and in the on-demand modules it is
/// NREL's SPA at once ([`Spa`]); the page asks its second module and keeps the answers, so that
/// SPA's tables stay out of its first load.
pub trait Sunlight {
    /// The sun at `unix_s` from `place`: `Some` with SPA's answer (itself `None` for a time or place
    /// SPA cannot take), or `None` while it is not known here yet.
    fn sun_at(&self, unix_s: f64, place: Place) -> Option<Option<SunPosition>>;
}

/// The sun by NREL's SPA, worked out at once ([`sun_position`]).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct Spa;

impl Sunlight for Spa {
    fn sun_at(&self, unix_s: f64, place: Place) -> Option<Option<SunPosition>> {
        Some(sun_position(unix_s, place))
    }
}

/// The sun at `unix_s` seen from `place` (NREL SPA), apparent (refracted by the standard
/// atmosphere), with ΔT from [`delta_t_s`]; `None` for an invalid place or a time outside SPA's
/// years (−2000 to 6000).
pub fn sun_position(unix_s: f64, place: Place) -> Option<SunPosition> {
    sun_position_with(unix_s, place, Some(Air::STANDARD), delta_t_s(unix_s))
}

/// The sun at `unix_s` seen from `place` (NREL SPA, Reda & Andreas, NREL/TP-560-34302): refracted
/// by `air`, or geometric with `None`; `delta_t` is TT − UT in seconds (a non-finite one counts as
/// [`delta_t_s`]'s estimate).
pub fn sun_position_with(unix_s: f64, place: Place, air: Option<Air>, delta_t: f64) -> Option<SunPosition> {
    let delta_t = if delta_t.is_finite() {
        delta_t
    } else {
        delta_t_s(unix_s)
    };
    let location = place.location()?;
    let sky = prepare(unix_s, delta_t)?;
    position(&sky, location, place.height(), air)
}

/// The time-dependent part of SPA at `unix_s`.
fn prepare(unix_s: f64, delta_t: f64) -> Option<PreparedPositions> {
    let julian = JulianDate::new(unix_s / DAY_S + UNIX_EPOCH_JD, delta_t).ok()?;
    SolarPositions::new().for_time_from_julian(julian).ok()
}

/// The place-dependent part of SPA, checked to be finite.
fn position(sky: &PreparedPositions, location: Location, height_m: f64, air: Option<Air>) -> Option<SunPosition> {
    let found = sky.at(location, height_m, air.map(|a| a.refraction())).ok()?;
    let (elevation_deg, azimuth_deg) = (found.elevation_angle(), found.azimuth());
    (elevation_deg.is_finite() && azimuth_deg.is_finite()).then_some(SunPosition {
        elevation_deg,
        azimuth_deg,
    })
}

/// One sample of the sun's day.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SunSample {
    /// UTC, Unix seconds.
    pub unix_s: f64,
    /// Apparent elevation (standard refraction), degrees.
    pub elevation_deg: f64,
    /// Azimuth, degrees clockwise from north.
    pub azimuth_deg: f64,
}

/// The sun over 24 hours from a start (usually local midnight).
#[derive(Clone, Debug, PartialEq)]
pub struct SunDay {
    /// The sun every [`SAMPLE_STEP_S`] from the start to 24 hours later, both ends included.
    pub samples: Vec<SunSample>,
    /// First sunrise (the centre's geometric elevation rising through [`SUNRISE_ELEVATION_DEG`],
    /// at sea level), or `None` when the sun does not rise in these 24 hours.
    pub sunrise_unix_s: Option<f64>,
    /// Last sunset, or `None` when the sun does not set in these 24 hours.
    pub sunset_unix_s: Option<f64>,
    /// The highest sun of the 24 hours (solar noon: within seconds of the meridian transit except
    /// near the poles), Unix seconds.
    pub noon_unix_s: f64,
    /// The sun's apparent elevation then, degrees.
    pub noon_elevation_deg: f64,
    /// The lowest sun of the 24 hours, Unix seconds.
    pub lowest_unix_s: f64,
    place: Place,
    delta_t: f64,
}

/// A stretch of time, Unix seconds.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Window {
    /// Start, Unix seconds.
    pub start_unix_s: f64,
    /// End, Unix seconds.
    pub end_unix_s: f64,
}

/// The sun over the 24 hours from `start_unix_s` at `place` (NREL SPA, ΔT from [`delta_t_s`]):
/// samples every ten minutes, sunrise, sunset and the highest sun, each crossing found to a
/// millisecond between samples. `None` for an invalid place or a day outside SPA's years.
pub fn sun_day(start_unix_s: f64, place: Place) -> Option<SunDay> {
    let delta_t = delta_t_s(start_unix_s);
    let location = place.location()?;
    let height = place.height();
    let count = (DAY_S / SAMPLE_STEP_S) as usize + 1;
    let mut samples = Vec::with_capacity(count);
    let mut geometric = Vec::with_capacity(count);
    for k in 0..count {
        let unix_s = start_unix_s + k as f64 * SAMPLE_STEP_S;
        let sky = prepare(unix_s, delta_t)?;
        let apparent = position(&sky, location, height, Some(Air::STANDARD))?;
        let plain = position(&sky, location, 0.0, None)?;
        samples.push(SunSample {
            unix_s,
            elevation_deg: apparent.elevation_deg,
            azimuth_deg: apparent.azimuth_deg,
        });
        geometric.push((unix_s, plain.elevation_deg));
    }
    let sea_level = Place { height_m: 0.0, ..place };
    let sea_elevation = |t: f64| elevation_at(t, sea_level, None, delta_t);
    let noon = extremum(&geometric, &sea_elevation, 1.0);
    let lowest = extremum(&geometric, &sea_elevation, -1.0);
    let points = geometric.iter().map(|&(t, e)| (t, e - SUNRISE_ELEVATION_DEG)).collect();
    let crossings = crossings(points, [noon.0, lowest.0], &|t| {
        sea_elevation(t) - SUNRISE_ELEVATION_DEG
    });
    let sunrise_unix_s = crossings.iter().find(|c| c.rising).map(|c| c.unix_s);
    let sunset_unix_s = crossings.iter().rev().find(|c| !c.rising).map(|c| c.unix_s);
    let noon_elevation_deg = elevation_at(noon.0, place, Some(Air::STANDARD), delta_t);
    Some(SunDay {
        samples,
        sunrise_unix_s,
        sunset_unix_s,
        noon_unix_s: noon.0,
        noon_elevation_deg: if noon_elevation_deg.is_finite() {
            noon_elevation_deg
        } else {
            noon.1
        },
        lowest_unix_s: lowest.0,
        place,
        delta_t,
    })
}

impl SunDay {
    /// The stretches of these 24 hours when the sun's apparent elevation is at least
    /// `min_elevation_deg` (a non-finite threshold gives none), each end found to a millisecond.
    pub fn above(&self, min_elevation_deg: f64) -> Vec<Window> {
        if !min_elevation_deg.is_finite() {
            return Vec::new();
        }
        let apparent = |t: f64| elevation_at(t, self.place, Some(Air::STANDARD), self.delta_t);
        let (Some(first), Some(last)) = (self.samples.first(), self.samples.last()) else {
            return Vec::new();
        };
        let points: Vec<(f64, f64)> = self
            .samples
            .iter()
            .map(|s| (s.unix_s, s.elevation_deg - min_elevation_deg))
            .collect();
        let mut windows = Vec::new();
        let mut open = (first.elevation_deg >= min_elevation_deg).then_some(first.unix_s);
        let extremes = [self.noon_unix_s, self.lowest_unix_s];
        for crossing in crossings(points, extremes, &|t| apparent(t) - min_elevation_deg) {
            match (crossing.rising, open) {
                (true, None) => open = Some(crossing.unix_s),
                (false, Some(start_unix_s)) => {
                    windows.push(Window {
                        start_unix_s,
                        end_unix_s: crossing.unix_s,
                    });
                    open = None;
                }
                _ => {}
            }
        }
        if let Some(start_unix_s) = open {
            windows.push(Window {
                start_unix_s,
                end_unix_s: last.unix_s,
            });
        }
        windows
    }
}

/// Elevation at `unix_s`, or NaN where SPA has no answer (the root finder bisects past it).
fn elevation_at(unix_s: f64, place: Place, air: Option<Air>, delta_t: f64) -> f64 {
    sun_position_with(unix_s, place, air, delta_t).map_or(f64::NAN, |p| p.elevation_deg)
}

/// The highest (`sign` 1) or lowest (`sign` −1) elevation near the best sample, refined by golden
/// section over the two steps around it: (time, elevation).
fn extremum(points: &[(f64, f64)], elevation: &dyn Fn(f64) -> f64, sign: f64) -> (f64, f64) {
    let best = points
        .iter()
        .enumerate()
        .filter(|(_, p)| p.1.is_finite())
        .max_by(|a, b| (sign * a.1 .1).total_cmp(&(sign * b.1 .1)));
    let Some((k, &(t_best, e_best))) = best else {
        return points.first().copied().unwrap_or((0.0, 0.0));
    };
    let lo_point = points.get(k.wrapping_sub(1)).map_or(t_best, |p| p.0);
    let hi_point = points.get(k + 1).map_or(t_best, |p| p.0);
    let score = |t: f64| {
        let e = elevation(t);
        if e.is_finite() {
            sign * e
        } else {
            f64::NEG_INFINITY
        }
    };
    let ratio = 0.5 * (5f64.sqrt() - 1.0);
    let (mut lo, mut hi) = (lo_point, hi_point);
    let mut a = hi - ratio * (hi - lo);
    let mut b = lo + ratio * (hi - lo);
    let (mut fa, mut fb) = (score(a), score(b));
    // 30 steps shrink 20 minutes to under a millisecond.
    for _ in 0..30 {
        if fa >= fb {
            hi = b;
            b = a;
            fb = fa;
            a = hi - ratio * (hi - lo);
            fa = score(a);
        } else {
            lo = a;
            a = b;
            fa = fb;
            b = lo + ratio * (hi - lo);
            fb = score(b);
        }
    }
    let t = 0.5 * (lo + hi);
    let e = elevation(t);
    if e.is_finite() && sign * e >= sign * e_best {
        (t, e)
    } else {
        (t_best, e_best)
    }
}

/// A time where a value changes sign.
struct Crossing {
    unix_s: f64,
    rising: bool,
}

/// Where `value` changes sign, in time order. `points` are the samples' (time, value) pairs in
/// time order; the `extremes` (the times of the highest and lowest sun) join them so that a sun
/// peeking above a threshold between two samples is not missed. Each sign change between
/// neighbours is refined by the core's root finder. (A `dyn` closure keeps one copy of the code.)
fn crossings(mut points: Vec<(f64, f64)>, extremes: [f64; 2], value: &dyn Fn(f64) -> f64) -> Vec<Crossing> {
    for t in extremes {
        let v = value(t);
        if t.is_finite() && v.is_finite() {
            let at = points.partition_point(|p| p.0 < t);
            points.insert(at, (t, v));
        }
    }
    // Times relative to a point one day before the start, so that the root finder's relative
    // tolerance is about 0.2 ms.
    let origin = points.first().map_or(0.0, |p| p.0) - DAY_S;
    let mut found = Vec::new();
    for pair in points.windows(2) {
        let &[(t0, v0), (t1, v1)] = pair else {
            continue;
        };
        // Rising where the value goes from negative to not negative, setting the other way.
        let rising = v0 < 0.0;
        if rising == (v1 < 0.0) {
            continue;
        }
        let sign = if rising { -1.0 } else { 1.0 };
        let at = last_not_negative(t0 - origin, t1 - origin, |s| sign * value(s + origin), 1e-9);
        found.push(Crossing {
            unix_s: at + origin,
            rising,
        });
    }
    found
}

/// A direction from the camera: azimuth clockwise from north and elevation above the horizon
/// (negative looking down; −90° is straight down), degrees.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Direction {
    /// Azimuth, degrees clockwise from north.
    pub azimuth_deg: f64,
    /// Elevation, degrees above the horizon.
    pub elevation_deg: f64,
}

impl Direction {
    /// The unit vector (east, north, up), or `None` when an angle is not finite.
    fn unit(&self) -> Option<[f64; 3]> {
        let (az, el) = (self.azimuth_deg.to_radians(), self.elevation_deg.to_radians());
        (az.is_finite() && el.is_finite()).then(|| [el.cos() * az.sin(), el.cos() * az.cos(), el.sin()])
    }
}

/// The angle in degrees (0–180) between the camera's line of sight `view` and the sun's mirror
/// image in level still water (the sun's azimuth, minus its elevation), by the law of reflection:
/// glare from water where it is small. `None` when an angle is not finite.
pub fn glint_angle_deg(view: Direction, sun: SunPosition) -> Option<f64> {
    let mirror = Direction {
        azimuth_deg: sun.azimuth_deg,
        elevation_deg: -sun.elevation_deg,
    };
    let (a, b) = (view.unit()?, mirror.unit()?);
    let dot = a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    let cross = [
        a[1] * b[2] - a[2] * b[1],
        a[2] * b[0] - a[0] * b[2],
        a[0] * b[1] - a[1] * b[0],
    ];
    let sine = (cross[0] * cross[0] + cross[1] * cross[1] + cross[2] * cross[2]).sqrt();
    let angle = sine.atan2(dot).to_degrees();
    angle.is_finite().then_some(angle)
}
