//! The linear regulator: it stays above dropout at the lowest input with
//! its output at the high end of its tolerance, and its junction stays
//! below its limit at the highest input and ambient with its output at the
//! low end (most dissipation). Regulator data sheets: P_D = (V_IN − V_OUT)·
//! I_OUT + V_IN·I_Q, T_J = T_A + P_D·θ_JA.

use crate::circuit::regulator::LinearRegulator;
use crate::design::Design;
use crate::quantity::format_engineering;
use crate::report::{Check, SupplyBudget};

fn eng(x: f64, unit: &str) -> String {
    format_engineering(x, unit, 3)
}

/// `regulator-dropout` and `regulator-junction`, when there is a regulator.
pub(crate) fn checks(design: &Design, budget: &SupplyBudget) -> Vec<Check> {
    let Some(g) = design.supply.regulator else {
        return Vec::new();
    };
    let reg = crate::analysis::stage::regulator(&g);
    let (vin_lo, vin_hi) = (design.supply.input_min_v, design.supply.input_max_v);
    let ambient_max = design.ambient.max_k;
    let v_out_hi = g.output_v * (1.0 + g.tolerance);
    let v_out_lo = g.output_v * (1.0 - g.tolerance);
    let headroom = LinearRegulator {
        output_v: v_out_hi,
        ..reg
    }
    .headroom_v(vin_lo);
    let mut out = vec![Check::at_least(
        "regulator-dropout",
        "regulator stays above dropout",
        headroom,
        0.0,
        "V",
    )
    .at(format!(
        "lowest input {vin_lo:.2} V, output at its highest {v_out_hi:.2} V"
    ))
    .detail(format!(
        "lowest input {vin_lo:.2} V against {v_out_hi:.2} V output (nominal {:.2} V + {:.0} %) + {:.2} V dropout: headroom {headroom:.2} V",
        g.output_v,
        100.0 * g.tolerance,
        g.dropout_v
    ))];
    let name = "regulator junction temperature within its limit";
    let i_out = budget.regulator_load_a.unwrap_or(0.0);
    let reg_low = LinearRegulator {
        output_v: v_out_lo,
        ..reg
    };
    out.push(match reg_low.dissipation_w(vin_hi, i_out) {
        Ok(p) => {
            let tj = reg.junction_k(ambient_max, p);
            Check::at_most(
                "regulator-junction",
                name,
                tj - 273.15,
                g.max_junction_k - 273.15,
                "°C",
            )
            .at(format!(
                "highest input {vin_hi:.2} V, output at its lowest {v_out_lo:.2} V, {:.1} °C ambient, worst load",
                ambient_max - 273.15
            ))
            .detail(format!(
                "P = ({vin_hi:.2} V − {v_out_lo:.2} V)·{} + {vin_hi:.2} V·{} = {}; T_J = {:.1} °C + P·{:.0} K/W = {:.1} °C against {:.1} °C (margin {:.1} K)",
                eng(i_out, "A"),
                eng(g.quiescent_a, "A"),
                eng(p, "W"),
                ambient_max - 273.15,
                g.theta_ja_k_per_w,
                tj - 273.15,
                g.max_junction_k - 273.15,
                g.max_junction_k - tj
            ))
        }
        Err(e) => Check::judged("regulator-junction", name, false)
            .detail(format!("dissipation undefined: {e}")),
    });
    out
}
