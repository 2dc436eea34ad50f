//! Heat-loss laws of the sensing element.
//!
//! Every law gives the heat the element loses, `P_loss(T, U)`, to air at
//! the ambient temperature, with its partial derivatives in T and U.

use super::Environment;
use crate::physics::air::AIR_TABLE_RANGE_K;
use crate::physics::convection::{
    ConvectionState, CylinderInCrossFlow, ForcedCorrelation, MixingRule, NaturalCorrelation,
};
use crate::physics::materials::Material;
use crate::physics::radiation::radiative_loss_w;
use crate::precision::FD_REL_STEP;

/// Why a cooling law could not be built.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum CoolingLawError {
    /// A parameter violated its stated condition.
    #[error("{parameter} must be {condition}, found {value}")]
    Invalid {
        /// Which parameter.
        parameter: &'static str,
        /// The condition it must satisfy.
        condition: &'static str,
        /// The offending value (SI).
        value: f64,
    },
    /// The cylinder's dimensions were refused.
    #[error("wire geometry: {message}")]
    Geometry {
        /// The convection model's message, with the offending values.
        message: String,
    },
}

/// King's law in conductance form, `G(U) = A + B·Uⁿ` (W/K), with
/// `P_loss = G(U)·(T − T_amb)`.
///
/// L. V. King, "On the convection of heat from small cylinders in a stream
/// of fluid", Phil. Trans. R. Soc. A 214 (1914) 373–432. King's theory gives
/// n = 0.5; calibrations commonly find n ≈ 0.45. `B` is the conductance
/// added at U = 1 m/s, so U is taken in m/s.
///
/// **Still-air floor** (optional, `still_air_floor_m_per_s` > 0): near still
/// air A + B·Uⁿ has an infinite slope at U → 0, where free convection, not
/// the airflow, sets the loss. With a floor U_N the airflow term becomes
/// B·(U² + U_N²)^(n/2): the airflow and a natural-convection velocity added
/// as perpendicular vectors, the form of the effective-velocity methods for
/// cross flow over horizontal cylinders (the concept: Lemlich & Hoke 1956,
/// as described by S. W. Churchill, Ind. Eng. Chem. Res. 2014; draftwire's
/// construction, not a published correlation). The slope at U = 0 is then
/// zero, the still-air conductance A + B·U_Nⁿ, and well above U_N the law
/// is King's within (n/2)·(U_N/U)².
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct KingsLaw {
    a_w_per_k: f64,
    b_w_per_k: f64,
    n: f64,
    still_air_floor_m_per_s: f64,
}

impl KingsLaw {
    /// Build King's law: A ≥ 0, B > 0, 0 < n ≤ 1, and A + B > 0.
    pub fn new(a_w_per_k: f64, b_w_per_k: f64, n: f64) -> Result<Self, CoolingLawError> {
        let bad = |parameter, condition, value| {
            Err(CoolingLawError::Invalid {
                parameter,
                condition,
                value,
            })
        };
        if !(a_w_per_k.is_finite() && a_w_per_k >= 0.0) {
            return bad("A", "a finite conductance of at least 0 W/K", a_w_per_k);
        }
        if !(b_w_per_k.is_finite() && b_w_per_k > 0.0) {
            return bad("B", "a finite conductance above 0 W/K", b_w_per_k);
        }
        if !(n.is_finite() && n > 0.0 && n <= 1.0) {
            return bad("n", "a number in (0, 1]", n);
        }
        Ok(Self {
            a_w_per_k,
            b_w_per_k,
            n,
            still_air_floor_m_per_s: 0.0,
        })
    }
    /// The same law with a still-air floor U_N (m/s; 0 for none). A value
    /// that is not finite and ≥ 0 leaves the law unchanged.
    pub fn with_still_air_floor(self, floor_m_per_s: f64) -> Self {
        if !(floor_m_per_s.is_finite() && floor_m_per_s >= 0.0) {
            return self;
        }
        Self {
            still_air_floor_m_per_s: floor_m_per_s,
            ..self
        }
    }
    /// The still-air floor U_N, m/s (0: none, King's law extrapolated to
    /// still air).
    pub fn still_air_floor_m_per_s(&self) -> f64 {
        self.still_air_floor_m_per_s
    }
    /// A, the still-air conductance without a floor (W/K).
    pub fn a_w_per_k(&self) -> f64 {
        self.a_w_per_k
    }
    /// B, the conductance added at 1 m/s (W/K).
    pub fn b_w_per_k(&self) -> f64 {
        self.b_w_per_k
    }
    /// n, the airflow exponent.
    pub fn n(&self) -> f64 {
        self.n
    }
    /// The airflow at which the conductance is `g` (W/K), King's law
    /// inverted: `U = ((G − A)/B)^(1/n)`, or with a floor
    /// `U = √(((G − A)/B)^(2/n) − U_N²)`; `None` when G is below what still
    /// air gives or the result is not finite.
    pub fn airflow_for_conductance(&self, g_w_per_k: f64) -> Option<f64> {
        let x = (g_w_per_k - self.a_w_per_k) / self.b_w_per_k;
        if x.is_nan() || x < 0.0 {
            return None;
        }
        let uf = self.still_air_floor_m_per_s;
        let u = if uf == 0.0 {
            x.powf(1.0 / self.n)
        } else {
            let s = x.powf(2.0 / self.n) - uf * uf;
            if s.is_nan() || s < 0.0 {
                return None;
            }
            s.sqrt()
        };
        u.is_finite().then_some(u)
    }

    /// G(U) = A + B·Uⁿ, or A + B·(U² + U_N²)^(n/2) with a floor; U in m/s
    /// (negative U taken as |U|).
    #[inline]
    pub fn conductance_w_per_k(&self, airflow_m_per_s: f64) -> f64 {
        let uf = self.still_air_floor_m_per_s;
        let term = if uf == 0.0 {
            airflow_m_per_s.abs().powf(self.n)
        } else {
            (airflow_m_per_s * airflow_m_per_s + uf * uf).powf(0.5 * self.n)
        };
        self.a_w_per_k + self.b_w_per_k * term
    }

