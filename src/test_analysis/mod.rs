//! Constant-rate pumping-test analysis: fit aquifer parameters to time–drawdown observations.
//!
//! Methods (Kruseman & de Ridder, *Analysis and Evaluation of Pumping Test Data*, 2nd ed. 1994):
//! - Theis (1935), confined: T and S by nonlinear least squares (Levenberg–Marquardt, [`lm`])
//!   on log10 T and log10 S (keeps both positive), all observation wells at once;
//! - Cooper–Jacob (1946) straight line s = 2.303Q/(4πT)·log10(2.25·T·t/(r²S)) on late data,
//!   all wells on one line in log10(t/r²); the earliest point used is reported with its u,
//!   which should be below 0.05;
//! - Hantush–Jacob (1955), leaky: T, S and B (r/B reported per well);
//! - unconfined: Theis on the drawdowns corrected with Jacob's s′ = s − s²/(2H) (Jacob 1944),
//!   giving T = K·H and S_y;
//! - Theis recovery: residual drawdown s′ against log10(t/t′), T = 2.303Q/(4π·Δs′);
//! - distance–drawdown at one time with several observation wells: s = 2.303Q/(2πT)·
//!   log10(R/r), S = 2.25·T·t/R² (Cooper & Jacob 1946).
//!
//! Standard errors from the Jacobian: cov = σ²·(JᵀJ)⁻¹, σ² = Σr²/(n − p), taken to T and S by
//! the delta method. Units SI inside: s, m, m³/s, m²/s.

pub mod csv_input;
pub mod leaky;
pub mod lm;
pub mod prepare;

pub use leaky::fit_hantush;

use crate::physics::special::{exp1, hantush_w};
use prepare::{plausible, prepare, Point, Prepared, S_SEARCH, T_SEARCH};
use std::f64::consts::{LN_10, PI};

/// One observation well: its distance from the pumped well and its (time s, drawdown m) data.
#[derive(Debug, Clone, PartialEq)]
pub struct ObservationWell {
    /// Name, for messages and charts.
    pub name: String,
    /// Distance r from the pumped well, m.
    pub distance: f64,
    /// (time since pumping started s, drawdown m), or for recovery (time since the pump
    /// stopped s, residual drawdown m).
    pub points: Vec<(f64, f64)>,
}

/// A constant-rate test.
#[derive(Debug, Clone, PartialEq)]
pub struct PumpingTestData {
    /// Constant rate Q, m³/s (abstraction, > 0).
    pub rate: f64,
    /// Observation wells.
    pub wells: Vec<ObservationWell>,
    /// Saturated thickness H (unconfined) or aquifer thickness b, m: needed for Jacob's
    /// correction, and used to turn T into K in [`aquifer_lines`].
    pub thickness: Option<f64>,
}

/// The analysis method of a fit.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Method {
    /// Theis type curve, least squares.
    Theis,
    /// Cooper–Jacob straight line on late data.
    CooperJacob,
    /// Hantush–Jacob leaky type curves, least squares.
    Hantush,
    /// Theis on Jacob-corrected drawdowns (unconfined).
    TheisUnconfined,
    /// Theis recovery straight line.
    TheisRecovery,
    /// Distance–drawdown straight line at one time.
    DistanceDrawdown,
}

impl Method {
    /// Name for reports.
    pub fn name(self) -> &'static str {
        match self {
            Method::Theis => "Theis",
            Method::CooperJacob => "Cooper–Jacob",
            Method::Hantush => "Hantush–Jacob (leaky)",
            Method::TheisUnconfined => "Theis with Jacob's correction (unconfined)",
            Method::TheisRecovery => "Theis recovery",
            Method::DistanceDrawdown => "distance–drawdown",
        }
    }
}

/// A value with its standard error, SI.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Estimate {
    /// Best value.
    pub value: f64,
    /// Standard error (1σ); 0 when the data fit exactly, `f64::INFINITY` is never returned:
    /// an undetermined error is reported as `None` on the fit instead.
    pub std_error: f64,
}

