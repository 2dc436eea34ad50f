//! The report for people: aligned, unit-labelled plain text.

use crate::quantity::format_engineering;
use crate::report::Report;
use std::fmt::Write;

/// A plain aligned table; each column left- (`l`) or right-aligned (`r`).
struct Table {
    rows: Vec<Vec<String>>,
}

impl Table {
    fn new(header: &[&str]) -> Self {
        Self {
            rows: vec![header.iter().map(|s| s.to_string()).collect()],
        }
    }
    fn push(&mut self, row: Vec<String>) {
        self.rows.push(row);
    }
    fn render(&self, out: &mut String, indent: &str, align: &str) {
        let align: Vec<char> = align.chars().collect();
        let n = self.rows.iter().map(Vec::len).max().unwrap_or(0);
        let widths: Vec<usize> = (0..n)
            .map(|i| {
                self.rows
                    .iter()
                    .filter_map(|r| r.get(i))
                    .map(|c| c.chars().count())
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        for row in &self.rows {
            let mut line = String::from(indent);
            for (i, cell) in row.iter().enumerate() {
                let pad = widths[i] - cell.chars().count();
                if i > 0 {
                    line.push_str("  ");
                }
                if align.get(i).copied().unwrap_or('r') == 'l' {
                    line.push_str(cell);
                    if i + 1 < row.len() {
                        line.push_str(&" ".repeat(pad));
                    }
                } else {
                    line.push_str(&" ".repeat(pad));
                    line.push_str(cell);
                }
            }
            out.push_str(line.trim_end());
            out.push('\n');
        }
    }
}

fn eng(x: f64, unit: &str) -> String {
    format_engineering(x, unit, 3)
}

fn heading(out: &mut String, title: &str) {
    let _ = writeln!(out, "\n{title}\n{}", "─".repeat(title.chars().count()));
}

/// Render the report as aligned text.
pub fn render(r: &Report, file: &str) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "draftwire size · {}", r.title);
    let _ = writeln!(out, "design file   {file}");
    let _ = writeln!(out, "element       {}", r.element);
    let _ = writeln!(out, "drive         {}", r.drive);
    let _ = writeln!(
        out,
        "air           {:.1} °C, {:.1} kPa",
        r.ambient_c,
        r.pressure_pa / 1000.0
    );
    if let Some(k) = &r.equivalent_kings_law {
        let _ = writeln!(
            out,
            "King's law    G(U) ≈ {} + {}·Uⁿ, n = {:.3} (equivalent around {:.0} °C, U in m/s)",
            eng(k.a_w_per_k, "W/K"),
            eng(k.b_w_per_k, "W/K"),
            k.n,
            k.at_temperature_c
        );
    }
    let verdict = if r.passed() {
        "PASS: every check passed".to_string()
    } else {
        format!(
            "FAIL: {} of {} checks failed",
            r.checks.iter().filter(|c| !c.passed).count(),
            r.checks.len()
        )
    };
    let _ = writeln!(out, "result        {verdict}");

    heading(
        &mut out,
        &format!("Element operating points (ambient {:.1} °C)", r.ambient_c),
    );
    let mut t = Table::new(&[
        "",
        "airflow",
        "element",
        "resistance",
        "current",
        "power",
        "sense",
        "overheat",
        "time const.",
    ]);
    t.push(vec![
        "".into(),
        "m/s".into(),
        "°C".into(),
        "".into(),
        "".into(),
        "".into(),
        "".into(),
        "ratio".into(),
        "".into(),
    ]);
    for p in &r.operating_points {
        t.push(vec![
            p.label.clone(),
            format!("{:.3}", p.airflow_m_per_s),
            format!("{:.1}", p.element_temperature_c),
            eng(p.element_resistance_ohm, "Ω"),
            eng(p.element_current_a, "A"),
            eng(p.element_power_w, "W"),
            format!("{:.4} V", p.sense_voltage_v),
            format!("{:.3}", p.overheat_ratio),
            eng(p.time_constant_s, "s"),
        ]);
    }
    t.render(&mut out, "  ", "lrrrrrrrr");

