//! Thermophysical properties of dry air, and atmospheric pressure at altitude.
//!
//! - Viscosity and thermal conductivity: Sutherland's law (W. Sutherland,
//!   Phil. Mag. 36 (1893) 507–531) with the constants of F. M. White,
//!   *Viscous Fluid Flow*, 3rd ed. (McGraw-Hill 2006), Tables 1-2 and 1-3.
//! - Density: ideal gas, ρ = p/(R·T).
//! - Specific heat: linear interpolation in Incropera, DeWitt, Bergman &
//!   Lavine, *Fundamentals of Heat and Mass Transfer*, 6th ed. (Wiley 2007),
//!   Table A.4 (air at atmospheric pressure, 100–3000 K).
//!
//! Checked against Table A.4 over [`AIR_TABLE_RANGE_K`]. Above about 1000 K
//! Sutherland's law falls below the table (computed: μ −2 % at 1000 K,
//! k −14 % at 1500 K), and above about 2000 K the table's c_p includes
//! dissociation; the values stay finite and positive up to 3000 K and beyond.

/// Standard sea-level pressure, Pa (U.S. Standard Atmosphere 1976, P₀).
pub const STANDARD_PRESSURE_PA: f64 = 101_325.0;

/// Universal gas constant used by the U.S. Standard Atmosphere 1976,
/// R* = 8314.32 J/(kmol·K) (NOAA/NASA/USAF, *U.S. Standard Atmosphere, 1976*,
/// Table 2).
const US1976_GAS_CONSTANT_J_PER_KMOL_K: f64 = 8_314.32;

/// Mean molar mass of sea-level dry air, M₀ = 28.9644 kg/kmol
/// (U.S. Standard Atmosphere 1976, Table 3).
const US1976_MOLAR_MASS_KG_PER_KMOL: f64 = 28.964_4;

/// Specific gas constant of dry air, R = R*/M₀ = 8314.32/28.9644
/// = 287.053 J/(kg·K) (U.S. Standard Atmosphere 1976).
pub const SPECIFIC_GAS_CONSTANT_AIR_J_PER_KG_K: f64 =
    US1976_GAS_CONSTANT_J_PER_KMOL_K / US1976_MOLAR_MASS_KG_PER_KMOL;

/// Standard acceleration of gravity g₀ = 9.80665 m/s² (3rd CGPM 1901; also
/// the U.S. Standard Atmosphere 1976 value).
pub const STANDARD_GRAVITY_M_PER_S2: f64 = 9.806_65;

/// Temperature range (K) over which these fits are checked against
/// Incropera 6th ed. Table A.4 in the tests (μ, k, Pr within 2 %).
pub const AIR_TABLE_RANGE_K: (f64, f64) = (250.0, 600.0);

/// Sutherland reference temperature T₀ = 273 K (White 2006, Tables 1-2, 1-3).
const SUTHERLAND_T0_K: f64 = 273.0;
/// μ₀ = 1.716e-5 Pa·s at T₀ (White 2006, Table 1-2, air).
const SUTHERLAND_MU0_PA_S: f64 = 1.716e-5;
/// Sutherland constant for viscosity, S = 111 K (White 2006, Table 1-2, air).
const SUTHERLAND_S_MU_K: f64 = 111.0;
/// k₀ = 0.0241 W/(m·K) at T₀ (White 2006, Table 1-3, air).
const SUTHERLAND_K0_W_PER_M_K: f64 = 0.0241;
/// Sutherland constant for conductivity, S = 194 K (White 2006, Table 1-3, air).
const SUTHERLAND_S_K_K: f64 = 194.0;

/// Incropera 6th ed. Table A.4, air: (T in K, c_p in J/(kg·K)).
const CP_TABLE_A4: [(f64, f64); 35] = [
    (100.0, 1032.0),
    (150.0, 1012.0),
    (200.0, 1007.0),
    (250.0, 1006.0),
    (300.0, 1007.0),
    (350.0, 1009.0),
    (400.0, 1014.0),
    (450.0, 1021.0),
    (500.0, 1030.0),
    (550.0, 1040.0),
    (600.0, 1051.0),
    (650.0, 1063.0),
    (700.0, 1075.0),
    (750.0, 1087.0),
    (800.0, 1099.0),
    (850.0, 1110.0),
    (900.0, 1121.0),
    (950.0, 1131.0),
    (1000.0, 1141.0),
    (1100.0, 1159.0),
    (1200.0, 1175.0),
    (1300.0, 1189.0),
    (1400.0, 1207.0),
    (1500.0, 1230.0),
    (1600.0, 1248.0),
    (1700.0, 1267.0),
    (1800.0, 1286.0),
    (1900.0, 1307.0),
    (2000.0, 1337.0),
    (2100.0, 1372.0),
    (2200.0, 1417.0),
    (2300.0, 1478.0),
    (2400.0, 1558.0),
    (2500.0, 1665.0),
    (3000.0, 2726.0),
];

