//! Monotone piecewise-cubic interpolation of tabulated data.
//!
//! Piecewise cubic Hermite interpolation with the slopes chosen by
//! F. N. Fritsch & R. E. Carlson, "Monotone piecewise cubic interpolation",
//! SIAM J. Numer. Anal. 17 (1980) 238–246: start from the mean of the two
//! neighbouring secants (one-sided secant at the ends), then on each interval
//! with secant δ scale the end slopes so that (m_k/δ)² + (m_{k+1}/δ)² ≤ 9, the
//! circle inside their monotonicity region (their §4). Monotone data then give
//! a monotone interpolant, with no overshoot between nodes; linear data are
//! reproduced exactly. Evaluation is a binary search plus one cubic: no heap
//! allocation.

use crate::roots::{brent, RootError};

/// Tables up to this many nodes find their interval by a branch-free count
/// instead of a binary search (the same index; faster on short tables).
const SHORT_TABLE: usize = 32;

/// Why a table could not be built or evaluated.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum TableError {
    /// Fewer than two points.
    #[error("a table needs at least 2 points, got {count}")]
    TooFewPoints {
        /// Number of points given.
        count: usize,
    },
    /// `xs` and `ys` have different lengths.
    #[error("xs has {xs} values but ys has {ys}; they must match")]
    LengthMismatch {
        /// Number of abscissae given.
        xs: usize,
        /// Number of ordinates given.
        ys: usize,
    },
    /// A value is NaN or infinite.
    #[error("point {index} is not finite: x = {x}, y = {y}")]
    NotFinite {
        /// Zero-based index of the point.
        index: usize,
        /// The point's abscissa, in the table's x unit.
        x: f64,
        /// The point's ordinate, in the table's y unit.
        y: f64,
    },
    /// `xs` must increase strictly.
    #[error("x must increase strictly: x[{index}] = {x} does not exceed x[{}] = {previous}", .index - 1)]
    XNotIncreasing {
        /// Zero-based index of the offending point.
        index: usize,
        /// The abscissa of the point before it, in the table's x unit.
        previous: f64,
        /// The offending abscissa, in the table's x unit.
        x: f64,
    },
    /// `ys` must be strictly monotone (all increasing or all decreasing).
    #[error(
        "y must be strictly monotone: y[{index}] = {y} after y[{}] = {previous} breaks the trend set by the first two points",
        .index - 1
    )]
    YNotMonotone {
        /// Zero-based index of the offending point.
        index: usize,
        /// The ordinate of the point before it, in the table's y unit.
        previous: f64,
        /// The offending ordinate, in the table's y unit.
        y: f64,
    },
    /// The abscissa lies outside the table.
    #[error("x = {x} is outside the table range [{min}, {max}]")]
    OutOfRange {
        /// The requested abscissa, in the table's x unit.
        x: f64,
        /// The table's smallest abscissa.
        min: f64,
        /// The table's largest abscissa.
        max: f64,
    },
    /// The ordinate given to [`MonotoneTable::inverse`] lies outside the table.
    #[error("y = {y} is outside the table's value range [{min}, {max}]")]
    ValueOutOfRange {
        /// The requested ordinate, in the table's y unit.
        y: f64,
        /// The table's smallest ordinate.
        min: f64,
        /// The table's largest ordinate.
        max: f64,
    },
    /// The inverse solve failed (cannot happen for a valid bracket; kept so
    /// that no path panics).
    #[error("inverse interpolation failed: {0}")]
    Root(#[from] RootError),
}

/// A strictly monotone table y(x) interpolated by Fritsch–Carlson monotone
/// cubic Hermite pieces. Built only through [`MonotoneTable::new`], so a value
/// of this type always holds valid data.
#[derive(Debug, Clone, PartialEq)]
pub struct MonotoneTable {
    xs: Vec<f64>,
    ys: Vec<f64>,
    /// dy/dx at each node after the Fritsch–Carlson limiter.
    slopes: Vec<f64>,
    increasing: bool,
}

