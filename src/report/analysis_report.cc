#include "report/analysis_report.h"

#include <fmt/format.h>
#include <openbabel/mol.h>
#include <openbabel/generic.h>
#include <openbabel/obconversion.h>

#include <cmath>
#include <limits>
#include <map>
#include <sstream>

#include "core/atomic_file.h"
#include "core/csv.h"
#include "report/depiction.h"
#include "report/html.h"

namespace vicinal::report {

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Optional members read forgivingly: absent or null gives NaN / "".
double num(const Json& j, const char* key) {
  const auto it = j.find(key);
  return it != j.end() && it->is_number() ? it->get<double>() : kNaN;
}
std::string str(const Json& j, const char* key) {
  const auto it = j.find(key);
  return it != j.end() && it->is_string() ? it->get<std::string>() : std::string();
}
const Json& member(const Json& j, const char* key) {
  static const Json empty_array = Json::array();
  const auto it = j.find(key);
  return it != j.end() && !it->is_null() ? *it : empty_array;
}

std::string fixed(double v, int digits) { return std::isfinite(v) ? fmt::format("{:.{}f}", v, digits) : "-"; }
std::string percent(double v) { return std::isfinite(v) ? fmt::format("{:.0f}%", 100 * v) : "-"; }
std::string percent_range(const Json& pair) {
  if (!pair.is_array() || pair.size() != 2 || !pair[0].is_number()) return "-";
  return fmt::format("{:.0f}-{:.0f}%", 100 * pair[0].get<double>(), 100 * pair[1].get<double>());
}

// "H-2,H-3" -> "H-2-H-3" and anything unsafe for a file name dropped.
std::string slug(const std::string& text) {
  std::string out;
  for (char c : text) {
    if (std::isalnum(static_cast<unsigned char>(c))) out += c;
    else if (!out.empty() && out.back() != '-') out += '-';
  }
  while (!out.empty() && out.back() == '-') out.pop_back();
  return out;
}

std::string intervals_text(const Json& coupling) {
  if (!str(coupling, "angle_error").empty()) return "none (" + str(coupling, "angle_error") + ")";
  std::string out;
  for (const auto& iv : member(coupling, "allowed_deg")) {
    if (!out.empty()) out += ", ";
    out += fmt::format("{:.0f} to {:.0f}", iv.at("from").get<double>(), iv.at("to").get<double>());
  }
  return out.empty() ? "-" : out;
}

const Json& favoured_candidate(const Json& doc) {
  const std::string name = str(doc.at("ranking"), "favoured");
  for (const auto& c : doc.at("candidates"))
    if (str(c, "name") == name) return c;
  return doc.at("candidates").at(0);
}

std::string conditions_line(const Json& k) {
  std::vector<std::string> parts;
  if (!str(k, "solvent").empty()) parts.push_back(str(k, "solvent"));
  if (std::isfinite(num(k, "temperature_k"))) parts.push_back(fmt::format("{:g} K", num(k, "temperature_k")));
  if (std::isfinite(num(k, "field_mhz"))) parts.push_back(fmt::format("{:g} MHz", num(k, "field_mhz")));
  std::string out;
  for (const auto& p : parts) out += (out.empty() ? "" : ", ") + p;
  return out;
}

// ---------------------------------------------------------------- figures

Figure karplus_figure(const Json& doc, const Json& c) {
  Figure f;
  const double j = num(c, "j_hz"), tol = num(c, "tolerance_hz");
  f.title = fmt::format("{}: J = {:.1f} ± {:.1f} Hz", str(c, "nuclei"), j, num(c, "sigma_hz"));
  f.x_label = fmt::format("dihedral {} (deg)", str(member(c, "curve"), "atoms"));
  f.y_label = "3J(H,H) (Hz)";
  f.x_range = {{-180.0, 180.0}};
  f.x_ticks = {-180, -120, -60, 0, 60, 120, 180};
  f.width_pt = 520;
  f.height_pt = 300;
  const Json& curve = member(c, "curve");
  f.series.push_back({.label = fmt::format("curve ({})", str(curve, "of")),
                      .x = member(curve, "dihedral_deg").get<std::vector<double>>(),
                      .y = member(curve, "j_hz").get<std::vector<double>>(),
                      .color = 0});
  if (std::isfinite(tol)) f.bands.push_back({.vertical = false, .from = j - tol, .to = j + tol, .label = "measured", .color = 1});
  for (const auto& iv : member(c, "allowed_deg"))
    f.bands.push_back({.vertical = true, .from = iv.at("from").get<double>(), .to = iv.at("to").get<double>(),
                       .label = "", .color = 2});
  // Every conformer of each candidate at its own dihedral and coupling.
  const std::size_t index = c.value("index", 0);
  int color = 4;
  for (const auto& cand : doc.at("candidates")) {
    Series s{.label = str(cand, "name") + " conformers", .style = Series::Style::Points, .color = color++};
    for (const auto& conf : member(cand, "conformers")) {
      const Json& d = member(conf, "dihedral_deg");
      const Json& jj = member(conf, "j_hz");
      if (index < d.size() && index < jj.size()) {
        s.x.push_back(d[index].get<double>());
        s.y.push_back(jj[index].get<double>());
      }
    }
    f.series.push_back(std::move(s));
  }
  f.footnote = "Curve: " + str(c, "set_citation") + ". Shaded: measured J ± " + fixed(tol, 2) +
               " Hz (2 x sqrt(sigma² + rms²)) and the dihedral angles it allows.";
  return f;
}

// One bar series per candidate: its value of `key` for each coupling, in order.
void add_candidate_bars(Figure& f, const Json& doc, const char* key) {
  int color = 4;
  for (const auto& cand : doc.at("candidates")) {
    Series s{.label = str(cand, "name"), .style = Series::Style::Bars, .color = color++};
    const Json& rows = member(cand, "couplings");
    for (std::size_t r = 0; r < rows.size(); ++r) {
      s.x.push_back(static_cast<double>(r + 1));
      s.y.push_back(num(rows[r], key));
    }
    f.series.push_back(std::move(s));
  }
}

Figure couplings_figure(const Json& doc) {
  Figure f;
  f.title = "Observed and back-calculated couplings";
  f.y_label = "3J (Hz)";
  f.x_label = "coupling";
  const Json& couplings = doc.at("couplings");
  Series obs{.label = "observed ± sigma", .style = Series::Style::Bars, .color = 0};
  for (std::size_t r = 0; r < couplings.size(); ++r) {
    f.x_ticks.push_back(static_cast<double>(r + 1));
    f.x_tick_labels.push_back(str(couplings[r], "nuclei"));
    obs.x.push_back(static_cast<double>(r + 1));
    const double j = num(couplings[r], "j_hz"), s = num(couplings[r], "sigma_hz");
    obs.y.push_back(j);
    obs.error_low.push_back(j - s);
    obs.error_high.push_back(j + s);
  }
  f.series.push_back(std::move(obs));
  add_candidate_bars(f, doc, "predicted_hz");
  f.footnote = "Back-calculated: ensemble averages at the populations behind each candidate's score.";
  return f;
}

Figure contributions_figure(const Json& doc) {
  Figure f;
  f.title = "Where the candidates differ: misfit per coupling";
  f.y_label = "contribution to the score";
  f.x_label = "coupling";
  const Json& couplings = doc.at("couplings");
  for (std::size_t r = 0; r < couplings.size(); ++r) {
    f.x_ticks.push_back(static_cast<double>(r + 1));
    f.x_tick_labels.push_back(str(couplings[r], "nuclei"));
  }
  add_candidate_bars(f, doc, "contribution");
  f.footnote = "Each bar is ((J obs - J calc) / s)² for that coupling; lower is better.";
  return f;
}

Figure populations_figure(const Json& cand) {
  Figure f;
  f.title = "Populations of " + str(cand, "name");
  f.x_label = "conformer (by MMFF94 energy)";
  f.y_label = "population";
  f.y_range = {{0.0, 1.0}};
  Series boltz{.label = "Boltzmann (MMFF94)", .style = Series::Style::Bars, .color = 7};
  Series tied{.label = "energy-tied fit (score)", .style = Series::Style::Bars, .color = 4};
  Series free{.label = "free fit, 95% Monte Carlo", .style = Series::Style::Bars, .color = 5};
  double x = 0;
  for (const auto& conf : member(cand, "conformers")) {
    x += 1;
    f.x_ticks.push_back(x);
    f.x_tick_labels.push_back(fmt::format("{:.0f}", x));
    boltz.x.push_back(x);
    boltz.y.push_back(num(conf, "boltzmann"));
    tied.x.push_back(x);
    tied.y.push_back(num(conf, "population"));
    free.x.push_back(x);
    free.y.push_back(num(conf, "free_population"));
    const Json& ci = member(conf, "ci95");
    free.error_low.push_back(ci.size() == 2 ? ci[0].get<double>() : kNaN);
    free.error_high.push_back(ci.size() == 2 ? ci[1].get<double>() : kNaN);
  }
  if (f.x_ticks.size() > 16) f.x_tick_labels.clear(), f.x_ticks.clear();
  f.series = {boltz, tied, free};
  f.footnote = "Free fit: populations fitted to the couplings alone; with more conformers than couplings they are "
               "not unique (see the ranges in the table).";
  return f;
}

// Observed peaks as sticks and the fitted first-order multiplet drawn with
// Lorentzian lines, on a chemical-shift axis.
Figure multiplet_figure(const Json& m) {
  Figure f;
  f.title = fmt::format("{}: {}", str(m, "proton"), str(m, "notation"));
  f.x_label = "chemical shift (ppm)";
  f.y_label = "intensity";
  f.reverse_x = true;
  f.height_pt = 280;
  const double mhz = num(m, "field_mhz");
  Series peaks{.label = "observed peaks", .style = Series::Style::Sticks, .color = 0};
  double lo = INFINITY, hi = -INFINITY, top = 0;
  for (const auto& p : member(m, "peaks")) {
    peaks.x.push_back(num(p, "ppm"));
    peaks.y.push_back(num(p, "intensity"));
    lo = std::min(lo, num(p, "hz"));
    hi = std::max(hi, num(p, "hz"));
    top = std::max(top, num(p, "intensity"));
  }
  Series fit{.label = "first-order fit", .color = 5};
  const double width_hz = 0.6, margin = 6;
  const Json& lines = member(m, "tree_lines");
  double line_top = 0;
  for (const auto& l : lines) line_top = std::max(line_top, num(l, "intensity"));
  for (double hz = lo - margin; hz <= hi + margin; hz += 0.05) {
    double y = 0;
    for (const auto& l : lines) {
      const double d = (hz - num(l, "hz")) / (width_hz / 2);
      y += num(l, "intensity") / (1 + d * d);
    }
    fit.x.push_back(hz / mhz);
    fit.y.push_back(line_top > 0 ? y * top / line_top : y);
  }
  f.series = {fit, peaks};
  f.footnote = fmt::format("Peaks at {:g} MHz. Fit lines drawn {:g} Hz wide, scaled to the tallest observed peak.", mhz,
                           width_hz);
  return f;
}

// ---------------------------------------------------------------- tables

std::vector<std::string> candidate_names(const Json& doc) {
  std::vector<std::string> out;
  for (const auto& c : doc.at("candidates")) out.push_back(str(c, "name"));
  return out;
}

struct Table {
  std::string file, caption;
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
};

Table measured_table(const Json& doc) {
  Table t{"measured-couplings.csv", "Measured couplings",
          {"coupling", "J / Hz", "sigma / Hz", "note"}, {}};
  for (const auto& c : doc.at("couplings"))
    t.rows.push_back({str(c, "nuclei"), fixed(num(c, "j_hz"), 1), fixed(num(c, "sigma_hz"), 1), str(c, "note")});
  return t;
}

Table angles_table(const Json& doc) {
  Table t{"allowed-angles.csv", "Dihedral angles allowed by each coupling",
          {"coupling", "Karplus set", "J ± tolerance / Hz", "allowed dihedral / deg", "exact solutions / deg"}, {}};
  for (const auto& c : doc.at("couplings")) {
    std::string exact;
    for (const auto& e : member(c, "exact_deg")) exact += (exact.empty() ? "" : ", ") + fmt::format("{:.0f}", e.get<double>());
    t.rows.push_back({str(c, "nuclei"), str(c, "set"),
                      fmt::format("{:.1f} ± {:.1f}", num(c, "j_hz"), num(c, "tolerance_hz")), intervals_text(c),
                      exact.empty() ? "-" : exact});
  }
  return t;
}

Table ranking_table(const Json& doc) {
  Table t{"ranking.csv", "Candidates ranked by the couplings",
          {"candidate", "conformers", "chi2 free", "chi2 Boltzmann", "energy penalty", "score", "probability"}, {}};
  for (const auto& c : doc.at("candidates"))
    t.rows.push_back({str(c, "name"), fmt::format("{}", member(c, "conformers").size()), fixed(num(c, "chi2_free"), 2),
                      fixed(num(c, "chi2_boltzmann"), 2), fixed(num(c, "prior_penalty"), 2), fixed(num(c, "score"), 2),
                      fixed(num(c, "probability"), 3)});
  return t;
}

Table comparison_table(const Json& doc) {
  Table t{"couplings-observed-calculated.csv", "Observed and back-calculated couplings (Hz)", {"coupling", "observed"}, {}};
  for (const auto& name : candidate_names(doc)) {
    t.header.push_back(name + " calc");
    t.header.push_back(name + " misfit");
  }
  const Json& couplings = doc.at("couplings");
  for (std::size_t r = 0; r < couplings.size(); ++r) {
    std::vector<std::string> row{str(couplings[r], "nuclei"),
                                 fmt::format("{:.1f} ± {:.1f}", num(couplings[r], "j_hz"), num(couplings[r], "sigma_hz"))};
    for (const auto& cand : doc.at("candidates")) {
      const Json& rows = member(cand, "couplings");
      row.push_back(r < rows.size() ? fixed(num(rows[r], "predicted_hz"), 1) : "-");
      row.push_back(r < rows.size() ? fixed(num(rows[r], "contribution"), 2) : "-");
    }
    t.rows.push_back(row);
  }
  return t;
}

Table populations_table(const Json& cand) {
  Table t{"populations-" + slug(str(cand, "name")) + ".csv", "Conformer populations of " + str(cand, "name"),
          {"conformer", "E / kcal/mol", "Boltzmann", "energy-tied", "free fit", "95% MC", "allowed range",
           str(cand, "key_dihedral_name").empty() ? "key dihedral" : str(cand, "key_dihedral_name"), "side chain"},
          {}};
  for (const auto& conf : member(cand, "conformers"))
    t.rows.push_back({str(conf, "name"), fixed(num(conf, "energy_kcal_mol"), 2), percent(num(conf, "boltzmann")),
                      percent(num(conf, "population")), percent(num(conf, "free_population")),
                      percent_range(member(conf, "ci95")), percent_range(member(conf, "range")),
                      fixed(num(conf, "key_dihedral_deg"), 0), str(conf, "side_chain").empty() ? "-" : str(conf, "side_chain")});
  return t;
}

Table side_chain_table(const Json& doc) {
  Table t{"side-chain-rotamers.csv", "Side-chain rotamers (populations summed over conformers)", {"candidate", "rotamer"},
          {}};
  t.header.insert(t.header.end(), {"Boltzmann", "energy-tied", "free fit"});
  for (const auto& cand : doc.at("candidates"))
    for (const auto& r : member(cand, "side_chain"))
      t.rows.push_back({str(cand, "name"), str(r, "rotamer"), percent(num(r, "boltzmann")), percent(num(r, "population")),
                        percent(num(r, "free_population"))});
  return t;
}

Table peaks_table(const Json& m) {
  Table t{"multiplet-peaks.csv", "Peaks of " + str(m, "proton") + " and the fitted first-order lines",
          {"peak", "position / ppm", "position / Hz", "intensity", "fitted / Hz"}, {}};
  const Json& peaks = member(m, "peaks");
  for (std::size_t i = 0; i < peaks.size(); ++i)
    t.rows.push_back({fmt::format("{}", i + 1), fixed(num(peaks[i], "ppm"), 4), fixed(num(peaks[i], "hz"), 2),
                      fixed(num(peaks[i], "intensity"), 2), fixed(num(peaks[i], "fitted_hz"), 2)});
  return t;
}

Table sets_table(const Json& doc) {
  Table t{"karplus-sets.csv", "Karplus parameter sets used",
          {"set", "equation", "coefficients", "rms / Hz", "source"}, {}};
  for (const auto& s : doc.at("sets")) {
    std::string coeffs;
    for (const auto& [name, value] : member(s, "coefficients").items())
      coeffs += (coeffs.empty() ? "" : ", ") + fmt::format("{} = {:g}", name, value.get<double>());
    std::string source = str(s, "citation");
    if (!str(s, "table").empty()) source += "; " + str(s, "table");
    if (!str(s, "doi").empty()) source += "; doi:" + str(s, "doi");
    t.rows.push_back({str(s, "id"), str(s, "form"), coeffs, fixed(num(s, "rms_hz"), 2), source});
  }
  return t;
}

std::vector<Table> all_tables(const Json& doc) {
  std::vector<Table> out{measured_table(doc), angles_table(doc), ranking_table(doc), comparison_table(doc)};
  for (const auto& cand : doc.at("candidates")) out.push_back(populations_table(cand));
  out.push_back(side_chain_table(doc));
  if (doc.contains("multiplet")) out.push_back(peaks_table(doc.at("multiplet")));
  out.push_back(sets_table(doc));
  return out;
}

std::string csv_text(const Table& t) {
  std::string out;
  auto line = [&](const std::vector<std::string>& cells) {
    for (std::size_t i = 0; i < cells.size(); ++i) out += (i ? "," : "") + csv_escape(cells[i]);
    out += "\n";
  };
  line(t.header);
  for (const auto& r : t.rows) line(r);
  return out;
}

void add_table(HtmlDocument& html, const Table& t) { html.table(t.header, t.rows, t.caption); }

const NamedFigure* find_figure(const std::vector<NamedFigure>& figures, const std::string& name) {
  for (const auto& f : figures)
    if (f.name == name) return &f;
  return nullptr;
}

void add_figure(HtmlDocument& html, const std::vector<NamedFigure>& figures, const std::string& name) {
  if (const auto* f = find_figure(figures, name)) html.figure(figure_svg(f->figure), f->caption);
}

std::string depiction(const Json& compound) {
  OpenBabel::OBMol mol;
  OpenBabel::OBConversion conv;
  conv.SetInFormat("mol");
  if (!conv.ReadString(&mol, str(compound, "molfile")) || mol.NumAtoms() == 0) return {};
  if (compound.value("configuration_open", false)) {
    // The structure stands for the constitution only: no wedges from the
    // arbitrary configuration its 3D coordinates happen to have.
    mol.DeleteData(OpenBabel::OBGenericDataType::StereoData);
    mol.SetChiralityPerceived(true);
  }
  std::map<int, std::string> labels;
  for (const auto& [label, atom] : member(compound, "depict_labels").items()) labels[atom.get<int>()] = label;
  return depiction_svg(mol, labels, {.title = str(compound, "name"), .size_px = 360});
}

std::string json_error_text(const Json::exception& e) {
  std::string text = e.what();
  // nlohmann prefixes "[json.exception.type_error.302] "; the rest is the useful part.
  if (const auto close = text.find("] "); close != std::string::npos) text = text.substr(close + 2);
  return text;
}

}  // namespace