/// U.S. Standard Atmosphere 1976, first layer: sea-level temperature
/// T_b = 288.15 K and lapse rate L = −6.5 K/km.
const US1976_SEA_LEVEL_TEMPERATURE_K: f64 = 288.15;
const US1976_TROPOSPHERE_LAPSE_K_PER_M: f64 = 0.0065;
/// Effective Earth radius for geopotential altitude, r₀ = 6 356 766 m
/// (U.S. Standard Atmosphere 1976, eq. 18).
const US1976_EARTH_RADIUS_M: f64 = 6_356_766.0;
/// Lowest geometric altitude the 1976 tables cover, m.
const MIN_ALTITUDE_M: f64 = -5_000.0;
/// Top of the troposphere (first layer), taken as geometric altitude, m.
const MAX_ALTITUDE_M: f64 = 11_000.0;

/// Why air properties could not be computed.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub enum AirError {
    /// Temperature must be finite and > 0 K.
    #[error("air temperature must be finite and > 0 K, got {value_k} K")]
    Temperature {
        /// The offending temperature, K.
        value_k: f64,
    },
    /// Pressure must be finite and > 0 Pa.
    #[error("air pressure must be finite and > 0 Pa, got {value_pa} Pa")]
    Pressure {
        /// The offending pressure, Pa.
        value_pa: f64,
    },
    /// Altitude outside the troposphere model's range.
    #[error("altitude must lie within -5000 m to 11000 m (U.S. Standard Atmosphere 1976 troposphere), got {value_m} m")]
    Altitude {
        /// The offending geometric altitude, m.
        value_m: f64,
    },
}

/// Properties of dry air at one temperature and pressure (SI units).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AirProperties {
    /// Temperature, K.
    pub temperature_k: f64,
    /// Pressure, Pa.
    pub pressure_pa: f64,
    /// Density ρ = p/(R·T), kg/m³.
    pub density_kg_per_m3: f64,
    /// Dynamic viscosity μ, Pa·s.
    pub dynamic_viscosity_pa_s: f64,
    /// Kinematic viscosity ν = μ/ρ, m²/s.
    pub kinematic_viscosity_m2_per_s: f64,
    /// Thermal conductivity k, W/(m·K).
    pub thermal_conductivity_w_per_m_k: f64,
    /// Specific heat at constant pressure c_p, J/(kg·K).
    pub specific_heat_j_per_kg_k: f64,
    /// Prandtl number Pr = μ·c_p/k.
    pub prandtl: f64,
}

impl AirProperties {
    /// Thermal diffusivity α = k/(ρ·c_p), m²/s.
    pub fn thermal_diffusivity_m2_per_s(&self) -> f64 {
        self.thermal_conductivity_w_per_m_k
            / (self.density_kg_per_m3 * self.specific_heat_j_per_kg_k)
    }
}

/// Sutherland's law, X = X₀·(T/T₀)^{3/2}·(T₀ + S)/(T + S)
/// (Sutherland 1893; White, *Viscous Fluid Flow*, 3rd ed., 2006, eq. 1-36).
fn sutherland(x0: f64, s_k: f64, temperature_k: f64) -> f64 {
    let ratio = temperature_k / SUTHERLAND_T0_K;
    x0 * ratio * ratio.sqrt() * (SUTHERLAND_T0_K + s_k) / (temperature_k + s_k)
}

/// c_p by linear interpolation in Incropera 6th ed. Table A.4; held at the
/// end values outside 100–3000 K.
fn specific_heat_j_per_kg_k(temperature_k: f64) -> f64 {
    let first = CP_TABLE_A4[0];
    let last = CP_TABLE_A4[CP_TABLE_A4.len() - 1];
    if temperature_k <= first.0 {
        return first.1;
    }
    if temperature_k >= last.0 {
        return last.1;
    }
    CP_TABLE_A4
        .windows(2)
        .find(|w| temperature_k <= w[1].0)
        .map(|w| {
            let (t0, c0) = w[0];
            let (t1, c1) = w[1];
            c0 + (c1 - c0) * (temperature_k - t0) / (t1 - t0)
        })
        .unwrap_or(last.1)
}