impl MonotoneTable {
    /// Build a table from nodes. Needs ≥ 2 finite points, `xs` strictly
    /// increasing and `ys` strictly monotone; the error names the first
    /// offending index and its values.
    pub fn new(xs: Vec<f64>, ys: Vec<f64>) -> Result<Self, TableError> {
        if xs.len() != ys.len() {
            return Err(TableError::LengthMismatch {
                xs: xs.len(),
                ys: ys.len(),
            });
        }
        let n = xs.len();
        if n < 2 {
            return Err(TableError::TooFewPoints { count: n });
        }
        for (index, (&x, &y)) in xs.iter().zip(&ys).enumerate() {
            if !x.is_finite() || !y.is_finite() {
                return Err(TableError::NotFinite { index, x, y });
            }
        }
        let increasing = ys[1] > ys[0];
        for index in 1..n {
            if xs[index] <= xs[index - 1] {
                return Err(TableError::XNotIncreasing {
                    index,
                    previous: xs[index - 1],
                    x: xs[index],
                });
            }
            let step_ok = if increasing {
                ys[index] > ys[index - 1]
            } else {
                ys[index] < ys[index - 1]
            };
            if !step_ok {
                return Err(TableError::YNotMonotone {
                    index,
                    previous: ys[index - 1],
                    y: ys[index],
                });
            }
        }
        // Secants δ_k = (y_{k+1} − y_k)/(x_{k+1} − x_k); all share one sign.
        let secants: Vec<f64> = (0..n - 1)
            .map(|k| (ys[k + 1] - ys[k]) / (xs[k + 1] - xs[k]))
            .collect();
        // Fritsch & Carlson (1980) step 1: initial slopes.
        let mut slopes = Vec::with_capacity(n);
        slopes.push(secants[0]);
        for k in 1..n - 1 {
            slopes.push(0.5 * (secants[k - 1] + secants[k]));
        }
        slopes.push(secants[n - 2]);
        // Steps 3–5: on each interval, pull (α, β) = (m_k, m_{k+1})/δ_k into
        // the circle α² + β² ≤ 9 (a sufficient monotonicity condition).
        for (k, &delta) in secants.iter().enumerate() {
            let alpha = slopes[k] / delta;
            let beta = slopes[k + 1] / delta;
            let radius_sq = alpha * alpha + beta * beta;
            if radius_sq > 9.0 {
                let tau = 3.0 / radius_sq.sqrt();
                slopes[k] = tau * alpha * delta;
                slopes[k + 1] = tau * beta * delta;
            }
        }
        Ok(Self {
            xs,
            ys,
            slopes,
            increasing,
        })
    }

    /// The table's abscissa range `(x_first, x_last)`.
    pub fn range(&self) -> (f64, f64) {
        (self.xs[0], self.xs[self.xs.len() - 1])
    }

    /// The table's ordinate range `(y_min, y_max)`.
    pub fn value_range(&self) -> (f64, f64) {
        let (first, last) = (self.ys[0], self.ys[self.ys.len() - 1]);
        (first.min(last), first.max(last))
    }

    /// `true` when y increases with x, `false` when it decreases.
    pub fn is_increasing(&self) -> bool {
        self.increasing
    }

    /// The nodes' abscissae.
    pub fn xs(&self) -> &[f64] {
        &self.xs
    }

    /// The nodes' ordinates.
    pub fn ys(&self) -> &[f64] {
        &self.ys
    }

    /// Index k of the interval [x_k, x_{k+1}] holding `x` (x within range).
    fn interval(&self, x: f64) -> usize {
        // The count of nodes at or below x, which is what a binary search
        // (`partition_point`) returns on sorted nodes; for the short tables
        // here a branch-free count is faster than the search's
        // unpredictable branches.
        let upper = if self.xs.len() <= SHORT_TABLE {
            self.xs.iter().map(|&v| usize::from(v <= x)).sum()
        } else {
            self.xs.partition_point(|&v| v <= x)
        };
        upper.saturating_sub(1).min(self.xs.len() - 2)
    }

    fn check(&self, x: f64) -> Result<usize, TableError> {
        let (min, max) = self.range();
        if x >= min && x <= max {
            Ok(self.interval(x))
        } else {
            Err(TableError::OutOfRange { x, min, max })
        }
    }