    let tr = &r.trip;
    heading(
        &mut out,
        &format!("Trip point (trips on {} airflow)", tr.direction),
    );
    let kv = |out: &mut String, k: &str, v: String| {
        let _ = writeln!(out, "  {k:<30} {v}");
    };
    kv(
        &mut out,
        "target",
        format!("{:.3} m/s", tr.target_airflow_m_per_s),
    );
    kv(
        &mut out,
        "trips at",
        format!("{:.3} m/s", tr.airflow_m_per_s),
    );
    kv(
        &mut out,
        "releases at",
        format!("{:.3} m/s", tr.release_airflow_m_per_s),
    );
    kv(
        &mut out,
        "sense voltage at trip",
        format!("{:.4} V", tr.sense_voltage_v),
    );
    kv(
        &mut out,
        "reference voltage (wiper)",
        format!("{:.4} V", tr.reference_voltage_v),
    );
    kv(
        &mut out,
        "sensitivity dV/dU",
        format!("{:.2} mV per m/s", tr.sensitivity_v_per_m_per_s * 1000.0),
    );
    kv(
        &mut out,
        "trimmer setting",
        format!(
            "{:.1} % of travel from the grounded end",
            tr.trimmer_position_percent
        ),
    );
    kv(
        &mut out,
        "trimmer range",
        format!(
            "grounded end: {}; top end: {}",
            tr.trimmer_bottom_state, tr.trimmer_top_state
        ),
    );
    kv(
        &mut out,
        "1 % of travel moves it",
        format!("{:.4} m/s", tr.airflow_per_percent_travel_m_per_s),
    );
    kv(
        &mut out,
        "comparator offset adds",
        format!("± {:.4} m/s", tr.offset_uncertainty_m_per_s),
    );
    kv(
        &mut out,
        "non-inverting input (+)",
        tr.non_inverting_input.clone(),
    );
    kv(&mut out, "inverting input (−)", tr.inverting_input.clone());
    let _ = writeln!(out, "  {}", tr.hysteresis_note);

    heading(&mut out, "Bill of values");
    let mut t = Table::new(&["ref", "part", "value", "exact", "rating", "why"]);
    for v in &r.values {
        let exact = match (v.exact, v.value_ohm, v.value_a, v.value_f) {
            (Some(x), Some(_), _, _) => eng(x, "Ω"),
            (Some(x), _, Some(_), _) => eng(x, "A"),
            (Some(x), _, _, Some(_)) => eng(x, "F"),
            _ => String::new(),
        };
        let rating = match v.rating_w {
            Some(w) if v.rating.is_empty() => eng(w, "W"),
            Some(w) => format!("{} · {}", eng(w, "W"), v.rating),
            None => v.rating.clone(),
        };
        let series = if v.e_series.is_empty() || v.e_series == "given" {
            String::new()
        } else {
            format!(" {}", v.e_series)
        };
        t.push(vec![
            v.designator.clone(),
            v.part.clone(),
            format!("{}{}", v.text, series),
            exact,
            rating,
            v.reason.clone(),
        ]);
    }
    t.render(&mut out, "  ", "llllll");

    if !r.drift.is_empty() {
        heading(&mut out, "Trip-point drift");
        let mut t = Table::new(&[
            "condition",
            "ambient",
            "element rail",
            "ref rail",
            "trips at",
            "shift",
            "note",
        ]);
        for d in &r.drift {
            t.push(vec![
                d.condition.clone(),
                format!("{:.1} °C", d.ambient_c),
                format!("{:.3} V", d.element_rail_v),
                format!("{:.3} V", d.reference_rail_v),
                d.trip_airflow_m_per_s
                    .map_or("—".into(), |u| format!("{u:.3} m/s")),
                d.shift_m_per_s
                    .map_or("—".into(), |u| format!("{u:+.3} m/s")),
                d.note.clone(),
            ]);
        }
        t.render(&mut out, "  ", "lrrrrrl");
    }

    if r.supply.idle_a > 0.0 {
        heading(&mut out, "Supply");
        kv(&mut out, "input current, idle", eng(r.supply.idle_a, "A"));
        kv(
            &mut out,
            "input current, tripped",
            eng(r.supply.tripped_a, "A"),
        );
        if let Some(tj) = r.supply.regulator_junction_c {
            kv(
                &mut out,
                "regulator dissipation (worst)",
                eng(r.supply.regulator_dissipation_w, "W"),
            );
            kv(
                &mut out,
                "regulator junction (worst)",
                format!("{tj:.1} °C"),
            );
        }
    }

    heading(&mut out, "Checks");
    for c in &r.checks {
        let _ = writeln!(
            out,
            "  {} {} — {}",
            if c.passed { "pass" } else { "FAIL" },
            c.name,
            c.detail
        );
    }

    if !r.warnings.is_empty() {
        heading(&mut out, "Warnings");
        for w in &r.warnings {
            let _ = writeln!(out, "  ? {w}");
        }
    }

    heading(&mut out, "Cautions");
    for c in &r.cautions {
        let _ = writeln!(out, "  ! {c}");
    }
    if !r.assumptions.is_empty() {
        heading(&mut out, "Assumed (the file left these open)");
        for a in &r.assumptions {
            let _ = writeln!(out, "  - {a}");
        }
    }
    out
}