    /// dG/dU (W/K per m/s): B·n·U^(n−1), infinite as U → 0 (taken at the
    /// smallest positive U there); with a floor B·n·U·(U² + U_N²)^(n/2 − 1),
    /// zero at U = 0.
    pub fn dconductance_du(&self, airflow_m_per_s: f64) -> f64 {
        let uf = self.still_air_floor_m_per_s;
        let u = airflow_m_per_s.abs();
        if uf == 0.0 {
            let u = u.max(f64::MIN_POSITIVE);
            self.b_w_per_k * self.n * u.powf(self.n - 1.0)
        } else {
            self.b_w_per_k * self.n * u * (u * u + uf * uf).powf(0.5 * self.n - 1.0)
        }
    }
}

/// Thermistor data-sheet form: the still-air dissipation constant δ0 and
/// the dissipation constant δ1 the data sheet (or a bench test) gives at
/// one airflow U1, joined by
///
/// δ(U) = δ0 + (δ1 − δ0)·(U/U1)ⁿ (W/K), P_loss = δ(U)·(T − T_amb).
///
/// δ is the dissipation constant of MIL-PRF-23648 and IEC 60539-1 (power
/// per kelvin of self-heating, in still air unless stated). The flow term
/// has King's form (King 1914, n = 0.5 by default); written this way its
/// inputs are the two figures a data sheet quotes. The thermal time
/// constant τ (63.2 % response to a step at zero power in still air, same
/// standards) gives the heat capacity C = τ·δ0 of a lumped body.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DissipationLaw {
    still_air_w_per_k: f64,
    moving_w_per_k: f64,
    moving_airflow_m_per_s: f64,
    king: KingsLaw,
}

impl DissipationLaw {
    /// δ0 > 0 in still air, δ1 > δ0 at airflow U1 > 0, exponent 0 < n ≤ 1.
    pub fn new(
        still_air_w_per_k: f64,
        moving_w_per_k: f64,
        moving_airflow_m_per_s: f64,
        n: f64,
    ) -> Result<Self, CoolingLawError> {
        let bad = |parameter, condition, value| {
            Err(CoolingLawError::Invalid {
                parameter,
                condition,
                value,
            })
        };
        if !(still_air_w_per_k.is_finite() && still_air_w_per_k > 0.0) {
            return bad(
                "dissipation",
                "a finite dissipation constant above 0 W/K",
                still_air_w_per_k,
            );
        }
        if !(moving_w_per_k.is_finite() && moving_w_per_k > still_air_w_per_k) {
            return bad(
                "dissipation_moving",
                "a finite dissipation constant above the still-air one",
                moving_w_per_k,
            );
        }
        if !(moving_airflow_m_per_s.is_finite() && moving_airflow_m_per_s > 0.0) {
            return bad(
                "moving_airflow",
                "a finite airflow above 0 m/s",
                moving_airflow_m_per_s,
            );
        }
        let b = (moving_w_per_k - still_air_w_per_k) / moving_airflow_m_per_s.powf(n);
        let king = KingsLaw::new(still_air_w_per_k, b, n)?;
        Ok(Self {
            still_air_w_per_k,
            moving_w_per_k,
            moving_airflow_m_per_s,
            king,
        })
    }
    /// δ0, the still-air dissipation constant, W/K.
    pub fn still_air_w_per_k(&self) -> f64 {
        self.still_air_w_per_k
    }
    /// δ1 at [`DissipationLaw::moving_airflow_m_per_s`], W/K.
    pub fn moving_w_per_k(&self) -> f64 {
        self.moving_w_per_k
    }
    /// U1, m/s.
    pub fn moving_airflow_m_per_s(&self) -> f64 {
        self.moving_airflow_m_per_s
    }
    /// The same law as King's A + B·Uⁿ (A = δ0, B = (δ1 − δ0)/U1ⁿ).
    pub fn as_kings_law(&self) -> KingsLaw {
        self.king
    }
    /// Heat capacity from the data-sheet time constant, C = τ·δ0, J/K.
    pub fn heat_capacity_from_time_constant(&self, time_constant_s: f64) -> f64 {
        time_constant_s * self.still_air_w_per_k
    }
}

/// Whether the geometry is the wire itself or the envelope of a coil.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Shape {
    /// A straight wire: diameter and length are the wire's.
    StraightWire,
    /// A coil treated as a solid cylinder of its outer envelope (diameter
    /// and length of the coil). Stated simplification: the turns shade each
    /// other, so the coil is taken to lose heat like its envelope; this is
    /// the usual first estimate and gives a lower loss than the uncoiled
    /// wire would (see `crate::physics::lamp::coil_note`).
    CoilEnvelope,
}

/// Heat loss of a cylinder from its geometry: convection
/// ([`CylinderInCrossFlow`]: forced correlation, natural floor, power-mean
/// mixing), radiation `ε(T)·σ·A·(T⁴ − T_amb⁴)` (Incropera et al., 6th ed.,
/// eq. 1.7; surroundings at ambient), and optional conduction to the
/// supports: a fixed conductance `G_s·(T − T_amb)`, or for a straight wire
/// the fin model ([`end_loss_share`]), whose share of the loss follows the
/// airflow.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct GeometryCooling {
    cylinder: CylinderInCrossFlow,
    shape: Shape,
    material: Material,
    emissivity_override: Option<f64>,
    support_w_per_k: f64,
    fin_supports: bool,
}

/// The share of the electrical power a uniformly heated wire of length L
/// conducts into two supports held at ambient, `tanh(a)/a` with
/// `a = L/(2·l_c)` and the cold length `l_c = √(k_w·d/(4h))`: the straight
/// fin with uniform heat generation and both ends at the base temperature
/// (Incropera et al., 6th ed., §3.6, the fin equation
/// d²θ/dx² − θ/l_c² = −q'/(k_w·A_c), solved with θ = 0 at x = ±L/2):
/// θ(x) = θ_∞·(1 − cosh(x/l_c)/cosh(a)), θ_∞ = q'/(h·π·d), whose mean is
/// θ_∞·(1 − tanh(a)/a). The lateral loss is h·π·d·L·θ_mean, so the ends
/// take tanh(a)/a of q'·L. `h` is the lateral heat-transfer coefficient
/// (convection and linearised radiation), W/(m²·K).
pub fn end_loss_share(h_w_per_m2_k: f64, k_wire_w_per_m_k: f64, d_m: f64, l_m: f64) -> f64 {
    let a = 0.5 * l_m / cold_length_m(h_w_per_m2_k, k_wire_w_per_m_k, d_m);
    if a < 1e-4 {
        // tanh(a)/a = 1 − a²/3 + … : all the heat goes to the ends.
        return 1.0 - a * a / 3.0;
    }
    a.tanh() / a
}