/// Result of one analysis.
#[derive(Debug, Clone, PartialEq)]
pub struct Fit {
    /// Method.
    pub method: Method,
    /// Rate of the test, m³/s.
    pub rate: f64,
    /// Transmissivity T, m²/s.
    pub transmissivity: Estimate,
    /// Storativity S (S_y when unconfined); `None` for recovery.
    pub storativity: Option<Estimate>,
    /// Leakage factor B, m (Hantush).
    pub leakage_factor: Option<Estimate>,
    /// Thickness from the input, m.
    pub thickness: Option<f64>,
    /// Root mean square of the residuals, m.
    pub rms: f64,
    /// Points used.
    pub points_used: usize,
    /// Iterations (least squares) or 0 (straight lines).
    pub iterations: usize,
    /// u at the earliest point used (Cooper–Jacob), dimensionless.
    pub earliest_u: Option<f64>,
    /// Time of the distance–drawdown line, s.
    pub at_time: Option<f64>,
    /// Warnings and remarks (validity of the straight line, convergence).
    pub notes: Vec<String>,
}

impl Fit {
    /// Drawdown of the fitted model at distance r (m) and time t (s), m; 0 where undefined.
    /// Theis/Hantush curves; Cooper–Jacob line (0 beyond its zero); unconfined: Theis with T
    /// and S_y then Jacob's correction undone (s = H − √(H² − 2Hs′)).
    pub fn model_drawdown(&self, r: f64, t: f64) -> f64 {
        let tr = self.transmissivity.value;
        let q = self.rate;
        let Some(s) = self.storativity.map(|e| e.value) else {
            return 0.0;
        };
        if !(t > 0.0 && r > 0.0 && t.is_finite()) {
            return 0.0;
        }
        let u = r * r * s / (4.0 * tr * t);
        let v = match self.method {
            Method::Theis | Method::DistanceDrawdown => q / (4.0 * PI * tr) * exp1(u),
            Method::CooperJacob => {
                (q / (4.0 * PI * tr) * (-0.577_215_664_901_532_9 - u.ln())).max(0.0)
            }
            Method::Hantush => {
                let b = self.leakage_factor.map_or(f64::INFINITY, |e| e.value);
                q / (4.0 * PI * tr) * hantush_w(u, r / b)
            }
            Method::TheisUnconfined => {
                let lin = q / (4.0 * PI * tr) * exp1(u);
                let h = self.thickness.unwrap_or(f64::INFINITY);
                crate::physics::thiem::jacob_uncorrect(lin, h).unwrap_or(h)
            }
            Method::TheisRecovery => 0.0,
        };
        if v.is_finite() {
            v
        } else {
            0.0
        }
    }
}

fn check_data(data: &PumpingTestData, allow_zero_drawdown: bool) -> Result<(), String> {
    if !(data.rate.is_finite() && data.rate > 0.0) {
        return Err(format!(
            "rate = {} m³/s: the test rate must be a finite abstraction rate greater than 0",
            data.rate
        ));
    }
    if data.wells.is_empty() {
        return Err(
            "wells: at least one observation well with (time, drawdown) data is needed".into(),
        );
    }
    if let Some(h) = data.thickness {
        if !(h.is_finite() && h > 0.0) {
            return Err(format!(
                "thickness = {h} m: must be a finite number greater than 0"
            ));
        }
    }
    for w in &data.wells {
        if !(w.distance.is_finite() && w.distance > 0.0) {
            return Err(format!(
                "observation well '{}': distance {} m must be greater than 0 (the pumped well itself needs its well losses; give the distance of the observation well)",
                w.name, w.distance
            ));
        }
        for (i, &(t, s)) in w.points.iter().enumerate() {
            if !(t.is_finite() && t > 0.0) {
                return Err(format!(
                    "observation well '{}', point {}: time {t} s must be after the start, > 0",
                    w.name,
                    i + 1
                ));
            }
            if !s.is_finite() || s < 0.0 || (!allow_zero_drawdown && s == 0.0) {
                return Err(format!(
                    "observation well '{}', point {}: drawdown {s} m must be a finite number {} (drawdown is positive downwards; a rise or a logger offset needs correcting first)",
                    w.name,
                    i + 1,
                    if allow_zero_drawdown { "≥ 0" } else { "> 0" }
                ));
            }
        }
    }
    Ok(())
}

