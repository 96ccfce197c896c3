#include "report/pucker_section.h"

#include <fmt/format.h>

#include <cmath>

namespace vicinal::report {

namespace {

const char* const kParameters[] = {"P_N", "nu_max_N", "P_S", "nu_max_S", "x_S"};

bool is_angle(const std::string& name) { return name != "x_S"; }

const Json& parameter(const Json& doc, const char* name) { return doc.at("parameters").at(name); }

// "162.3 ± 4.1 deg" or "0.71 ± 0.05" (no ± when the value was fixed).
std::string value_text(const Json& doc, const char* name) {
  const Json& p = parameter(doc, name);
  const double v = json_number_or_nan(p, "value"), sd = json_number_or_nan(p, "sd");
  const bool angle = is_angle(name);
  std::string text = fixed_or_dash(v, angle ? 1 : 2);
  if (std::isfinite(sd)) text += " ± " + fixed_or_dash(sd, angle ? 1 : 2);
  if (angle) text += " deg";
  if (json_string_or_empty(p, "status") == "fixed") text += " (fixed)";
  return text;
}

PageFigure map_figure(const Json& doc) {
  const HeatMap h = pucker_chi2_heatmap(doc);
  return {"chi2-map",
          "chi² of the two-state fit over a grid of (P_N, P_S), the other free parameters refitted at every point: "
          "a narrow valley means the phases are well defined, a long one that they trade off.",
          std::nullopt, h};
}

PageFigure couplings_figure(const Json& doc) {
  Figure f;
  f.title = "Measured and back-calculated ring couplings";
  f.x_label = "coupling";
  f.y_label = "3J(H,H) (Hz)";
  Series obs{.label = "measured ± sigma", .style = Series::Style::Bars, .color = 0};
  Series north{.label = "North conformer", .style = Series::Style::Bars, .color = 1};
  Series south{.label = "South conformer", .style = Series::Style::Bars, .color = 2};
  Series calc{.label = "two-state mixture", .style = Series::Style::Bars, .color = 5};
  double x = 0;
  for (const auto& c : doc.at("couplings")) {
    x += 1;
    f.x_ticks.push_back(x);
    f.x_tick_labels.push_back(json_string_or_empty(c, "name"));
    const double j = json_number_or_nan(c, "j_hz"), s = json_number_or_nan(c, "sigma_hz");
    obs.x.push_back(x), obs.y.push_back(j), obs.error_low.push_back(j - s), obs.error_high.push_back(j + s);
    north.x.push_back(x), north.y.push_back(json_number_or_nan(c, "j_north_hz"));
    south.x.push_back(x), south.y.push_back(json_number_or_nan(c, "j_south_hz"));
    calc.x.push_back(x), calc.y.push_back(json_number_or_nan(c, "j_calc_hz"));
  }
  f.series = {obs, north, south, calc};
  f.footnote = fmt::format("Mixture: (1 - x_S) J(North) + x_S J(South) with x_S = {}.", value_text(doc, "x_S"));
  return {"couplings",
          "Each measured ring coupling beside the pure North and South conformers and their fitted mixture.", f,
          std::nullopt};
}

PageFigure cycle_figure(const Json& doc) {
  const Json& cycle = doc.at("cycle");
  Figure f;
  f.title = "Ring couplings around the pseudorotation cycle";
  f.x_label = "phase angle P (deg)";
  f.y_label = "3J(H,H) (Hz)";
  f.x_range = {{-90.0, 270.0}};
  f.x_ticks = {-90, -36, 0, 18, 90, 162, 180, 270};
  const auto phase = json_numbers(cycle, "phase_deg");
  int color = 0;
  for (const auto& c : json_array_or_empty(cycle, "couplings"))
    f.series.push_back(
        {.label = json_string_or_empty(c, "name"), .x = phase, .y = json_numbers(c, "j_hz"), .color = color++});
  for (const char* name : {"P_N", "P_S"}) {
    const Json& p = parameter(doc, name);
    const double v = json_number_or_nan(p, "value"), sd = json_number_or_nan(p, "sd");
    const double half = std::isfinite(sd) && sd > 1 ? sd : 1;
    f.bands.push_back({.vertical = true, .from = v - half, .to = v + half, .label = name, .color = 7});
  }
  f.footnote = fmt::format(
      "Curves at nu_max_N = {} for P < 90 and nu_max_S = {} for P > 90. Shaded: the fitted "
      "P_N and P_S ± sd.",
      value_text(doc, "nu_max_N"), value_text(doc, "nu_max_S"));
  return {"cycle",
          "The couplings the model gives for every phase P (at the fitted amplitudes), with the fitted North and South "
          "phases shaded: where the curves are steep the phase is well determined.",
          f, std::nullopt};
}

}  // namespace

HeatMap pucker_chi2_heatmap(const Json& doc) {
  const Json& map = doc.at("map");
  HeatMap h;
  h.title = fmt::format("chi² over (P_N, P_S), {} ring", json_string_or_empty(doc, "ring"));
  h.x_label = "P_N / deg";
  h.y_label = "P_S / deg";
  h.value_label = "chi²";
  h.x = json_numbers(map, "phase_n_deg");
  h.y = json_numbers(map, "phase_s_deg");
  h.value = json_numbers(map, "chi2");
  h.log_scale = true;
  const double chi2 = json_number_or_nan(doc, "chi2");
  // Delta chi^2 = 2.30 and 6.18 bound the 68.3 % and 95.4 % joint regions of two
  // parameters (Press et al., Numerical Recipes, section 15.6; from memory).
  h.outlines = {chi2 + 2.30, chi2 + 6.18};
  h.points.push_back({json_number_or_nan(parameter(doc, "P_N"), "value"),
                      json_number_or_nan(parameter(doc, "P_S"), "value"), "best fit"});
  h.footnote =
      "White outlines: chi²_min + 2.30 and + 6.18 (68 % and 95 % joint regions). " + json_string_or_empty(map, "note");
  return h;
}

ResultPage pucker_page(const Json& doc) {
  ResultPage page;
  if (doc.contains("map")) page.figures.push_back(map_figure(doc));
  page.figures.push_back(couplings_figure(doc));
  if (doc.contains("cycle")) page.figures.push_back(cycle_figure(doc));

  HtmlDocument html = result_document(doc);
  html.open_section("summary", "Summary");
  const double x_s = json_number_or_nan(parameter(doc, "x_S"), "value");
  html.paragraph(fmt::format(
      "{} ({} couplings from {}): North P_N = {} ({}), South P_S = {} ({}); mole fraction of "
      "South x_S = {}, so {:.0f} % South.",
      json_string_or_empty(doc, "ring_title"), doc.at("n").get<int>(), json_string_or_empty(doc, "couplings_file"),
      value_text(doc, "P_N"), json_string_or_empty(parameter(doc, "P_N"), "nearest_envelope"), value_text(doc, "P_S"),
      json_string_or_empty(parameter(doc, "P_S"), "nearest_envelope"), value_text(doc, "x_S"), 100 * x_s));
  const int dof = doc.at("degrees_of_freedom").get<int>();
  html.paragraph(fmt::format("chi² = {:.2f} with {} degrees of freedom{}. Uncertainties: {}.",
                             json_number_or_nan(doc, "chi2"), dof,
                             dof > 0 ? fmt::format(" (reduced chi² {:.2f})", json_number_or_nan(doc, "reduced_chi2"))
                                     : std::string(" (as many free parameters as couplings: the fit is exact by "
                                                   "construction and chi² tests nothing)"),
                             json_string_or_empty(doc, "uncertainty_from")));
  std::string constraints;
  for (const auto& c : json_array_or_empty(doc, "constraints"))
    constraints += (constraints.empty() ? "" : ", ") + c.get<std::string>();
  html.paragraph("Constraints: " + (constraints.empty() ? std::string("none") : constraints) + ".");
  html.caution("A model, not a measurement",
               "The two-state model assumes a fast North/South equilibrium, ideal pseudorotation and the ring's "
               "phi(H,H) relations; few couplings determine few parameters. Check the chi² map before you quote P.");
  html.close_section();

  html.open_section("parameters", "Fitted pseudorotation parameters");
  PageTable t{
      "pucker-parameters.csv", "Two-state parameters", {"parameter", "value", "sd", "status", "nearest envelope"}, {}};
  for (const char* name : kParameters) {
    const Json& p = parameter(doc, name);
    const int digits = is_angle(name) ? 1 : 3;
    t.rows.push_back(
        {std::string(name) + (is_angle(name) ? " / deg" : ""), fixed_or_dash(json_number_or_nan(p, "value"), digits),
         fixed_or_dash(json_number_or_nan(p, "sd"), digits), json_string_or_empty(p, "status"),
         json_string_or_empty(p, "nearest_envelope").empty() ? "-" : json_string_or_empty(p, "nearest_envelope")});
  }
  page.add_table(html, t);
  page.add_figure(html, "chi2-map");
  html.close_section();

  html.open_section("ring-couplings", "Measured and back-calculated couplings");
  PageTable c{"pucker-couplings.csv",
              "Ring couplings (Hz)",
              {"coupling", "J obs", "sigma", "J North", "J South", "J calc", "obs - calc", "Karplus set"},
              {}};
  for (const auto& r : doc.at("couplings"))
    c.rows.push_back(
        {json_string_or_empty(r, "name"), fixed_or_dash(json_number_or_nan(r, "j_hz"), 2),
         fixed_or_dash(json_number_or_nan(r, "sigma_hz"), 2), fixed_or_dash(json_number_or_nan(r, "j_north_hz"), 2),
         fixed_or_dash(json_number_or_nan(r, "j_south_hz"), 2), fixed_or_dash(json_number_or_nan(r, "j_calc_hz"), 2),
         fmt::format("{:+.2f}", json_number_or_nan(r, "j_hz") - json_number_or_nan(r, "j_calc_hz")),
         json_string_or_empty(r, "set")});
  page.add_table(html, c);
  page.add_figure(html, "couplings");
  page.add_figure(html, "cycle");
  html.paragraph("Relations between the H-H and endocyclic torsions: " + json_string_or_empty(doc, "relations_source"));
  html.close_section();

  add_provenance(html, doc, "pucker.json");
  page.html = html.render();
  return page;
}

}  // namespace vicinal::report