/// The cold length `l_c = √(k_w·d/(4h))`, m (the fin parameter 1/m of
/// Incropera et al., §3.6, for a cylinder: m² = h·P/(k·A_c) = 4h/(k·d)).
pub fn cold_length_m(h_w_per_m2_k: f64, k_wire_w_per_m_k: f64, d_m: f64) -> f64 {
    (k_wire_w_per_m_k * d_m / (4.0 * h_w_per_m2_k)).sqrt()
}

impl GeometryCooling {
    /// A cylinder of `diameter_m` < `length_m` of `material`, with the
    /// correlations to use, an optional fixed emissivity (0…1; otherwise the
    /// material's, temperature-dependent for tungsten) and a support
    /// conductance ≥ 0 W/K.
    // Eight plain physical inputs, each validated here; a builder would add
    // a type for no gain.
    #[allow(clippy::too_many_arguments)]
    pub fn new(
        shape: Shape,
        diameter_m: f64,
        length_m: f64,
        material: Material,
        forced: ForcedCorrelation,
        natural: NaturalCorrelation,
        emissivity_override: Option<f64>,
        support_w_per_k: f64,
    ) -> Result<Self, CoolingLawError> {
        let cylinder =
            CylinderInCrossFlow::new(diameter_m, length_m, forced, natural).map_err(|e| {
                CoolingLawError::Geometry {
                    message: e.to_string(),
                }
            })?;
        if let Some(e) = emissivity_override {
            if !(e.is_finite() && (0.0..=1.0).contains(&e)) {
                return Err(CoolingLawError::Invalid {
                    parameter: "emissivity",
                    condition: "a number from 0 to 1",
                    value: e,
                });
            }
        }
        if !(support_w_per_k.is_finite() && support_w_per_k >= 0.0) {
            return Err(CoolingLawError::Invalid {
                parameter: "supports",
                condition: "a finite conductance of at least 0 W/K",
                value: support_w_per_k,
            });
        }
        Ok(Self {
            cylinder,
            shape,
            material,
            emissivity_override,
            support_w_per_k,
            fin_supports: false,
        })
    }
    /// The same wire with its ends in supports held at ambient, the end
    /// loss from the fin model instead of a fixed conductance. A straight
    /// wire only (a coil's turns do not conduct along one axis).
    pub fn with_fin_supports(self) -> Result<Self, CoolingLawError> {
        if self.shape != Shape::StraightWire {
            return Err(CoolingLawError::Geometry {
                message: "the fin model of the supports needs a straight wire (law = \"wire\")"
                    .into(),
            });
        }
        Ok(Self {
            fin_supports: true,
            support_w_per_k: 0.0,
            ..self
        })
    }
    /// The fin model's wire constants: conductivity (W/(m·K)), diameter and
    /// length (m).
    fn fin_constants(&self) -> (f64, f64, f64) {
        (
            self.material.thermal_conductivity_w_per_m_k(),
            self.cylinder.diameter_m(),
            self.cylinder.length_m(),
        )
    }
    /// Whether the supports follow the fin model.
    pub fn fin_supports(&self) -> bool {
        self.fin_supports
    }
    /// The lateral loss (convection + radiation) at `t_k`, W, and with the
    /// fin model the share of the total that goes to the supports and the
    /// cold length (m); `None` outside the convection model's domain.
    fn lateral_and_share(&self, t_k: f64, u: f64, env: &Environment) -> Option<(f64, f64, f64)> {
        let conv = self.convection(t_k, u, env)?.heat_loss_w;
        let rad = radiative_loss_w(
            self.cylinder.surface_area_m2(),
            self.emissivity(t_k),
            t_k,
            env.ambient_k,
        );
        let lateral = conv + rad;
        if !self.fin_supports {
            return Some((lateral, 0.0, f64::INFINITY));
        }
        let rise = t_k - env.ambient_k;
        if rise == 0.0 || lateral == 0.0 {
            return Some((lateral, 0.0, f64::INFINITY));
        }
        let h = lateral / (rise * self.cylinder.surface_area_m2());
        let (k, d, l) = self.fin_constants();
        Some((lateral, end_loss_share(h, k, d, l), cold_length_m(h, k, d)))
    }
    /// With the fin model: the supports' share of the loss and the cold
    /// length (m) at `t_k` and airflow `u`; `None` for a fixed support
    /// conductance.
    pub fn support_share(&self, t_k: f64, u: f64, env: &Environment) -> Option<(f64, f64)> {
        if !self.fin_supports {
            return None;
        }
        self.lateral_and_share(t_k, u, env)
            .map(|(_, share, lc)| (share, lc))
    }
    /// The convecting cylinder.
    pub fn cylinder(&self) -> &CylinderInCrossFlow {
        &self.cylinder
    }
    /// Wire or coil envelope.
    pub fn shape(&self) -> Shape {
        self.shape
    }
    /// The material (emissivity, heat capacity, limits).
    pub fn material(&self) -> Material {
        self.material
    }
    /// Conductance to the supports, W/K.
    pub fn support_w_per_k(&self) -> f64 {
        self.support_w_per_k
    }
    /// Emissivity used at `t_k`.
    pub fn emissivity(&self, t_k: f64) -> f64 {
        self.emissivity_override
            .unwrap_or_else(|| self.material.emissivity(t_k))
    }
    /// Heat capacity ρ·c·(π/4)·d²·L of a solid wire of this material, J/K
    /// (ρ, c near 300 K from [`Material`]). For a coil envelope this is not
    /// the wire's volume: callers use it for straight wires only.
    pub fn wire_heat_capacity_j_per_k(&self) -> f64 {
        let d = self.cylinder.diameter_m();
        self.material.density_kg_per_m3()
            * self.material.specific_heat_j_per_kg_k()
            * std::f64::consts::FRAC_PI_4
            * d
            * d
            * self.cylinder.length_m()
    }
    fn convection(&self, t_k: f64, u: f64, env: &Environment) -> Option<ConvectionState> {
        self.cylinder
            .convection(u, t_k, env.ambient_k, env.pressure_pa)
            .ok()
    }
    /// Total loss, W; NaN only when the convection model refuses its input
    /// (T or ambient not above 0 K, a bad pressure), which the solver then
    /// reports as a numerical failure.
    ///
    /// With the fin model `t_k` is the wire's mean temperature (the one its
    /// resistance gives, exactly for a linear law) and the ends take
    /// `tanh(a)/a` of the power ([`end_loss_share`]): loss = lateral/(1 − share).
    fn loss_w(&self, t_k: f64, u: f64, env: &Environment) -> f64 {
        if self.fin_supports {
            return self
                .lateral_and_share(t_k, u, env)
                .map_or(f64::NAN, |(lateral, share, _)| lateral / (1.0 - share));
        }
        let conv = self
            .convection(t_k, u, env)
            .map_or(f64::NAN, |c| c.heat_loss_w);
        let rad = radiative_loss_w(
            self.cylinder.surface_area_m2(),
            self.emissivity(t_k),
            t_k,
            env.ambient_k,
        );
        conv + rad + self.support_w_per_k * (t_k - env.ambient_k)
    }
}

