use super::*;
use crate::physics::thiem::{jacob_correction, thiem_drawdown};
use approx::assert_relative_eq;

const DAY: f64 = 86_400.0;

fn confined() -> TransientAquifer {
    TransientAquifer::Confined {
        transmissivity: 1e-3,
        storativity: 1e-4,
    }
}

fn one_well(schedule: Vec<(f64, f64)>) -> TransientModel {
    let src = TransientSource {
        x: 0.0,
        y: 0.0,
        schedule: RateSchedule::new(schedule).unwrap(),
        sign: 1.0,
    };
    TransientModel::new(confined(), 0.1, vec![src]).unwrap()
}

#[test]
fn step_rate_increase() {
    // library: scipy exp1 (checks.md §14): T = 1e-3, S = 1e-4, r = 30 m; 0.01 m³/s from 0,
    // 0.02 m³/s from 1 day; drawdown at 2 days 12.768652 m
    let m = one_well(vec![(0.0, 0.01), (DAY, 0.02)]);
    assert_relative_eq!(
        m.drawdown_at([30.0, 0.0], 2.0 * DAY),
        12.768652,
        max_relative = 1e-6
    );
}

#[test]
fn recovery_after_switch_off() {
    // library: scipy exp1 (checks.md §14): 0.01 m³/s for 1 day, then off; residual drawdown at
    // 1.5 days 0.873972 m
    let m = one_well(vec![(0.0, 0.01), (DAY, 0.0)]);
    assert_relative_eq!(
        m.drawdown_at([0.0, 30.0], 1.5 * DAY),
        0.873972,
        max_relative = 1e-6
    );
}

#[test]
fn time_to_reach_two_metres() {
    // library: scipy exp1 (checks.md §14): 0.01 m³/s from 0 first reaches 2.0 m at 471.960 s
    let m = one_well(vec![(0.0, 0.01)]);
    let t = m.time_to_reach([30.0, 0.0], 2.0, 10.0 * DAY).unwrap();
    assert!((t - 471.960).abs() < 5e-4, "t = {t}");
    // never reached within a short window (common practice (no source): None, not a guess)
    assert!(m.time_to_reach([30.0, 0.0], 2.0, 400.0).is_none());
    assert!(m.time_to_reach([30.0, 0.0], f64::NAN, 400.0).is_none());
}

#[test]
fn ten_days_theis_and_thiem_with_cooper_jacob_radius() {
    // library: scipy exp1 (checks.md §14): at 10 days Theis 7.940736 m; Thiem with
    // R = √(2.25 T t / S) 7.942189 m (Cooper & Jacob 1946)
    let m = one_well(vec![(0.0, 0.01)]);
    let t = 10.0 * DAY;
    assert_relative_eq!(m.drawdown_at([30.0, 0.0], t), 7.940736, max_relative = 1e-6);
    let r = cooper_jacob_radius(1e-3, t, 1e-4);
    assert_relative_eq!(
        thiem_drawdown(0.01, 1e-3, 30.0, r),
        7.942189,
        max_relative = 1e-6
    );
}

fn imaged(sign: f64) -> TransientModel {
    let sched = RateSchedule::constant(0.0, 0.01).unwrap();
    let real = TransientSource {
        x: 50.0,
        y: 0.0,
        schedule: sched.clone(),
        sign: 1.0,
    };
    let image = TransientSource {
        x: -50.0,
        y: 0.0,
        schedule: sched,
        sign,
    };
    TransientModel::new(confined(), 0.1, vec![real, image]).unwrap()
}

#[test]
fn images_constant_head_and_barrier() {
    // library: scipy exp1 (checks.md §8; method Ferris et al. 1962, USGS WSP 1536-E):
    // Q = 0.01, T = 1e-3, S = 1e-4, t = 1 day, well at (50, 0), boundary x = 0
    let head = imaged(-1.0);
    assert_relative_eq!(
        head.drawdown_at([25.0, 0.0], DAY),
        1.74734,
        max_relative = 1e-5
    );
    assert_relative_eq!(
        head.drawdown_at([50.0, 20.0], DAY),
        2.59041,
        max_relative = 1e-5
    );
    let wall = imaged(1.0);
    assert_relative_eq!(
        wall.drawdown_at([25.0, 0.0], DAY),
        11.05004,
        max_relative = 1e-6
    );
    assert_relative_eq!(
        wall.drawdown_at([50.0, 20.0], DAY),
        10.91716,
        max_relative = 1e-6
    );
    // on a constant-head line the drawdown is 0 (Ferris et al. 1962)
    assert!(head.drawdown_at([0.0, 37.0], DAY).abs() < 1e-12);
}

#[test]
fn fetter_single_point() {
    // Inputs from Fetter, Applied Hydrogeology; value library (anaflow `theis` 5.71867 m),
    // checks.md §5, tolerance 1e-3
    let aq = TransientAquifer::Confined {
        transmissivity: 14.9 * 20.1 / DAY,
        storativity: 0.0051,
    };
    let src = TransientSource {
        x: 0.0,
        y: 0.0,
        schedule: RateSchedule::constant(0.0, 2725.0 / DAY).unwrap(),
        sign: 1.0,
    };
    let m = TransientModel::new(aq, 0.1, vec![src]).unwrap();
    assert_relative_eq!(m.drawdown_at([7.0, 0.0], DAY), 5.719, max_relative = 1e-3);
}

