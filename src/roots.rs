//! One-dimensional root finding: a bracketed Brent solver, and the real
//! roots of a quadratic in closed form.
//!
//! Brent, R. P., *Algorithms for Minimization without Derivatives*,
//! Prentice-Hall (1973), ch. 4 (the `zero` procedure). The method keeps a
//! bracket `[a, b]` with `f(a)·f(b) ≤ 0` at every step and falls back to
//! bisection whenever inverse-quadratic or secant steps misbehave, so it
//! always converges for a continuous function on a valid bracket.
//! No heap allocation.

use crate::precision::{BRENT_MAX_EVALUATIONS, ROOT_ABS_TOL, ROOT_REL_TOL};

/// Why a root search failed.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum RootError {
    /// `f(a)` and `f(b)` have the same sign, so the interval holds no
    /// guaranteed root.
    #[error("no sign change on [{a}, {b}]: f(a) = {fa}, f(b) = {fb}")]
    NotBracketed {
        /// Left end of the interval.
        a: f64,
        /// Right end of the interval.
        b: f64,
        /// f(a).
        fa: f64,
        /// f(b).
        fb: f64,
    },
    /// The function returned NaN or an infinity.
    #[error("function value is not finite at x = {x}")]
    NotFinite {
        /// The abscissa where f was not finite.
        x: f64,
    },
    /// The evaluation budget ran out before the tolerance was met.
    #[error("no convergence after {evaluations} evaluations")]
    NoConvergence {
        /// Number of function evaluations spent.
        evaluations: usize,
    },
}

/// A converged root and how much work it took.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Root {
    /// The abscissa of the root.
    pub x: f64,
    /// The function value there.
    pub fx: f64,
    /// Function evaluations spent.
    pub evaluations: usize,
}

/// Find a root of `f` in `[a, b]` with Brent's method, to the crate's
/// precision policy (`ROOT_REL_TOL`·|x| + `ROOT_ABS_TOL`).
pub fn brent<F: FnMut(f64) -> f64>(f: F, a: f64, b: f64) -> Result<Root, RootError> {
    brent_with(f, a, b, ROOT_REL_TOL, ROOT_ABS_TOL, BRENT_MAX_EVALUATIONS)
}

/// Brent's method with explicit tolerances and evaluation budget.
pub fn brent_with<F: FnMut(f64) -> f64>(
    mut f: F,
    a0: f64,
    b0: f64,
    rel_tol: f64,
    abs_tol: f64,
    max_evaluations: usize,
) -> Result<Root, RootError> {
    let fa = f(a0);
    let fb = f(b0);
    brent_from(f, (a0, fa), (b0, fb), rel_tol, abs_tol, max_evaluations, 2)
}

/// Brent's method to the crate's precision policy from a bracket whose end
/// values are already known (a scan that found the sign change has them):
/// the same steps, root and evaluation count as [`brent`] on `f`, bit for
/// bit (the count includes the two ends, as there), without evaluating the
/// ends again.
pub fn brent_known_ends<F: FnMut(f64) -> f64>(
    f: F,
    (a, fa): (f64, f64),
    (b, fb): (f64, f64),
) -> Result<Root, RootError> {
    brent_from(
        f,
        (a, fa),
        (b, fb),
        ROOT_REL_TOL,
        ROOT_ABS_TOL,
        BRENT_MAX_EVALUATIONS,
        2,
    )
}

