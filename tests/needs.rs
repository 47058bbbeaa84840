//! Needs that say what they mean (resolution-model §5): a smallest detail (`need`, compared with
//! the governing limit, a separation) and a required GSD (`needgsd`), each on the target's own
//! plane (`tplane`): the ground, where an oblique look stretches the along-view figure by 1/cos θ,
//! or an upright plane facing the camera, stretched by 1/cos ε = 1/sin θ (plain geometry).

use sharpfield::core::contract::report::report_for_query;
use sharpfield::core::physics::engine::Limit;
use sharpfield::core::planning::solve::{FocalNeed, Reach, TargetPlane};

/// The 1-type 20 MP camera behind an 8.8 mm lens at f/4, no air, still: p = 13.2 mm / 5472.
const CAMERA: &str = "sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&wl=550&air=none&speed=0";
const PITCH: f64 = 13.2e-3 / 5472.0;

fn close(actual: f64, expected: f64, relative: f64, what: &str) {
    assert!(
        (actual - expected).abs() <= relative * expected.abs(),
        "{what}: {actual} vs {expected}"
    );
}

#[test]
fn a_required_gsd_sets_the_greatest_height_and_the_lens_by_hand() {
    // Nadir, GSD = p·h/f ≤ 2 cm ⇒ h ≤ 0.02 · 8.8 mm / p = 72.96 m; at 80 m the lens must be at
    // least p · 80 m / 0.02 m = 9.65 mm (GIQE 5.0 §2.3, by hand).
    let r = report_for_query(&format!("{CAMERA}&h=80&needgsd=0.02"));
    assert_eq!(r.target_plane, TargetPlane::Ground);
    close(r.plane_stretch, 1.0, 1e-12, "straight down");
    match r.reach {
        Some(Reach::UpTo { position_m, bound_by }) => {
            close(position_m, 0.02 * 8.8e-3 / PITCH, 1e-6, "greatest height");
            assert_eq!(bound_by, Limit::Sampling);
        }
        other => panic!("{other:?}"),
    }
    match r.focal_needed {
        Some(FocalNeed::AtLeast { focal_m, bound_by }) => {
            close(focal_m, PITCH * 80.0 / 0.02, 1e-12, "focal length");
            assert_eq!(bound_by, Limit::Sampling);
        }
        other => panic!("{other:?}"),
    }
}

#[test]
fn both_needs_must_be_met_and_the_tighter_one_sets_the_reach() {
    // A 5 cm detail needs 2·GSD ≤ 5 cm (h ≤ 91.2 m, sampling governs without air); a 2 cm GSD
    // needs h ≤ 73.0 m: together the GSD sets the reach.
    let detail = report_for_query(&format!("{CAMERA}&h=80&need=0.05"))
        .reach_m
        .expect("a reach");
    let both = report_for_query(&format!("{CAMERA}&h=80&need=0.05&needgsd=0.02"))
        .reach_m
        .expect("a reach");
    close(detail, 0.05 / 2.0 * 8.8e-3 / PITCH, 1e-6, "detail alone");
    close(both, 0.02 * 8.8e-3 / PITCH, 1e-6, "both");
}

#[test]
fn an_oblique_look_is_judged_on_the_ground() {
    // The case: a 5 cm need at a tilt of 85° was "met up to 14 m" in the plane normal to
    // the view, while the GSD on the ground along the view is 11.5 times longer (1/cos 85°). On
    // the ground, 2·p·(h/cos θ)/f/cos θ ≤ 5 cm gives h ≤ 0.05·f·cos²θ/(2p) = 0.69 m.
    let cos = 85f64.to_radians().cos();
    let r = report_for_query(&format!("{CAMERA}&h=80&tilt=85&need=0.05"));
    assert_eq!(r.target_plane, TargetPlane::Ground);
    close(r.plane_stretch, 1.0 / cos, 1e-9, "1/cos θ");
    close(
        r.gsd_on_plane_m,
        r.gsd_ground_m,
        1e-9,
        "GSD on the ground along the view",
    );
    close(
        r.detail_on_plane_m,
        r.limit_m / cos,
        1e-9,
        "the governing limit on the ground",
    );
    let reach = r.reach_m.expect("a reach");
    close(
        reach,
        0.05 * 8.8e-3 * cos * cos / (2.0 * PITCH),
        1e-6,
        "greatest height",
    );
}