void check_analysis(const Json& doc, const std::string& source) {
  auto need = [&](const Json& j, const char* key, Json::value_t type, const std::string& path) -> const Json& {
    const auto it = j.find(key);
    const bool ok = it != j.end() && (it->type() == type || (type == Json::value_t::number_float && it->is_number()));
    if (!ok)
      throw Error(fmt::format("the analysis lacks '{}' or it has the wrong kind of value", path + key),
                  Location::field_in(source, path + key),
                  "give an analysis.json as `vicinal demo` writes it (format \"vicinal-analysis\")");
    return *it;
  };
  if (!doc.is_object() || str(doc, "format") != kAnalysisFormat)
    throw Error("not a vicinal analysis document", Location::field_in(source, "format"),
                fmt::format("an analysis file has \"format\": \"{}\" (written by `vicinal demo`)", kAnalysisFormat));
  if (doc.value("version", 0) != kAnalysisVersion)
    throw Error(fmt::format("analysis version {} is not one this program reads", doc.value("version", 0)),
                Location::field_in(source, "version"), fmt::format("this program reads version {}", kAnalysisVersion));
  using T = Json::value_t;
  need(doc, "title", T::string, "");
  const Json& compound = need(doc, "compound", T::object, "");
  need(compound, "name", T::string, "compound.");
  need(compound, "molfile", T::string, "compound.");
  need(doc, "conditions", T::object, "");
  const Json& couplings = need(doc, "couplings", T::array, "");
  if (couplings.empty())
    throw Error("the analysis lists no couplings", Location::field_in(source, "couplings"), "analyse at least one coupling");
  for (std::size_t r = 0; r < couplings.size(); ++r) {
    const std::string at = fmt::format("couplings[{}].", r);
    need(couplings[r], "nuclei", T::string, at);
    need(couplings[r], "j_hz", T::number_float, at);
    need(couplings[r], "sigma_hz", T::number_float, at);
  }
  need(doc, "sets", T::array, "");
  const Json& candidates = need(doc, "candidates", T::array, "");
  for (std::size_t c = 0; c < candidates.size(); ++c) {
    const std::string at = fmt::format("candidates[{}].", c);
    need(candidates[c], "name", T::string, at);
    need(candidates[c], "conformers", T::array, at);
    if (need(candidates[c], "couplings", T::array, at).size() != couplings.size())
      throw Error(fmt::format("candidate {} has {} couplings, the analysis {}", c + 1, candidates[c]["couplings"].size(),
                              couplings.size()),
                  Location::field_in(source, at + "couplings"), "every candidate lists the measured couplings in order");
  }
  need(doc, "ranking", T::object, "");
  need(doc, "command_line", T::string, "");
}

