//! Fitting the element's cooling to the builder's own bench readings.
//!
//! - **Airflow readings** (airflow, element voltage and current, ambient):
//!   each row gives the element's resistance R = V/I (Ohm's law), its
//!   temperature by inverting the design's resistance law, its power
//!   P = V·I (Joule's law) and so its conductance G = P/(T − T_a) (the
//!   lumped energy balance in steady state). King's law G = A + B·Uⁿ
//!   (L. V. King, Phil. Trans. R. Soc. A 214 (1914) 373) is fitted to the
//!   conductances by weighted nonlinear least squares (weights 1/G²: equal
//!   relative uncertainty) with the Levenberg–Marquardt
//!   method (K. Levenberg, Q. Appl. Math. 2 (1944) 164; D. W. Marquardt,
//!   J. SIAM 11 (1963) 431), started from the best n of a profile over n
//!   with A and B linear.
//! - **Still-air readings** (element current and voltage, ambient): the
//!   resistance at two or more currents. The model R = s·R_law(T_a + P/A)
//!   (the design's law scaled by s, the element at T_a + P/A in still air)
//!   gives the law's scale (so R0) and the still-air conductance A.
//!
//! Standard errors come from the covariance s²·(JᵀJ)⁻¹ at the optimum with
//! s² = SSR/(m − p) (the linearised least-squares covariance: N. R. Draper
//! & H. Smith, *Applied Regression Analysis*, 3rd ed., Wiley 1998, ch. 24);
//! the 95 % intervals use Student's t with m − p degrees of freedom.

use crate::element::ResistanceLaw;

/// Why a fit could not be made.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum FitError {
    /// Too few readings for the parameters.
    #[error("{found} readings cannot determine {params} parameters with an uncertainty: give at least {needed}")]
    TooFew {
        /// Rows found.
        found: usize,
        /// Parameters fitted.
        params: usize,
        /// Rows needed.
        needed: usize,
    },
    /// The readings do not vary enough to determine a parameter.
    #[error("the readings cannot determine {what}: {why}")]
    Undetermined {
        /// Which parameter.
        what: &'static str,
        /// Why.
        why: String,
    },
    /// A reading is not usable.
    #[error("reading {row}: {why}")]
    BadReading {
        /// Row number (1 = first data row).
        row: usize,
        /// Why.
        why: String,
    },
    /// The iteration did not converge.
    #[error("the fit did not converge after {iterations} iterations (last relative change {change:.2e}); check the readings for a wrong unit or a mislabelled column")]
    NoConvergence {
        /// Iterations run.
        iterations: usize,
        /// Last relative change of the sum of squares.
        change: f64,
    },
}

/// One airflow reading.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AirflowReading {
    /// Airflow, m/s.
    pub airflow_m_per_s: f64,
    /// Element voltage, V.
    pub voltage_v: f64,
    /// Element current, A.
    pub current_a: f64,
    /// Ambient, K.
    pub ambient_k: f64,
}

/// One still-air reading.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StillAirReading {
    /// Element current, A.
    pub current_a: f64,
    /// Element voltage, V.
    pub voltage_v: f64,
    /// Ambient, K.
    pub ambient_k: f64,
}

/// A residual row: what was measured, what the fit gives.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct Residual {
    /// Airflow, m/s (0 for still-air readings).
    pub airflow_m_per_s: f64,
    /// The measured quantity (conductance W/K, or resistance ohm).
    pub measured: f64,
    /// The fitted one.
    pub fitted: f64,
    /// Measured less fitted.
    pub residual: f64,
}

/// King's law fitted to airflow readings.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct KingFit {
    /// A, W/K.
    pub a_w_per_k: f64,
    /// Its standard error, W/K.
    pub a_stderr_w_per_k: f64,
    /// B, W/K (at 1 m/s).
    pub b_w_per_k: f64,
    /// Its standard error, W/K.
    pub b_stderr_w_per_k: f64,
    /// n.
    pub n: f64,
    /// Its standard error.
    pub n_stderr: f64,
    /// Covariance of (A, B, n), SI.
    pub covariance: [[f64; 3]; 3],
    /// Residuals of the conductances, W/K.
    pub residuals: Vec<Residual>,
    /// Lowest and highest airflow read, m/s.
    pub airflow_range_m_per_s: [f64; 2],
    /// Degrees of freedom (readings less parameters).
    pub degrees_of_freedom: usize,
    /// Student's t for the 95 % intervals at those degrees of freedom.
    pub t95: f64,
}

