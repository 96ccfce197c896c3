#include "report/calibration_section.h"

#include <fmt/format.h>

#include <cmath>

namespace vicinal::report {

namespace {

PageFigure curves_figure(const Json& doc) {
  Figure f;
  f.title = fmt::format("{}: calibration points and curves", json_string_or_empty(doc, "coupling"));
  f.x_label = fmt::format("dihedral {} (deg)", json_string_or_empty(doc, "angle_name"));
  f.y_label = json_string_or_empty(doc, "coupling") + " (Hz)";
  f.x_range = {{-180.0, 180.0}};
  f.x_ticks = {-180, -120, -60, 0, 60, 120, 180};
  int color = 1;
  for (const auto& c : json_array_or_empty(doc, "curves")) {
    const bool fitted = c.value("fitted", false);
    f.series.push_back({.label = json_string_or_empty(c, "label"),
                        .x = json_numbers(c, "dihedral_deg"),
                        .y = json_numbers(c, "j_hz"),
                        .color = fitted ? 0 : color++,
                        .dashed = !fitted});
  }
  Series points{.label = "measured ± sigma", .style = Series::Style::Points, .color = 5};
  for (const auto& p : doc.at("data")) {
    const double j = json_number_or_nan(p, "j_hz"), s = json_number_or_nan(p, "sigma_hz");
    points.x.push_back(json_number_or_nan(p, "dihedral_deg"));
    points.y.push_back(j);
    points.error_low.push_back(j - s);
    points.error_high.push_back(j + s);
  }
  f.series.push_back(std::move(points));
  f.footnote = fmt::format(
      "Solid: this calibration ({} form, offset {:g} deg, {} loss). Dashed: published sets, not "
      "refitted.",
      json_string_or_empty(doc, "form"), json_number_or_nan(doc, "offset_deg"), json_string_or_empty(doc, "loss"));
  return {"calibration-curves",
          "The (J, dihedral) points with their sigma, the fitted curve and the published curves for the same coupling.",
          f, std::nullopt};
}

PageFigure residuals_figure(const Json& doc) {
  Figure f;
  f.title = "Residuals of the calibration";
  f.x_label = fmt::format("dihedral {} (deg)", json_string_or_empty(doc, "angle_name"));
  f.y_label = "J obs - J fitted (Hz)";
  f.x_range = {{-180.0, 180.0}};
  f.x_ticks = {-180, -120, -60, 0, 60, 120, 180};
  Series r{.label = "residual ± sigma", .style = Series::Style::Points, .color = 5};
  for (const auto& p : doc.at("data")) {
    const double d = json_number_or_nan(p, "j_hz") - json_number_or_nan(p, "fitted_hz"),
                 s = json_number_or_nan(p, "sigma_hz");
    r.x.push_back(json_number_or_nan(p, "dihedral_deg"));
    r.y.push_back(d);
    r.error_low.push_back(d - s);
    r.error_high.push_back(d + s);
  }
  f.series.push_back(std::move(r));
  const double rmsd = json_number_or_nan(doc.at("statistics"), "rmsd_hz");
  f.bands.push_back({.vertical = false, .from = -rmsd, .to = rmsd, .label = "± RMSD", .color = 7});
  f.footnote =
      "A pattern in the residuals (a run of one sign over an angle range) means the form does not fit the data.";
  return {"calibration-residuals", "Residuals of the fitted curve against the dihedral angle.", f, std::nullopt};
}

}  // namespace

ResultPage calibration_page(const Json& doc) {
  ResultPage page;
  page.figures.push_back(curves_figure(doc));
  page.figures.push_back(residuals_figure(doc));
  const Json& stats = doc.at("statistics");
  const Json& boot = doc.at("bootstrap");

  HtmlDocument html = result_document(doc);
  html.open_section("summary", "Summary");
  html.paragraph(fmt::format("{} form fitted to {} points from {} ({} loss): RMSD {:.2f} Hz, reduced chi² {}.",
                             json_string_or_empty(doc, "form"), doc.at("n").get<int>(),
                             json_string_or_empty(doc, "input"), json_string_or_empty(doc, "loss"),
                             json_number_or_nan(stats, "rmsd_hz"),
                             fixed_or_dash(json_number_or_nan(stats, "reduced_chi2"), 2)));
  if (!json_string_or_empty(doc, "written").empty())
    html.paragraph("Saved as a parameter set: " + json_string_or_empty(doc, "written") + ".");
  html.caution("Calibrations extrapolate badly",
               "Coefficients are only as good as the angle range the points cover and the trust in their dihedral "
               "angles; compare with the published sets below before you use the new set.");
  html.close_section();

  html.open_section("coefficients", "Fitted coefficients");
  PageTable c{
      "calibration-coefficients.csv",
      fmt::format("Coefficients (Hz) with the covariance sd and the 95 % bootstrap interval ({} resamples, seed {})",
                  boot.value("samples", 0), boot.value("seed", 0)),
      {"coefficient", "value", "sd (covariance)", "bootstrap 2.5 %", "bootstrap 97.5 %"},
      {}};
  for (const auto& k : doc.at("coefficients"))
    c.rows.push_back({json_string_or_empty(k, "name"), fixed_or_dash(json_number_or_nan(k, "value"), 3),
                      fixed_or_dash(json_number_or_nan(k, "sd"), 3),
                      fixed_or_dash(json_number_or_nan(k, "bootstrap_low"), 3),
                      fixed_or_dash(json_number_or_nan(k, "bootstrap_high"), 3)});
  page.add_table(html, c);
  page.add_figure(html, "calibration-curves");
  page.add_figure(html, "calibration-residuals");
  html.close_section();

  html.open_section("comparison", "Comparison with published sets");
  html.paragraph(
      "Every set judged on the same points. Published sets are not fitted here (k = 0), so their reduced "
      "chi² is chi²/n; AIC = chi² + 2k and BIC = chi² + k ln n, lower is better.");
  PageTable t{"calibration-comparison.csv",
              "The calibration and the published sets on the same data",
              {"set", "k", "RMSD / Hz", "reduced chi²", "AIC", "BIC", "source"},
              {}};
  t.rows.push_back({"this calibration", fmt::format("{}", stats.value("k", 0)),
                    fixed_or_dash(json_number_or_nan(stats, "rmsd_hz"), 3),
                    fixed_or_dash(json_number_or_nan(stats, "reduced_chi2"), 3),
                    fixed_or_dash(json_number_or_nan(stats, "aic"), 1),
                    fixed_or_dash(json_number_or_nan(stats, "bic"), 1), json_string_or_empty(doc, "input")});
  for (const auto& s : json_array_or_empty(doc, "comparison"))
    t.rows.push_back({json_string_or_empty(s, "set"), "0", fixed_or_dash(json_number_or_nan(s, "rmsd_hz"), 3),
                      fixed_or_dash(json_number_or_nan(s, "reduced_chi2"), 3),
                      fixed_or_dash(json_number_or_nan(s, "aic"), 1), fixed_or_dash(json_number_or_nan(s, "bic"), 1),
                      json_string_or_empty(s, "citation")});
  page.add_table(html, t);
  html.close_section();

  add_provenance(html, doc, "calibration.json");
  page.html = html.render();
  return page;
}

}  // namespace vicinal::report
