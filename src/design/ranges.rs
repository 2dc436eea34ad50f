//! Per-key physical ranges: the second gate at the door, after the
//! per-dimension plausible range (`Dimension::plausible_magnitude`).
//!
//! Each row bounds one key by what a part of its class can physically be in
//! a detector draftwire sizes. The figures are draftwire's own (no source
//! unless a row says otherwise), each chosen wide enough to hold every
//! generic part of the class with room to spare; docs/design-file.md
//! ("Per-key ranges") lists them, and a test keeps that page in step.

use crate::quantity::Dimension;

/// One key's range in SI units. `key` matches a field whose name is the key
/// or ends in `.key` (so `cooling.a` also covers `candidate[2].cooling.a`);
/// `dim` tells keys with the same name apart (King's `a` is a conductance,
/// Steinhart–Hart's `a` a temperature coefficient). Bounds are on the
/// value itself, zero included where the key allows it.
pub struct KeyRange {
    /// The key, or its last segments (`cooling.a`).
    pub key: &'static str,
    /// The dimension the key is read in.
    pub dim: Dimension,
    /// Lowest value allowed, SI.
    pub lo: f64,
    /// Highest value allowed, SI.
    pub hi: f64,
    /// What the range holds, for the message.
    pub why: &'static str,
}

const C0: f64 = 273.15;

macro_rules! row {
    ($key:expr, $dim:ident, $lo:expr, $hi:expr, $why:expr) => {
        KeyRange {
            key: $key,
            dim: Dimension::$dim,
            lo: $lo,
            hi: $hi,
            why: $why,
        }
    };
}