std::vector<NamedFigure> analysis_figures(const Json& doc) {
  std::vector<NamedFigure> out;
  const Json& couplings = doc.at("couplings");
  for (std::size_t r = 0; r < couplings.size(); ++r) {
    Json c = couplings[r];
    c["index"] = r;
    out.push_back({fmt::format("karplus-{}-{}", r + 1, slug(str(c, "nuclei"))),
                   fmt::format("Karplus curve of {} ({}) with the measured value, the dihedral angles it allows, and "
                               "every conformer of each candidate.",
                               str(c, "nuclei"), str(c, "set")),
                   karplus_figure(doc, c)});
  }
  if (!doc.at("candidates").empty()) {
    out.push_back({"couplings", "Observed couplings (with sigma) and each candidate's back-calculated values.",
                   couplings_figure(doc)});
    out.push_back({"contributions", "Contribution of each coupling to each candidate's score.", contributions_figure(doc)});
    for (const auto& cand : doc.at("candidates"))
      out.push_back({"populations-" + slug(str(cand, "name")),
                     "Conformer populations of " + str(cand, "name") +
                         ": Boltzmann weights of the force field, the energy-tied fit behind the score, and the free "
                         "fit with its 95% Monte Carlo interval.",
                     populations_figure(cand)});
  }
  if (doc.contains("multiplet"))
    out.push_back({"multiplet", "Peak list of " + str(doc.at("multiplet"), "proton") + " and its first-order analysis.",
                   multiplet_figure(doc.at("multiplet"))});
  return out;
}