fn too_few(n: usize, need: usize, what: &str) -> Result<(), String> {
    if n < need {
        Err(format!(
            "{what}: at least {need} (time, drawdown) points are needed, got {n}"
        ))
    } else {
        Ok(())
    }
}

/// Flattened (r², t, s) of all wells.
fn flatten(data: &PumpingTestData) -> Vec<(f64, f64, f64)> {
    data.wells
        .iter()
        .flat_map(|w| {
            let r2 = w.distance * w.distance;
            w.points.iter().map(move |&(t, s)| (r2, t, s))
        })
        .collect()
}

fn rms(res: &[f64]) -> f64 {
    (res.iter().map(|v| v * v).sum::<f64>() / res.len().max(1) as f64).sqrt()
}

/// Weighted least-squares line y = a + m·x (weights w, the readings each point stands for):
/// (intercept, slope, covariance of (intercept, slope), weighted residuals √w·(a + m·x − y)).
/// The variance of one reading is Σ w·r² / (points − 2); with two points the line is exact
/// and its covariance is reported as 0.
type LineFit = (f64, f64, [[f64; 2]; 2], Vec<f64>);

fn line_fit(x: &[f64], y: &[f64], w: &[f64]) -> Option<LineFit> {
    if x.len() < 2 {
        return None;
    }
    let sw: f64 = w.iter().sum();
    let mx = x.iter().zip(w).map(|(a, b)| a * b).sum::<f64>() / sw;
    let my = y.iter().zip(w).map(|(a, b)| a * b).sum::<f64>() / sw;
    let sxx: f64 = x.iter().zip(w).map(|(v, wi)| wi * (v - mx).powi(2)).sum();
    if sxx <= 1e-300 {
        return None;
    }
    let sxy: f64 = x
        .iter()
        .zip(y)
        .zip(w)
        .map(|((a, b), wi)| wi * (a - mx) * (b - my))
        .sum();
    let m = sxy / sxx;
    let a = my - m * mx;
    let res: Vec<f64> = x
        .iter()
        .zip(y)
        .zip(w)
        .map(|((xi, yi), wi)| wi.sqrt() * (a + m * xi - yi))
        .collect();
    let s2 = if x.len() > 2 {
        res.iter().map(|v| v * v).sum::<f64>() / (x.len() - 2) as f64
    } else {
        0.0
    };
    let var_m = s2 / sxx;
    let var_a = s2 * (1.0 / sw + mx * mx / sxx);
    let cov_am = -mx * s2 / sxx;
    Some((a, m, [[var_a, cov_am], [cov_am, var_m]], res))
}

fn ones(n: usize) -> Vec<f64> {
    vec![1.0; n]
}

/// Cooper–Jacob first guess (T, S) from the later half of the points; falls back to
/// T = 1e-3 m²/s, S = 1e-4 (common practice (no source)).
fn first_guess(pts: &[Point], q: f64) -> (f64, f64) {
    let mut v: Vec<(f64, f64)> = pts.iter().map(|p| ((p.t / p.r2).log10(), p.s)).collect();
    v.sort_by(|a, b| a.0.total_cmp(&b.0));
    let half = &v[v.len() / 2..];
    let x: Vec<f64> = half.iter().map(|p| p.0).collect();
    let y: Vec<f64> = half.iter().map(|p| p.1).collect();
    if let Some((a, m, _, _)) = line_fit(&x, &y, &ones(x.len())) {
        if m > 0.0 {
            let t = LN_10 * q / (4.0 * PI * m);
            let s = 2.25 * t * 10f64.powf(-a / m);
            if t.is_finite() && s.is_finite() && s > 1e-8 && s < 1.0 && t > 1e-10 && t < 100.0 {
                return (t, s);
            }
        }
    }
    (1e-3, 1e-4)
}

const MAX_ITER: usize = 300;