#[test]
fn a_camera_looking_across_judges_an_upright_target() {
    // The fence-mast geometry: 8 m up, 1.5 km out; upright plane facing the camera, stretch
    // 1/sin θ = R/g (θ from straight down), barely above 1.
    let base = "sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&h=8&gd=1500&need=0.1";
    let r = report_for_query(base);
    assert_eq!(r.target_plane, TargetPlane::Upright);
    close(r.plane_stretch, 8f64.hypot(1500.0) / 1500.0, 1e-9, "R/g");
    // Said otherwise, the same need on the ground is stretched by R/h = 187.5 times.
    let ground = report_for_query(&format!("{base}&tplane=ground"));
    assert_eq!(ground.target_plane, TargetPlane::Ground);
    close(ground.plane_stretch, 8f64.hypot(1500.0) / 8.0, 1e-9, "R/h");
    assert!(ground.reach_m.unwrap_or(0.0) < r.reach_m.unwrap_or(f64::MAX));
}

#[test]
fn an_unknown_plane_is_named_and_the_view_decides() {
    let r = report_for_query(&format!("{CAMERA}&h=80&tplane=sideways"));
    let error = r.errors.iter().find(|e| e.key == "tplane").expect("tplane is rejected");
    assert!(error.message.contains("ground or upright"), "{}", error.message);
    assert!(error.message.contains("follows the view"), "{}", error.message);
    assert_eq!(r.target_plane, TargetPlane::Ground);
}

#[test]
fn task_ranges_put_the_chance_at_50_and_80_percent() {
    // At each returned range the cycles across a 0.75 m person, dimension ÷ period on the plane,
    // equal N50 (50 %) and N50 · 1.452104 (80 %, resolution-model §6): re-evaluated there.
    for query in [
        "sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&h=8&gd=1500&tdim=0.75&air=none",
        "sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&h=8&gd=1500&tdim=0.75&air=power&cn2=1e-13",
        "sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&tdim=0.75&cdm=1d",
    ] {
        let r = report_for_query(query);
        assert_eq!(r.task_ranges.len(), 3, "{query}");
        for range in &r.task_ranges {
            for (position, ratio) in [(range.p50_m, 1.0), (range.p80_m, 1.452104)] {
                let Some(x) = position else { continue };
                let at = if query.contains("gd=") {
                    report_for_query(&format!("{query}&gd={x}").replacen("gd=1500&", "", 1))
                } else {
                    report_for_query(&format!("{query}&h={x}").replacen("h=80&", "", 1))
                };
                let cycles = at.target_cycles.expect("a target");
                close(
                    cycles,
                    range.cycles_needed * ratio,
                    1e-5,
                    &format!("{query}: {:?}", range.task),
                );
            }
            if let (Some(a), Some(b)) = (range.p50_m, range.p80_m) {
                assert!(b < a, "80 % is reached closer in than 50 %");
            }
        }
    }
}

#[test]
fn a_long_path_over_hot_ground_warns_of_strong_scintillation() {
    // 3 km at 1.5 m over hot ground (Cn² 1e-12 constant): σ_R² = 1.23·Cn²·k^(7/6)·L^(11/6) ≫ 1
    // (Andrews & Phillips 2005); the same path in weak air (1e-16) stays below 1.
    let base = "sw=6.17&sh=4.55&cols=4000&rows=3000&focal=300&fnum=4&wl=550&h=1.5&gd=3000&air=power&cexp=0";
    let hot = report_for_query(&format!("{base}&cn2=1e-12"));
    assert!(hot.rytov > 1.0, "{}", hot.rytov);
    assert!(hot.cautions.iter().any(|c| c.code == "scintillation"));
    let calm = report_for_query(&format!("{base}&cn2=1e-16"));
    assert!(calm.rytov < 1.0, "{}", calm.rytov);
    assert!(calm.cautions.iter().all(|c| c.code != "scintillation"));
}