/// R0 and A fitted to still-air readings.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct StillAirFit {
    /// The law's R0 (its resistance at its reference temperature), ohm.
    pub r0_ohm: f64,
    /// Its standard error, ohm.
    pub r0_stderr_ohm: f64,
    /// Still-air conductance (the dissipation constant), W/K.
    pub a_w_per_k: f64,
    /// Its standard error, W/K.
    pub a_stderr_w_per_k: f64,
    /// Covariance of (R0, A), SI.
    pub covariance: [[f64; 2]; 2],
    /// Residuals of the resistances, ohm.
    pub residuals: Vec<Residual>,
    /// Degrees of freedom.
    pub degrees_of_freedom: usize,
    /// Student's t for the 95 % intervals.
    pub t95: f64,
}

/// Largest Levenberg–Marquardt iterations.
const LM_ITERATIONS: usize = 200;

/// Solve a small symmetric positive system by Gaussian elimination with
/// partial pivoting; `None` when singular.
fn solve<const P: usize>(mut a: [[f64; P]; P], mut b: [f64; P]) -> Option<[f64; P]> {
    for c in 0..P {
        let piv = (c..P).max_by(|&i, &j| a[i][c].abs().total_cmp(&a[j][c].abs()))?;
        if a[piv][c].abs() < 1e-300 || !a[piv][c].is_finite() {
            return None;
        }
        a.swap(c, piv);
        b.swap(c, piv);
        for r in c + 1..P {
            let f = a[r][c] / a[c][c];
            let pivot_row = a[c];
            for (x, p) in a[r].iter_mut().zip(pivot_row.iter()).skip(c) {
                *x -= f * p;
            }
            b[r] -= f * b[c];
        }
    }
    let mut x = [0.0; P];
    for c in (0..P).rev() {
        let mut s = b[c];
        for k in c + 1..P {
            s -= a[c][k] * x[k];
        }
        x[c] = s / a[c][c];
    }
    Some(x)
}

/// The inverse of a small matrix, column by column.
fn invert<const P: usize>(a: [[f64; P]; P]) -> Option<[[f64; P]; P]> {
    let mut inv = [[0.0; P]; P];
    for c in 0..P {
        let mut e = [0.0; P];
        e[c] = 1.0;
        let col = solve(a, e)?;
        for r in 0..P {
            inv[r][c] = col[r];
        }
    }
    Some(inv)
}

/// An optimum: the parameters, JᵀJ there and the sum of squares.
type Optimum<const P: usize> = ([f64; P], [[f64; P]; P], f64);

