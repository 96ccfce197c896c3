#include "report/configuration_section.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace vicinal::report {

namespace {

// (|J_obs| - J_pred) / sqrt(sigma^2 + tolerance^2): the unit the scores use.
double deviation(const Json& measured, const Json& predicted) {
  const double s = json_number_or_nan(measured, "sigma_hz"), t = json_number_or_nan(predicted, "tolerance_hz");
  return (std::fabs(json_number_or_nan(measured, "j_hz")) - json_number_or_nan(predicted, "j_hz")) /
         std::sqrt(s * s + t * t);
}

// "E-H3" for a single rotamer, "E-H3 + E-C4" for a pair.
std::string short_name(const Json& doc, const Json& candidate) {
  std::string out;
  for (const auto& m : json_array_or_empty(candidate, "members"))
    out += (out.empty() ? "" : " + ") +
           json_string_or_empty(doc.at("arrangements").at(m.get<std::size_t>()), "short_name");
  return out;
}

PageFigure deviations_figure(const Json& doc) {
  Figure f;
  f.title = "How far each coupling lies from each arrangement";
  f.x_label = "staggered arrangement (E = erythro, T = threo; the atom anti to H2)";
  f.y_label = "(|J obs| - J pred) / s";
  const Json& measured = doc.at("measured");
  const Json& arrangements = doc.at("arrangements");
  for (std::size_t i = 0; i < arrangements.size(); ++i) {
    f.x_ticks.push_back(static_cast<double>(i + 1));
    f.x_tick_labels.push_back(json_string_or_empty(arrangements[i], "short_name"));
  }
  for (std::size_t k = 0; k < measured.size(); ++k) {
    Series s{
        .label = json_string_or_empty(measured[k], "name"), .style = Series::Style::Bars, .color = static_cast<int>(k)};
    for (std::size_t i = 0; i < arrangements.size(); ++i) {
      s.x.push_back(static_cast<double>(i + 1));
      s.y.push_back(deviation(measured[k], arrangements[i].at("couplings").at(k)));
    }
    f.series.push_back(std::move(s));
  }
  f.bands.push_back({.vertical = false, .from = -2, .to = 2, .label = "within 2 s", .color = 7});
  f.footnote =
      "s = sqrt(sigma² + tolerance²): the measurement's sigma and the prediction's tolerance (a Karplus set's "
      "rms, at least 1 Hz, or half the width of a small/large category). An arrangement is ruled out by "
      "any bar far outside the band.";
  return {"deviations",
          "Deviation of every measured coupling from the prediction of each staggered arrangement: the arrangement "
          "that fits has all its bars inside the band.",
          f, std::nullopt};
}

PageFigure scores_figure(const Json& doc, std::size_t shown) {
  Figure f;
  f.title = "Candidates ranked by their score";
  f.x_label = "candidate, best first (E = erythro, T = threo; the atom anti to H2; + = pair in exchange)";
  f.y_label = "score (with the pair penalty)";
  const Json& candidates = doc.at("candidates");
  // One series, so that every bar stands on its own tick; the labels carry E or T.
  Series scores{.label = "score", .style = Series::Style::Bars, .color = 0};
  for (std::size_t i = 0; i < shown; ++i) {
    const double x = static_cast<double>(i + 1);
    f.x_ticks.push_back(x);
    f.x_tick_labels.push_back(short_name(doc, candidates[i]));
    scores.x.push_back(x);
    scores.y.push_back(json_number_or_nan(candidates[i], "ranked_score"));
  }
  // Markers on the bars, so that a best score near zero still shows.
  Series tops{.label = "", .x = scores.x, .y = scores.y, .style = Series::Style::Points, .color = 5};
  f.series = {scores, tops};
  const double best = json_number_or_nan(candidates.at(0), "ranked_score");
  const double margin = json_number_or_nan(doc, "equally_good_margin");
  f.bands.push_back({.vertical = false, .from = -INFINITY, .to = best + margin, .label = "equally good", .color = 7});
  f.footnote = fmt::format(
      "Score: sum of squared deviations (previous figure); a pair in exchange pays {:g} for its "
      "fitted fraction. Candidates below the band's edge (best + {:g}) explain the data equally well.",
      json_number_or_nan(doc, "pair_penalty"), margin);
  return {"scores",
          "The best candidates and their scores. When candidates of both configurations (E and T) fall inside the "
          "shaded band the couplings do not decide the configuration.",
          f, std::nullopt};
}

}  // namespace

