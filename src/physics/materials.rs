//! Material presets for wire elements: temperature coefficient of
//! resistance, resistivity, thermal properties, a bare-wire temperature limit
//! in air, and emissivity.
//!
//! Sources (each value's own source is returned by the `*_source` methods or
//! stated in the table below):
//! - density, specific heat, thermal conductivity near 300 K: F. P. Incropera,
//!   D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat and Mass
//!   Transfer*, 6th ed. (Wiley 2007), Table A.1 — recalled, marked *memory*;
//! - resistivity at 20 °C: IACS (NBS Handbook 100) for copper, CRC Handbook
//!   wire tables for tungsten, *memory* for the rest;
//! - emissivity: tungsten from [`crate::physics::tungsten::emissivity`]; the
//!   others are constants for clean, bright wire (*memory*). Oxidised
//!   surfaces reach roughly 0.3–0.9 (*memory*), so radiation is then
//!   underestimated; at the few tens of kelvin of overheat a sensing element
//!   runs at, radiation is a small share of its loss either way.

use crate::physics::tungsten;

/// A wire material with preset properties.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Material {
    /// Annealed copper.
    Copper,
    /// Commercially pure nickel.
    Nickel,
    /// Platinum (IEC 60751 grade).
    Platinum,
    /// Lamp-grade tungsten.
    Tungsten,
    /// Commercially pure iron.
    Iron,
    /// 80 % Ni / 20 % Cr resistance alloy.
    Nichrome,
    /// 55 % Cu / 45 % Ni resistance alloy.
    Constantan,
}

/// One material's preset values, all SI.
struct Props {
    name: &'static str,
    tcr_per_k: f64,
    tcr_reference_temperature_k: f64,
    tcr_source: &'static str,
    resistivity_ohm_m_at_20c: f64,
    density_kg_per_m3: f64,
    specific_heat_j_per_kg_k: f64,
    thermal_conductivity_w_per_m_k: f64,
    max_temperature_in_air_k: f64,
    max_temperature_source: &'static str,
    /// Constant emissivity of clean, bright wire (unused for tungsten).
    emissivity: f64,
}

const ALL: [Material; 7] = [
    Material::Copper,
    Material::Nickel,
    Material::Platinum,
    Material::Tungsten,
    Material::Iron,
    Material::Nichrome,
    Material::Constantan,
];

const COPPER: Props = Props {
    name: "copper",
    tcr_per_k: 0.00393,
    tcr_reference_temperature_k: 293.15,
    tcr_source: "annealed copper at 20 °C, International Annealed Copper Standard; NBS Handbook 100, Copper Wire Tables (1966)",
    resistivity_ohm_m_at_20c: 1.7241e-8,
    density_kg_per_m3: 8933.0,
    specific_heat_j_per_kg_k: 385.0,
    thermal_conductivity_w_per_m_k: 401.0,
    max_temperature_in_air_k: 473.15,
    max_temperature_source: "about 200 °C: bare copper oxidises progressively above this in air (common practice, no source)",
    emissivity: 0.03,
};

const NICKEL: Props = Props {
    name: "nickel",
    tcr_per_k: 0.0060,
    tcr_reference_temperature_k: 293.15,
    tcr_source: "0.0059–0.0068 /K near 20 °C depending on grade; 0.0060 taken, near the lower end, for commercially pure wire (memory; common practice, no source)",
    resistivity_ohm_m_at_20c: 6.93e-8,
    density_kg_per_m3: 8900.0,
    specific_heat_j_per_kg_k: 444.0,
    thermal_conductivity_w_per_m_k: 90.7,
    max_temperature_in_air_k: 873.15,
    max_temperature_source: "about 600 °C: nickel forms a protective oxide and is used bare in air to several hundred °C (memory)",
    emissivity: 0.05,
};

const PLATINUM: Props = Props {
    name: "platinum",
    tcr_per_k: 0.003_850_55,
    tcr_reference_temperature_k: 273.15,
    tcr_source: "IEC 60751 mean coefficient over 0–100 °C referred to R0 at 0 °C: (R100 − R0)/(100 K·R0) = A + 100·B = 0.00385055 /K",
    resistivity_ohm_m_at_20c: 1.05e-7,
    density_kg_per_m3: 21450.0,
    specific_heat_j_per_kg_k: 133.0,
    thermal_conductivity_w_per_m_k: 71.6,
    max_temperature_in_air_k: 1123.15,
    max_temperature_source: "850 °C, the top of the IEC 60751 range; platinum does not oxidise in air",
    emissivity: 0.05,
};