    /// Cubic Hermite piece k at `x`: with h = x_{k+1} − x_k, t = (x − x_k)/h,
    /// p = h00·y_k + h10·h·m_k + h01·y_{k+1} + h11·h·m_{k+1}, where
    /// h00 = 2t³ − 3t² + 1, h10 = t³ − 2t² + t, h01 = −2t³ + 3t², h11 = t³ − t²
    /// (Fritsch & Carlson 1980, eq. 1). Exact at the nodes.
    fn piece(&self, k: usize, x: f64) -> f64 {
        let h = self.xs[k + 1] - self.xs[k];
        let t = (x - self.xs[k]) / h;
        let t2 = t * t;
        let t3 = t2 * t;
        (2.0 * t3 - 3.0 * t2 + 1.0) * self.ys[k]
            + (t3 - 2.0 * t2 + t) * h * self.slopes[k]
            + (-2.0 * t3 + 3.0 * t2) * self.ys[k + 1]
            + (t3 - t2) * h * self.slopes[k + 1]
    }

    /// dp/dx of piece k: (h00'·y_k + h10'·h·m_k + h01'·y_{k+1} + h11'·h·m_{k+1})/h
    /// with h00' = 6t² − 6t, h10' = 3t² − 4t + 1, h01' = −6t² + 6t,
    /// h11' = 3t² − 2t.
    fn piece_derivative(&self, k: usize, x: f64) -> f64 {
        let h = self.xs[k + 1] - self.xs[k];
        let t = (x - self.xs[k]) / h;
        let t2 = t * t;
        ((6.0 * t2 - 6.0 * t) * self.ys[k] + (-6.0 * t2 + 6.0 * t) * self.ys[k + 1]) / h
            + (3.0 * t2 - 4.0 * t + 1.0) * self.slopes[k]
            + (3.0 * t2 - 2.0 * t) * self.slopes[k + 1]
    }

    /// Interpolated y(x); `OutOfRange` outside `range()`.
    pub fn eval(&self, x: f64) -> Result<f64, TableError> {
        let k = self.check(x)?;
        Ok(self.piece(k, x))
    }

    /// Interpolated dy/dx at `x` (analytic derivative of the cubic piece; at
    /// a node the pieces' slopes agree, so it is continuous).
    pub fn derivative(&self, x: f64) -> Result<f64, TableError> {
        let k = self.check(x)?;
        Ok(self.piece_derivative(k, x))
    }

