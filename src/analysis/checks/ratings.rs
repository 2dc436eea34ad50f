//! `power-rating-<designator>`: every resistor and the trimmer within its
//! power rating at the design's derating and the highest ambient, each on
//! its own temperature-derating curve (film resistors 70 → 155 °C, cermet
//! trimmers 70 → 125 °C; `circuit::ratings`).

use crate::analysis::output::RatedPart;
use crate::design::Design;
use crate::quantity::format_engineering;
use crate::report::Check;

fn eng(x: f64, unit: &str) -> String {
    format_engineering(x, unit, 3)
}

/// One check per rated part.
pub(crate) fn checks(design: &Design, rated: &[RatedPart]) -> Vec<Check> {
    rated.iter().map(|p| power_rating(design, p)).collect()
}

fn power_rating(design: &Design, p: &RatedPart) -> Check {
    let derating = design.ratings.resistor_derating;
    let ambient_c = design.ambient.max_k - 273.15;
    let name = format!("{} within its power rating", p.designator);
    let id = format!("power-rating-{}", p.designator.to_lowercase());
    let at = format!("{}, {ambient_c:.1} °C ambient", p.case);
    match &p.rating {
        Ok((r, m)) => Check::at_most(&id, &name, p.watts, m.allowed_w, "W")
            .at(at)
            .detail(format!(
                "{} worst case; {} {} rating allows {} at {:.0} % derating and {ambient_c:.1} °C ambient on the {} derating curve (margin {}, {:.0} % of the temperature-derated rating)",
                eng(p.watts, "W"),
                if p.trimmer { "the given" } else { "a standard" },
                eng(*r, "W"),
                eng(m.allowed_w, "W"),
                100.0 * derating,
                if p.trimmer {
                    "cermet trimmer (70 → 125 °C)"
                } else {
                    "film resistor (70 → 155 °C)"
                },
                eng(m.margin_w, "W"),
                100.0 * m.load_fraction
            )),
        Err(e) => Check::judged(&id, &name, false)
            .numbers(Some(p.watts), None, "W")
            .at(at)
            .detail(format!(
                "{} worst case: no standard power rating carries it at {:.0} % derating and {ambient_c:.1} °C ambient ({e}); raise the resistance or split the power",
                eng(p.watts, "W"),
                100.0 * derating,
            )),
    }
}