/// Levenberg–Marquardt on residuals `r(p)` with Jacobian `j(p)` (rows of
/// ∂model/∂p): returns the optimum, the final JᵀJ and the SSR.
fn levenberg_marquardt<const P: usize>(
    mut p: [f64; P],
    residuals: impl Fn(&[f64; P]) -> Vec<f64>,
    jacobian: impl Fn(&[f64; P]) -> Vec<[f64; P]>,
) -> Result<Optimum<P>, FitError> {
    let ssr = |r: &[f64]| r.iter().map(|x| x * x).sum::<f64>();
    let mut r = residuals(&p);
    let mut s = ssr(&r);
    let mut lambda = 1e-3;
    let mut change = f64::INFINITY;
    for _ in 0..LM_ITERATIONS {
        let j = jacobian(&p);
        let mut jtj = [[0.0; P]; P];
        let mut jtr = [0.0; P];
        for (row, ri) in j.iter().zip(&r) {
            for a in 0..P {
                jtr[a] += row[a] * ri;
                for b in 0..P {
                    jtj[a][b] += row[a] * row[b];
                }
            }
        }
        let mut improved = false;
        for _ in 0..30 {
            let mut m = jtj;
            for (d, row) in m.iter_mut().enumerate() {
                row[d] += lambda * jtj[d][d].max(1e-300);
            }
            let Some(step) = solve(m, jtr) else {
                lambda *= 10.0;
                continue;
            };
            let mut trial = p;
            for a in 0..P {
                trial[a] += step[a];
            }
            let rt = residuals(&trial);
            let st = ssr(&rt);
            if st.is_finite() && st <= s {
                change = (s - st) / s.max(1e-300);
                p = trial;
                r = rt;
                s = st;
                lambda = (lambda / 10.0).max(1e-12);
                improved = true;
                break;
            }
            lambda *= 10.0;
        }
        if !improved || change < 1e-14 {
            let j = jacobian(&p);
            let mut jtj = [[0.0; P]; P];
            for row in &j {
                for a in 0..P {
                    for b in 0..P {
                        jtj[a][b] += row[a] * row[b];
                    }
                }
            }
            return Ok((p, jtj, s));
        }
    }
    Err(FitError::NoConvergence {
        iterations: LM_ITERATIONS,
        change,
    })
}

/// King's model and its Jacobian row at airflow `u`: G = A + B·uⁿ;
/// ∂G/∂n = B·uⁿ·ln u (0 at u = 0, the limit).
fn king_row(p: &[f64; 3], u: f64) -> (f64, [f64; 3]) {
    let un = if u > 0.0 { u.powf(p[2]) } else { 0.0 };
    let dn = if u > 0.0 { p[1] * un * u.ln() } else { 0.0 };
    (p[0] + p[1] * un, [1.0, un, dn])
}

/// A and B by linear least squares at a given n, and the SSR.
fn linear_ab(points: &[(f64, f64)], n: f64) -> Option<(f64, f64, f64)> {
    let mut a = [[0.0; 2]; 2];
    let mut b = [0.0; 2];
    for &(u, g) in points {
        let x = if u > 0.0 { u.powf(n) } else { 0.0 };
        let w = 1.0 / (g * g);
        a[0][0] += w;
        a[0][1] += w * x;
        a[1][0] += w * x;
        a[1][1] += w * x * x;
        b[0] += w * g;
        b[1] += w * x * g;
    }
    let [aa, bb] = solve(a, b)?;
    let ssr = points
        .iter()
        .map(|&(u, g)| {
            let x = if u > 0.0 { u.powf(n) } else { 0.0 };
            ((g - aa - bb * x) / g).powi(2)
        })
        .sum();
    Some((aa, bb, ssr))
}