impl GeometryCooling {
    /// The airflow at which the total loss at `t_k` equals `loss_w`:
    /// radiation and support conduction taken off, the convective rest
    /// inverted through the correlations
    /// ([`CylinderInCrossFlow::airflow_for_convective_loss`]). `None` below
    /// the still-air loss or outside the model's domain.
    pub fn airflow_for_loss(&self, t_k: f64, loss_w: f64, env: &Environment) -> Option<f64> {
        let rad = radiative_loss_w(
            self.cylinder.surface_area_m2(),
            self.emissivity(t_k),
            t_k,
            env.ambient_k,
        );
        let convective = if self.fin_supports {
            self.convective_for_fin_loss(t_k, loss_w, rad, env)?
        } else {
            loss_w - rad - self.support_w_per_k * (t_k - env.ambient_k)
        };
        self.cylinder
            .airflow_for_convective_loss(convective, t_k, env.ambient_k, env.pressure_pa)
    }

    /// With the fin model: the convective loss that, with radiation `rad`
    /// and the ends' share, makes the total `loss_w` at `t_k`. The total
    /// lateral/(1 − share) rises with the lateral loss (the cold length
    /// shortens as h grows), so Brent's method on 0 … loss_w finds it;
    /// `None` when even no convection would lose more.
    fn convective_for_fin_loss(
        &self,
        t_k: f64,
        loss_w: f64,
        rad: f64,
        env: &Environment,
    ) -> Option<f64> {
        let rise = t_k - env.ambient_k;
        let area = self.cylinder.surface_area_m2();
        let (k, d, l) = self.fin_constants();
        let total = |conv: f64| {
            let lateral = conv + rad;
            if lateral <= 0.0 {
                return -loss_w;
            }
            let share = end_loss_share(lateral / (rise * area), k, d, l);
            lateral / (1.0 - share) - loss_w
        };
        if !(rise > 0.0 && loss_w > 0.0) || total(0.0) > 0.0 {
            return None;
        }
        crate::roots::brent(total, 0.0, loss_w).ok().map(|r| r.x)
    }
}

/// The element's heat-loss law.
#[derive(Debug, Clone, PartialEq)]
pub enum CoolingLaw {
    /// King's law with constant coefficients.
    King(KingsLaw),
    /// Thermistor data-sheet form (dissipation constants).
    Datasheet(DissipationLaw),
    /// From the wire's (or coil envelope's) geometry and material.
    Geometry(GeometryCooling),
}

/// Central finite difference of `f` at `x` with step `FD_REL_STEP·scale`,
/// one-sided (forward) when `x − h` would fall below `floor`.
fn central_difference(f: impl Fn(f64) -> f64, x: f64, scale: f64, floor: f64) -> f64 {
    let h = FD_REL_STEP * scale;
    let lo = (x - h).max(floor);
    let hi = lo + 2.0 * h;
    (f(hi) - f(lo)) / (hi - lo)
}

impl CoolingLaw {
    /// The constant King's-law conductance `G(U) = A + B·Uⁿ` behind this
    /// law, when it has one (King's law itself and the data-sheet form):
    /// then the loss is `G(U)·(T − T_amb)` and the airflow for a given
    /// conductance has a closed form ([`KingsLaw::airflow_for_conductance`]).
    pub fn kings_form(&self) -> Option<&KingsLaw> {
        match self {
            CoolingLaw::King(k) => Some(k),
            CoolingLaw::Datasheet(d) => Some(&d.king),
            CoolingLaw::Geometry(_) => None,
        }
    }

    /// This law with a still-air floor U_N (m/s) on its airflow term
    /// ([`KingsLaw`]); `None` for geometry cooling, which has a natural-
    /// convection term of its own.
    pub fn with_still_air_floor(&self, floor_m_per_s: f64) -> Option<CoolingLaw> {
        match self {
            CoolingLaw::King(k) => Some(CoolingLaw::King(k.with_still_air_floor(floor_m_per_s))),
            CoolingLaw::Datasheet(d) => Some(CoolingLaw::Datasheet(DissipationLaw {
                king: d.king.with_still_air_floor(floor_m_per_s),
                ..*d
            })),
            CoolingLaw::Geometry(_) => None,
        }
    }

