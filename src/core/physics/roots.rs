//! The one root finder of the core: where a continuous value changes sign in a bracket.

/// The last point of [`lo`, `hi`] where `value` is not negative (it is not negative at `lo` and is
/// negative at `hi`), to a relative width `tolerance`. The Illinois form of regula falsi (Dowell &
/// Jarratt, BIT 11, 1971): a handful of evaluations where bisection takes twenty or more. Each step
/// is kept a thousandth of the bracket inside its ends, an end without a finite value makes it
/// bisect, and halving the stale end's value keeps a value that jumps bracketed. A point where the
/// value is exactly zero is returned at once. At most 60 steps; never panics.
pub fn last_not_negative(mut lo: f64, mut hi: f64, value: impl Fn(f64) -> f64, tolerance: f64) -> f64 {
    let (mut v_lo, mut v_hi) = (value(lo), value(hi));
    let mut side = 0i8;
    for _ in 0..60 {
        let width = hi - lo;
        if width <= tolerance * hi {
            break;
        }
        let secant = if v_lo.is_finite() && v_hi.is_finite() && v_lo > v_hi {
            lo + width * v_lo / (v_lo - v_hi)
        } else {
            f64::NAN
        };
        let mid = if secant.is_finite() {
            secant.clamp(lo + 1e-3 * width, hi - 1e-3 * width)
        } else {
            0.5 * (lo + hi)
        };
        let v = value(mid);
        if v == 0.0 {
            return mid;
        }
        if v >= 0.0 {
            lo = mid;
            v_lo = v;
            if side == 1 {
                v_hi *= 0.5;
            }
            side = 1;
        } else {
            hi = mid;
            v_hi = v;
            if side == -1 {
                v_lo *= 0.5;
            }
            side = -1;
        }
    }
    lo
}