/// Refuse a record whose drawdowns are all zero: nothing to fit.
fn not_all_zero(pts: &[Point], method: Method) -> Result<(), String> {
    if pts.iter().all(|p| p.s <= 0.0) {
        return Err(format!(
            "{}: data too flat to fit T: every drawdown is 0 m",
            method.name()
        ));
    }
    Ok(())
}

fn estimate_log(value_log10: f64, var_log10: Option<f64>) -> Estimate {
    let value = 10f64.powf(value_log10);
    let se = var_log10
        .filter(|v| v.is_finite() && *v >= 0.0)
        .map_or(0.0, |v| value * LN_10 * v.sqrt());
    Estimate {
        value,
        std_error: se,
    }
}

fn theis_lsq(data: &PumpingTestData, prep: &Prepared, method: Method) -> Result<Fit, String> {
    let pts = &prep.points;
    too_few(pts.len(), 3, method.name())?;
    not_all_zero(pts, method)?;
    let q = data.rate;
    let (t0, s0) = first_guess(pts, q);
    let f = |p: &[f64], out: &mut [f64]| {
        let tr = 10f64.powf(p[0]);
        let s = 10f64.powf(p[1]);
        let scale = q / (4.0 * PI * tr);
        for (o, pt) in out.iter_mut().zip(pts) {
            *o = pt.w.sqrt() * (scale * exp1(pt.r2 * s / (4.0 * tr * pt.t)) - pt.s);
        }
    };
    let out = lm::minimise(
        f,
        &[t0.log10(), s0.log10()],
        &[T_SEARCH, S_SEARCH],
        pts.len(),
        MAX_ITER,
    )
    .ok_or_else(|| {
        format!(
            "{}: the model is not finite at the first guess",
            method.name()
        )
    })?;
    plausible(finish(data, method, prep, out, 2))
}

fn finish(
    data: &PumpingTestData,
    method: Method,
    prep: &Prepared,
    out: lm::LmOutcome,
    n_par: usize,
) -> Fit {
    let n = prep.points.len();
    let ssr: f64 = out.residuals.iter().map(|v| v * v).sum();
    let sigma2 = if n > n_par {
        ssr / (n - n_par) as f64
    } else {
        0.0
    };
    let var = |k: usize| out.jtj_inverse.as_ref().map(|c| sigma2 * c[(k, k)]);
    let mut notes = Vec::new();
    if !out.converged {
        notes.push(format!(
            "least squares stopped at the iteration limit ({MAX_ITER}) before its stopping test"
        ));
    }
    if out.jtj_inverse.is_none() {
        notes.push("parameters not independently determined by these data (singular JᵀJ): standard errors not available".into());
    }
    notes.extend(prep.note());
    Fit {
        method,
        rate: data.rate,
        transmissivity: estimate_log(out.params[0], var(0)),
        storativity: Some(estimate_log(out.params[1], var(1))),
        leakage_factor: (n_par > 2).then(|| estimate_log(out.params[2], var(2))),
        thickness: data.thickness,
        rms: prep.rms(&out.residuals),
        points_used: prep.readings,
        iterations: out.iterations,
        earliest_u: None,
        at_time: None,
        notes,
    }
}

/// Theis fit of T (m²/s) and S by Levenberg–Marquardt on log10 T, log10 S, all observation
/// wells together: s = Q/(4πT)·W(u), u = r²S/(4Tt). Source: Theis (1935); Kruseman & de Ridder
/// (1994), §3.2.1.
pub fn fit_theis(data: &PumpingTestData) -> Result<Fit, String> {
    check_data(data, true)?;
    theis_lsq(data, &prepare(flatten(data)), Method::Theis)
}