const TUNGSTEN: Props = Props {
    name: "tungsten",
    tcr_per_k: 0.0045,
    tcr_reference_temperature_k: 293.15,
    tcr_source: "CRC Handbook wire tables, pure tungsten: (7.18 − 5.28)/(5.28 · 80 K) = 0.0045 /K over 20–100 °C",
    resistivity_ohm_m_at_20c: 5.28e-8,
    density_kg_per_m3: 19300.0,
    specific_heat_j_per_kg_k: 132.0,
    thermal_conductivity_w_per_m_k: 174.0,
    max_temperature_in_air_k: 673.15,
    max_temperature_source: "about 400 °C: bare tungsten oxidises quickly in air above roughly this (weak sources; keep a bare element to a few hundred °C, common practice)",
    emissivity: 0.0,
};

const IRON: Props = Props {
    name: "iron",
    tcr_per_k: 0.0055,
    tcr_reference_temperature_k: 293.15,
    tcr_source: "tables quote 0.005–0.0065 /K for iron depending on purity; 0.0055 taken (memory)",
    resistivity_ohm_m_at_20c: 9.7e-8,
    density_kg_per_m3: 7870.0,
    specific_heat_j_per_kg_k: 447.0,
    thermal_conductivity_w_per_m_k: 80.2,
    max_temperature_in_air_k: 573.15,
    max_temperature_source: "about 300 °C: bare iron scales increasingly above a few hundred °C in air (common practice, no source)",
    emissivity: 0.07,
};

const NICHROME: Props = Props {
    name: "nichrome",
    tcr_per_k: 1e-4,
    tcr_reference_temperature_k: 293.15,
    tcr_source:
        "about 0.0001 /K for 80/20 nickel-chromium resistance alloy (common practice, no source)",
    resistivity_ohm_m_at_20c: 1.10e-6,
    density_kg_per_m3: 8400.0,
    specific_heat_j_per_kg_k: 420.0,
    thermal_conductivity_w_per_m_k: 12.0,
    max_temperature_in_air_k: 1423.15,
    max_temperature_source:
        "about 1150 °C: the usual limit of 80/20 nickel-chromium heating wire in air (memory)",
    emissivity: 0.15,
};

const CONSTANTAN: Props = Props {
    name: "constantan",
    tcr_per_k: 2e-5,
    tcr_reference_temperature_k: 293.15,
    tcr_source: "|α| below 1e-4 /K, sign depends on the melt; 2e-5 /K taken (memory)",
    resistivity_ohm_m_at_20c: 4.9e-7,
    density_kg_per_m3: 8920.0,
    specific_heat_j_per_kg_k: 384.0,
    thermal_conductivity_w_per_m_k: 23.0,
    max_temperature_in_air_k: 673.15,
    max_temperature_source: "about 400 °C for copper-nickel resistance wire in air (memory)",
    emissivity: 0.1,
};