std::vector<std::pair<std::string, std::string>> analysis_tables(const Json& doc) {
  std::vector<std::pair<std::string, std::string>> out;
  for (const auto& t : all_tables(doc)) out.emplace_back(t.file, csv_text(t));
  return out;
}

std::string analysis_html(const Json& doc, const std::vector<NamedFigure>& figures) {
  const Json& compound = doc.at("compound");
  const Json& conditions = doc.at("conditions");
  const Json& ranking = doc.at("ranking");
  HtmlDocument html(str(doc, "title"));
  html.set_subtitle(fmt::format("{} · measured in {} · {}", str(compound, "name"), conditions_line(conditions),
                                str(doc, "program")));
  const std::string caution_text =
      "These assignments come from models: Karplus relations with their stated errors, force-field conformers and "
      "statistics that assume the stated uncertainties are right. Confirm the configuration "
      "independently (NOE/ROE, an authentic sample, a crystal structure or a synthesis of known outcome) before you "
      "rely on it.";

  html.open_section("summary", "Summary");
  if (!str(ranking, "verdict").empty()) html.paragraph(str(ranking, "verdict"));
  if (doc.at("candidates").size() > 0) {
    const Json& best = favoured_candidate(doc);
    html.paragraph(fmt::format("Favoured: {} (relative probability {:.3f}, confidence {}).", str(best, "name"),
                               num(best, "probability"), str(ranking, "confidence")));
    for (const auto& line : member(best, "summary")) html.paragraph(line.get<std::string>());
  }
  if (doc.contains("multiplet"))
    html.paragraph(fmt::format("{} multiplet: {}.", str(doc.at("multiplet"), "proton"), str(doc.at("multiplet"), "notation")));
  html.caution("Confirm independently", caution_text);
  html.close_section();

  html.open_section("compound", "Compound");
  if (const std::string svg = depiction(compound); !svg.empty())
    html.figure(svg, str(compound, "name") + " with the atom labels used for the couplings" +
                         (compound.value("configuration_open", false)
                              ? " (constitution only: the configuration is what the analysis asks)."
                              : "."));
  std::vector<std::pair<std::string, std::string>> terms{{"name", str(compound, "name")}};
  if (!str(compound, "smiles").empty()) terms.emplace_back("SMILES", str(compound, "smiles"));
  if (!str(compound, "inchikey").empty()) terms.emplace_back("InChIKey", str(compound, "inchikey"));
  if (!str(doc, "library").empty()) terms.emplace_back("library", str(doc, "library"));
  html.definitions(terms);
  html.close_section();

  html.open_section("measured", "Measured couplings");
  std::vector<std::pair<std::string, std::string>> cond;
  for (const char* key : {"measurement", "solvent", "instrument", "method", "measured_by", "measured_on", "source"})
    if (!str(conditions, key).empty()) cond.emplace_back(key, str(conditions, key));
  if (std::isfinite(num(conditions, "temperature_k"))) cond.emplace_back("temperature", fmt::format("{:g} K", num(conditions, "temperature_k")));
  if (std::isfinite(num(conditions, "field_mhz"))) cond.emplace_back("1H frequency", fmt::format("{:g} MHz", num(conditions, "field_mhz")));
  html.definitions(cond);
  add_table(html, measured_table(doc));
  if (!str(doc, "alternatives_note").empty()) html.paragraph(str(doc, "alternatives_note"));
  html.close_section();

  html.open_section("angles", "Allowed dihedral angles");
  html.paragraph("Each coupling on its own: the dihedral intervals where the Karplus curve lies within the tolerance of "
                 "the measured value. The curve of an H-C-C-H coupling depends on its substituents and their "
                 "orientation, taken here from the favoured candidate.");
  add_table(html, angles_table(doc));
  for (std::size_t r = 0; r < doc.at("couplings").size(); ++r)
    add_figure(html, figures, fmt::format("karplus-{}-{}", r + 1, slug(str(doc.at("couplings")[r], "nuclei"))));
  html.close_section();

  if (!doc.at("candidates").empty()) {
    html.open_section("ranking", "Candidate configurations");
    add_table(html, ranking_table(doc));
    std::string how = fmt::format(
        "Score = misfit ({} errors) at the populations used{}; probability proportional to exp(-score/2) with equal "
        "prior odds.",
        str(ranking, "error_model"),
        ranking.value("energies_used", false)
            ? fmt::format(" + energy penalty (populations tied to the MMFF94 energies, each uncertain by {:g} kcal/mol, at "
                          "{:g} K)",
                          num(ranking, "energy_sigma_kcal_mol"), num(ranking, "temperature_k"))
            : " (free populations)");
    html.paragraph(how);
    for (const auto& cand : doc.at("candidates"))
      html.paragraph(fmt::format("{}: {}; stereo-unassigned protons taken as {}.", str(cand, "name"), str(cand, "origin"),
                                 str(cand, "assignment")));
    add_figure(html, figures, "contributions");
    html.close_section();

    html.open_section("couplings", "Observed and back-calculated couplings");
    add_table(html, comparison_table(doc));
    add_figure(html, figures, "couplings");
    html.close_section();

    html.open_section("populations", "Conformer populations");
    html.paragraph("Three sets of populations per candidate: the Boltzmann weights of the force-field energies, the "
                   "energy-tied fit that the ranking scores, and the free fit to the couplings alone with its 95% Monte "
                   "Carlo interval and the range each population can take while the fit stays acceptable "
                   "(profile chi-square, 95%). A wide range means the couplings do not determine that population.");
    add_table(html, side_chain_table(doc));
    for (const auto& cand : doc.at("candidates")) {
      html.open_section("populations-" + slug(str(cand, "name")), str(cand, "name"));
      if (!str(cand, "fit_verdict").empty()) html.paragraph("Free fit: " + str(cand, "fit_verdict"));
      add_table(html, populations_table(cand));
      add_figure(html, figures, "populations-" + slug(str(cand, "name")));
      html.close_section();
    }
    html.close_section();
  }

  if (doc.contains("multiplet")) {
    const Json& m = doc.at("multiplet");
    html.open_section("multiplet", "Multiplet of " + str(m, "proton"));
    html.paragraph(fmt::format("{} at {:.3f} ppm: {} (RMS deviation of the peaks from the fitted lines {:.2f} Hz).",
                               str(m, "proton"), num(m, "center_ppm"), str(m, "notation"), num(m, "residual_hz")));
    if (m.value("ambiguous", false)) {
      std::string alt;
      for (const auto& a : member(m, "alternatives")) alt += (alt.empty() ? "" : "; ") + a.get<std::string>();
      html.caution("More than one reading", "Other coupling trees fit the peaks as well: " + alt);
    }
    add_figure(html, figures, "multiplet");
    add_table(html, peaks_table(m));
    html.close_section();
  }

  html.open_section("sets", "Karplus parameter sets");
  add_table(html, sets_table(doc));
  html.close_section();

  html.open_section("provenance", "How this report was made");
  html.definitions({{"program", str(doc, "program")}, {"analysis", str(doc, "created_by")}});
  html.preformatted(str(doc, "command_line"));
  html.paragraph("Rebuild this page, its figures (SVG, PDF, PNG) and its tables (CSV) from the saved analysis with "
                 "`vicinal report analysis.json --out report.html`.");
  html.caution("Confirm independently", caution_text);
  html.close_section();
  html.set_footer(fmt::format("{} · made with {}", str(doc, "title"), str(doc, "program")));
  return html.render();
}

