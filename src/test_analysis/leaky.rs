//! Hantush–Jacob leaky fit, and the test that decides whether the data show leakage at all.
//!
//! s = Q/(4πT)·W(u, r/B) (Hantush & Jacob 1955; Kruseman & de Ridder 1994, §4.2), fitted by
//! Levenberg–Marquardt on log10 T, log10 S, log10 B from the Theis fit with B = 1, 3, 10 and 30
//! times the largest distance, keeping the best. B is searched between 0.05·r_min (drawdown
//! vanishes) and B_max = max(1000·√(T·t_max/S), 100·r_max): beyond B_max the leakage changes
//! the drawdown by less than about 1e-6 of itself during the test (W(u, β) − E₁(u) ≈
//! β²/(4u) for small β, i.e. T·t/(B²·S)), so the data cannot tell it from Theis.
//!
//! **No leakage detected** (the fit is refused, with no aquitard line to offer) when B ends on
//! B_max, or when the extra parameter does not improve the fit significantly: the F test for one
//! added parameter, F = (SSR_Theis − SSR_Hantush)/σ², σ² = SSR_Hantush/(n − 3) but at least
//! the square of a reading resolution of 0.1 mm (common practice (no source)), against the 95 %
//! point of F(1, n − 3) (e.g. Draper & Smith, *Applied Regression Analysis*, 3rd ed. 1998,
//! §6.1, extra sum of squares, from memory).

use super::prepare::{plausible, prepare, S_SEARCH, T_SEARCH};
use super::{check_data, finish, flatten, lm, theis_lsq, too_few, Fit, Method, PumpingTestData};
use crate::physics::special::{exp1, hantush_w};
use std::f64::consts::PI;

/// Reading resolution below which misfits are not told apart, m.
const RESOLUTION: f64 = 1e-4;
/// Iteration cap of each Hantush start.
const MAX_ITER: usize = 100;

/// 95 % point of Fisher's F with (1, ν) degrees of freedom, = t²(0.975, ν). ν ≤ 5 from the
/// published table (Fisher & Yates, *Statistical Tables*, from memory); above, Student's t by
/// the Cornish–Fisher expansion in 1/ν (Abramowitz & Stegun 1964, 26.7.5), z = 1.959964.
pub fn f95_one(nu: usize) -> f64 {
    const TABLE: [f64; 5] = [161.45, 18.51, 10.13, 7.71, 6.61];
    if nu == 0 {
        return f64::INFINITY;
    }
    if nu <= 5 {
        return TABLE[nu - 1];
    }
    let z: f64 = 1.959_964;
    let n = nu as f64;
    let g1 = (z.powi(3) + z) / 4.0;
    let g2 = (5.0 * z.powi(5) + 16.0 * z.powi(3) + 3.0 * z) / 96.0;
    let g3 = (3.0 * z.powi(7) + 19.0 * z.powi(5) + 17.0 * z.powi(3) - 15.0 * z) / 384.0;
    let g4 = (79.0 * z.powi(9) + 776.0 * z.powi(7) + 1482.0 * z.powi(5)
        - 1920.0 * z.powi(3)
        - 945.0 * z)
        / 92_160.0;
    let t = z + g1 / n + g2 / (n * n) + g3 / n.powi(3) + g4 / n.powi(4);
    t * t
}

/// Hantush–Jacob leaky fit of T (m²/s), S and B (m); `Err` says "no leakage detected" when the
/// data do not show leakage (see the module docs), or why no fit could be made.
pub fn fit_hantush(data: &PumpingTestData) -> Result<Fit, String> {
    let name = Method::Hantush.name();
    check_data(data, true)?;
    let prep = prepare(flatten(data));
    let pts = &prep.points;
    too_few(pts.len(), 4, name)?;
    let q = data.rate;
    let theis = theis_lsq(data, &prep, Method::Theis)?;
    let (t_th, s_th) = (
        theis.transmissivity.value,
        theis.storativity.map_or(1e-4, |e| e.value),
    );
    let r_min = data
        .wells
        .iter()
        .map(|w| w.distance)
        .fold(f64::INFINITY, f64::min);
    let r_max = data.wells.iter().map(|w| w.distance).fold(0.0, f64::max);
    let t_max = pts.iter().map(|p| p.t).fold(0.0, f64::max);
    let b_max = (1e3 * (t_th * t_max / s_th).sqrt()).max(100.0 * r_max);
    let b_box = ((0.05 * r_min).log10(), b_max.log10());
    let f = |p: &[f64], out: &mut [f64]| {
        let tr = 10f64.powf(p[0]);
        let s = 10f64.powf(p[1]);
        let b = 10f64.powf(p[2]);
        let scale = q / (4.0 * PI * tr);
        for (o, pt) in out.iter_mut().zip(pts) {
            let w = hantush_w(pt.r2 * s / (4.0 * tr * pt.t), pt.r2.sqrt() / b);
            *o = pt.w.sqrt() * (scale * w - pt.s);
        }
    };
    let cost = |o: &lm::LmOutcome| o.residuals.iter().map(|v| v * v).sum::<f64>();
    let mut best: Option<lm::LmOutcome> = None;
    for k in [1.0, 3.0, 10.0, 30.0] {
        let p0 = [t_th.log10(), s_th.log10(), (k * r_max).log10()];
        let bounds = [T_SEARCH, S_SEARCH, b_box];
        if let Some(o) = lm::minimise(f, &p0, &bounds, pts.len(), MAX_ITER) {
            if best.as_ref().is_none_or(|b| cost(&o) < cost(b)) {
                best = Some(o);
            }
        }
    }
    let out = best.ok_or_else(|| format!("{name}: the model is not finite at any first guess"))?;
    let b = 10f64.powf(out.params[2]);
    match out.at_bound[2] {
        1 => {
            return Err(format!(
                "no leakage detected: the fit runs B out to its limit of {b_max:.3e} m, where leakage would change the drawdown by less than a millionth during the test; use the Theis fit (no aquitard resistance to offer)"
            ))
        }
        -1 => {
            return Err(format!(
                "leakage factor not determined: B would be below {:.3} m (0.05 × the nearest distance), where no drawdown would reach the observation wells",
                10f64.powf(b_box.0)
            ))
        }
        _ => {}
    }
    let ssr_h = cost(&out);
    let scale = q / (4.0 * PI * t_th);
    let ssr_t: f64 = pts
        .iter()
        .map(|p| p.w * (scale * exp1(p.r2 * s_th / (4.0 * t_th * p.t)) - p.s).powi(2))
        .sum();
    let dof = pts.len() - 3;
    let var = (ssr_h / dof as f64).max(RESOLUTION * RESOLUTION);
    let f_stat = (ssr_t - ssr_h).max(0.0) / var;
    let crit = f95_one(dof);
    // crit may be ∞ (no degrees of freedom left); a NaN statistic shows nothing either
    if f_stat.is_nan() || f_stat < crit {
        return Err(format!(
            "no leakage detected: the Theis curve fits these data as well (F = {f_stat:.2} for the leakage term, below its 95 % value {crit:.2}); B would be {b:.3e} m; use the Theis fit (no aquitard resistance to offer)"
        ));
    }
    let mut fit = plausible(finish(data, Method::Hantush, &prep, out, 3))?;
    fit.notes.push(format!(
        "leakage shown by the data: F = {f_stat:.1} above its 95 % value {crit:.2} (one more parameter than Theis)"
    ));
    for w in &data.wells {
        fit.notes
            .push(format!("r/B at '{}' = {:.4}", w.name, w.distance / b));
    }
    Ok(fit)
}