    /// The x at which the interpolant equals `y`: the interval is found by
    /// binary search on the ordinates, then Brent's method solves the one
    /// monotone cubic piece to the crate's precision policy.
    pub fn inverse(&self, y: f64) -> Result<f64, TableError> {
        let (min, max) = self.value_range();
        if !(y >= min && y <= max) {
            return Err(TableError::ValueOutOfRange { y, min, max });
        }
        let upper = if self.increasing {
            self.ys.partition_point(|&v| v <= y)
        } else {
            self.ys.partition_point(|&v| v >= y)
        };
        let k = upper.saturating_sub(1).min(self.ys.len() - 2);
        if y == self.ys[k] {
            return Ok(self.xs[k]);
        }
        if y == self.ys[k + 1] {
            return Ok(self.xs[k + 1]);
        }
        let root = brent(|x| self.piece(k, x) - y, self.xs[k], self.xs[k + 1])?;
        Ok(root.x)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn sample() -> MonotoneTable {
        // Forsythe & Worthing (1925) tungsten resistivity rows, µΩ·cm, as
        // uneven, curved monotone test data.
        MonotoneTable::new(
            vec![300.0, 400.0, 500.0, 600.0, 800.0, 1000.0, 1500.0],
            vec![5.65, 8.06, 10.56, 13.23, 19.00, 24.93, 40.36],
        )
        .unwrap()
    }

    #[test]
    fn reproduces_nodes_exactly() {
        let t = sample();
        for (&x, &y) in t.xs().iter().zip(t.ys()) {
            assert_eq!(t.eval(x).unwrap(), y);
            assert_eq!(t.inverse(y).unwrap(), x);
        }
    }

    #[test]
    fn linear_data_reproduced_exactly() {
        // y = 3 − 2x: Fritsch–Carlson slopes are all −2, so every Hermite
        // piece is the line itself.
        let xs = vec![0.0, 0.5, 2.0, 2.5, 7.0];
        let ys: Vec<f64> = xs.iter().map(|x| 3.0 - 2.0 * x).collect();
        let t = MonotoneTable::new(xs, ys).unwrap();
        assert!(!t.is_increasing());
        for i in 0..=70 {
            let x = i as f64 * 0.1;
            approx::assert_abs_diff_eq!(t.eval(x).unwrap(), 3.0 - 2.0 * x, epsilon = 1e-12);
            approx::assert_abs_diff_eq!(t.derivative(x).unwrap(), -2.0, epsilon = 1e-12);
        }
    }

    #[test]
    fn derivative_matches_finite_difference() {
        let t = sample();
        for i in 1..120 {
            let x = 300.0 + i as f64 * 10.0 + 0.37;
            let h = crate::precision::FD_REL_STEP * x;
            let fd = (t.eval(x + h).unwrap() - t.eval(x - h).unwrap()) / (2.0 * h);
            approx::assert_relative_eq!(t.derivative(x).unwrap(), fd, max_relative = 1e-6);
        }
    }

    #[test]
    fn inverse_round_trip() {
        let t = sample();
        for i in 0..=120 {
            let x = 300.0 + i as f64 * 10.0;
            let y = t.eval(x).unwrap();
            approx::assert_relative_eq!(t.inverse(y).unwrap(), x, max_relative = 1e-11);
        }
    }

    #[test]
    fn rejects_bad_tables_with_index() {
        assert_eq!(
            MonotoneTable::new(vec![1.0], vec![2.0]),
            Err(TableError::TooFewPoints { count: 1 })
        );
        assert_eq!(
            MonotoneTable::new(vec![1.0, 2.0], vec![2.0]),
            Err(TableError::LengthMismatch { xs: 2, ys: 1 })
        );
        assert_eq!(
            MonotoneTable::new(vec![1.0, 2.0, 2.0], vec![1.0, 2.0, 3.0]),
            Err(TableError::XNotIncreasing {
                index: 2,
                previous: 2.0,
                x: 2.0
            })
        );
        assert_eq!(
            MonotoneTable::new(vec![1.0, 2.0, 3.0, 4.0], vec![1.0, 2.0, 3.0, 2.5]),
            Err(TableError::YNotMonotone {
                index: 3,
                previous: 3.0,
                y: 2.5
            })
        );
        assert!(matches!(
            MonotoneTable::new(vec![1.0, f64::NAN], vec![1.0, 2.0]),
            Err(TableError::NotFinite { index: 1, .. })
        ));
        let t = sample();
        assert_eq!(
            t.eval(299.0),
            Err(TableError::OutOfRange {
                x: 299.0,
                min: 300.0,
                max: 1500.0
            })
        );
        assert!(matches!(
            t.eval(f64::NAN),
            Err(TableError::OutOfRange { .. })
        ));
        assert!(matches!(
            t.inverse(50.0),
            Err(TableError::ValueOutOfRange { .. })
        ));
    }

    proptest! {
        #[test]
        fn monotone_on_random_monotone_data(
            steps in prop::collection::vec((0.01f64..10.0, 0.001f64..100.0), 1..12),
            decreasing in any::<bool>(),
        ) {
            let mut xs = vec![0.0];
            let mut ys = vec![0.0];
            for (dx, dy) in &steps {
                xs.push(xs[xs.len() - 1] + dx);
                let sign = if decreasing { -1.0 } else { 1.0 };
                ys.push(ys[ys.len() - 1] + sign * dy);
            }
            let t = MonotoneTable::new(xs, ys).unwrap();
            let (a, b) = t.range();
            let n = 400;
            let mut previous = t.eval(a).unwrap();
            for i in 1..=n {
                let x = a + (b - a) * i as f64 / n as f64;
                let y = t.eval(x.min(b)).unwrap();
                if decreasing {
                    prop_assert!(y <= previous + 1e-12 * previous.abs().max(1.0));
                } else {
                    prop_assert!(y >= previous - 1e-12 * previous.abs().max(1.0));
                }
                previous = y;
            }
        }
    }
}
