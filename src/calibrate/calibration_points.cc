#include "calibrate/calibration_points.h"

#include <cmath>

#include "core/csv.h"
#include "core/error.h"
#include "core/parse.h"

namespace vicinal::calibrate {

namespace {

double positive_sigma(const CsvTable& t, const CsvRow& row, std::size_t col) {
  const double s = parse_coupling_hz(row.fields[col], t.where(row, col));
  if (!(s > 0)) throw Error("sigma_hz must be positive", t.where(row, col), "give the uncertainty, e.g. 0.3");
  return s;
}

std::vector<CalibrationPoint> points_from(const CsvTable& t) {
  const std::size_t j = t.require_column("j_hz"), s = t.require_column("sigma_hz"), d = t.require_column("dihedral_deg");
  std::vector<CalibrationPoint> out;
  for (const auto& row : t.rows()) {
    CalibrationPoint p;
    p.line = row.line;
    p.j_hz = parse_coupling_hz(row.fields[j], t.where(row, j));
    p.sigma_hz = positive_sigma(t, row, s);
    p.dihedral_deg = parse_double(row.fields[d], t.where(row, d));
    if (p.dihedral_deg < -360 || p.dihedral_deg > 360)
      throw Error("dihedral_deg must lie within [-360, 360]", t.where(row, d), "give the angle in degrees");
    out.push_back(p);
  }
  if (out.empty()) throw Error("no data rows", {t.source()}, "add one row per (J, dihedral) pair");
  return out;
}

std::vector<SiteCoupling> sites_from(const CsvTable& t) {
  const std::size_t site = t.require_column("site"), type = t.require_column("type"), j = t.require_column("j_hz"),
                    s = t.require_column("sigma_hz");
  const auto start = t.column("start_deg");
  std::vector<SiteCoupling> out;
  for (const auto& row : t.rows()) {
    SiteCoupling c;
    c.line = row.line;
    c.site = std::string(trim(row.fields[site]));
    c.type = std::string(trim(row.fields[type]));
    if (c.site.empty()) throw Error("empty site name", t.where(row, site), "name the residue or site, e.g. A12");
    if (c.type.empty()) throw Error("empty coupling type", t.where(row, type), "give a Karplus set id");
    c.j_hz = parse_coupling_hz(row.fields[j], t.where(row, j));
    c.sigma_hz = positive_sigma(t, row, s);
    if (start && !trim(row.fields[*start]).empty()) {
      c.start_deg = parse_double(row.fields[*start], t.where(row, *start));
      if (c.start_deg < -360 || c.start_deg > 360)
        throw Error("start_deg must lie within [-360, 360]", t.where(row, *start), "give the angle in degrees");
      c.has_start = true;
    }
    out.push_back(c);
  }
  if (out.empty()) throw Error("no data rows", {t.source()}, "add one row per measured coupling");
  return out;
}

}  // namespace

std::vector<CalibrationPoint> read_calibration_points(const std::string& path) {
  return points_from(CsvTable::read_file(path));
}
std::vector<CalibrationPoint> parse_calibration_points(const std::string& text, const std::string& source) {
  return points_from(CsvTable::parse(text, source));
}
std::vector<SiteCoupling> read_site_couplings(const std::string& path) { return sites_from(CsvTable::read_file(path)); }
std::vector<SiteCoupling> parse_site_couplings(const std::string& text, const std::string& source) {
  return sites_from(CsvTable::parse(text, source));
}

}  // namespace vicinal::calibrate