/// Brent's iteration from two ends and their values; `evaluations` counts
/// those already spent on the ends (towards `max_evaluations`).
fn brent_from<F: FnMut(f64) -> f64>(
    mut f: F,
    (mut a, mut fa): (f64, f64),
    (mut b, mut fb): (f64, f64),
    rel_tol: f64,
    abs_tol: f64,
    max_evaluations: usize,
    mut evaluations: usize,
) -> Result<Root, RootError> {
    if !fa.is_finite() {
        return Err(RootError::NotFinite { x: a });
    }
    if !fb.is_finite() {
        return Err(RootError::NotFinite { x: b });
    }
    if fa == 0.0 {
        return Ok(Root {
            x: a,
            fx: fa,
            evaluations,
        });
    }
    if fb == 0.0 {
        return Ok(Root {
            x: b,
            fx: fb,
            evaluations,
        });
    }
    if fa.signum() == fb.signum() {
        return Err(RootError::NotBracketed { a, b, fa, fb });
    }
    // Invariant: the root lies between b and c; b is the best estimate.
    let (mut c, mut fc) = (a, fa);
    let mut d = b - a;
    let mut e = d;
    loop {
        if fb.signum() == fc.signum() {
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        let tol = 2.0 * f64::EPSILON * b.abs() + 0.5 * (rel_tol * b.abs() + abs_tol);
        let m = 0.5 * (c - b);
        if m.abs() <= tol || fb == 0.0 {
            return Ok(Root {
                x: b,
                fx: fb,
                evaluations,
            });
        }
        if evaluations >= max_evaluations {
            return Err(RootError::NoConvergence { evaluations });
        }
        if e.abs() < tol || fa.abs() <= fb.abs() {
            d = m;
            e = m;
        } else {
            let s = fb / fa;
            let (mut p, mut q);
            if a == c {
                // Secant step.
                p = 2.0 * m * s;
                q = 1.0 - s;
            } else {
                // Inverse quadratic interpolation.
                let qq = fa / fc;
                let r = fb / fc;
                p = s * (2.0 * m * qq * (qq - r) - (b - a) * (r - 1.0));
                q = (qq - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            if 2.0 * p < (3.0 * m * q - (tol * q).abs()).min((e * q).abs()) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        }
        a = b;
        fa = fb;
        b += if d.abs() > tol { d } else { tol.copysign(m) };
        fb = f(b);
        evaluations += 1;
        if !fb.is_finite() {
            return Err(RootError::NotFinite { x: b });
        }
    }
}

/// Brent's method on a function that can fail. The first failure stops the
/// search (the remaining steps see NaN and end it) and is returned as the
/// outer `Err`; the inner result is the root search's own outcome. Keeps the
/// solve allocation-free: the failure is carried out through a flag.
pub fn brent_fallible<E, F: FnMut(f64) -> Result<f64, E>>(
    mut f: F,
    a: f64,
    b: f64,
) -> Result<Result<Root, RootError>, E> {
    let mut failure: Option<E> = None;
    let root = brent(
        |x| match f(x) {
            Ok(v) => v,
            Err(e) => {
                failure.get_or_insert(e);
                f64::NAN
            }
        },
        a,
        b,
    );
    match failure {
        Some(e) => Err(e),
        None => Ok(root),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_sqrt_two() {
        // Reference: sqrt(2) = 1.41421356237309504880… (any table of constants).
        let r = brent(|x| x * x - 2.0, 0.0, 2.0).unwrap();
        assert!((r.x - std::f64::consts::SQRT_2).abs() < 1e-12);
    }

    #[test]
    fn finds_cosine_fixed_point() {
        // Reference: the Dottie number 0.7390851332151607 (root of cos x = x).
        let r = brent(|x| x.cos() - x, 0.0, 1.0).unwrap();
        assert!((r.x - 0.739_085_133_215_160_7).abs() < 1e-12);
        assert!(r.evaluations < 20);
    }

    #[test]
    fn fallible_search_returns_the_function_failure() {
        // Invariant: a failure inside the search comes out as the outer error.
        let r = brent_fallible(
            |x| if x > 1.5 { Err("too far") } else { Ok(x - 1.0) },
            0.0,
            2.0,
        );
        assert_eq!(r, Err("too far"));
        let ok = brent_fallible(|x| Ok::<f64, ()>(x * x - 2.0), 0.0, 2.0)
            .unwrap()
            .unwrap();
        assert!((ok.x - std::f64::consts::SQRT_2).abs() < 1e-12);
    }

    #[test]
    fn rejects_unbracketed_interval() {
        assert!(matches!(
            brent(|x| x * x + 1.0, -1.0, 1.0),
            Err(RootError::NotBracketed { .. })
        ));
    }
}

/// The real roots of a·x² + b·x + c = 0 by the cancellation-free form
/// q = −½·(b + sgn(b)·√(b² − 4ac)), x₁ = q/a, x₂ = c/q (Press et al.,
/// *Numerical Recipes*, 3rd ed., §5.6). With a = 0 the single root of the
/// linear equation is returned twice; `None` when there is no real root.
pub fn quadratic_roots(a: f64, b: f64, c: f64) -> Option<(f64, f64)> {
    if a == 0.0 {
        let x = -c / b;
        return x.is_finite().then_some((x, x));
    }
    let disc = b * b - 4.0 * a * c;
    if disc.is_nan() || disc < 0.0 {
        return None;
    }
    let q = -0.5 * (b + b.signum() * disc.sqrt());
    if q == 0.0 {
        return Some((0.0, 0.0));
    }
    Some((q / a, c / q))
}

#[cfg(test)]
mod quadratic_tests {
    use super::quadratic_roots;

    #[test]
    fn roots_of_worked_quadratics() {
        // Hand calculation: x² − 3x + 2 = (x − 1)(x − 2).
        let (r0, r1) = quadratic_roots(1.0, -3.0, 2.0).unwrap();
        let (lo, hi) = (r0.min(r1), r0.max(r1));
        assert!((lo - 1.0).abs() < 1e-15 && (hi - 2.0).abs() < 1e-15);
        // Hand calculation: x² + 1 has no real root.
        assert!(quadratic_roots(1.0, 0.0, 1.0).is_none());
        // Cancellation case (Numerical Recipes §5.6): x² − 1e8·x + 1 has
        // roots 1e8 and 1e-8 (product 1, sum 1e8); the small one keeps
        // full precision.
        let (r0, r1) = quadratic_roots(1.0, -1e8, 1.0).unwrap();
        let small = r0.min(r1);
        assert!((small - 1e-8).abs() < 1e-22);
        // Linear: 2x − 4 = 0.
        assert_eq!(quadratic_roots(0.0, 2.0, -4.0), Some((2.0, 2.0)));
    }
}