/// Unconfined: Theis on drawdowns corrected with Jacob's s′ = s − s²/(2H), H =
/// `data.thickness` (required); gives T = K·H and S_y. Source: Jacob (1944); Kruseman & de
/// Ridder (1994), §5.1 (Neuman's delayed yield is not modelled: use late data).
pub fn fit_theis_unconfined(data: &PumpingTestData) -> Result<Fit, String> {
    check_data(data, true)?;
    let h = data.thickness.ok_or_else(|| {
        "thickness: the saturated thickness H (m) is needed for Jacob's correction".to_string()
    })?;
    let mut pts = flatten(data);
    for p in pts.iter_mut() {
        if p.2 >= h {
            return Err(format!(
                "drawdown {} m is not below the saturated thickness {h} m: Jacob's correction does not apply",
                p.2
            ));
        }
        p.2 = crate::physics::thiem::jacob_correction(p.2, h);
    }
    let mut fit = theis_lsq(data, &prepare(pts), Method::TheisUnconfined)?;
    fit.notes
        .push("residuals are in Jacob-corrected drawdown s′ = s − s²/(2H) (Jacob 1944)".into());
    Ok(fit)
}

/// Cooper–Jacob straight line on late data, all wells on one line in x = log10(t/r²):
/// s = 2.303Q/(4πT)·log10(2.25·T·t/(r²S)), so T = 2.303Q/(4π·m) with m the slope per log
/// cycle and S = 2.25·T·10^(x₀) where the line crosses s = 0. Source: Cooper & Jacob (1946);
/// Kruseman & de Ridder (1994), §3.2.2.
///
/// Late data: starting from all points, the earliest (smallest t/r²) is dropped while its
/// u = r²S/(4Tt) is 0.05 or more and more than 3 points remain. The u at the earliest point
/// used is reported; a note says so when it is still ≥ 0.05 (the line is then not valid).
pub fn fit_cooper_jacob(data: &PumpingTestData) -> Result<Fit, String> {
    check_data(data, true)?;
    let q = data.rate;
    let prep = prepare(flatten(data));
    let mut v: Vec<(f64, f64, f64)> = prep
        .points
        .iter()
        .map(|p| ((p.t / p.r2).log10(), p.s, p.w))
        .collect();
    v.sort_by(|a, b| a.0.total_cmp(&b.0));
    too_few(v.len(), 3, Method::CooperJacob.name())?;
    let start = late_start(&v)?;
    let x: Vec<f64> = v[start..].iter().map(|p| p.0).collect();
    let y: Vec<f64> = v[start..].iter().map(|p| p.1).collect();
    let w: Vec<f64> = v[start..].iter().map(|p| p.2).collect();
    let (a, m, cov, res) = line_fit(&x, &y, &w)
        .ok_or("Cooper–Jacob: the points do not span more than one time/distance²")?;
    if m.is_nan() || m <= 0.0 {
        return Err("Cooper–Jacob: drawdown does not increase with time on the late data".into());
    }
    let tr = LN_10 * q / (4.0 * PI * m);
    let s = 2.25 * tr * 10f64.powf(-a / m);
    let u_first = s / (4.0 * tr * 10f64.powf(x[0]));
    // delta method: ln T = c − ln m; ln S = ln 2.25 + ln T − (a/m)·ln 10
    let se_t = tr * cov[1][1].max(0.0).sqrt() / m;
    let g = [-LN_10 / m, -1.0 / m + a * LN_10 / (m * m)];
    let var_ln_s =
        g[0] * g[0] * cov[0][0] + 2.0 * g[0] * g[1] * cov[0][1] + g[1] * g[1] * cov[1][1];
    let used: f64 = w.iter().sum();
    let mut notes = vec![format!(
        "earliest point used has u = {u_first:.4} ({used:.0} of {} readings used)",
        prep.readings
    )];
    if u_first >= 0.05 {
        notes.push("u ≥ 0.05 at the earliest point used: the straight line is not yet valid (Cooper & Jacob 1946); use later data or the Theis fit".into());
    }
    notes.extend(prep.note());
    plausible(Fit {
        method: Method::CooperJacob,
        rate: q,
        transmissivity: Estimate {
            value: tr,
            std_error: se_t,
        },
        storativity: Some(Estimate {
            value: s,
            std_error: s * var_ln_s.max(0.0).sqrt(),
        }),
        leakage_factor: None,
        thickness: data.thickness,
        // over the readings used (bin means when binned)
        rms: (res.iter().map(|v| v * v).sum::<f64>() / used).sqrt(),
        points_used: used as usize,
        iterations: 0,
        earliest_u: Some(u_first),
        at_time: None,
        notes,
    })
}