/// Fit King's law to (airflow, conductance) points.
pub fn fit_king(points: &[(f64, f64)]) -> Result<KingFit, FitError> {
    let m = points.len();
    if m < 4 {
        return Err(FitError::TooFew {
            found: m,
            params: 3,
            needed: 4,
        });
    }
    if let Some(i) = points
        .iter()
        .position(|&(u, g)| !(g > 0.0 && g.is_finite() && u >= 0.0 && u.is_finite()))
    {
        return Err(FitError::BadReading {
            row: i + 1,
            why: "a conductance must be finite and above zero at an airflow of at least zero"
                .into(),
        });
    }
    let mut distinct: Vec<f64> = points.iter().map(|p| p.0).filter(|&u| u > 0.0).collect();
    distinct.sort_by(f64::total_cmp);
    distinct.dedup_by(|a, b| (*a - *b).abs() <= 1e-9 * b.abs());
    if distinct.len() < 2 || distinct[distinct.len() - 1] < 1.5 * distinct[0] {
        return Err(FitError::Undetermined {
            what: "King's exponent n",
            why: "it needs readings at two or more airflows above zero, the highest at least 1.5 times the lowest".into(),
        });
    }
    // Profile over n in (0.05, 1.5] for a start, then LM on all three.
    let mut best = (f64::INFINITY, 0.45);
    for i in 1..=145 {
        let n = 0.01 * f64::from(i) + 0.04;
        if let Some((_, _, s)) = linear_ab(points, n) {
            if s < best.0 {
                best = (s, n);
            }
        }
    }
    let (a0, b0, _) = linear_ab(points, best.1).ok_or(FitError::Undetermined {
        what: "A and B",
        why: "the airflows do not vary".into(),
    })?;
    // Each reading weighted by 1/G²: equal relative uncertainty of the
    // conductances (their error comes mostly from the rise T − T_a, which
    // scales with them).
    let (p, jtj, ssr) = levenberg_marquardt(
        [a0, b0, best.1],
        |p| {
            points
                .iter()
                .map(|&(u, g)| (g - king_row(p, u).0) / g)
                .collect()
        },
        |p| {
            points
                .iter()
                .map(|&(u, g)| king_row(p, u).1.map(|x| x / g))
                .collect()
        },
    )?;
    if !(p[2] > 0.0 && p[2] <= 1.0) {
        return Err(FitError::Undetermined {
            what: "King's exponent n",
            why: format!(
                "the readings give n = {:.3}, outside King's law's 0 < n ≤ 1: check the airflows and the element's resistance law, or read over a wider airflow range",
                p[2]
            ),
        });
    }
    if p[0] < 0.0 {
        return Err(FitError::Undetermined {
            what: "King's A",
            why: format!(
                "the readings give a negative still-air conductance ({:.3e} W/K): add readings at low airflow (still air if possible)",
                p[0]
            ),
        });
    }
    let dof = m - 3;
    let s2 = ssr / dof as f64;
    let inv = invert(jtj).ok_or(FitError::Undetermined {
        what: "the parameters' uncertainties",
        why:
            "the readings leave A, B and n correlated beyond separation; spread the airflows wider"
                .into(),
    })?;
    let mut cov = [[0.0; 3]; 3];
    for (r, row) in cov.iter_mut().enumerate() {
        for (c, x) in row.iter_mut().enumerate() {
            *x = s2 * inv[r][c];
        }
    }
    let lo = points.iter().map(|p| p.0).fold(f64::INFINITY, f64::min);
    let hi = points.iter().map(|p| p.0).fold(f64::NEG_INFINITY, f64::max);
    Ok(KingFit {
        a_w_per_k: p[0],
        a_stderr_w_per_k: cov[0][0].max(0.0).sqrt(),
        b_w_per_k: p[1],
        b_stderr_w_per_k: cov[1][1].max(0.0).sqrt(),
        n: p[2],
        n_stderr: cov[2][2].max(0.0).sqrt(),
        covariance: cov,
        residuals: points
            .iter()
            .map(|&(u, g)| {
                let f = king_row(&p, u).0;
                Residual {
                    airflow_m_per_s: u,
                    measured: g,
                    fitted: f,
                    residual: g - f,
                }
            })
            .collect(),
        airflow_range_m_per_s: [lo, hi],
        degrees_of_freedom: dof,
        t95: student_t_quantile(0.975, dof as f64),
    })
}

/// The conductances of airflow readings through the design's resistance
/// law: (airflow, G) for each row.
pub fn conductances(
    law: &ResistanceLaw,
    readings: &[AirflowReading],
) -> Result<Vec<(f64, f64)>, FitError> {
    readings
        .iter()
        .enumerate()
        .map(|(i, r)| {
            let bad = |why: String| FitError::BadReading { row: i + 1, why };
            if !(r.current_a > 0.0 && r.voltage_v > 0.0) {
                return Err(bad("the element's voltage and current must be above zero".into()));
            }
            let res = r.voltage_v / r.current_a;
            let t = law.temperature_for_resistance(res).ok_or(bad(format!(
                "{res:.4} ohm lies outside what the design's resistance law reaches"
            )))?;
            if t <= r.ambient_k + 1.0 {
                return Err(bad(format!(
                    "the element is at {:.1} °C, within 1 K of the ambient {:.1} °C: it is not heated enough to measure its cooling (or the resistance law's R0 does not match this element)",
                    t - 273.15,
                    r.ambient_k - 273.15
                )));
            }
            Ok((r.airflow_m_per_s, r.voltage_v * r.current_a / (t - r.ambient_k)))
        })
        .collect()
}