/// Every per-key range. Keys not listed keep the per-dimension range only,
/// or a range of their own checked where they are read (fractions, the
/// LED, `[compensation]`, …; docs/design-file.md says which).
pub const KEY_RANGES: &[KeyRange] = &[
    row!(
        "ambient.nominal",
        Temperature,
        C0 - 100.0,
        C0 + 300.0,
        "air a detector can sit in"
    ),
    row!(
        "ambient.min",
        Temperature,
        C0 - 100.0,
        C0 + 300.0,
        "air a detector can sit in"
    ),
    row!(
        "ambient.max",
        Temperature,
        C0 - 100.0,
        C0 + 300.0,
        "air a detector can sit in"
    ),
    row!(
        "ambient.pressure",
        Pressure,
        10e3,
        1e6,
        "0.1–10 atm: the ideal-gas air properties hold"
    ),
    row!(
        "supply.input",
        Voltage,
        0.5,
        400.0,
        "a low-voltage or rectified supply"
    ),
    row!("supply.input_min", Voltage, 0.5, 400.0, "as supply.input"),
    row!("supply.input_max", Voltage, 0.5, 400.0, "as supply.input"),
    row!(
        "supply.decoupling",
        Capacitance,
        1e-12,
        0.1,
        "a decoupling capacitor"
    ),
    row!(
        "regulator.output",
        Voltage,
        0.5,
        100.0,
        "a linear regulator's output"
    ),
    row!(
        "regulator.dropout",
        Voltage,
        0.0,
        10.0,
        "a linear regulator's dropout"
    ),
    row!(
        "regulator.quiescent",
        Current,
        0.0,
        0.1,
        "a linear regulator's quiescent current"
    ),
    row!(
        "regulator.theta_ja",
        ThermalResistance,
        0.1,
        1000.0,
        "a package's junction-to-ambient resistance"
    ),
    row!(
        "regulator.max_junction",
        Temperature,
        C0 + 50.0,
        C0 + 250.0,
        "a silicon junction's limit"
    ),
    row!("drive.series", Resistance, 1e-3, 100e6, "a series resistor"),
    row!("drive.current", Current, 1e-6, 10.0, "a drive current"),
    row!(
        "overheat_rise",
        TemperatureDifference,
        1e-3,
        3000.0,
        "below the tungsten law's top"
    ),
    row!(
        "detector.top",
        Resistance,
        1e-3,
        100e6,
        "a divider resistor"
    ),
    row!(
        "detector.trimmer",
        Resistance,
        1.0,
        100e6,
        "a trimmer's end-to-end track"
    ),
    row!(
        "detector.bottom",
        Resistance,
        1e-3,
        100e6,
        "a divider resistor"
    ),
    row!(
        "detector.feedback",
        Resistance,
        1.0,
        1e9,
        "a feedback resistor"
    ),
    row!(
        "detector.input_resistor",
        Resistance,
        1.0,
        100e6,
        "an input resistor"
    ),
    row!(
        "detector.divider_current",
        Current,
        1e-6,
        0.1,
        "a reference divider's current"
    ),
    row!(
        "detector.hysteresis",
        Velocity,
        1e-6,
        10.0,
        "an airflow band"
    ),
    row!(
        "detector.hysteresis",
        Voltage,
        1e-6,
        10.0,
        "a voltage band at the sense node"
    ),
    row!(
        "comparator.offset",
        Voltage,
        0.0,
        0.1,
        "a comparator's input offset"
    ),
    row!(
        "comparator.offset_full_range",
        Voltage,
        0.0,
        0.1,
        "a comparator's input offset"
    ),
    row!(
        "comparator.bias_current",
        Current,
        0.0,
        10e-6,
        "a comparator's input bias current"
    ),
    row!(
        "comparator.bias_current_full_range",
        Current,
        0.0,
        10e-6,
        "a comparator's input bias current"
    ),
    row!(
        "comparator.common_mode_low",
        Voltage,
        0.0,
        10.0,
        "a common-mode limit above ground"
    ),
    row!(
        "comparator.common_mode_headroom",
        Voltage,
        0.0,
        10.0,
        "a common-mode limit below V+"
    ),
    row!(
        "comparator.common_mode_headroom_full_range",
        Voltage,
        0.0,
        10.0,
        "a common-mode limit below V+"
    ),
    row!(
        "comparator.sink_max",
        Current,
        1e-6,
        1.0,
        "an output's sink limit"
    ),
    row!(
        "comparator.output_low",
        Voltage,
        0.0,
        5.0,
        "an output's low level"
    ),
    row!(
        "comparator.output_low_full_range",
        Voltage,
        0.0,
        5.0,
        "an output's low level"
    ),
    row!(
        "comparator.supply_min",
        Voltage,
        0.5,
        100.0,
        "a comparator's supply range"
    ),
    row!(
        "comparator.supply_max",
        Voltage,
        0.5,
        100.0,
        "a comparator's supply range"
    ),
    row!(
        "comparator.supply_current",
        Current,
        0.0,
        0.1,
        "a comparator's supply current"
    ),
    row!(
        "comparator.pullup",
        Resistance,
        1.0,
        100e6,
        "an output pull-up"
    ),
    row!("output.buzzer_current", Current, 1e-6, 1.0, "a buzzer"),
    row!("output.coil_voltage", Voltage, 0.5, 400.0, "a relay coil"),
    row!(
        "output.coil_resistance",
        Resistance,
        1.0,
        1e6,
        "a relay coil"
    ),
    row!(
        "transistor.vce_max",
        Voltage,
        1.0,
        1000.0,
        "a transistor's V_CEO"
    ),
    row!(
        "transistor.ic_max",
        Current,
        1e-3,
        100.0,
        "a transistor's collector rating"
    ),
    row!(
        "transistor.power_max",
        Power,
        1e-3,
        1000.0,
        "a transistor's power rating"
    ),
    row!(
        "transistor.vce_sat",
        Voltage,
        1e-3,
        5.0,
        "a saturated switch"
    ),
    row!(
        "transistor.vbe_on",
        Voltage,
        0.05,
        2.0,
        "a base-emitter junction (or a Darlington pair)"
    ),
    row!(
        "transistor.max_junction",
        Temperature,
        C0 + 26.0,
        C0 + 250.0,
        "a silicon junction's limit"
    ),
    row!("diode.reverse_max", Voltage, 1.0, 1000.0, "a rectifier"),
    row!("diode.forward_max", Current, 1e-3, 100.0, "a rectifier"),
    row!(
        "ratings.trimmer_power",
        Power,
        1e-3,
        10.0,
        "a trimmer's rating"
    ),
    row!(
        "ratings.resistor_min",
        Power,
        1e-3,
        10.0,
        "a resistor's rating"
    ),
    row!(
        "heat_capacity",
        HeatCapacity,
        1e-11,
        10.0,
        "a 1 µm × 0.1 mm wire (about 0.2 nJ/K) to a lamp with its base"
    ),
    row!(
        "resistance.r0",
        Resistance,
        1e-3,
        100e6,
        "an element's resistance"
    ),
    row!(
        "resistance.beta",
        TemperatureDifference,
        100.0,
        10e3,
        "an NTC's beta"
    ),
    row!(
        "cooling.a",
        ThermalConductance,
        0.0,
        1.0,
        "an element's still-air conductance"
    ),
    row!(
        "cooling.b",
        ThermalConductance,
        1e-9,
        1.0,
        "an element's conductance at 1 m/s"
    ),
    row!(
        "cooling.dissipation",
        ThermalConductance,
        1e-6,
        1.0,
        "a thermistor's dissipation constant"
    ),
    row!(
        "cooling.dissipation_moving",
        ThermalConductance,
        1e-6,
        1.0,
        "a thermistor's dissipation constant"
    ),
    row!(
        "cooling.time_constant",
        Time,
        1e-4,
        1000.0,
        "a thermistor's thermal time constant"
    ),
    row!(
        "cooling.diameter",
        Length,
        1e-6,
        0.05,
        "a wire (or a coil's outer diameter)"
    ),
    row!("cooling.length", Length, 1e-4, 1.0, "a wire or a coil"),
    row!("cooling.wire_diameter", Length, 1e-6, 5e-3, "a coil's wire"),
    row!("cooling.wire_length", Length, 1e-4, 10.0, "a coil's wire"),
    row!(
        "cooling.still_air_floor",
        Velocity,
        1e-3,
        0.5,
        "a natural-convection velocity (about 4 cm/s for a 100 K rise)"
    ),
    row!(
        "cooling.supports",
        ThermalConductance,
        0.0,
        1.0,
        "conduction to the supports"
    ),
    row!(
        "lamp.voltage",
        Voltage,
        0.5,
        400.0,
        "a lamp's rated voltage"
    ),
    row!("lamp.power", Power, 1e-3, 1000.0, "a lamp's rated power"),
    row!(
        "lamp.cold_resistance",
        Resistance,
        1e-3,
        1e6,
        "a lamp's cold resistance"
    ),
];

