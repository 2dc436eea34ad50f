//! Dormand–Prince 5(4): an explicit embedded Runge–Kutta pair with the
//! fifth-order solution propagated and the fourth-order one used for the
//! error estimate, first-same-as-last (J. R. Dormand & P. J. Prince, "A
//! family of embedded Runge–Kutta formulae", J. Comput. Appl. Math. 6 (1980)
//! 19–26; the tableau as printed in E. Hairer, S. P. Nørsett & G. Wanner,
//! *Solving Ordinary Differential Equations I*, 2nd ed., Springer 1993,
//! Table II.5.2). Step control: the standard controller
//! h_new = h·min(5, max(0.2, 0.9·err^(−1/5))) on the mixed
//! absolute/relative error norm of Hairer et al. §II.4, eq. (4.11).

/// Largest state the transient model needs (element, twin, reference node).
pub const MAX_STATE: usize = 4;

/// A state vector of at most [`MAX_STATE`] entries (no allocation).
pub type State = [f64; MAX_STATE];

/// Tolerances and step limits.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Tolerances {
    /// Relative tolerance.
    pub rtol: f64,
    /// Absolute tolerance per component (same units as the state).
    pub atol: State,
    /// Largest step, s.
    pub h_max: f64,
}

const C2: f64 = 1.0 / 5.0;
const C3: f64 = 3.0 / 10.0;
const C4: f64 = 4.0 / 5.0;
const C5: f64 = 8.0 / 9.0;
const A21: f64 = 1.0 / 5.0;
const A31: f64 = 3.0 / 40.0;
const A32: f64 = 9.0 / 40.0;
const A41: f64 = 44.0 / 45.0;
const A42: f64 = -56.0 / 15.0;
const A43: f64 = 32.0 / 9.0;
const A51: f64 = 19372.0 / 6561.0;
const A52: f64 = -25360.0 / 2187.0;
const A53: f64 = 64448.0 / 6561.0;
const A54: f64 = -212.0 / 729.0;
const A61: f64 = 9017.0 / 3168.0;
const A62: f64 = -355.0 / 33.0;
const A63: f64 = 46732.0 / 5247.0;
const A64: f64 = 49.0 / 176.0;
const A65: f64 = -5103.0 / 18656.0;
const A71: f64 = 35.0 / 384.0;
const A73: f64 = 500.0 / 1113.0;
const A74: f64 = 125.0 / 192.0;
const A75: f64 = -2187.0 / 6784.0;
const A76: f64 = 11.0 / 84.0;
// Error coefficients: fifth-order weights less fourth-order weights.
const E1: f64 = 71.0 / 57600.0;
const E3: f64 = -71.0 / 16695.0;
const E4: f64 = 71.0 / 1920.0;
const E5: f64 = -17253.0 / 339200.0;
const E6: f64 = 22.0 / 525.0;
const E7: f64 = -1.0 / 40.0;

fn axpy(n: usize, y: &State, terms: &[(f64, &State)], h: f64) -> State {
    let mut out = *y;
    for i in 0..n {
        let mut s = 0.0;
        for (c, k) in terms {
            s += c * k[i];
        }
        out[i] += h * s;
    }
    out
}

/// One Dormand–Prince step of size `h` from `(t, y)` with `k1 = f(t, y)`:
/// the fifth-order result, its derivative there (FSAL) and the error norm
/// (≤ 1 means accepted).
pub fn step(
    f: &mut impl FnMut(f64, &State) -> State,
    n: usize,
    t: f64,
    y: &State,
    k1: &State,
    h: f64,
    tol: &Tolerances,
) -> (State, State, f64) {
    let k2 = f(t + C2 * h, &axpy(n, y, &[(A21, k1)], h));
    let k3 = f(t + C3 * h, &axpy(n, y, &[(A31, k1), (A32, &k2)], h));
    let k4 = f(
        t + C4 * h,
        &axpy(n, y, &[(A41, k1), (A42, &k2), (A43, &k3)], h),
    );
    let k5 = f(
        t + C5 * h,
        &axpy(n, y, &[(A51, k1), (A52, &k2), (A53, &k3), (A54, &k4)], h),
    );
    let k6 = f(
        t + h,
        &axpy(
            n,
            y,
            &[(A61, k1), (A62, &k2), (A63, &k3), (A64, &k4), (A65, &k5)],
            h,
        ),
    );
    let y5 = axpy(
        n,
        y,
        &[(A71, k1), (A73, &k3), (A74, &k4), (A75, &k5), (A76, &k6)],
        h,
    );
    let k7 = f(t + h, &y5);
    let mut err = 0.0;
    for i in 0..n {
        let e = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
        let sc = tol.atol[i] + tol.rtol * y[i].abs().max(y5[i].abs());
        err += (e / sc) * (e / sc);
    }
    (y5, k7, (err / n as f64).sqrt())
}

/// The next step size after an error norm `err` (Hairer et al. §II.4).
pub fn next_h(h: f64, err: f64, tol: &Tolerances) -> f64 {
    let factor = if err == 0.0 {
        5.0
    } else {
        (0.9 * err.powf(-0.2)).clamp(0.2, 5.0)
    };
    (h * factor).min(tol.h_max)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// y' = −y, y(0) = 1: y(1) = e^−1 (closed form), stepped with error
    /// control at rtol 1e-10.
    #[test]
    fn exponential_decay_to_tolerance() {
        let tol = Tolerances {
            rtol: 1e-10,
            atol: [1e-12; MAX_STATE],
            h_max: 1.0,
        };
        let mut f = |_t: f64, y: &State| {
            let mut d = [0.0; MAX_STATE];
            d[0] = -y[0];
            d
        };
        let (mut t, mut y, mut h): (f64, State, f64) = (0.0, [1.0, 0.0, 0.0, 0.0], 1e-3);
        let mut k = f(t, &y);
        while t < 1.0 {
            let hh = h.min(1.0 - t);
            let (y1, k1, err) = step(&mut f, 1, t, &y, &k, hh, &tol);
            if err <= 1.0 {
                t += hh;
                y = y1;
                k = k1;
            }
            h = next_h(hh, err, &tol);
        }
        assert!((y[0] - (-1.0f64).exp()).abs() < 1e-9, "{}", y[0]);
    }

    /// Fifth order: halving a fixed step on y' = cos t (y = sin t) cuts the
    /// error by about 2^5 = 32 (the method's order).
    #[test]
    fn fifth_order_convergence() {
        let tol = Tolerances {
            rtol: 1.0,
            atol: [1.0; MAX_STATE],
            h_max: 10.0,
        };
        let run = |h: f64| {
            let mut f = |t: f64, _y: &State| [t.cos(), 0.0, 0.0, 0.0];
            let (mut t, mut y) = (0.0, [0.0; MAX_STATE]);
            let mut k = f(t, &y);
            while t < 2.0 - 1e-12 {
                let (y1, k1, _) = step(&mut f, 1, t, &y, &k, h, &tol);
                t += h;
                y = y1;
                k = k1;
            }
            (y[0] - 2.0f64.sin()).abs()
        };
        let ratio = run(0.2) / run(0.1);
        assert!(ratio > 20.0 && ratio < 50.0, "{ratio}");
    }
}