/// Fit the law's scale (so R0) and the still-air conductance to still-air
/// readings.
pub fn fit_still_air(
    law: &ResistanceLaw,
    readings: &[StillAirReading],
) -> Result<StillAirFit, FitError> {
    let m = readings.len();
    if m < 3 {
        return Err(FitError::TooFew {
            found: m,
            params: 2,
            needed: 3,
        });
    }
    let powers: Vec<f64> = readings.iter().map(|r| r.voltage_v * r.current_a).collect();
    let (pmin, pmax) = powers
        .iter()
        .fold((f64::INFINITY, 0.0f64), |(a, b), &p| (a.min(p), b.max(p)));
    if pmax <= 2.0 * pmin || !pmax.is_finite() {
        return Err(FitError::Undetermined {
            what: "the still-air conductance",
            why: "it needs readings whose powers differ at least twofold (currents differing by 1.5× or more)".into(),
        });
    }
    for (i, r) in readings.iter().enumerate() {
        if !(r.current_a > 0.0 && r.voltage_v > 0.0) {
            return Err(FitError::BadReading {
                row: i + 1,
                why: "the element's voltage and current must be above zero".into(),
            });
        }
    }
    let model = |p: &[f64; 2], r: &StillAirReading| {
        let t = r.ambient_k + r.voltage_v * r.current_a / p[1];
        p[0] * law.resistance_ohm(t)
    };
    // Start: the law's own scale, A from the two extreme readings' rise.
    let lowest = readings
        .iter()
        .min_by(|a, b| (a.current_a).total_cmp(&b.current_a))
        .copied()
        .unwrap_or(readings[0]);
    let s0 = (lowest.voltage_v / lowest.current_a) / law.resistance_ohm(lowest.ambient_k);
    let a0 = {
        let hottest = readings
            .iter()
            .max_by(|a, b| (a.voltage_v * a.current_a).total_cmp(&(b.voltage_v * b.current_a)))
            .copied()
            .unwrap_or(readings[0]);
        let r = hottest.voltage_v / hottest.current_a / s0;
        law.temperature_for_resistance(r)
            .map(|t| hottest.voltage_v * hottest.current_a / (t - hottest.ambient_k).max(0.1))
            .unwrap_or(1e-3)
    };
    let h = |x: f64| 1e-6 * x.abs().max(1e-12);
    let (p, jtj, ssr) = levenberg_marquardt(
        [s0, a0],
        |p| {
            readings
                .iter()
                .map(|r| r.voltage_v / r.current_a - model(p, r))
                .collect()
        },
        |p| {
            readings
                .iter()
                .map(|r| {
                    let d0 = (model(&[p[0] + h(p[0]), p[1]], r)
                        - model(&[p[0] - h(p[0]), p[1]], r))
                        / (2.0 * h(p[0]));
                    let d1 = (model(&[p[0], p[1] + h(p[1])], r)
                        - model(&[p[0], p[1] - h(p[1])], r))
                        / (2.0 * h(p[1]));
                    [d0, d1]
                })
                .collect()
        },
    )?;
    let dof = m - 2;
    let s2 = ssr / dof as f64;
    let inv = invert(jtj).ok_or(FitError::Undetermined {
        what: "R0 and A",
        why: "the readings do not separate them; spread the currents wider".into(),
    })?;
    let r0_law = law.resistance_ohm(law_reference_k(law));
    let cov_s = [
        [s2 * inv[0][0], s2 * inv[0][1]],
        [s2 * inv[1][0], s2 * inv[1][1]],
    ];
    // R0 = s·R_law(T_ref): its covariance scales with R_law(T_ref).
    let covariance = [
        [cov_s[0][0] * r0_law * r0_law, cov_s[0][1] * r0_law],
        [cov_s[1][0] * r0_law, cov_s[1][1]],
    ];
    Ok(StillAirFit {
        r0_ohm: p[0] * r0_law,
        r0_stderr_ohm: covariance[0][0].max(0.0).sqrt(),
        a_w_per_k: p[1],
        a_stderr_w_per_k: covariance[1][1].max(0.0).sqrt(),
        covariance,
        residuals: readings
            .iter()
            .map(|r| {
                let f = model(&p, r);
                let meas = r.voltage_v / r.current_a;
                Residual {
                    airflow_m_per_s: 0.0,
                    measured: meas,
                    fitted: f,
                    residual: meas - f,
                }
            })
            .collect(),
        degrees_of_freedom: dof,
        t95: student_t_quantile(0.975, dof as f64),
    })
}