/// The key's own range, if it has one.
pub fn range_of(field: &str, dim: Dimension) -> Option<&'static KeyRange> {
    KEY_RANGES
        .iter()
        .find(|r| r.dim == dim && matches_key(field, r.key))
}

fn matches_key(field: &str, key: &str) -> bool {
    field == key
        || field
            .strip_suffix(key)
            .is_some_and(|head| head.ends_with('.'))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn suffix_matching_takes_whole_segments() {
        assert!(matches_key("element.cooling.a", "cooling.a"));
        assert!(matches_key("candidate[2].cooling.a", "cooling.a"));
        assert!(!matches_key("element.cooling.ba", "cooling.a"));
        assert!(matches_key("supply.regulator.output", "regulator.output"));
        assert!(!matches_key("output.led_current", "regulator.output"));
    }

    #[test]
    fn dimension_tells_same_named_keys_apart() {
        // King's a is a conductance; Steinhart–Hart's a has no row.
        assert!(range_of("element.cooling.a", Dimension::ThermalConductance).is_some());
        assert!(range_of("element.resistance.a", Dimension::TemperatureCoefficient).is_none());
        assert_eq!(
            range_of("detector.hysteresis", Dimension::Voltage).map(|r| r.hi),
            Some(10.0)
        );
    }

    #[test]
    fn every_row_is_ordered_and_inside_its_dimension() {
        for r in KEY_RANGES {
            assert!(r.lo <= r.hi, "{}", r.key);
            let (_, hi) = r.dim.plausible_magnitude();
            assert!(
                r.hi <= hi,
                "{}: {} above the dimension's {}",
                r.key,
                r.hi,
                hi
            );
        }
    }
}
