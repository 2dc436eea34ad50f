//! Thermal radiation from a small grey body to large isothermal surroundings.

/// Stefan–Boltzmann constant σ = 5.670 374 419 × 10⁻⁸ W/(m²·K⁴)
/// (CODATA 2018; exact, derived from the exact SI values of h, c and k_B).
pub const STEFAN_BOLTZMANN_W_PER_M2_K4: f64 = 5.670_374_419e-8;

/// Net radiative loss of a small grey body in a large enclosure, W:
/// q = ε·σ·A·(T⁴ − T_s⁴) (Incropera, DeWitt, Bergman & Lavine, *Fundamentals
/// of Heat and Mass Transfer*, 6th ed., 2007, eq. 1.7).
///
/// Pure formula: the caller supplies area ≥ 0, 0 ≤ ε ≤ 1 and absolute
/// temperatures; finite inputs give a finite result. Negative when the
/// surroundings are hotter than the surface.
pub fn radiative_loss_w(area_m2: f64, emissivity: f64, surface_k: f64, surroundings_k: f64) -> f64 {
    emissivity
        * STEFAN_BOLTZMANN_W_PER_M2_K4
        * area_m2
        * (surface_k.powi(4) - surroundings_k.powi(4))
}

/// Derivative of [`radiative_loss_w`] with respect to the surface
/// temperature, W/K: ∂q/∂T = 4·ε·σ·A·T³ (differentiating Incropera eq. 1.7).
pub fn radiative_loss_derivative_w_per_k(area_m2: f64, emissivity: f64, surface_k: f64) -> f64 {
    4.0 * emissivity * STEFAN_BOLTZMANN_W_PER_M2_K4 * area_m2 * surface_k.powi(3)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::precision::FD_REL_STEP;
    use proptest::prelude::*;

    #[test]
    fn incropera_example_9_3_pipe_radiation() {
        // Incropera 6th ed., Example 9.3 (steam pipe, memory for the example
        // number): D = 0.1 m, ε = 0.85, T_s = 165 °C = 438 K, T_sur = 23 °C
        // = 296 K, radiation per unit length q'_rad ≈ 441 W/m.
        // Hand calculation: 438⁴ = 3.68041e10, 296⁴ = 7.67656e9,
        // difference 2.91275e10 K⁴; × σ = 1651.67 W/m²; × ε = 1403.92 W/m²;
        // × πD = 0.314159 m → 441.05 W/m.
        let area_per_metre = std::f64::consts::PI * 0.1;
        let q = radiative_loss_w(area_per_metre, 0.85, 438.0, 296.0);
        assert!((q - 441.05).abs() < 0.05, "{q}");
        assert!((q - 441.0).abs() / 441.0 < 0.005);
    }

    #[test]
    fn blackbody_at_1000_k() {
        // Hand calculation: σ·T⁴ with T = 1000 K, A = 1 m², ε = 1, T_s = 0:
        // 5.670374419e-8 · 1e12 = 56 703.74419 W.
        let q = radiative_loss_w(1.0, 1.0, 1000.0, 0.0);
        assert!((q - 56_703.744_19).abs() < 1e-6);
        // Derivative: 4·σ·T³ = 4 · 5.670374419e-8 · 1e9 = 226.81497676 W/K.
        let d = radiative_loss_derivative_w_per_k(1.0, 1.0, 1000.0);
        assert!((d - 226.814_976_76).abs() < 1e-8);
    }

    #[test]
    fn no_net_exchange_at_equal_temperature() {
        assert_eq!(radiative_loss_w(1e-6, 0.3, 300.0, 300.0), 0.0);
    }

    proptest! {
        #[test]
        fn derivative_matches_central_difference(
            area in 1e-9f64..1e-2,
            eps in 0.01f64..1.0,
            t in 250.0f64..3000.0,
            ts in 200.0f64..350.0,
        ) {
            let h = FD_REL_STEP * t;
            let fd = (radiative_loss_w(area, eps, t + h, ts) - radiative_loss_w(area, eps, t - h, ts))
                / (2.0 * h);
            let exact = radiative_loss_derivative_w_per_k(area, eps, t);
            prop_assert!((fd - exact).abs() <= 1e-6 * exact.abs(), "fd {} exact {}", fd, exact);
        }
    }
}