    /// This law with its airflow term scaled by `factor` (a model
    /// tolerance on the cooling: King's `B`, the data-sheet form's flow
    /// term, geometry cooling's forced correlation, intercept included).
    pub fn with_airflow_term_scaled(&self, factor: f64) -> CoolingLaw {
        let scale = |k: &KingsLaw| KingsLaw {
            b_w_per_k: k.b_w_per_k * factor,
            ..*k
        };
        match self {
            CoolingLaw::King(k) => CoolingLaw::King(scale(k)),
            CoolingLaw::Datasheet(d) => CoolingLaw::Datasheet(DissipationLaw {
                king: scale(&d.king),
                ..*d
            }),
            CoolingLaw::Geometry(g) => CoolingLaw::Geometry(GeometryCooling {
                cylinder: g
                    .cylinder
                    .with_forced_factor(g.cylinder.forced_factor() * factor),
                ..*g
            }),
        }
    }

    /// The law of `factor` times the length of the same wire (a twin cut
    /// longer): King's A and B (and a data-sheet form's dissipation
    /// constants) scale with the length, since a wire's convective and
    /// radiative losses are per unit length (Collis & Williams 1959 give
    /// Nu per unit length; King 1914 likewise); a geometry law takes the
    /// longer cylinder, its supports unchanged. `None` for a factor that is
    /// not finite and positive.
    pub fn scaled_in_length(&self, factor: f64) -> Option<CoolingLaw> {
        if !(factor.is_finite() && factor > 0.0) {
            return None;
        }
        let scale = |k: &KingsLaw| KingsLaw {
            a_w_per_k: k.a_w_per_k * factor,
            b_w_per_k: k.b_w_per_k * factor,
            ..*k
        };
        match self {
            CoolingLaw::King(k) => Some(CoolingLaw::King(scale(k))),
            CoolingLaw::Datasheet(d) => Some(CoolingLaw::Datasheet(DissipationLaw {
                still_air_w_per_k: d.still_air_w_per_k * factor,
                moving_w_per_k: d.moving_w_per_k * factor,
                king: scale(&d.king),
                ..*d
            })),
            CoolingLaw::Geometry(g) => g
                .cylinder
                .with_length(g.cylinder.length_m() * factor)
                .ok()
                .map(|cylinder| CoolingLaw::Geometry(GeometryCooling { cylinder, ..*g })),
        }
    }

    /// This law with another rule for combining forced and natural
    /// convection (geometry cooling only; `None` for the other laws).
    pub fn with_mixing(&self, rule: MixingRule) -> Option<CoolingLaw> {
        match self {
            CoolingLaw::Geometry(g) => Some(CoolingLaw::Geometry(GeometryCooling {
                cylinder: g.cylinder.with_mixing(rule),
                ..*g
            })),
            _ => None,
        }
    }

    /// The mixing rule of geometry cooling.
    pub fn mixing(&self) -> Option<MixingRule> {
        match self {
            CoolingLaw::Geometry(g) => Some(g.cylinder.mixing()),
            _ => None,
        }
    }

