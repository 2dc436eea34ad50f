//! Pictures as SVG (plotters' SVG backend; text as SVG text elements, no
//! system fonts needed): the transfer curve with the drift over ambient,
//! the spread's histogram, a sweep's outputs. Each is a pure function of
//! its data, 800 px wide, axis labels with units.

use crate::analysis::plot::TransferPlot;
use crate::analysis::spread::SpreadReport;
use crate::analysis::sweep::SweepReport;
use plotters::prelude::*;

/// Width of every picture, px.
pub const WIDTH: u32 = 800;

/// Series colours (fixed, so a test can find each series in the raster).
pub const SENSE: RGBColor = RGBColor(31, 119, 180);
/// The trip level and the trip airflow.
pub const TRIP: RGBColor = RGBColor(214, 39, 40);
/// The release level and the release airflow.
pub const RELEASE: RGBColor = RGBColor(44, 160, 44);
/// The trip band.
pub const BAND: RGBColor = RGBColor(255, 127, 14);
/// A second series (the high rail end).
pub const SECOND: RGBColor = RGBColor(148, 103, 189);

const FONT: (&str, u32) = ("sans-serif", 14);
const CAPTION: (&str, u32) = ("sans-serif", 18);

fn range(values: impl Iterator<Item = f64>, pad: f64) -> (f64, f64) {
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    for v in values.filter(|v| v.is_finite()) {
        lo = lo.min(v);
        hi = hi.max(v);
    }
    if !lo.is_finite() {
        return (0.0, 1.0);
    }
    if hi <= lo {
        hi = lo + 1.0;
    }
    let d = (hi - lo) * pad;
    (lo - d, hi + d)
}

/// A message in place of a picture that could not be drawn.
fn failed(e: impl std::fmt::Display) -> String {
    format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{WIDTH}\" height=\"60\"><text x=\"10\" y=\"30\">cannot draw: {}</text></svg>\n",
        e.to_string().replace('<', "&lt;")
    )
}

/// `size --format svg`: the transfer curve (sense voltage against airflow,
/// the trip and release levels, the hysteresis band shaded, the trip band
/// marked) above the trip airflow against ambient at the rail ends.
pub fn transfer(p: &TransferPlot) -> String {
    let mut s = String::new();
    let r = draw_transfer(p, &mut s);
    match r {
        Ok(()) => with_schematic_pointer(s),
        Err(e) => failed(e),
    }
}

/// A line under the transfer curve pointing to the schematic of the same
/// circuit (`draftwire netlist DESIGN --svg`).
fn with_schematic_pointer(svg: String) -> String {
    let Some(end) = svg.rfind("</svg>") else {
        return svg;
    };
    let note = "<text x=\"12\" y=\"774\" font-family=\"sans-serif\" font-size=\"12\" fill=\"#444444\">The circuit: draftwire netlist DESIGN.toml --svg draws its schematic (--spice writes its netlist).</text>\n";
    format!("{}{note}{}", &svg[..end], &svg[end..])
}

