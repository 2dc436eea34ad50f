//! `draftwire new`: a commented starter design that `size` accepts, built
//! from a choice of element and load. Every value in it is an example
//! value to be replaced with the builder's own.

/// The element a starter design uses.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StarterElement {
    /// A bare lamp filament described by its rating and cold resistance.
    Lamp,
    /// A fine metal wire with geometry cooling.
    Wire,
    /// A self-heated NTC thermistor with data-sheet dissipation constants.
    Thermistor,
}

/// The load a starter design drives.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StarterLoad {
    /// An indicator LED.
    Led,
    /// A DC buzzer with a built-in driver.
    Buzzer,
    /// A relay coil (through a transistor stage).
    Relay,
}

fn element_block(e: StarterElement) -> &'static str {
    match e {
        StarterElement::Lamp => {
            r#"[element]
name = "bare lamp filament (example values)"   # free text
tolerance = "5 %"                              # part-to-part spread of the resistance

# A lamp is described by what is printed on it and one multimeter reading;
# draftwire infers the tungsten wire from them.
[element.lamp]
voltage = "12 V"                 # rated voltage
power = "1.2 W"                  # rated power
cold_resistance = "9.6 ohm"      # measured cold, with the meter's leads nulled
cold_temperature = "22 degC"     # room temperature when measured
"#
        }
        StarterElement::Wire => {
            r#"[element]
name = "fine nickel wire (example values)"     # free text
material = "nickel"                            # emissivity, heat capacity, limit in air
tolerance = "5 %"                              # part-to-part spread of the resistance

[element.resistance]
law = "linear"                   # R = R0·(1 + α·(T − T0))
r0 = "8.5 ohm"                   # measured at t0
t0 = "20 degC"

[element.cooling]
law = "wire"                     # geometry: Collis & Williams / Churchill–Bernstein + free convection
diameter = "25 um"
length = "60 mm"
"#
        }
        StarterElement::Thermistor => {
            r#"[element]
name = "NTC bead (example values)"             # free text
tolerance = "5 %"                              # part-to-part spread of R25

[element.resistance]
law = "beta"                     # R = R0·exp(B·(1/T − 1/T0))
r0 = "1 kohm"                    # at t0 (25 °C unless given)
beta = "3950 K"

[element.cooling]
law = "datasheet"                # still-air dissipation constant plus a flow term
dissipation = "1.5 mW/K"         # data sheet, still air
dissipation_moving = "3 mW/K"    # measured or data sheet at moving_airflow
moving_airflow = "1 m/s"
time_constant = "10 s"           # data sheet, still air
"#
        }
    }
}

fn drive_block(e: StarterElement) -> &'static str {
    match e {
        StarterElement::Thermistor => {
            r#"[drive]
kind = "series-resistor"         # or "constant-current"
rail = "regulated"               # which rail feeds the element
series = "auto"                  # sized for the overheat below; or a value such as "100 ohm"
overheat_rise = "30 K"           # still-air rise over ambient (a thermistor runs cool)
"#
        }
        _ => {
            r#"[drive]
kind = "series-resistor"         # or "constant-current"
rail = "regulated"               # which rail feeds the element
series = "auto"                  # sized for the overheat below; or a value such as "47 ohm"
overheat_rise = "100 K"          # still-air rise over ambient
"#
        }
    }
}

fn output_block(l: StarterLoad) -> &'static str {
    match l {
        StarterLoad::Led => {
            r#"[output]
stage = "auto"                   # "direct", "npn-low-side", "pnp-high-side" or "auto"
load = "led"
rail = "regulated"
led_forward = "2 V"              # LED forward voltage
led_current = "3 mA"             # wanted LED current
"#
        }
        StarterLoad::Buzzer => {
            r#"[output]
stage = "auto"                   # "direct", "npn-low-side", "pnp-high-side" or "auto"
load = "buzzer"
rail = "input"
buzzer_current = "20 mA"         # the buzzer's rated current at the rail
"#
        }
        StarterLoad::Relay => {
            r#"[output]
stage = "auto"                   # a relay is always switched by a transistor
load = "relay"
rail = "input"
coil_voltage = "12 V"            # rated coil voltage
coil_resistance = "400 ohm"      # coil resistance
contact_rating = "1 A at 30 V DC"
switches_mains = false           # true only within the relay's rating, wired by a qualified person
"#
        }
    }
}

/// The starter design's text.
pub fn starter_design(element: StarterElement, load: StarterLoad) -> String {
    format!(
        r#"# Starter design written by `draftwire new` (example values throughout:
# replace each with your own). Every dimensional value carries its unit.
# Check it with: draftwire size THIS_FILE.toml

[design]
title = "my airflow detector"
e_series = "E24"                 # series the sized resistors are taken from

[ambient]
nominal = "22 degC"              # where the detector is trimmed
min = "15 degC"                  # coldest day in service
max = "30 degC"                  # warmest day in service

[supply]
input = "12 V"
input_min = "11.4 V"
input_max = "12.6 V"

[supply.regulator]               # a fixed linear regulator makes the "regulated" rail
output = "5 V"
tolerance = "4 %"
dropout = "2 V"
quiescent = "5 mA"
theta_ja = "65 K/W"
max_junction = "125 degC"

{element}
{drive}
[detector]
trip_airflow = "1 m/s"           # where the output should switch
trip_on = "falling"              # "falling": loss-of-flow alarm; "rising": draught detector
normal_airflow = "3 m/s"         # the airflow when all is well (falling trip)
trip_band = ["0.5 m/s", "1.6 m/s"]  # the trip point must stay inside this at every condition
reference_rail = "regulated"
top = "auto"                     # divider and trimmer sized from the E-series
trimmer = "auto"
bottom = "auto"
hysteresis = "0.1 m/s"           # band between trip and release

{output}"#,
        element = element_block(element),
        drive = drive_block(element),
        output = output_block(load),
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::parse_design;

    #[test]
    fn every_starter_is_a_valid_design() {
        for e in [
            StarterElement::Lamp,
            StarterElement::Wire,
            StarterElement::Thermistor,
        ] {
            for l in [StarterLoad::Led, StarterLoad::Buzzer, StarterLoad::Relay] {
                let text = starter_design(e, l);
                if let Err(d) = parse_design("new.toml", &text) {
                    panic!("{e:?} {l:?}: {d}");
                }
            }
        }
    }
}
