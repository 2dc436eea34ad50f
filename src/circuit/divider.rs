//! The reference divider: fixed top resistor, trimmer, fixed bottom
//! resistor between a rail and ground, wiper to the comparator.

use crate::eseries::ESeries;

/// A reference divider's values (ohm).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Divider {
    /// Fixed resistor from the rail to the trimmer's top end.
    pub top_ohm: f64,
    /// Trimmer end-to-end resistance.
    pub trimmer_ohm: f64,
    /// Fixed resistor from the trimmer's bottom end to ground.
    pub bottom_ohm: f64,
}

/// Why a divider could not be sized.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum DividerError {
    /// The wanted wiper range reaches outside 0 … rail.
    #[error(
        "the reference must reach {low:.4}–{high:.4} of its rail; a divider between the rail and ground can only give 0–1"
    )]
    OutOfRail {
        /// Lowest wanted ratio.
        low: f64,
        /// Highest wanted ratio.
        high: f64,
    },
    /// No standard trimmer is large enough.
    #[error("the wanted trimmer value {wanted_ohm:.0} ohm is above the largest standard trimmer")]
    NoTrimmer {
        /// Wanted value.
        wanted_ohm: f64,
    },
}

pub use super::ratings::STANDARD_TRIMMER_OHM;

/// Extra trimmer span beyond the computed need, to absorb the trimmer's own
/// tolerance (typically ±20 % on end-to-end resistance; common practice,
/// no source) and the fixed resistors' tolerance.
pub const TRIMMER_SPAN_MARGIN: f64 = 1.3;

impl Divider {
    /// Total resistance, ohm.
    pub fn total_ohm(&self) -> f64 {
        self.top_ohm + self.trimmer_ohm + self.bottom_ohm
    }

    /// Unloaded wiper voltage as a fraction of the rail at trimmer position
    /// `x` (0 = grounded end, 1 = top end): `(Rb + x·Rp)/(Rt + Rp + Rb)`
    /// (voltage-divider rule).
    pub fn ratio_at(&self, x: f64) -> f64 {
        (self.bottom_ohm + x * self.trimmer_ohm) / self.total_ohm()
    }

    /// Thevenin equivalent of the wiper: `(V·ratio, (Rb + x·Rp) ∥ (Rt + (1 − x)·Rp))`
    /// (Thevenin's theorem).
    pub fn thevenin(&self, rail_v: f64, x: f64) -> (f64, f64) {
        let lower = self.bottom_ohm + x * self.trimmer_ohm;
        let upper = self.top_ohm + (1.0 - x) * self.trimmer_ohm;
        (rail_v * self.ratio_at(x), lower * upper / (lower + upper))
    }

    /// The wiper ratios the trimmer's two ends are sure to reach with every
    /// part at its tolerance end (fractions `top`, `trimmer`, `bottom`):
    /// the highest ratio at the grounded end,
    /// `Rb(1+tb)/(Rt(1−tt) + Rp(1−tp) + Rb(1+tb))`, and the lowest at the
    /// top end, `1 − Rt(1+tt)/(Rt(1+tt) + Rp(1−tp) + Rb(1−tb))`
    /// (voltage-divider rule at the corners).
    pub fn reach_at_tolerances(&self, top: f64, trimmer: f64, bottom: f64) -> (f64, f64) {
        let (rt, rp, rb) = (self.top_ohm, self.trimmer_ohm, self.bottom_ohm);
        let k0 =
            rb * (1.0 + bottom) / (rt * (1.0 - top) + rp * (1.0 - trimmer) + rb * (1.0 + bottom));
        let t_hi = rt * (1.0 + top);
        let k1 = 1.0 - t_hi / (t_hi + rp * (1.0 - trimmer) + rb * (1.0 - bottom));
        (k0, k1)
    }

    /// Trimmer position giving wiper ratio `k` (may fall outside 0 … 1).
    pub fn position_for_ratio(&self, k: f64) -> f64 {
        (k * self.total_ohm() - self.bottom_ohm) / self.trimmer_ohm
    }