fn draw_transfer(p: &TransferPlot, out: &mut String) -> Result<(), Box<dyn std::error::Error>> {
    let root = SVGBackend::with_string(out, (WIDTH, 780)).into_drawing_area();
    root.fill(&WHITE)?;
    // The last 20 px hold the pointer to the schematic.
    let (root, _footer) = root.split_vertically(760);
    let (top, bottom) = root.split_vertically(420);
    let x_max = p.airflow_m_per_s.last().copied().unwrap_or(1.0);
    let (y0, y1) = range(
        p.sense_v
            .iter()
            .flatten()
            .copied()
            .chain([p.trip_level_v, p.release_level_v]),
        0.08,
    );
    let mut c = ChartBuilder::on(&top)
        .caption(format!("{} — transfer curve", p.title), CAPTION)
        .margin(12)
        .x_label_area_size(40)
        .y_label_area_size(70)
        .build_cartesian_2d(0f64..x_max, y0..y1)?;
    c.configure_mesh()
        .x_desc("airflow (m/s)")
        .y_desc("voltage (V)")
        .label_style(FONT)
        .draw()?;
    let (b0, b1) = p.band_m_per_s;
    c.draw_series(std::iter::once(Rectangle::new(
        [(b0, y0), (b1, y1)],
        BAND.mix(0.15).filled(),
    )))?
    .label("trip band")
    .legend(|(x, y)| Rectangle::new([(x, y - 5), (x + 16, y + 5)], BAND.mix(0.4).filled()));
    let (h0, h1) = (
        p.trip_level_v.min(p.release_level_v),
        p.trip_level_v.max(p.release_level_v),
    );
    c.draw_series(std::iter::once(Rectangle::new(
        [(0.0, h0), (x_max, h1)],
        TRIP.mix(0.12).filled(),
    )))?;
    c.draw_series(LineSeries::new(
        p.airflow_m_per_s
            .iter()
            .zip(&p.sense_v)
            .filter_map(|(u, v)| v.map(|v| (*u, v))),
        SENSE.stroke_width(3),
    ))?
    .label("sense voltage")
    .legend(|(x, y)| PathElement::new(vec![(x, y), (x + 16, y)], SENSE.stroke_width(3)));
    c.draw_series(LineSeries::new(
        [(0.0, p.trip_level_v), (x_max, p.trip_level_v)],
        TRIP.stroke_width(2),
    ))?
    .label("trips at this level")
    .legend(|(x, y)| PathElement::new(vec![(x, y), (x + 16, y)], TRIP.stroke_width(2)));
    c.draw_series(LineSeries::new(
        [(0.0, p.release_level_v), (x_max, p.release_level_v)],
        RELEASE.stroke_width(2),
    ))?
    .label("releases at this level")
    .legend(|(x, y)| PathElement::new(vec![(x, y), (x + 16, y)], RELEASE.stroke_width(2)));
    for (u, colour) in [
        (p.trip_airflow_m_per_s, TRIP),
        (p.release_airflow_m_per_s, RELEASE),
    ] {
        if let Some(u) = u {
            c.draw_series(std::iter::once(Circle::new(
                (
                    u,
                    if colour == TRIP {
                        p.trip_level_v
                    } else {
                        p.release_level_v
                    },
                ),
                6,
                colour.filled(),
            )))?;
        }
    }
    c.configure_series_labels()
        .background_style(WHITE.mix(0.8))
        .border_style(BLACK)
        .label_font(FONT)
        .draw()?;

    let (a0, a1) = range(p.ambient_c.iter().copied(), 0.0);
    let (t0, t1) = range(
        p.trip_low_rail_m_per_s
            .iter()
            .chain(&p.trip_high_rail_m_per_s)
            .flatten()
            .copied()
            .chain([b0, b1]),
        0.08,
    );
    let mut d = ChartBuilder::on(&bottom)
        .caption("trip airflow against ambient (nominal parts)", CAPTION)
        .margin(12)
        .x_label_area_size(40)
        .y_label_area_size(70)
        .build_cartesian_2d(a0..a1, t0.max(0.0)..t1)?;
    d.configure_mesh()
        .x_desc("ambient (°C)")
        .y_desc("trip airflow (m/s)")
        .label_style(FONT)
        .draw()?;
    d.draw_series(std::iter::once(Rectangle::new(
        [(a0, b0), (a1, b1)],
        BAND.mix(0.15).filled(),
    )))?;
    for (series, colour, label) in [
        (&p.trip_low_rail_m_per_s, TRIP, "rails at their low end"),
        (&p.trip_high_rail_m_per_s, SECOND, "rails at their high end"),
    ] {
        d.draw_series(LineSeries::new(
            p.ambient_c
                .iter()
                .zip(series)
                .filter_map(|(t, u)| u.map(|u| (*t, u))),
            colour.stroke_width(3),
        ))?
        .label(label)
        .legend(move |(x, y)| PathElement::new(vec![(x, y), (x + 16, y)], colour.stroke_width(3)));
    }
    d.configure_series_labels()
        .position(SeriesLabelPosition::UpperLeft)
        .background_style(WHITE.mix(0.8))
        .border_style(BLACK)
        .label_font(FONT)
        .draw()?;
    root.present()?;
    Ok(())
}

/// `spread --format svg`: the histogram of the trip airflow with the band
/// and the 5 % and 95 % quantiles.
pub fn spread(r: &SpreadReport) -> String {
    let mut s = String::new();
    match draw_spread(r, &mut s) {
        Ok(()) => s,
        Err(e) => failed(e),
    }
}