/// Properties of dry air at `temperature_k` and `pressure_pa`.
///
/// μ and k by Sutherland's law with White's (2006) constants
/// (μ₀ = 1.716e-5 Pa·s, S = 111 K; k₀ = 0.0241 W/(m·K), S = 194 K; T₀ = 273 K);
/// ρ = p/(R·T) with R from the U.S. Standard Atmosphere 1976; c_p interpolated
/// in Incropera 6th ed. Table A.4; ν = μ/ρ; Pr = μ·c_p/k.
/// μ, k and c_p are taken as independent of pressure (dilute gas).
pub fn air_properties(temperature_k: f64, pressure_pa: f64) -> Result<AirProperties, AirError> {
    if !(temperature_k.is_finite() && temperature_k > 0.0) {
        return Err(AirError::Temperature {
            value_k: temperature_k,
        });
    }
    if !(pressure_pa.is_finite() && pressure_pa > 0.0) {
        return Err(AirError::Pressure {
            value_pa: pressure_pa,
        });
    }
    let density = pressure_pa / (SPECIFIC_GAS_CONSTANT_AIR_J_PER_KG_K * temperature_k);
    let mu = sutherland(SUTHERLAND_MU0_PA_S, SUTHERLAND_S_MU_K, temperature_k);
    let k = sutherland(SUTHERLAND_K0_W_PER_M_K, SUTHERLAND_S_K_K, temperature_k);
    let cp = specific_heat_j_per_kg_k(temperature_k);
    Ok(AirProperties {
        temperature_k,
        pressure_pa,
        density_kg_per_m3: density,
        dynamic_viscosity_pa_s: mu,
        kinematic_viscosity_m2_per_s: mu / density,
        thermal_conductivity_w_per_m_k: k,
        specific_heat_j_per_kg_k: cp,
        prandtl: mu * cp / k,
    })
}