/// The first of the points `v` (x = log10(t/r²), s, weight; sorted by x) kept for the
/// Cooper–Jacob line: the earliest is dropped while the line through the rest gives it
/// u ≥ 0.05 and more than 3 points remain. One pass from the end builds the weighted sums of
/// every tail (x taken about the mean for accuracy), so each candidate line costs O(1).
fn late_start(v: &[(f64, f64, f64)]) -> Result<usize, String> {
    let n = v.len();
    let x0 = v.iter().map(|p| p.0).sum::<f64>() / n as f64;
    // tails[k] = (Σw, Σwx, Σwy, Σwx², Σwxy) of v[k..]
    let mut tails = vec![[0.0f64; 5]; n + 1];
    for k in (0..n).rev() {
        let (x, y, w) = (v[k].0 - x0, v[k].1, v[k].2);
        let t = tails[k + 1];
        tails[k] = [
            t[0] + w,
            t[1] + w * x,
            t[2] + w * y,
            t[3] + w * x * x,
            t[4] + w * x * y,
        ];
    }
    for (start, t) in tails.iter().enumerate().take(n) {
        let [sw, sx, sy, sxx, sxy] = *t;
        let cxx = sxx - sx * sx / sw;
        if cxx <= 1e-300 {
            return Err("Cooper–Jacob: the points do not span more than one time/distance²".into());
        }
        let m = (sxy - sx * sy / sw) / cxx;
        if m.is_nan() || m <= 0.0 {
            return Err(
                "Cooper–Jacob: drawdown does not increase with time on the late data".into(),
            );
        }
        // s = 0 where x = x0 + (mean x) − (mean y)/m; u at the first point = 2.25/4·10^(x₀ − x).
        let x_zero = x0 + sx / sw - (sy / sw) / m;
        let u_first = 2.25 / 4.0 * 10f64.powf(x_zero - v[start].0);
        if !(u_first >= 0.05 && n - start > 3) {
            return Ok(start);
        }
    }
    Ok(n.saturating_sub(3))
}

/// Theis recovery: after pumping at Q for `pumping_time` (s), the residual drawdown s′ at time
/// t′ since the pump stopped is s′ = 2.303Q/(4πT)·log10(t/t′), t = pumping_time + t′, for small
/// u′. A line s′ = a + m·log10(t/t′) through the points with t′ ≥ `min_time_since_stop` (s)
/// gives T = 2.303Q/(4π·m); S is not obtained (Theis 1935; Kruseman & de Ridder 1994, §3.2.5).
/// The wells' points are (t′ s, s′ m). The intercept a (ideally 0) is in the notes.
pub fn fit_theis_recovery(
    data: &PumpingTestData,
    pumping_time: f64,
    min_time_since_stop: f64,
) -> Result<Fit, String> {
    check_data(data, true)?;
    if !(pumping_time.is_finite() && pumping_time > 0.0) {
        return Err(format!(
            "pumping_time = {pumping_time} s: the duration of pumping before recovery must be > 0"
        ));
    }
    let q = data.rate;
    let prep = prepare(
        flatten(data)
            .into_iter()
            .filter(|(_, tp, _)| *tp >= min_time_since_stop)
            .collect(),
    );
    let pts = &prep.points;
    let x: Vec<f64> = pts
        .iter()
        .map(|p| ((pumping_time + p.t) / p.t).log10())
        .collect();
    let y: Vec<f64> = pts.iter().map(|p| p.s).collect();
    let w: Vec<f64> = pts.iter().map(|p| p.w).collect();
    too_few(x.len(), 3, Method::TheisRecovery.name())?;
    let (a, m, cov, res) =
        line_fit(&x, &y, &w).ok_or("Theis recovery: the points do not span more than one t/t′")?;
    if m.is_nan() || m <= 0.0 {
        return Err("Theis recovery: residual drawdown does not fall as t/t′ falls".into());
    }
    let tr = LN_10 * q / (4.0 * PI * m);
    Ok(Fit {
        method: Method::TheisRecovery,
        rate: q,
        transmissivity: Estimate {
            value: tr,
            std_error: tr * cov[1][1].max(0.0).sqrt() / m,
        },
        storativity: None,
        leakage_factor: None,
        thickness: data.thickness,
        rms: prep.rms(&res),
        points_used: prep.readings,
        iterations: 0,
        earliest_u: None,
        at_time: None,
        notes: std::iter::once(format!(
            "line intercept at t/t′ = 1: {a:.4} m (0 for an ideal test)"
        ))
        .chain(prep.note())
        .collect(),
    })
    .and_then(plausible)
}

