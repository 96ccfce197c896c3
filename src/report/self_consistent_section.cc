#include "report/self_consistent_section.h"

#include <fmt/format.h>

namespace vicinal::report {

namespace {

PageFigure type_figure(const Json& doc, const Json& curve) {
  const std::string type = json_string_or_empty(curve, "type");
  Figure f;
  f.title = fmt::format("{} ({}): fitted and starting curves", json_string_or_empty(curve, "coupling"), type);
  f.x_label = fmt::format("{} (deg)", json_string_or_empty(doc, "angle_name"));
  f.y_label = json_string_or_empty(curve, "coupling") + " (Hz)";
  f.x_range = {{-180.0, 180.0}};
  f.x_ticks = {-180, -120, -60, 0, 60, 120, 180};
  f.height_pt = 300;
  const auto grid = json_numbers(curve, "dihedral_deg");
  f.series.push_back({.label = "self-consistent fit", .x = grid, .y = json_numbers(curve, "fitted_hz"), .color = 0});
  f.series.push_back(
      {.label = "starting set " + type, .x = grid, .y = json_numbers(curve, "start_hz"), .color = 1, .dashed = true});
  Series points{.label = "measured, at the fitted site angle", .style = Series::Style::Points, .color = 5};
  for (const auto& p : json_array_or_empty(curve, "points")) {
    const double j = json_number_or_nan(p, "j_hz"), s = json_number_or_nan(p, "sigma_hz");
    points.x.push_back(json_number_or_nan(p, "angle_deg"));
    points.y.push_back(j);
    points.error_low.push_back(j - s);
    points.error_high.push_back(j + s);
  }
  f.series.push_back(std::move(points));
  f.footnote =
      "The site angles are fitted together with the coefficients of every type: each point sits at the angle "
      "its site was given, not at a measured one.";
  return {"self-consistent-" + file_slug(type), "Couplings of type " + type + " at the fitted site angles.", f,
          std::nullopt};
}

}  // namespace

ResultPage self_consistent_page(const Json& doc) {
  ResultPage page;
  for (const auto& c : json_array_or_empty(doc, "curves")) page.figures.push_back(type_figure(doc, c));

  HtmlDocument html = result_document(doc);
  html.open_section("summary", "Summary");
  html.paragraph(
      fmt::format("Self-consistent fit of {} coupling types and {} site angles ({} parameters) to {} "
                  "couplings from {}: chi² = {:.2f}.",
                  doc.at("types").size(), doc.at("sites").size(), doc.at("k").get<int>(), doc.at("n").get<int>(),
                  json_string_or_empty(doc, "input"), json_number_or_nan(doc, "chi2")));
  html.paragraph(
      "Method: Schmidt, Blümel, Löhr and Rüterjans, J. Biomol. NMR 14, 1 (1999): the coupling types measured "
      "at one site share its unknown angle, so coefficients and angles are fitted together.");
  html.caution("Angles are parameters here",
               "The site angles are not measured: they are whatever angles let all types agree. A site with few "
               "couplings, or couplings on a flat part of their curves, has a poorly defined angle.");
  html.close_section();

  html.open_section("types", "Coefficients per coupling type");
  PageTable t{"self-consistent-types.csv",
              "Fitted coefficients (Hz) beside those of the starting set",
              {"type", "couplings", "A", "B", "C", "start A", "start B", "start C", "RMSD / Hz"},
              {}};
  for (const auto& ty : doc.at("types")) {
    const auto c = json_numbers(ty, "coefficients"), s = json_numbers(ty, "start_coefficients");
    t.rows.push_back({json_string_or_empty(ty, "type"), fmt::format("{}", ty.at("n").get<int>()),
                      fixed_or_dash(c.at(0), 2), fixed_or_dash(c.at(1), 2), fixed_or_dash(c.at(2), 2),
                      fixed_or_dash(s.at(0), 2), fixed_or_dash(s.at(1), 2), fixed_or_dash(s.at(2), 2),
                      fixed_or_dash(json_number_or_nan(ty, "rmsd_hz"), 3)});
  }
  page.add_table(html, t);
  for (const auto& f : page.figures) page.add_figure(html, f.name);
  html.close_section();

  html.open_section("sites", "Fitted site angles");
  PageTable s{"self-consistent-sites.csv",
              "Site angles (deg)",
              {"site", json_string_or_empty(doc, "angle_name") + " fitted", "start"},
              {}};
  for (const auto& site : doc.at("sites"))
    s.rows.push_back({json_string_or_empty(site, "site"), fixed_or_dash(json_number_or_nan(site, "angle_deg"), 1),
                      fixed_or_dash(json_number_or_nan(site, "start_deg"), 1)});
  page.add_table(html, s);
  html.close_section();

  add_provenance(html, doc, "self-consistent.json");
  page.html = html.render();
  return page;
}

}  // namespace vicinal::report