/// The temperature a law's R0 (the `r0` of the design file) refers to, K:
/// a linear law's t0, 0 °C for platinum (IEC 60751's R0), a tungsten
/// wire's or a beta thermistor's own reference temperature, and 25 °C for
/// the others (the thermistor convention).
pub fn law_reference_k(law: &ResistanceLaw) -> f64 {
    match law {
        ResistanceLaw::Linear(l) => l.t0_k(),
        ResistanceLaw::Platinum(_) => 273.15,
        ResistanceLaw::Tungsten(w) => w.reference_temperature_k(),
        ResistanceLaw::Beta(b) => b.t0_k(),
        _ => 298.15,
    }
}

/// The regularized incomplete beta function I_x(a, b) by its continued
/// fraction (W. H. Press et al., *Numerical Recipes*, 3rd ed., CUP 2007,
/// §6.4, eqs. 6.4.5–6.4.6; Lentz's method).
fn incomplete_beta(x: f64, a: f64, b: f64) -> f64 {
    if x <= 0.0 {
        return 0.0;
    }
    if x >= 1.0 {
        return 1.0;
    }
    let ln_front = ln_gamma(a + b) - ln_gamma(a) - ln_gamma(b) + a * x.ln() + b * (1.0 - x).ln();
    let cf = |x: f64, a: f64, b: f64| {
        let tiny = 1e-300;
        let (qab, qap, qam) = (a + b, a + 1.0, a - 1.0);
        let mut c = 1.0;
        let mut d = 1.0 - qab * x / qap;
        if d.abs() < tiny {
            d = tiny;
        }
        d = 1.0 / d;
        let mut h = d;
        for m in 1..300 {
            let m = f64::from(m);
            let m2 = 2.0 * m;
            let aa = m * (b - m) * x / ((qam + m2) * (a + m2));
            d = 1.0 + aa * d;
            if d.abs() < tiny {
                d = tiny;
            }
            c = 1.0 + aa / c;
            if c.abs() < tiny {
                c = tiny;
            }
            d = 1.0 / d;
            h *= d * c;
            let aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
            d = 1.0 + aa * d;
            if d.abs() < tiny {
                d = tiny;
            }
            c = 1.0 + aa / c;
            if c.abs() < tiny {
                c = tiny;
            }
            d = 1.0 / d;
            let del = d * c;
            h *= del;
            if (del - 1.0).abs() < 1e-15 {
                break;
            }
        }
        h
    };
    if x < (a + 1.0) / (a + b + 2.0) {
        ln_front.exp() * cf(x, a, b) / a
    } else {
        1.0 - ln_front.exp() * cf(1.0 - x, b, a) / b
    }
}