std::vector<std::string> write_analysis_report(const Json& doc, const std::string& source, const ReportPaths& paths) {
  check_analysis(doc, source);
  std::vector<std::string> written;
  try {
    const auto figures = analysis_figures(doc);
    const std::string html = analysis_html(doc, figures);
    const auto tables = analysis_tables(doc);
    if (!paths.figures_dir.empty()) {
      create_output_folder(paths.figures_dir);
      for (const auto& f : figures)
        for (const char* ext : {".svg", ".pdf", ".png"}) {
          Figure fig = f.figure;
          if (std::string(ext) == ".png") fig.png_scale = 2;
          const auto path = paths.figures_dir / (f.name + ext);
          save_figure(fig, path);
          written.push_back(path.string());
        }
    }
    if (!paths.tables_dir.empty()) {
      create_output_folder(paths.tables_dir);
      for (const auto& [file, text] : tables) {
        write_file_atomically(paths.tables_dir / file, text);
        written.push_back((paths.tables_dir / file).string());
      }
      write_file_atomically(paths.tables_dir / "analysis.json", doc.dump(2) + "\n");
      written.push_back((paths.tables_dir / "analysis.json").string());
    }
    write_file_atomically(paths.html, html);
    written.push_back(paths.html.string());
  } catch (const Json::exception& e) {
    throw Error("the analysis has an unexpected value: " + json_error_text(e), Location(source),
                "give an analysis.json as `vicinal demo` writes it, unedited");
  }
  return written;
}

}  // namespace vicinal::report