    /// Heat lost (W) at element temperature `t_k` and airflow `u` (m/s).
    #[inline]
    pub fn heat_loss_w(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> f64 {
        match self {
            CoolingLaw::King(k) => k.conductance_w_per_k(airflow_m_per_s) * (t_k - env.ambient_k),
            CoolingLaw::Datasheet(d) => {
                d.king.conductance_w_per_k(airflow_m_per_s) * (t_k - env.ambient_k)
            }
            CoolingLaw::Geometry(g) => g.loss_w(t_k, airflow_m_per_s, env),
        }
    }

    /// ∂P_loss/∂T (W/K): analytic for King and the data-sheet form; for
    /// geometry a central difference with step `FD_REL_STEP·T`.
    #[inline]
    pub fn d_heat_loss_dt(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> f64 {
        match self {
            CoolingLaw::King(k) => k.conductance_w_per_k(airflow_m_per_s),
            CoolingLaw::Datasheet(d) => d.king.conductance_w_per_k(airflow_m_per_s),
            CoolingLaw::Geometry(g) => central_difference(
                |t| g.loss_w(t, airflow_m_per_s, env),
                t_k,
                t_k,
                f64::MIN_POSITIVE,
            ),
        }
    }

    /// ∂P_loss/∂U (W per m/s); for U = 0 the one-sided limit is infinite
    /// for King without a still-air floor (n < 1) and for the forced correlations (Nu − Nu₀ ∝ Re^½),
    /// so callers evaluate it at U > 0. Geometry: central difference with
    /// step `FD_REL_STEP·max(|U|, 0.01 m/s)`, forward at U = 0.
    pub fn d_heat_loss_du(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> f64 {
        let king_du = |k: &KingsLaw| k.dconductance_du(airflow_m_per_s) * (t_k - env.ambient_k);
        match self {
            CoolingLaw::King(k) => king_du(k),
            CoolingLaw::Datasheet(d) => king_du(&d.king),
            CoolingLaw::Geometry(g) => {
                let u = airflow_m_per_s.abs();
                central_difference(|v| g.loss_w(t_k, v, env), u, u.max(0.01), 0.0)
            }
        }
    }

    /// The name with what the law does near still air, for reports: King's
    /// law and the data-sheet form state their still-air floor, or that they
    /// are extrapolated to still air without one.
    pub fn summary(&self) -> String {
        match self.kings_form() {
            Some(k) if k.still_air_floor_m_per_s() > 0.0 => format!(
                "{}, still-air floor {:.1} mm/s",
                self.name(),
                k.still_air_floor_m_per_s() * 1e3
            ),
            Some(_) => format!(
                "{}, no still-air floor (extrapolated to U = 0)",
                self.name()
            ),
            None => self.name().to_string(),
        }
    }

    /// Short name for reports.
    pub fn name(&self) -> &'static str {
        match self {
            CoolingLaw::King(_) => "King's law",
            CoolingLaw::Datasheet(_) => "thermistor dissipation constant",
            CoolingLaw::Geometry(g) => match g.shape {
                Shape::StraightWire => "straight-wire geometry",
                Shape::CoilEnvelope => "coil-envelope geometry",
            },
        }
    }

    /// Where the model is used outside its published range at (T, U):
    /// empty for King and the data-sheet form; for geometry, the flags of
    /// the convection correlations ([`crate::physics::convection::RangeWarnings`])
    /// and a film temperature outside the range over which the air
    /// properties were checked against published tables (240–700 K).
    pub fn range_warnings(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> Vec<String> {
        let CoolingLaw::Geometry(g) = self else {
            return Vec::new();
        };
        let Some(c) = g.convection(t_k, airflow_m_per_s, env) else {
            return vec![format!(
                "convection could not be evaluated at {t_k:.1} K, {airflow_m_per_s} m/s"
            )];
        };
        let forced = match g.cylinder.forced() {
            ForcedCorrelation::CollisWilliams => "Collis & Williams (0.02 < Re < 140)",
            ForcedCorrelation::ChurchillBernstein => "Churchill & Bernstein (Re·Pr ≥ 0.2)",
        };
        let natural = match g.cylinder.natural() {
            NaturalCorrelation::ChurchillChu => "Churchill & Chu (1e-5 ≤ Ra ≤ 1e12)",
            NaturalCorrelation::Morgan => "Morgan (1e-10 < Ra < 1e12)",
        };
        let at = format!("at {:.1} °C and {airflow_m_per_s:.3} m/s", t_k - 273.15);
        let mut out = Vec::new();
        let w = c.warnings;
        if w.reynolds_above_range {
            out.push(format!(
                "Re = {:.3e} {at} is above the range of {forced}",
                c.reynolds
            ));
        }
        if w.reynolds_below_range {
            out.push(format!(
                "Re = {:.3e} {at} is below the range of {forced}",
                c.reynolds
            ));
        }
        if w.rayleigh_out_of_range {
            out.push(format!(
                "Ra = {:.3e} {at} is outside the range of {natural}",
                c.rayleigh
            ));
        }
        if w.free_convection_dominates && airflow_m_per_s > 0.0 {
            out.push(format!(
                "free convection dominates {at} (Re = {:.3e} < Gr^(1/3), the Collis & Williams criterion): \
                 the forced-convection correlation is outside its regime and the wire's orientation matters",
                c.reynolds
            ));
        }
        let (lo, hi) = AIR_TABLE_RANGE_K;
        if c.film_temperature_k < lo || c.film_temperature_k > hi {
            out.push(format!(
                "film temperature {:.0} K {at} is outside {lo:.0}–{hi:.0} K, where the air properties were checked \
                 against published tables",
                c.film_temperature_k
            ));
        }
        out
    }

    /// Conductance G(U) = P_loss(T, U)/(T − T_amb), W/K, at a fixed element
    /// temperature (radiation and support conduction included).
    #[inline]
    pub fn conductance_w_per_k(&self, t_k: f64, airflow_m_per_s: f64, env: &Environment) -> f64 {
        let dt = t_k - env.ambient_k;
        self.heat_loss_w(t_k, airflow_m_per_s, env) / dt
    }

    /// The King's law A + B·Uⁿ equivalent to this law around an operating
    /// point: G(U) = P_loss(T, U)/(T − T_amb) at the fixed temperature `t_k`
    /// is evaluated at U = 0, U_trip/2, U_trip and 2·U_trip and fitted by
    /// least squares: for each n, A and B solve the linear 2×2 normal
    /// equations; n minimises the sum of squared residuals over [0.05, 1]
    /// by golden-section search (Kiefer 1953; e.g. Press et al., Numerical
    /// Recipes, 3rd ed., §10.2). A includes radiation and support
    /// conduction linearised at T. Needs T > T_amb and U_trip > 0.
    pub fn equivalent_kings_law(
        &self,
        t_k: f64,
        trip_airflow_m_per_s: f64,
        env: &Environment,
    ) -> Result<KingsLaw, CoolingLawError> {
        if !(t_k.is_finite() && t_k > env.ambient_k) {
            return Err(CoolingLawError::Invalid {
                parameter: "element temperature",
                condition: "above ambient",
                value: t_k,
            });
        }
        let u_t = trip_airflow_m_per_s;
        if !(u_t.is_finite() && u_t > 0.0) {
            return Err(CoolingLawError::Invalid {
                parameter: "trip airflow",
                condition: "a finite airflow above 0 m/s",
                value: u_t,
            });
        }
        let us = [0.0, 0.5 * u_t, u_t, 2.0 * u_t];
        let gs = us.map(|u| self.conductance_w_per_k(t_k, u, env));
        if gs.iter().any(|g| !g.is_finite()) {
            return Err(CoolingLawError::Invalid {
                parameter: "conductance",
                condition: "finite at the fit airflows",
                value: f64::NAN,
            });
        }
        // Linear least squares in (A, B) for a given n; returns (A, B, SSE).
        let solve = |n: f64| {
            let xs = us.map(|u| u.powf(n));
            let m = xs.len() as f64;
            let (sx, sy) = (xs.iter().sum::<f64>(), gs.iter().sum::<f64>());
            let sxx: f64 = xs.iter().map(|x| x * x).sum();
            let sxy: f64 = xs.iter().zip(&gs).map(|(x, y)| x * y).sum();
            let det = m * sxx - sx * sx;
            let b = (m * sxy - sx * sy) / det;
            let a = (sy - b * sx) / m;
            let sse: f64 = xs
                .iter()
                .zip(&gs)
                .map(|(x, y)| (a + b * x - y).powi(2))
                .sum();
            (a, b, sse)
        };
        let (mut lo, mut hi) = (0.05_f64, 1.0_f64);
        let phi = 0.5 * (5f64.sqrt() - 1.0);
        let mut x1 = hi - phi * (hi - lo);
        let mut x2 = lo + phi * (hi - lo);
        let (mut f1, mut f2) = (solve(x1).2, solve(x2).2);
        for _ in 0..crate::precision::GOLDEN_SECTION_ITERATIONS {
            if f1 <= f2 {
                hi = x2;
                x2 = x1;
                f2 = f1;
                x1 = hi - phi * (hi - lo);
                f1 = solve(x1).2;
            } else {
                lo = x1;
                x1 = x2;
                f1 = f2;
                x2 = lo + phi * (hi - lo);
                f2 = solve(x2).2;
            }
        }
        let n = 0.5 * (lo + hi);
        let (a, b, _) = solve(n);
        KingsLaw::new(a.max(0.0), b, n)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn still_air_floor_limits() {
        // Hand calculation: A = 1.2 mW/K, B = 2.4 mW/K, n = 0.45,
        // U_N = 4 cm/s: G(0) = A + B·0.04^0.45 = 1.76382 mW/K.
        let k = KingsLaw::new(1.2e-3, 2.4e-3, 0.45)
            .unwrap()
            .with_still_air_floor(0.04);
        assert_relative_eq!(
            k.conductance_w_per_k(0.0),
            1.763_817e-3,
            max_relative = 1e-6
        );
        // The slope is zero at still air and finite near it; without the
        // floor it grows without bound as U → 0.
        assert_eq!(k.dconductance_du(0.0), 0.0);
        assert!(k.dconductance_du(1e-6).is_finite() && k.dconductance_du(1e-6) < 1e-3);
        let bare = KingsLaw::new(1.2e-3, 2.4e-3, 0.45).unwrap();
        assert!(bare.dconductance_du(1e-9) > 1.0);
        // Well above U_N the law is King's within (n/2)·(U_N/U)² of the
        // airflow term.
        for u in [0.5, 1.0, 3.0] {
            let term = |law: &KingsLaw| law.conductance_w_per_k(u) - 1.2e-3;
            let rel = term(&k) / term(&bare) - 1.0;
            assert!(
                rel > 0.0 && rel <= 0.5 * 0.45 * (0.04f64 / u).powi(2) * 1.0001,
                "{u}: {rel}"
            );
        }
        // A conductance below what still air gives has no airflow.
        assert!(k.airflow_for_conductance(1.7e-3).is_none());
        // At still air's own conductance: zero airflow (to rounding; the
        // inversion subtracts U_N² from a value near U_N²).
        assert!(
            k.airflow_for_conductance(k.conductance_w_per_k(0.0))
                .unwrap()
                < 1e-6
        );
    }

    proptest::proptest! {
        /// Invariant: with a floor, the inversion returns the airflow the
        /// conductance came from.
        #[test]
        fn still_air_floor_inverts(
            a in 0.0f64..5e-3, b in 1e-4f64..1e-2, n in 0.2f64..1.0,
            floor in 1e-3f64..0.3, u in 0.0f64..50.0,
        ) {
            let k = KingsLaw::new(a, b, n).unwrap().with_still_air_floor(floor);
            let back = k.airflow_for_conductance(k.conductance_w_per_k(u)).unwrap();
            proptest::prop_assert!((back - u).abs() <= 1e-9 * u.max(floor), "{u} -> {back}");
        }
    }
    use approx::assert_relative_eq;

    fn env() -> Environment {
        Environment::at(293.15)
    }

    #[test]
    fn fin_end_loss_hand_worked_and_against_the_fin_equation() {
        // Hand-worked case: platinum (k = 71.6 W/(m·K)), d = 25 µm,
        // L = 2 mm, h = 500 W/(m²·K): l_c = √(71.6·25e-6/2000) = 0.94604 mm,
        // a = 1 mm/0.94604 mm = 1.05703, tanh a = 0.78453, share
        // tanh(a)/a = 0.74220.
        let (k, d, l, h) = (71.6, 25e-6, 2e-3, 500.0);
        assert_relative_eq!(cold_length_m(h, k, d), 0.946_04e-3, max_relative = 1e-5);
        assert_relative_eq!(end_loss_share(h, k, d, l), 0.742_20, max_relative = 1e-5);
        // Independent evaluation: the fin equation θ'' − θ/l_c² = −θ_∞/l_c²
        // with θ(±L/2) = 0 solved by second-order finite differences
        // (tridiagonal, Thomas algorithm); the ends' share is 1 − mean θ/θ_∞.
        let lc = cold_length_m(h, k, d);
        let n = 4001;
        let dx = l / (n - 1) as f64;
        let m = n - 2; // interior nodes
        let (diag, off, rhs) = (-2.0 - dx * dx / (lc * lc), 1.0, -dx * dx / (lc * lc));
        let mut c = vec![0.0; m];
        let mut dd = vec![0.0; m];
        c[0] = off / diag;
        dd[0] = rhs / diag;
        for i in 1..m {
            let den = diag - off * c[i - 1];
            c[i] = off / den;
            dd[i] = (rhs - off * dd[i - 1]) / den;
        }
        let mut theta = vec![0.0; m];
        theta[m - 1] = dd[m - 1];
        for i in (0..m - 1).rev() {
            theta[i] = dd[i] - c[i] * theta[i + 1];
        }
        // Trapezoid mean over [−L/2, L/2] with θ = 0 at both ends.
        let mean = theta.iter().sum::<f64>() * dx / l;
        assert_relative_eq!(1.0 - mean, end_loss_share(h, k, d, l), max_relative = 1e-5);
        // The limits: a long wire loses little to its ends (about l_c/(L/2)),
        // a short one nearly all.
        assert_relative_eq!(
            end_loss_share(h, k, d, 1.0),
            2.0 * lc / 1.0,
            max_relative = 1e-9
        );
        assert!(end_loss_share(h, k, d, 1e-7) > 0.999_999);
    }

    #[test]
    fn fin_supports_follow_the_airflow_and_invert() {
        let CoolingLaw::Geometry(g) = wire() else {
            unreachable!()
        };
        let fin = g.with_fin_supports().unwrap();
        let e = env();
        let t = 450.0;
        let (still, lc0) = fin.support_share(t, 0.0, &e).unwrap();
        let (fast, lc5) = fin.support_share(t, 5.0, &e).unwrap();
        // More airflow, higher h, a shorter cold length, a smaller share.
        assert!(fast < still && lc5 < lc0, "{still} {fast} {lc0} {lc5}");
        assert!(still > 0.0 && still < 0.2);
        // The total is the lateral loss over (1 − share).
        let fixed = GeometryCooling {
            support_w_per_k: 0.0,
            ..g
        };
        let lateral = fixed.loss_w(t, 5.0, &e);
        assert_relative_eq!(
            fin.loss_w(t, 5.0, &e),
            lateral / (1.0 - fast),
            max_relative = 1e-12
        );
        // The trip inversion returns the airflow the loss came from.
        for u in [0.05, 0.3, 2.0, 10.0] {
            let back = fin.airflow_for_loss(t, fin.loss_w(t, u, &e), &e).unwrap();
            assert_relative_eq!(back, u, max_relative = 1e-7);
        }
        // A coil envelope has no fin model.
        let coil = GeometryCooling::new(
            Shape::CoilEnvelope,
            0.5e-3,
            3e-3,
            Material::Tungsten,
            ForcedCorrelation::CollisWilliams,
            NaturalCorrelation::Morgan,
            None,
            0.0,
        )
        .unwrap();
        assert!(coil.with_fin_supports().is_err());
    }

    fn wire() -> CoolingLaw {
        CoolingLaw::Geometry(
            GeometryCooling::new(
                Shape::StraightWire,
                25e-6,
                0.03,
                Material::Platinum,
                ForcedCorrelation::ChurchillBernstein,
                NaturalCorrelation::ChurchillChu,
                None,
                1e-4,
            )
            .unwrap(),
        )
    }

    #[test]
    fn datasheet_form_hits_both_given_points() {
        // δ(U) = δ0 + (δ1 − δ0)·(U/U1)ⁿ: δ(0) = 1.5 mW/K, δ(2 m/s) = 4 mW/K
        // by construction; at 0.5 m/s with n = 0.5: 1.5 + 2.5·√0.25 = 2.75 mW/K.
        let d = DissipationLaw::new(1.5e-3, 4e-3, 2.0, 0.5).unwrap();
        let law = CoolingLaw::Datasheet(d);
        let e = env();
        assert_relative_eq!(
            law.heat_loss_w(303.15, 0.0, &e),
            1.5e-3 * 10.0,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            law.heat_loss_w(303.15, 2.0, &e),
            4e-3 * 10.0,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            law.heat_loss_w(303.15, 0.5, &e),
            2.75e-3 * 10.0,
            max_relative = 1e-12
        );
        // C = τ·δ0 (MIL-PRF-23648 definitions): 8 s × 1.5 mW/K = 12 mJ/K.
        assert_relative_eq!(
            d.heat_capacity_from_time_constant(8.0),
            0.012,
            max_relative = 1e-12
        );
        assert!(DissipationLaw::new(2e-3, 1e-3, 1.0, 0.5).is_err());
    }

    #[test]
    fn geometry_derivatives_match_wider_differences() {
        // Central differences at FD_REL_STEP against a 100× wider central
        // difference: a smooth loss makes them agree closely.
        let law = wire();
        let e = env();
        for (t, u) in [(330.0, 0.0), (360.0, 0.3), (420.0, 2.0), (600.0, 8.0)] {
            let h = 1e-4 * t;
            let wide_t =
                (law.heat_loss_w(t + h, u, &e) - law.heat_loss_w(t - h, u, &e)) / (2.0 * h);
            assert_relative_eq!(law.d_heat_loss_dt(t, u, &e), wide_t, max_relative = 1e-5);
            if u > 0.0 {
                let k = 1e-4 * u;
                let wide_u =
                    (law.heat_loss_w(t, u + k, &e) - law.heat_loss_w(t, u - k, &e)) / (2.0 * k);
                assert_relative_eq!(law.d_heat_loss_du(t, u, &e), wide_u, max_relative = 1e-5);
            }
        }
    }

    #[test]
    fn equivalent_kings_law_recovers_a_kings_law() {
        // Fitting A + B·Uⁿ to a King's law itself must return it (the model
        // is exact, so the least-squares residual is zero at the true n).
        let king = CoolingLaw::King(KingsLaw::new(1.2e-3, 2.4e-3, 0.45).unwrap());
        let fit = king.equivalent_kings_law(350.0, 0.5, &env()).unwrap();
        assert_relative_eq!(fit.a_w_per_k(), 1.2e-3, max_relative = 1e-6);
        assert_relative_eq!(fit.b_w_per_k(), 2.4e-3, max_relative = 1e-6);
        assert_relative_eq!(fit.n(), 0.45, max_relative = 1e-6);
    }

    #[test]
    fn equivalent_kings_law_of_a_wire_is_close_at_the_fit_points() {
        let law = wire();
        let e = env();
        let (t, u_t) = (373.15, 1.0);
        let k = law.equivalent_kings_law(t, u_t, &e).unwrap();
        for u in [0.0, 0.5, 1.0, 2.0] {
            let g = law.conductance_w_per_k(t, u, &e);
            assert_relative_eq!(k.conductance_w_per_k(u), g, max_relative = 0.05);
        }
        assert!(k.n() > 0.05 && k.n() < 1.0);
        assert!(law.equivalent_kings_law(293.15, 1.0, &e).is_err());
    }

    #[test]
    fn range_warnings_only_for_geometry_out_of_range() {
        let e = env();
        let king = CoolingLaw::King(KingsLaw::new(1e-3, 2e-3, 0.5).unwrap());
        assert!(king.range_warnings(400.0, 500.0, &e).is_empty());
        // A film temperature of (2000 + 293)/2 ≈ 1147 K lies above the
        // 240–700 K over which the air properties were checked.
        let w = wire().range_warnings(2000.0, 1.0, &e);
        assert!(w.iter().any(|s| s.contains("film temperature")), "{w:?}");
    }

    #[test]
    fn geometry_rejects_bad_inputs() {
        let bad = |d: f64, l: f64, eps: Option<f64>, g: f64| {
            GeometryCooling::new(
                Shape::StraightWire,
                d,
                l,
                Material::Nickel,
                ForcedCorrelation::ChurchillBernstein,
                NaturalCorrelation::ChurchillChu,
                eps,
                g,
            )
            .is_err()
        };
        assert!(bad(0.0, 0.01, None, 0.0));
        assert!(bad(0.02, 0.01, None, 0.0));
        assert!(bad(1e-5, 0.01, Some(1.5), 0.0));
        assert!(bad(1e-5, 0.01, None, -1.0));
    }
}