/// ln Γ(x) by the Lanczos approximation (g = 7, n = 9; C. Lanczos, J. SIAM
/// Numer. Anal. B 1 (1964) 86; coefficients as widely tabulated).
fn ln_gamma(x: f64) -> f64 {
    const G: [f64; 9] = [
        0.999_999_999_999_809_9,
        676.520_368_121_885_1,
        -1_259.139_216_722_402_8,
        771.323_428_777_653_1,
        -176.615_029_162_140_6,
        12.507_343_278_686_905,
        -0.138_571_095_265_720_12,
        9.984_369_578_019_572e-6,
        1.505_632_735_149_311_6e-7,
    ];
    if x < 0.5 {
        let pi = std::f64::consts::PI;
        return (pi / (pi * x).sin()).ln() - ln_gamma(1.0 - x);
    }
    let x = x - 1.0;
    let mut a = G[0];
    let t = x + 7.5;
    for (i, g) in G.iter().enumerate().skip(1) {
        a += g / (x + i as f64);
    }
    0.5 * (2.0 * std::f64::consts::PI).ln() + (x + 0.5) * t.ln() - t + a.ln()
}

/// Student's t cumulative distribution: F(t) = 1 − ½·I_{ν/(ν+t²)}(ν/2, ½)
/// for t ≥ 0 (Abramowitz & Stegun 26.7.1 with 26.5.27).
pub fn student_t_cdf(t: f64, dof: f64) -> f64 {
    let tail = 0.5 * incomplete_beta(dof / (dof + t * t), 0.5 * dof, 0.5);
    if t >= 0.0 {
        1.0 - tail
    } else {
        tail
    }
}

/// The quantile of Student's t, by bisection on the distribution function.
pub fn student_t_quantile(p: f64, dof: f64) -> f64 {
    if !(dof > 0.0 && p > 0.0 && p < 1.0) {
        return f64::NAN;
    }
    let (mut lo, mut hi) = (-1e3, 1e3);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if student_t_cdf(mid, dof) < p {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn student_t_matches_the_table() {
        // NIST/SEMATECH e-Handbook of Statistical Methods, Table 1.3.6.7.2
        // (upper critical values of Student's t), 0.975 column: ν = 1:
        // 12.706, ν = 7: 2.365, ν = 30: 2.042; ν → ∞: 1.960 (the normal).
        for (dof, t) in [(1.0, 12.706), (7.0, 2.365), (30.0, 2.042), (1e7, 1.960)] {
            let q = student_t_quantile(0.975, dof);
            assert!((q - t).abs() < 1.5e-3, "ν = {dof}: {q} against {t}");
        }
    }

    #[test]
    fn ln_gamma_of_known_values() {
        // Γ(5) = 4! = 24; Γ(½) = √π (any table of the gamma function).
        assert!((ln_gamma(5.0) - 24f64.ln()).abs() < 1e-12);
        assert!((ln_gamma(0.5) - std::f64::consts::PI.sqrt().ln()).abs() < 1e-12);
    }

    #[test]
    fn king_fit_recovers_exact_constants() {
        // Noise-free readings of G = 1 mW/K + 2 mW/K·U^0.45 (invented
        // constants): the fit returns them.
        let pts: Vec<(f64, f64)> = [0.0, 0.1, 0.3, 0.6, 1.0, 2.0, 4.0]
            .iter()
            .map(|&u: &f64| (u, 1e-3 + 2e-3 * u.powf(0.45)))
            .collect();
        let f = fit_king(&pts).unwrap();
        assert!((f.a_w_per_k - 1e-3).abs() < 1e-10, "{f:?}");
        assert!((f.b_w_per_k - 2e-3).abs() < 1e-10);
        assert!((f.n - 0.45).abs() < 1e-8);
    }

    #[test]
    fn too_few_or_too_alike_readings_are_refused() {
        let pts = [(0.0, 1e-3), (1.0, 3e-3), (2.0, 3.7e-3)];
        assert!(matches!(fit_king(&pts), Err(FitError::TooFew { .. })));
        let same = [(1.0, 3e-3), (1.0, 3.01e-3), (1.0, 2.99e-3), (1.0, 3e-3)];
        assert!(matches!(
            fit_king(&same),
            Err(FitError::Undetermined { .. })
        ));
    }
}

/// The `fit` report: the constants, their uncertainties, the residuals and
/// a paste-ready section.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct FitReport {
    /// Layout version.
    pub schema_version: u32,
    /// draftwire's version.
    pub tool_version: String,
    /// The readings file.
    pub readings_file: String,
    /// The design file whose resistance law was used.
    pub design_file: String,
    /// `airflow` or `still-air`.
    pub kind: String,
    /// Readings used.
    pub readings: usize,
    /// King's law, for airflow readings.
    #[serde(flatten)]
    pub king: Option<KingFit>,
    /// R0 and A, for still-air readings.
    #[serde(flatten)]
    pub still_air: Option<StillAirFit>,
    /// The section to paste into the design file.
    pub section: String,
}

