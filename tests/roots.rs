//! The core's one root finder against a known constant and a value that jumps.

use sharpfield::core::physics::roots::last_not_negative;

#[test]
fn finds_the_dottie_number() {
    // cos x = x at 0.7390851332151607 (the Dottie number; OEIS A003957).
    let x = last_not_negative(0.0, 1.0, |x| x.cos() - x, 1e-15);
    assert!((x - 0.739_085_133_215_160_7).abs() < 1e-12, "{x}");
}

#[test]
fn brackets_a_jump_and_survives_values_that_are_not_numbers() {
    // A step from +1 to −1 at 0.3: the answer is the step, to the tolerance.
    let x = last_not_negative(0.0, 1.0, |x| if x <= 0.3 { 1.0 } else { -1.0 }, 1e-9);
    assert!((x - 0.3).abs() <= 1e-9, "{x}");
    // −∞ past 0.5 (a logarithm of zero): bisection steps still close in.
    let y = last_not_negative(
        0.0,
        1.0,
        |x| {
            if x <= 0.5 {
                (0.5 - x).ln() + 40.0
            } else {
                f64::NEG_INFINITY
            }
        },
        1e-9,
    );
    assert!(y <= 0.5 && y > 0.49, "{y}");
}