    /// Highest dissipation in any part of the divider at rail `rail_v`
    /// (W): each fixed resistor and the trimmer's whole track.
    pub fn dissipations_w(&self, rail_v: f64) -> (f64, f64, f64) {
        let i = rail_v / self.total_ohm();
        (
            i * i * self.top_ohm,
            i * i * self.trimmer_ohm,
            i * i * self.bottom_ohm,
        )
    }

    /// Size a divider on a rail so that the trimmer's mid-travel gives ratio
    /// `k_mid` and its travel covers `[k_low, k_high]` with margin, drawing
    /// about `current_a` from `rail_v`. Fixed values come from `series`;
    /// among the neighbouring preferred values the pair that puts the
    /// wanted ratio closest to mid-travel is chosen; the ideal (unsnapped)
    /// top and bottom values are returned beside it. Any of the three parts
    /// may be fixed by the caller; then only the others are chosen, and when
    /// no choice covers the span the closest is returned for the checks to
    /// judge.
    #[allow(clippy::too_many_arguments)]
    pub fn size_with(
        rail_v: f64,
        k_mid: f64,
        k_low: f64,
        k_high: f64,
        current_a: f64,
        series: ESeries,
        top: Option<f64>,
        trimmer: Option<f64>,
        bottom: Option<f64>,
    ) -> Result<(Divider, (f64, f64)), DividerError> {
        // At least ±1 % of the wanted ratio, so a design with no tolerances
        // still gets a trimmer that can trim (draftwire's choice, no source).
        let half = (k_mid - k_low).max(k_high - k_mid).max(0.01 * k_mid) * TRIMMER_SPAN_MARGIN;
        let (lo, hi) = (k_mid - half, k_mid + half);
        let any_fixed = top.is_some() || trimmer.is_some() || bottom.is_some();
        if (lo <= 0.0 || hi >= 1.0) && !any_fixed {
            return Err(DividerError::OutOfRail { low: lo, high: hi });
        }
        let total = rail_v / current_a;
        let wanted_trimmer = 2.0 * half * total;
        let trimmer = match trimmer {
            Some(t) => t,
            None => *STANDARD_TRIMMER_OHM
                .iter()
                .find(|&&t| t >= wanted_trimmer)
                .ok_or(DividerError::NoTrimmer {
                    wanted_ohm: wanted_trimmer,
                })?,
        };
        // Keep the total near the wanted current; with a larger trimmer than
        // needed, the fixed parts shrink accordingly.
        let total = total.max(trimmer / (2.0 * half));
        let bottom_ideal = (k_mid * total - 0.5 * trimmer).max(series.at_or_above(1.0));
        let top_ideal_at_ideal = (bottom_ideal + 0.5 * trimmer) / k_mid - trimmer - bottom_ideal;
        let exact = (top_ideal_at_ideal, bottom_ideal);
        let bottoms: Vec<f64> = match bottom {
            Some(b) => vec![b],
            None => neighbours(series, bottom_ideal).to_vec(),
        };
        let mut best_cover: Option<(f64, Divider)> = None;
        let mut best_any: Option<(f64, Divider)> = None;
        for &b in &bottoms {
            let top_ideal = (b + 0.5 * trimmer) / k_mid - trimmer - b;
            let tops: Vec<f64> = match top {
                Some(t) => vec![t],
                None if top_ideal > 0.0 => neighbours(series, top_ideal).to_vec(),
                None => vec![series.at_or_above(1.0)],
            };
            for &t in &tops {
                let d = Divider {
                    top_ohm: t,
                    trimmer_ohm: trimmer,
                    bottom_ohm: b,
                };
                let score = (d.position_for_ratio(k_mid) - 0.5).abs();
                let covers = d.ratio_at(0.0) <= k_low && d.ratio_at(1.0) >= k_high;
                if covers && best_cover.is_none_or(|(s, _)| score < s) {
                    best_cover = Some((score, d));
                }
                if best_any.is_none_or(|(s, _)| score < s) {
                    best_any = Some((score, d));
                }
            }
        }
        match (best_cover, best_any) {
            (Some((_, d)), _) => Ok((d, exact)),
            (None, Some((_, d))) if any_fixed => Ok((d, exact)),
            _ => Err(DividerError::OutOfRail { low: lo, high: hi }),
        }
    }
}