/// Drawdown of a well at time t by linear interpolation in log t; `None` outside its data.
fn interpolate_log(points: &[(f64, f64)], t: f64) -> Option<f64> {
    let mut p: Vec<(f64, f64)> = points.to_vec();
    p.sort_by(|a, b| a.0.total_cmp(&b.0));
    for w in p.windows(2) {
        let ((t1, s1), (t2, s2)) = (w[0], w[1]);
        if t >= t1 && t <= t2 {
            if t2 == t1 {
                return Some(s1);
            }
            let f = (t / t1).ln() / (t2 / t1).ln();
            return Some(s1 + f * (s2 - s1));
        }
    }
    p.last().filter(|l| l.0 == t).map(|l| l.1)
}

/// Distance–drawdown at one time with several observation wells: at the latest time all wells
/// cover (each interpolated linearly in log t), a line s = a − m·ln r gives T = Q/(2π·m), the
/// zero-drawdown distance R = exp(a/m) and S = 2.25·T·t/R². Source: Cooper & Jacob (1946);
/// Kruseman & de Ridder (1994), §3.2.2 (distance–drawdown); see also
/// [`crate::physics::pumping_test::distance_drawdown_fit`] for the steady form.
pub fn fit_distance_drawdown(data: &PumpingTestData) -> Result<Fit, String> {
    check_data(data, true)?;
    if data.wells.len() < 2 {
        return Err(format!(
            "distance–drawdown: at least 2 observation wells at different distances are needed, got {}",
            data.wells.len()
        ));
    }
    let t = data
        .wells
        .iter()
        .map(|w| w.points.iter().map(|p| p.0).fold(0.0, f64::max))
        .fold(f64::INFINITY, f64::min);
    let mut x = Vec::new();
    let mut y = Vec::new();
    for w in &data.wells {
        let s = interpolate_log(&w.points, t).ok_or_else(|| {
            format!(
                "distance–drawdown: observation well '{}' has no data around t = {t} s",
                w.name
            )
        })?;
        x.push(w.distance.ln());
        y.push(s);
    }
    let (a, slope, cov, res) = line_fit(&x, &y, &ones(x.len()))
        .ok_or("distance–drawdown: the observation wells must be at different distances")?;
    let m = -slope;
    if m.is_nan() || m <= 0.0 {
        return Err("distance–drawdown: drawdown does not fall with distance".into());
    }
    let tr = data.rate / (2.0 * PI * m);
    let r0 = (a / m).exp();
    let s = 2.25 * tr * t / (r0 * r0);
    // ln S = ln(2.25 t) + ln T − 2a/m; ∂/∂a = −2/m, ∂/∂slope (m = −slope): 1/m − 2a/m²
    let g = [-2.0 / m, 1.0 / m - 2.0 * a / (m * m)];
    let var_ln_s =
        g[0] * g[0] * cov[0][0] + 2.0 * g[0] * g[1] * cov[0][1] + g[1] * g[1] * cov[1][1];
    plausible(Fit {
        method: Method::DistanceDrawdown,
        rate: data.rate,
        transmissivity: Estimate {
            value: tr,
            std_error: tr * cov[1][1].max(0.0).sqrt() / m,
        },
        storativity: Some(Estimate {
            value: s,
            std_error: s * var_ln_s.max(0.0).sqrt(),
        }),
        leakage_factor: None,
        thickness: data.thickness,
        rms: rms(&res),
        points_used: x.len(),
        iterations: 0,
        earliest_u: None,
        at_time: Some(t),
        notes: std::iter::once(format!(
            "zero-drawdown distance R = {r0:.1} m at t = {t:.0} s"
        ))
        .chain((x.len() == 2).then(|| {
            "two wells: the line passes through both exactly, so its standard errors are not known (0 shown)".to_string()
        }))
        .collect(),
    })
}