#[test]
fn leaky_reaches_the_hantush_table() {
    // library: scipy quad W(u, r/B) (checks.md §2): W(0.1, 0.5) = 1.4421957
    let (t_m2s, s, b, q) = (1e-3, 1e-4, 200.0, 0.01);
    let r = 0.5 * b;
    let t = r * r * s / (4.0 * t_m2s * 0.1);
    let aq = TransientAquifer::Leaky {
        transmissivity: t_m2s,
        storativity: s,
        leakage_factor: b,
    };
    let src = TransientSource {
        x: 0.0,
        y: 0.0,
        schedule: RateSchedule::constant(0.0, q).unwrap(),
        sign: 1.0,
    };
    let m = TransientModel::new(aq, 0.1, vec![src]).unwrap();
    let scale = q / (4.0 * PI * t_m2s);
    assert_relative_eq!(
        m.drawdown_at([r, 0.0], t) / scale,
        1.4421957,
        max_relative = 1e-6
    );
}

#[test]
fn unconfined_uses_jacob_inverse() {
    // Jacob's correction values (checks.md §4, welltestpy 1.2.0 / Jacob 1944 from memory):
    // real s = 2 with b = 10 has corrected s' = 1.80; so a linear Theis drawdown of 1.80 m
    // (library: scipy exp1, W(0.1) = 1.8229240, checks.md §1) must come out as 2 m.
    let (k, h, sy) = (1e-4, 10.0, 0.1);
    let t_m2s = k * h;
    let target_w = 1.8229240; // u = 0.1
    let q = 1.80 * 4.0 * PI * t_m2s / target_w;
    let r = 20.0;
    let t = r * r * sy / (4.0 * t_m2s * 0.1);
    let aq = TransientAquifer::Unconfined {
        conductivity: k,
        saturated_thickness: h,
        specific_yield: sy,
    };
    let src = TransientSource {
        x: 0.0,
        y: 0.0,
        schedule: RateSchedule::constant(0.0, q).unwrap(),
        sign: 1.0,
    };
    let m = TransientModel::new(aq, 0.1, vec![src]).unwrap();
    let s = m.drawdown_at([r, 0.0], t);
    assert_relative_eq!(s, 2.0, max_relative = 1e-6);
    assert_relative_eq!(jacob_correction(s, h), 1.80, max_relative = 1e-6);
    // pumped dry: 2s' > H gives H, not NaN (common practice (no source))
    assert_eq!(aq.real_drawdown(6.0), h);
}

#[test]
fn unit_response_is_linear_in_rates() {
    // superposition (Theis 1935): the matrix times the rates gives the drawdown; check against
    // the published-formula values of checks.md §8 (barrier: 11.05004 m at (25, 0), Q = 0.01)
    let aq = confined();
    let wells = vec![(0.0, vec![[50.0, 0.0, 1.0], [-50.0, 0.0, 1.0]])];
    let m = aq.unit_response(0.1, &[[25.0, 0.0], [50.0, 20.0]], &wells, DAY);
    assert_relative_eq!(0.01 * m[0][0], 11.05004, max_relative = 1e-6);
    assert_relative_eq!(0.01 * m[1][0], 10.91716, max_relative = 1e-6);
    // before the well starts: nothing
    let late = vec![(2.0 * DAY, vec![[50.0, 0.0, 1.0]])];
    assert_eq!(aq.unit_response(0.1, &[[25.0, 0.0]], &late, DAY)[0][0], 0.0);
}

#[test]
fn batched_matches_single_and_guards() {
    // library values of checks.md §14 through the batched call
    let m = one_well(vec![(0.0, 0.01), (DAY, 0.02)]);
    let d = m.drawdowns(&[[30.0, 0.0], [1e6, 0.0]], &[2.0 * DAY, -1.0, f64::NAN]);
    assert_relative_eq!(d[0][0], 12.768652, max_relative = 1e-6);
    // before pumping, far away (u > 700) and NaN time: 0, never NaN (common practice (no source))
    assert_eq!(d[0][1], 0.0);
    assert_eq!(d[1][0], 0.0);
    assert_eq!(d[0][2], 0.0);
    // inside the well radius the well radius is used: finite
    assert!(m.drawdown_at([0.0, 0.0], DAY).is_finite());
    assert_eq!(
        m.drawdown_at([0.0, 0.0], DAY),
        m.drawdown_at([0.1, 0.0], DAY)
    );
}

#[test]
fn bad_input_names_the_field() {
    assert!(RateSchedule::new(vec![]).is_err());
    let e = RateSchedule::new(vec![(10.0, 0.01), (5.0, 0.0)]).unwrap_err();
    assert!(e.contains("step 2"), "{e}");
    let e = RateSchedule::new(vec![(0.0, f64::NAN)]).unwrap_err();
    assert!(e.contains("rate"), "{e}");
    let aq = TransientAquifer::Confined {
        transmissivity: -1.0,
        storativity: 1e-4,
    };
    let e = TransientModel::new(aq, 0.1, vec![]).unwrap_err();
    assert!(e.contains("transmissivity"), "{e}");
    let e = TransientModel::new(confined(), 0.0, vec![]).unwrap_err();
    assert!(e.contains("well_radius"), "{e}");
    let s = RateSchedule::new(vec![(0.0, 0.01), (10.0, 0.02), (20.0, 0.0)]).unwrap();
    assert_eq!(s.rate_at(15.0), 0.02);
    assert_eq!(s.rate_at(-1.0), 0.0);
    assert!(!s.is_non_decreasing());
}