/// Static pressure at a geometric altitude in the troposphere, Pa.
///
/// U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF, 1976), eq. 33a for a layer
/// with non-zero lapse rate: p = P₀·[T_b/(T_b + L_b·H)]^{g₀·M₀/(R*·L_b)}, with
/// T_b = 288.15 K, L_b = −6.5 K/km, exponent 5.2559, and the geopotential
/// altitude H = r₀·z/(r₀ + z) (eq. 18, r₀ = 6 356 766 m).
/// Valid for −5000 m ≤ z ≤ 11000 m.
pub fn pressure_at_altitude_pa(altitude_m: f64) -> Result<f64, AirError> {
    if !(altitude_m.is_finite() && (MIN_ALTITUDE_M..=MAX_ALTITUDE_M).contains(&altitude_m)) {
        return Err(AirError::Altitude {
            value_m: altitude_m,
        });
    }
    let geopotential_m = US1976_EARTH_RADIUS_M * altitude_m / (US1976_EARTH_RADIUS_M + altitude_m);
    let exponent = STANDARD_GRAVITY_M_PER_S2
        / (SPECIFIC_GAS_CONSTANT_AIR_J_PER_KG_K * US1976_TROPOSPHERE_LAPSE_K_PER_M);
    let temperature_ratio =
        1.0 - US1976_TROPOSPHERE_LAPSE_K_PER_M * geopotential_m / US1976_SEA_LEVEL_TEMPERATURE_K;
    Ok(STANDARD_PRESSURE_PA * temperature_ratio.powf(exponent))
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    /// Incropera, DeWitt, Bergman & Lavine, *Fundamentals of Heat and Mass
    /// Transfer*, 6th ed. (Wiley 2007), Table A.4, air:
    /// (T K, ρ kg/m³, c_p kJ/(kg·K), μ·10⁷ N·s/m², k·10³ W/(m·K), Pr).
    const TABLE_A4_ROWS: [(f64, f64, f64, f64, f64, f64); 6] = [
        (250.0, 1.3947, 1.006, 159.6, 22.3, 0.720),
        (300.0, 1.1614, 1.007, 184.6, 26.3, 0.707),
        (350.0, 0.9950, 1.009, 208.2, 30.0, 0.700),
        (400.0, 0.8711, 1.014, 230.1, 33.8, 0.690),
        (500.0, 0.6964, 1.030, 270.1, 40.7, 0.684),
        (600.0, 0.5804, 1.051, 305.8, 46.9, 0.685),
    ];

    fn rel(a: f64, b: f64) -> f64 {
        (a - b).abs() / b.abs()
    }

    #[test]
    fn matches_incropera_table_a4() {
        for (t, rho, cp_kj, mu7, k3, pr) in TABLE_A4_ROWS {
            assert!(t >= AIR_TABLE_RANGE_K.0 && t <= AIR_TABLE_RANGE_K.1);
            let air = air_properties(t, STANDARD_PRESSURE_PA).unwrap();
            // μ and k within 2 % (Sutherland vs Table A.4).
            assert!(
                rel(air.dynamic_viscosity_pa_s, mu7 * 1e-7) < 0.02,
                "mu at {t} K"
            );
            assert!(
                rel(air.thermal_conductivity_w_per_m_k, k3 * 1e-3) < 0.02,
                "k at {t} K"
            );
            // ρ within 1.5 %: the table's densities are for 100 kPa, about
            // 1.3 % below p/(RT) at 101.325 kPa.
            assert!(rel(air.density_kg_per_m3, rho) < 0.015, "rho at {t} K");
            // c_p is interpolated in this very table: exact at the nodes.
            assert!(
                rel(air.specific_heat_j_per_kg_k, cp_kj * 1e3) < 1e-12,
                "cp at {t} K"
            );
            assert!(rel(air.prandtl, pr) < 0.02, "Pr at {t} K");
        }
    }

    #[test]
    fn density_at_100_kpa_matches_table_tightly() {
        // Same table, same rows: at the table's own 100 kPa basis the ideal
        // gas law reproduces ρ within 0.2 %.
        for (t, rho, ..) in TABLE_A4_ROWS {
            let air = air_properties(t, 100_000.0).unwrap();
            assert!(rel(air.density_kg_per_m3, rho) < 0.002, "rho at {t} K");
        }
    }

    #[test]
    fn sutherland_reference_point_is_exact() {
        // At T = T₀ = 273 K Sutherland's law returns μ₀ and k₀ themselves
        // (White 2006, Tables 1-2 and 1-3).
        let air = air_properties(273.0, STANDARD_PRESSURE_PA).unwrap();
        assert!(rel(air.dynamic_viscosity_pa_s, 1.716e-5) < 1e-14);
        assert!(rel(air.thermal_conductivity_w_per_m_k, 0.0241) < 1e-14);
    }

    #[test]
    fn specific_gas_constant_is_us1976_value() {
        // Hand calculation: 8314.32 / 28.9644 = 287.0531 J/(kg·K).
        assert!((SPECIFIC_GAS_CONSTANT_AIR_J_PER_KG_K - 287.0531).abs() < 1e-4);
    }

    #[test]
    fn cp_interpolates_between_table_nodes() {
        // Hand calculation, Table A.4 nodes 300 K (1007) and 350 K (1009):
        // at 325 K, 1007 + 2·(25/50) = 1008 J/(kg·K).
        let air = air_properties(325.0, STANDARD_PRESSURE_PA).unwrap();
        assert!((air.specific_heat_j_per_kg_k - 1008.0).abs() < 1e-9);
    }

    #[test]
    fn pressure_at_altitude_matches_us_standard_atmosphere_1976() {
        // U.S. Standard Atmosphere 1976, Table I (geometric altitude), values
        // recalled (memory): 0 m 101325 Pa, 1000 m 89876 Pa, 2000 m 79501 Pa,
        // 5000 m 54048 Pa, 11000 m 22700 Pa.
        for (z, p) in [
            (0.0, 101_325.0),
            (1000.0, 89_876.0),
            (2000.0, 79_501.0),
            (5000.0, 54_048.0),
            (11_000.0, 22_700.0),
        ] {
            let got = pressure_at_altitude_pa(z).unwrap();
            assert!(rel(got, p) < 1e-4, "{z} m: {got} Pa vs {p} Pa");
        }
    }

    #[test]
    fn rejects_bad_input() {
        assert!(matches!(
            air_properties(0.0, STANDARD_PRESSURE_PA),
            Err(AirError::Temperature { .. })
        ));
        assert!(matches!(
            air_properties(f64::NAN, STANDARD_PRESSURE_PA),
            Err(AirError::Temperature { .. })
        ));
        assert!(matches!(
            air_properties(300.0, -1.0),
            Err(AirError::Pressure { .. })
        ));
        assert!(matches!(
            air_properties(300.0, f64::INFINITY),
            Err(AirError::Pressure { .. })
        ));
        assert!(matches!(
            pressure_at_altitude_pa(12_000.0),
            Err(AirError::Altitude { value_m }) if value_m == 12_000.0
        ));
        assert!(pressure_at_altitude_pa(f64::NAN).is_err());
    }

    proptest! {
        #[test]
        fn all_properties_finite_and_positive(t in 200.0f64..3000.0, p in 50_000.0f64..110_000.0) {
            let a = air_properties(t, p).unwrap();
            for v in [
                a.density_kg_per_m3,
                a.dynamic_viscosity_pa_s,
                a.kinematic_viscosity_m2_per_s,
                a.thermal_conductivity_w_per_m_k,
                a.specific_heat_j_per_kg_k,
                a.prandtl,
                a.thermal_diffusivity_m2_per_s(),
            ] {
                prop_assert!(v.is_finite() && v > 0.0);
            }
        }

        #[test]
        fn pressure_falls_with_altitude(z in -5000.0f64..10_999.0) {
            let p0 = pressure_at_altitude_pa(z).unwrap();
            let p1 = pressure_at_altitude_pa(z + 1.0).unwrap();
            prop_assert!(p1 < p0 && p1 > 0.0);
        }
    }
}