impl Material {
    fn props(self) -> &'static Props {
        match self {
            Material::Copper => &COPPER,
            Material::Nickel => &NICKEL,
            Material::Platinum => &PLATINUM,
            Material::Tungsten => &TUNGSTEN,
            Material::Iron => &IRON,
            Material::Nichrome => &NICHROME,
            Material::Constantan => &CONSTANTAN,
        }
    }

    /// Lower-case name, as [`Material::parse`] accepts it.
    pub fn name(self) -> &'static str {
        self.props().name
    }

    /// Parse a name (case-insensitive, surrounding blanks ignored) or a
    /// chemical symbol (Cu, Ni, Pt, W, Fe); `None` if unknown.
    pub fn parse(s: &str) -> Option<Self> {
        let key = s.trim().to_ascii_lowercase();
        let by_symbol = match key.as_str() {
            "cu" => Some(Material::Copper),
            "ni" => Some(Material::Nickel),
            "pt" => Some(Material::Platinum),
            "w" => Some(Material::Tungsten),
            "fe" => Some(Material::Iron),
            _ => None,
        };
        by_symbol.or_else(|| ALL.iter().copied().find(|m| m.name() == key))
    }

    /// Every preset, in declaration order.
    pub fn all() -> &'static [Material] {
        &ALL
    }

    /// Temperature coefficient of resistance α, 1/K, for the linear law
    /// R = R_ref·(1 + α·(T − T_ref)) with T_ref =
    /// [`Material::tcr_reference_temperature_k`].
    pub fn tcr_per_k(self) -> f64 {
        self.props().tcr_per_k
    }

    /// The temperature α refers to, K (20 °C, or 0 °C for platinum).
    pub fn tcr_reference_temperature_k(self) -> f64 {
        self.props().tcr_reference_temperature_k
    }

    /// Where α comes from.
    pub fn tcr_source(self) -> &'static str {
        self.props().tcr_source
    }

    /// Resistivity at 20 °C, ohm·m.
    pub fn resistivity_ohm_m_at_20c(self) -> f64 {
        self.props().resistivity_ohm_m_at_20c
    }

    /// Density near 300 K, kg/m³ (Incropera 6th ed. Table A.1; memory).
    pub fn density_kg_per_m3(self) -> f64 {
        self.props().density_kg_per_m3
    }

    /// Specific heat near 300 K, J/(kg·K) (Incropera 6th ed. Table A.1;
    /// memory).
    pub fn specific_heat_j_per_kg_k(self) -> f64 {
        self.props().specific_heat_j_per_kg_k
    }

    /// Highest temperature a bare wire of this material should run at in
    /// air, K. Tungsten's 400 °C rests on weak sources.
    pub fn max_temperature_in_air_k(self) -> f64 {
        self.props().max_temperature_in_air_k
    }

    /// Where the temperature limit comes from.
    pub fn max_temperature_source(self) -> &'static str {
        self.props().max_temperature_source
    }

    /// Total hemispherical emissivity at `t_k`: tungsten from
    /// [`tungsten::emissivity`] (Forsythe & Watson 1934 with a stated
    /// low-temperature assumption); the others a constant for clean, bright
    /// wire (memory): copper 0.03, nickel 0.05, platinum 0.05, iron 0.07,
    /// nichrome 0.15, constantan 0.1.
    pub fn emissivity(self, t_k: f64) -> f64 {
        match self {
            Material::Tungsten => tungsten::emissivity(t_k),
            _ => self.props().emissivity,
        }
    }

    /// Thermal conductivity near 300 K, W/(m·K), for conduction into the
    /// supports (Incropera 6th ed. Table A.1; memory).
    pub fn thermal_conductivity_w_per_m_k(self) -> f64 {
        self.props().thermal_conductivity_w_per_m_k
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn copper_tcr_is_iacs_value() {
        // IACS annealed copper, α20 = 0.00393 /K (NBS Handbook 100).
        assert_eq!(Material::Copper.tcr_per_k(), 0.00393);
        assert_eq!(Material::Copper.tcr_reference_temperature_k(), 293.15);
        // IACS: 1/58 Ω·mm²/m = 1.72414e-8 Ω·m, tabulated rounded to 1.7241e-8.
        assert_relative_eq!(
            Material::Copper.resistivity_ohm_m_at_20c(),
            1.0 / 58.0 * 1e-6,
            max_relative = 3e-5
        );
    }

    #[test]
    fn tungsten_tcr_matches_crc_wire_table() {
        // CRC Handbook wire tables, pure W: 5.28 µΩ·cm at 20 °C, 7.18 at
        // 100 °C; (7.18 − 5.28)/(5.28·80) = 0.004498 /K.
        let from_table = (7.18 - 5.28) / (5.28 * 80.0);
        assert!((Material::Tungsten.tcr_per_k() - from_table).abs() < 1e-5);
        assert_eq!(Material::Tungsten.resistivity_ohm_m_at_20c(), 5.28e-8);
    }

    #[test]
    fn platinum_tcr_from_iec60751() {
        // IEC 60751's printed Pt100 table: 100.00 Ω at 0 °C and 138.51 Ω
        // at 100 °C, so α = (138.51 − 100.00)/(100 Ω·100 K) = 3.8510e-3 /K
        // (the standard's conventional α = 0.003 851). Half a unit of the
        // printed 0.01 Ω over 10⁴ Ω·K is 5e-7 /K.
        assert!((Material::Platinum.tcr_per_k() - 3.8510e-3).abs() <= 5e-7);
    }

    #[test]
    fn every_value_positive_and_finite() {
        for &m in Material::all() {
            for v in [
                m.tcr_per_k(),
                m.tcr_reference_temperature_k(),
                m.resistivity_ohm_m_at_20c(),
                m.density_kg_per_m3(),
                m.specific_heat_j_per_kg_k(),
                m.max_temperature_in_air_k(),
                m.thermal_conductivity_w_per_m_k(),
            ] {
                assert!(v > 0.0 && v.is_finite(), "{m:?}: {v}");
            }
            assert!(!m.tcr_source().is_empty() && !m.max_temperature_source().is_empty());
            for t_k in [250.0, 300.0, 600.0, 1500.0, 3000.0, 4000.0] {
                let eps = m.emissivity(t_k);
                assert!(eps > 0.0 && eps < 1.0, "{m:?} at {t_k} K: {eps}");
            }
        }
    }

    #[test]
    fn tungsten_emissivity_comes_from_tungsten_module() {
        // Invariant: the material delegates to the tungsten module, also
        // between its nodes (the published check lives there).
        for t in [650.0, 1750.0, 2650.0] {
            assert_eq!(
                Material::Tungsten.emissivity(t),
                crate::physics::tungsten::emissivity(t)
            );
        }
    }

    #[test]
    fn parse_name_round_trip() {
        for &m in Material::all() {
            assert_eq!(Material::parse(m.name()), Some(m));
            assert_eq!(Material::parse(&m.name().to_uppercase()), Some(m));
        }
        assert_eq!(Material::parse(" W "), Some(Material::Tungsten));
        assert_eq!(Material::parse("Cu"), Some(Material::Copper));
        assert_eq!(Material::parse("unobtainium"), None);
        assert_eq!(Material::all().len(), 7);
    }
}
