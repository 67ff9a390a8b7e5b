//! A pattern as DXF, through the `dxf` crate, with a fixed header so that the same pattern
//! gives the same bytes.

use super::super::book::PatternEntry;
use super::super::nest::bbox;
use super::{centroid, label, notch};

/// The header's dates and ids, which the `dxf` crate takes from the clock and a random source,
/// set to fixed values so that the same ply book gives the same bytes (outputs are compared by
/// checksum, and a report set must be reproducible). The local dates are given as local wall
/// time, so they do not depend on the machine's time zone.
fn fixed_header(h: &mut dxf::Header) {
    use chrono::{Local, NaiveDate, TimeZone, Utc};
    if let Some(noon) = NaiveDate::from_ymd_opt(2000, 1, 1).and_then(|d| d.and_hms_opt(12, 0, 0)) {
        if let Some(local) = Local.from_local_datetime(&noon).earliest() {
            h.creation_date = local;
            h.update_date = local;
        }
        let utc = Utc.from_utc_datetime(&noon);
        h.creation_date_universal = utc;
        h.update_date_universal = utc;
    }
    h.fingerprint_guid = uuid::Uuid::nil();
    h.version_guid = uuid::Uuid::nil();
}

/// One pattern as DXF (R2000, millimetres): layer `OUTLINE` the closed outline, `FIBRE` the
/// fibre direction line, `NOTCH` the root notch, `LABEL` the label.
pub fn pattern_dxf(e: &PatternEntry) -> Result<Vec<u8>, String> {
    use dxf::entities::{Entity, EntityType, Line, LwPolyline, Text};
    use dxf::{Drawing, LwPolylineVertex, Point};
    let mut d = Drawing::new();
    d.header.version = dxf::enums::AcadVersion::R2000;
    d.header.default_drawing_units = dxf::enums::Units::Millimeters;
    fixed_header(&mut d.header);
    let outline: Vec<[f64; 2]> =
        e.pattern.outline.iter().map(|q| [q[0] * 1e3, q[1] * 1e3]).collect();
    let mut poly = LwPolyline::default();
    poly.vertices = outline
        .iter()
        .map(|q| LwPolylineVertex { x: q[0], y: q[1], ..Default::default() })
        .collect();
    poly.set_is_closed(true);
    let mut ent = Entity::new(EntityType::LwPolyline(poly));
    ent.common.layer = "OUTLINE".to_string();
    d.add_entity(ent);
    let (lo, hi) = bbox(&outline);
    let c = centroid(&outline);
    let len = ((hi[0] - lo[0]) * 0.3).clamp(20.0, 200.0);
    let mut ent = Entity::new(EntityType::Line(Line::new(
        Point::new(c[0] - 0.5 * len, c[1], 0.0),
        Point::new(c[0] + 0.5 * len, c[1], 0.0),
    )));
    ent.common.layer = "FIBRE".to_string();
    d.add_entity(ent);
    let n = notch(e);
    let mut notch_poly = LwPolyline::default();
    notch_poly.vertices =
        n.iter().map(|q| LwPolylineVertex { x: q[0], y: q[1], ..Default::default() }).collect();
    let mut ent = Entity::new(EntityType::LwPolyline(notch_poly));
    ent.common.layer = "NOTCH".to_string();
    d.add_entity(ent);
    let mut text = Text::default();
    text.location = Point::new(lo[0], lo[1] - 12.0, 0.0);
    text.text_height = 6.0;
    text.value = label(e).replace('²', "2").replace('°', " deg");
    let mut ent = Entity::new(EntityType::Text(text));
    ent.common.layer = "LABEL".to_string();
    d.add_entity(ent);
    let mut buf = Vec::new();
    d.save(&mut buf).map_err(|err| err.to_string())?;
    Ok(buf)
}