/// The preferred values around `x`: two below and two above.
pub(crate) fn neighbours(series: ESeries, x: f64) -> [f64; 4] {
    let below = series.at_or_below(x);
    let above = series.at_or_above(x);
    [
        series.at_or_below(below * 0.999),
        below,
        above,
        series.at_or_above(above * 1.001),
    ]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn wiper_ratio_and_thevenin_by_hand() {
        // Hand calculation: 10 kΩ + 5 kΩ trimmer + 10 kΩ on 5 V, wiper at
        // mid-travel: ratio (10k + 2.5k)/25k = 0.5 → 2.5 V; source resistance
        // 12.5 kΩ ∥ 12.5 kΩ = 6.25 kΩ.
        let d = Divider {
            top_ohm: 10e3,
            trimmer_ohm: 5e3,
            bottom_ohm: 10e3,
        };
        assert!((d.ratio_at(0.5) - 0.5).abs() < 1e-15);
        let (v, r) = d.thevenin(5.0, 0.5);
        assert!((v - 2.5).abs() < 1e-12);
        assert!((r - 6250.0).abs() < 1e-9);
        // Ends: 10k/25k = 0.4 and 15k/25k = 0.6.
        assert!((d.ratio_at(0.0) - 0.4).abs() < 1e-15);
        assert!((d.ratio_at(1.0) - 0.6).abs() < 1e-15);
    }

    #[test]
    fn position_inverts_ratio() {
        let d = Divider {
            top_ohm: 47e3,
            trimmer_ohm: 5e3,
            bottom_ohm: 6.2e3,
        };
        for x in [0.0, 0.1, 0.5, 0.93, 1.0] {
            assert!((d.position_for_ratio(d.ratio_at(x)) - x).abs() < 1e-12);
        }
    }

    #[test]
    fn sized_divider_covers_the_span_near_mid_travel() {
        // Invariant of the sizing rule: E24 fixed parts, a 1-2-5 trimmer, the
        // wanted span covered, the target near mid-travel, the current near
        // the wanted one (within the trimmer's rounding).
        for &(k_mid, k_lo, k_hi) in &[(0.15, 0.125, 0.18), (0.5, 0.45, 0.55), (0.8, 0.78, 0.83)] {
            let (d, (top, bottom)) = Divider::size_with(
                5.0,
                k_mid,
                k_lo,
                k_hi,
                200e-6,
                ESeries::E24,
                None,
                None,
                None,
            )
            .unwrap();
            assert!(d.ratio_at(0.0) <= k_lo && d.ratio_at(1.0) >= k_hi, "{d:?}");
            let x = d.position_for_ratio(k_mid);
            assert!((0.25..=0.75).contains(&x), "x = {x}");
            assert!(STANDARD_TRIMMER_OHM.contains(&d.trimmer_ohm));
            for v in [d.top_ohm, d.bottom_ohm] {
                assert_eq!(ESeries::E24.nearest(v), v, "{v} is an E24 value");
            }
            assert!(top > 0.0 && bottom > 0.0);
            let i = 5.0 / d.total_ohm();
            assert!(i <= 200e-6 * 1.2 && i > 10e-6, "divider current {i} A");
        }
    }

    #[test]
    fn span_beyond_the_rail_is_refused() {
        assert!(matches!(
            Divider::size_with(5.0, 0.05, 0.0, 0.3, 200e-6, ESeries::E24, None, None, None),
            Err(DividerError::OutOfRail { .. })
        ));
    }
}
