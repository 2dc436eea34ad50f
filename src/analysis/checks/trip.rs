//! The detector's job: trip inside its band, never on the air that is
//! always there, and release again when the air is quiet — at every build,
//! ambient end, supply end and offset drift.

use crate::analysis::corners::{Grid, Outcome, Switching};
use crate::design::model::TripDirection;
use crate::design::Design;
use crate::quantity::format_sig;
use crate::report::Check;

/// Differences below this (m/s) are float noise between builds that trim
/// to the same trip point; the first such build is reported, so the worst
/// condition named does not flip with the last bit.
pub const TIE_M_PER_S: f64 = 1e-9;

/// The three trip checks.
pub fn checks(design: &Design, grid: &Grid) -> Vec<Check> {
    vec![
        trip_band(design, grid),
        no_false_trip(design, grid),
        releases_when_quiet(design, grid),
    ]
}

fn span_text(grid: &Grid, pick: impl Fn(&Outcome) -> &Switching) -> String {
    let us: Vec<f64> = grid
        .outcomes
        .iter()
        .filter_map(|o| pick(o).airflow())
        .collect();
    let lo = us.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = us.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    let odd = grid.outcomes.len() - us.len();
    let mut s = if us.is_empty() {
        "no condition switches at any airflow".to_string()
    } else {
        format!("{lo:.3}–{hi:.3} m/s")
    };
    if odd > 0 && !us.is_empty() {
        s.push_str(&format!(" ({odd} condition(s) never switch)"));
    }
    s
}

/// `trip-band`: the trip airflow lies inside the band at every condition.
pub fn trip_band(design: &Design, grid: &Grid) -> Check {
    let (lo, hi) = design.detector.trip_band_m_per_s;
    let name = "trip point inside its band at every condition";
    // Worst: the smallest distance inside the band (negative outside);
    // a condition that never switches is worse than any number.
    let mut worst: Option<(&Outcome, f64)> = None;
    for o in &grid.outcomes {
        let m = match o.trip {
            Switching::At(u) => (u - lo).min(hi - u),
            _ => f64::NEG_INFINITY,
        };
        if worst.is_none_or(|(_, w)| m < w - TIE_M_PER_S) {
            worst = Some((o, m));
        }
    }
    let Some((o, _)) = worst else {
        return Check::judged("trip-band", name, false).detail("no condition was evaluated");
    };
    let span = span_text(grid, |o| &o.trip);
    let detail = format!(
        "across {} conditions it trips at {span}; band {}–{} m/s",
        grid.outcomes.len(),
        format_sig(lo, 3),
        format_sig(hi, 3)
    );
    let check = match o.trip {
        Switching::At(u) if u - lo < hi - u => Check::at_least("trip-band", name, u, lo, "m/s"),
        Switching::At(u) => Check::at_most("trip-band", name, u, hi, "m/s"),
        ref s => Check::judged("trip-band", name, false)
            .numbers(None, None, "m/s")
            .detail(format!("{}: {detail}", s.describe())),
    };
    let check = check.at(grid.condition(o));
    if !check.detail.is_empty() {
        return check;
    }
    let hint = if check.passed {
        ""
    } else {
        " — the trip point drifts out of its band: more overheat, a narrower ambient range, tighter parts or ambient compensation would help"
    };
    check.detail(format!("{detail}{hint}"))
}

/// The airflow where the output must stay idle, and how it is named.
fn quiet(design: &Design) -> (f64, &'static str) {
    match design.detector.trip_on {
        TripDirection::Rising => (
            design.detector.background_airflow_m_per_s,
            "background airflow",
        ),
        TripDirection::Falling => (design.detector.normal_airflow_m_per_s, "normal airflow"),
    }
}

/// Judge one switching kind against the quiet airflow: for a rising trip it
/// must switch above it, for a falling trip below it.
fn against_quiet(
    design: &Design,
    grid: &Grid,
    id: &str,
    name: &str,
    pick: impl Fn(&Outcome) -> &Switching,
    // Which non-numeric outcome is a failure.
    bad: &Switching,
) -> Check {
    let (q, what) = quiet(design);
    let rising = design.detector.trip_on == TripDirection::Rising;
    let mut worst: Option<(&Outcome, f64)> = None;
    for o in &grid.outcomes {
        let m = match pick(o) {
            Switching::At(u) => {
                if rising {
                    u - q
                } else {
                    q - u
                }
            }
            s if s == bad => f64::NEG_INFINITY,
            Switching::Unsolved(_) => f64::NEG_INFINITY,
            _ => f64::INFINITY,
        };
        if worst.is_none_or(|(_, w)| m < w - TIE_M_PER_S) {
            worst = Some((o, m));
        }
    }
    let Some((o, m)) = worst else {
        return Check::judged(id, name, false).detail("no condition was evaluated");
    };
    let span = span_text(grid, &pick);
    let check = match pick(o) {
        Switching::At(u) if rising => Check::at_least(id, name, *u, q, "m/s"),
        Switching::At(u) => Check::at_most(id, name, *u, q, "m/s"),
        s => Check::judged(id, name, m > 0.0)
            .numbers(None, Some(q), "m/s")
            .detail(format!("{} at the worst condition; ", s.describe())),
    };
    // Strictly beyond the quiet airflow: switching exactly there is a fault.
    let check = check.passed_if(m > 0.0).at(grid.condition(o));
    let detail = format!(
        "{}{what} {} m/s; across all conditions it switches at {span}",
        check.detail,
        format_sig(q, 3)
    );
    check.detail(detail)
}

/// `no-false-trip`: never tripped at the background airflow (rising) or the
/// normal airflow (falling).
pub fn no_false_trip(design: &Design, grid: &Grid) -> Check {
    let rising = design.detector.trip_on == TripDirection::Rising;
    let name = if rising {
        "never trips at the background airflow"
    } else {
        "never trips at the normal airflow"
    };
    let c = against_quiet(
        design,
        grid,
        "no-false-trip",
        name,
        |o| &o.trip,
        &Switching::AlwaysTripped,
    );
    if c.passed {
        c
    } else {
        let d = format!(
            "{} — the output would be tripped while all is well: more overheat, a narrower ambient range or ambient compensation would help",
            c.detail
        );
        c.detail(d)
    }
}

/// `releases-when-quiet`: once tripped, the output releases when the air
/// returns to the background (rising) or normal (falling) airflow.
pub fn releases_when_quiet(design: &Design, grid: &Grid) -> Check {
    let rising = design.detector.trip_on == TripDirection::Rising;
    let name = if rising {
        "releases again at the background airflow"
    } else {
        "releases again at the normal airflow"
    };
    let c = against_quiet(
        design,
        grid,
        "releases-when-quiet",
        name,
        |o| &o.release,
        &Switching::AlwaysTripped,
    );
    if c.passed {
        c
    } else {
        let d = format!(
            "{} — once tripped the output would stay latched: less hysteresis or a band further from the quiet airflow would help",
            c.detail
        );
        c.detail(d)
    }
}
