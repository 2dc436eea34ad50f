//! Rendering a `transient` report: aligned text, JSON, the events as CSV,
//! and the time series of `--samples` as CSV; pure functions.

use super::csv::field;
use crate::analysis::transient::TransientReport;
use crate::transient::Run;
use std::fmt::Write as _;

/// JSON, pretty-printed, units in the key names.
pub fn render_json(r: &TransientReport) -> String {
    serde_json::to_string_pretty(r).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}")) + "\n"
}

fn heading(o: &mut String, title: &str) {
    let _ = writeln!(o, "\n{title}\n{}", "─".repeat(title.chars().count()));
}

fn line(o: &mut String, label: &str, value: &str) {
    let _ = writeln!(o, "  {label:<40} {value}");
}

fn secs(x: Option<f64>) -> String {
    x.map_or("—".to_string(), |s| format!("{s:.3} s"))
}

/// Aligned text for people.
pub fn render_text(r: &TransientReport) -> String {
    let mut o = String::new();
    let _ = writeln!(o, "draftwire transient · {}", r.title);
    let _ = writeln!(o, "design file   {}", r.design_file);
    let _ = writeln!(o, "scenario      {}", r.scenario);
    let _ = writeln!(
        o,
        "result        {}",
        if r.passed { "PASS" } else { "FAIL" }
    );
    heading(&mut o, "Results");
    match r.scenario.as_str() {
        "power-on" => {
            let bare = if r.hold_off.is_some() {
                " (no hold-off C1)"
            } else {
                ""
            };
            let rows = [
                ("false alarm, nominal ambient", secs(r.false_alarm_s)),
                (
                    "false alarm, coldest ambient",
                    secs(r.false_alarm_coldest_s),
                ),
                ("settles, nominal ambient", secs(r.settle_s)),
                ("settles, coldest ambient", secs(r.settle_coldest_s)),
            ];
            for (label, value) in rows {
                line(&mut o, &format!("{label}{bare}"), &value);
            }
            line(
                &mut o,
                "accepted (power_on_grace)",
                &format!("{:.3} s", r.power_on_grace_s),
            );
            if let Some(v) = r.settled_sense_v {
                line(&mut o, "settled sense voltage", &format!("{v:.4} V"));
            }
            if let Some(h) = &r.hold_off {
                let eng = crate::quantity::format_engineering;
                line(
                    &mut o,
                    "hold-off capacitor C1",
                    &eng(h.capacitance_f, "F", 2),
                );
                line(&mut o, "its time constant", &eng(h.time_constant_s, "s", 3));
                line(
                    &mut o,
                    "false alarm with the hold-off C1",
                    &format!("{:.3} s", h.false_alarm_with_it_s),
                );
            }
        }
        "step" => {
            line(
                &mut o,
                "time to trip after the step",
                &secs(r.time_to_trip_s),
            );
            line(
                &mut o,
                "time to release after it falls back",
                &secs(r.time_to_release_s),
            );
        }
        "puff" => {
            line(&mut o, "trips at", &secs(r.time_to_trip_s));
            line(
                &mut o,
                "threshold that just trips",
                &r.threshold_peak_m_per_s.map_or(
                    "none within the search range (see below)".to_string(),
                    |u| format!("{u:.3} m/s"),
                ),
            );
        }
        _ => {}
    }
    let edges = |o: &mut String, title: &str, events: &[crate::analysis::transient::EventRow]| {
        heading(o, title);
        if events.is_empty() {
            let _ = writeln!(o, "  none: the output does not switch");
            return;
        }
        let _ = writeln!(o, "  {:>12}  {:>9}  event", "time", "ambient");
        for e in events {
            let _ = writeln!(
                o,
                "  {:>10.4} s  {:>6.1} °C  {}",
                e.time_s, e.ambient_c, e.kind
            );
        }
    };
    if r.scenario == "power-on" && r.hold_off.is_some() {
        edges(&mut o, "Output edges without the hold-off C1", &r.events);
        edges(
            &mut o,
            "Output edges with the hold-off C1 (nominal ambient)",
            &r.events_with_hold_off,
        );
    } else {
        edges(&mut o, "Output edges", &r.events);
    }
    if !r.recommendations.is_empty() {
        heading(&mut o, "Recommendations");
        for s in &r.recommendations {
            let _ = writeln!(o, "  - {s}");
        }
    }
    if !r.notes.is_empty() {
        heading(&mut o, "How it was run");
        for s in &r.notes {
            let _ = writeln!(o, "  - {s}");
        }
    }
    o
}

/// The events as CSV (RFC 4180).
pub fn render_csv(r: &TransientReport) -> String {
    let mut o = String::from("time_s,kind,ambient_c\r\n");
    for e in &r.events {
        let _ = write!(o, "{},{},{}\r\n", e.time_s, field(&e.kind), e.ambient_c);
    }
    o
}

/// The time series of a run as CSV: time, airflow, element temperature,
/// sense voltage, reference, output state.
pub fn samples_csv(run: &Run) -> String {
    let mut o = String::from(
        "time_s,airflow_m_per_s,element_temperature_c,sense_voltage_v,reference_v,output_active\r\n",
    );
    for s in &run.samples {
        let _ = write!(
            o,
            "{},{},{},{},{},{}\r\n",
            s.time_s,
            s.airflow_m_per_s,
            s.element_k - 273.15,
            s.sense_v,
            s.reference_v,
            s.active
        );
    }
    o
}