ResultPage configuration_page(const Json& doc) {
  ResultPage page;
  const Json& measured = doc.at("measured");
  const Json& arrangements = doc.at("arrangements");
  const Json& candidates = doc.at("candidates");
  const std::size_t shown = std::min<std::size_t>(candidates.size(), 10);
  page.figures.push_back(deviations_figure(doc));
  if (shown > 0) page.figures.push_back(scores_figure(doc, shown));

  HtmlDocument html = result_document(doc);
  html.open_section("summary", "Summary");
  html.paragraph(json_string_or_empty(doc, "statement"));
  html.definitions({{"verdict", json_string_or_empty(doc, "verdict")},
                    {"fragment", "C1-C2(H2)(X2 = O)-C3(H3)(X3)-C4, X3 = " + json_string_or_empty(doc, "x3")},
                    {"couplings", json_string_or_empty(doc, "couplings_file")},
                    {"categories", json_string_or_empty(doc, "rules_source")}});
  html.caution("Confirm independently",
               "The analysis compares the couplings with idealised staggered rotamers and coupling categories. A "
               "configuration assigned this way should be confirmed by NOE/ROE data or a synthesis of known outcome.");
  html.close_section();

  html.open_section("arrangements", "Staggered arrangements and their couplings");
  PageTable m{"measured-couplings.csv", "Measured couplings", {"coupling", "J / Hz", "sigma / Hz"}, {}};
  for (const auto& c : measured)
    m.rows.push_back({json_string_or_empty(c, "name"), fixed_or_dash(json_number_or_nan(c, "j_hz"), 1),
                      fixed_or_dash(json_number_or_nan(c, "sigma_hz"), 1)});
  page.add_table(html, m);
  PageTable p{"arrangement-couplings.csv",
              "Predicted couplings of each arrangement (Hz; L = large, s = small category; x = more than 2 s from the "
              "measurement)",
              {"arrangement", "short"},
              {}};
  for (const auto& c : measured) p.header.push_back(json_string_or_empty(c, "name"));
  for (const auto& a : arrangements) {
    std::vector<std::string> row{json_string_or_empty(a, "name"), json_string_or_empty(a, "short_name")};
    for (std::size_t k = 0; k < measured.size(); ++k) {
      const Json& pred = a.at("couplings").at(k);
      row.push_back(fmt::format("{} {:.1f} ± {:.1f}{}", json_string_or_empty(pred, "category") == "large" ? "L" : "s",
                                json_number_or_nan(pred, "j_hz"), json_number_or_nan(pred, "tolerance_hz"),
                                std::fabs(deviation(measured[k], pred)) > 2 ? " x" : ""));
    }
    p.rows.push_back(std::move(row));
  }
  page.add_table(html, p);
  page.add_figure(html, "deviations");
  html.close_section();

  html.open_section("candidates", "Candidates");
  PageTable c{"candidates.csv",
              "Single rotamers and pairs in fast exchange, best first",
              {"rank", "candidate", "configuration", "fraction of first", "score", "with penalty"},
              {}};
  for (std::size_t i = 0; i < candidates.size(); ++i) {
    const Json& cand = candidates[i];
    c.rows.push_back({fmt::format("{}", i + 1), json_string_or_empty(cand, "name"),
                      json_string_or_empty(cand, "configuration"),
                      fixed_or_dash(json_number_or_nan(cand, "fraction_first"), 2),
                      fixed_or_dash(json_number_or_nan(cand, "score"), 2),
                      fixed_or_dash(json_number_or_nan(cand, "ranked_score"), 2)});
  }
  page.add_table(html, c);
  page.add_figure(html, "scores");
  html.close_section();

  add_provenance(html, doc, "configuration.json");
  page.html = html.render();
  return page;
}

}  // namespace vicinal::report