fn sig(v: f64) -> String {
    format!("{v:.4e}")
}

/// TOML lines for a design file's `[aquifer]` section from a fit (field names and unit strings
/// as in `layouts/*.toml`): `kind`, `conductivity` (T divided by the thickness, when the test
/// data gave one), `storativity` or `specific_yield`, and `aquitard_resistance` c = B²/T for a
/// leaky fit. Values keep 4 significant figures; the standard errors are in comments. SI.
pub fn aquifer_lines(fit: &Fit) -> String {
    aquifer_lines_in(fit, crate::input::units::UnitSystem::Si)
}

/// [`aquifer_lines`] with lengths, transmissivity and conductivity written in `units` (US: ft,
/// ft2/d and ft/day, units the design file accepts; 1 ft = 0.3048 m, 1 day = 86 400 s, NIST
/// SP 811 (2008) App. B).
pub fn aquifer_lines_in(fit: &Fit, units: crate::input::units::UnitSystem) -> String {
    use crate::input::units::UnitSystem;
    const FOOT: f64 = 0.3048;
    let (lu, tu, ku, t_k, k_k) = match units {
        UnitSystem::Si => ("m", "m2/s", "m/s", 1.0, 1.0),
        UnitSystem::Us => (
            "ft",
            "ft2/d",
            "ft/day",
            86_400.0 / (FOOT * FOOT),
            86_400.0 / FOOT,
        ),
    };
    let len = |m: f64| sig(units.length(m));
    let tr = fit.transmissivity;
    let mut out = format!(
        "# from a {} analysis of a constant-rate pumping test: T = {} {tu} ± {} (1 s.e.), rms {:.3} {lu}\n",
        fit.method.name(),
        sig(tr.value * t_k),
        sig(tr.std_error * t_k),
        units.length(fit.rms)
    );
    let kind = match fit.method {
        Method::Hantush => "leaky",
        Method::TheisUnconfined => "unconfined",
        _ => "confined",
    };
    out.push_str(&format!("kind = \"{kind}\"\n"));
    match fit.thickness {
        Some(b) if (1e-9..=1.0).contains(&(tr.value / b)) => out.push_str(&format!(
            "conductivity = \"{} {ku}\"   # T / {} {lu}\n",
            sig(tr.value / b * k_k),
            len(b)
        )),
        Some(b) => out.push_str(&format!(
            "# conductivity: T / {} {lu} = {} {ku} is outside what a soil can have (1e-9 … 1 m/s; the design file refuses it): check the thickness\n",
            len(b),
            sig(tr.value / b * k_k)
        )),
        None => out.push_str(&format!(
            "# conductivity = T / thickness: T = {} {tu}; no thickness was given with the test\n",
            sig(tr.value * t_k)
        )),
    }
    if let Some(s) = fit.storativity {
        let key = if fit.method == Method::TheisUnconfined {
            "specific_yield"
        } else {
            "storativity"
        };
        out.push_str(&format!(
            "{key} = {}   # ± {}\n",
            sig(s.value),
            sig(s.std_error)
        ));
    } else {
        out.push_str("# storativity: not given by this method\n");
    }
    if let Some(b) = fit.leakage_factor {
        let c_days = b.value * b.value / tr.value / 86_400.0;
        out.push_str(&format!(
            "aquitard_resistance = \"{} days\"   # c = B²/T, B = {} {lu} ± {}\n",
            sig(c_days),
            len(b.value),
            len(b.std_error)
        ));
    }
    for n in &fit.notes {
        out.push_str(&format!("# note: {n}\n"));
    }
    out
}

#[cfg(test)]
mod tests;