/// A quantity in the file's notation with its unit, four significant
/// figures.
fn q(x: f64, unit: &str) -> String {
    crate::quantity::format_engineering(x, unit, 4)
}

/// The airflow term's 95 % relative interval at airflow `u`:
/// t·σ(B·uⁿ)/(B·uⁿ), σ² = gᵀ·cov·g with g = (uⁿ, B·uⁿ·ln u) over (B, n)
/// (first-order propagation of the fit's covariance, Draper & Smith ch. 24).
pub fn airflow_term_interval(f: &KingFit, u: f64) -> f64 {
    if u <= 0.0 {
        return 0.0;
    }
    let un = u.powf(f.n);
    let g = [un, f.b_w_per_k * un * u.ln()];
    let c = &f.covariance;
    let var = g[0] * g[0] * c[1][1] + 2.0 * g[0] * g[1] * c[1][2] + g[1] * g[1] * c[2][2];
    f.t95 * var.max(0.0).sqrt() / (f.b_w_per_k * un).abs().max(1e-300)
}

/// Largest `[spread] cooling` tolerance the design file takes.
pub const SPREAD_COOLING_MAX: f64 = 0.5;

/// The paste-ready `[element.cooling]` section of a King fit, recording the
/// calibrated range, and the `[spread]` cooling tolerance that carries the
/// airflow term's 95 % uncertainty at the trip airflow `u_trip` into
/// `draftwire spread`.
pub fn king_section(f: &KingFit, u_trip: f64) -> String {
    let rel = airflow_term_interval(f, u_trip);
    let capped = rel > SPREAD_COOLING_MAX;
    let rel_b = rel.min(SPREAD_COOLING_MAX);
    format!(
        "[element.cooling]\nlaw = \"king\"\na = \"{}\"    # ± {} (one standard error)\nb = \"{}\"    # ± {}\nn = {:.4}    # ± {:.4}\ncalibrated_range = [\"{} m/s\", \"{} m/s\"]\n\n[spread]\ncooling = \"{:.1} %\"    # the airflow term's 95 % interval at the trip airflow ({u_trip} m/s) from the fit (t = {:.3}, {} degrees of freedom){}\n",
        q(f.a_w_per_k, "W/K"),
        q(f.a_stderr_w_per_k, "W/K"),
        q(f.b_w_per_k, "W/K"),
        q(f.b_stderr_w_per_k, "W/K"),
        f.n,
        f.n_stderr,
        f.airflow_range_m_per_s[0],
        f.airflow_range_m_per_s[1],
        100.0 * rel_b,
        f.t95,
        f.degrees_of_freedom,
        if capped {
            format!(
                "; the interval is {:.0} %, capped at the file's 50 % limit: read more points near the trip airflow",
                100.0 * rel
            )
        } else {
            String::new()
        }
    )
}

/// The paste-ready lines of a still-air fit.
pub fn still_air_section(f: &StillAirFit, law: &ResistanceLaw) -> String {
    let t0 = law_reference_k(law) - 273.15;
    format!(
        "# [element.resistance]: the law's r0 (its resistance at {t0} °C) from the fit\nr0 = \"{}\"    # ± {} (one standard error)\nt0 = \"{t0} degC\"    # for a law that takes t0\n# [element.cooling]: King's A (or a data sheet's dissipation constant) from the fit\na = \"{}\"    # ± {}\n",
        q(f.r0_ohm, "ohm"),
        q(f.r0_stderr_ohm, "ohm"),
        q(f.a_w_per_k, "W/K"),
        q(f.a_stderr_w_per_k, "W/K"),
    )
}