fn draw_spread(r: &SpreadReport, out: &mut String) -> Result<(), Box<dyn std::error::Error>> {
    let root = SVGBackend::with_string(out, (WIDTH, 450)).into_drawing_area();
    root.fill(&WHITE)?;
    let bins = &r.trip_airflow_histogram;
    let (x0, x1) = range(
        bins.iter()
            .flat_map(|b| [b.from_m_per_s, b.to_m_per_s])
            .chain([r.band_m_per_s[0], r.band_m_per_s[1]]),
        0.05,
    );
    let y1 = bins.iter().map(|b| b.trials).max().unwrap_or(1).max(1) as f64 * 1.1;
    let mut c = ChartBuilder::on(&root)
        .caption(
            format!("{} — trip airflow over {} builds", r.title, r.trials),
            CAPTION,
        )
        .margin(12)
        .x_label_area_size(40)
        .y_label_area_size(70)
        .build_cartesian_2d(x0.max(0.0)..x1, 0f64..y1)?;
    c.configure_mesh()
        .x_desc("trip airflow, trimmer at its printed setting (m/s)")
        .y_desc("trials")
        .label_style(FONT)
        .draw()?;
    c.draw_series(std::iter::once(Rectangle::new(
        [(r.band_m_per_s[0], 0.0), (r.band_m_per_s[1], y1)],
        BAND.mix(0.15).filled(),
    )))?;
    c.draw_series(bins.iter().map(|b| {
        Rectangle::new(
            [(b.from_m_per_s, 0.0), (b.to_m_per_s, b.trials as f64)],
            SENSE.filled(),
        )
    }))?;
    let q = &r.trip_airflow_quantiles_m_per_s;
    for u in [q.p05, q.p95].into_iter().flatten() {
        c.draw_series(LineSeries::new([(u, 0.0), (u, y1)], TRIP.stroke_width(2)))?;
    }
    root.present()?;
    Ok(())
}

/// `sweep --format svg`: trip and release airflow against the first swept
/// key.
pub fn sweep(r: &SweepReport) -> String {
    let mut s = String::new();
    match draw_sweep(r, &mut s) {
        Ok(()) => s,
        Err(e) => failed(e),
    }
}

fn draw_sweep(r: &SweepReport, out: &mut String) -> Result<(), Box<dyn std::error::Error>> {
    let root = SVGBackend::with_string(out, (WIDTH, 450)).into_drawing_area();
    root.fill(&WHITE)?;
    let axis = &r.axes[0];
    let xs: Vec<f64> = r.rows.iter().map(|row| row.values[0]).collect();
    let (x0, x1) = range(xs.iter().copied(), 0.0);
    let (y0, y1) = range(
        r.rows
            .iter()
            .flat_map(|row| [row.trip_airflow_m_per_s, row.release_airflow_m_per_s])
            .flatten(),
        0.08,
    );
    let mut c = ChartBuilder::on(&root)
        .caption(format!("sweep of {}", axis.key), CAPTION)
        .margin(12)
        .x_label_area_size(40)
        .y_label_area_size(70)
        .build_cartesian_2d(x0..x1, y0.max(0.0)..y1)?;
    c.configure_mesh()
        .x_desc(axis.column.clone())
        .y_desc("airflow (m/s)")
        .label_style(FONT)
        .draw()?;
    for (pick, colour, label) in [
        (0usize, TRIP, "trip airflow"),
        (1usize, RELEASE, "release airflow"),
    ] {
        c.draw_series(LineSeries::new(
            r.rows.iter().filter_map(|row| {
                let y = if pick == 0 {
                    row.trip_airflow_m_per_s
                } else {
                    row.release_airflow_m_per_s
                };
                y.map(|y| (row.values[0], y))
            }),
            colour.stroke_width(3),
        ))?
        .label(label)
        .legend(move |(x, y)| PathElement::new(vec![(x, y), (x + 16, y)], colour.stroke_width(3)));
    }
    c.configure_series_labels()
        .background_style(WHITE.mix(0.8))
        .border_style(BLACK)
        .label_font(FONT)
        .draw()?;
    root.present()?;
    Ok(())
}
