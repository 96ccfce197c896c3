// vicinal configuration   relative configuration and rotamers of two adjacent
//                         stereocentres from 3J(H,H), 3J(C,H) and 2J(C,H)
#include <fmt/format.h>

#include <cmath>

#include "acyclic/configuration_analysis.h"
#include "cli/command.h"
#include "cli/result_report_output.h"
#include "core/error.h"
#include "report/configuration_section.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

using namespace vicinal::acyclic;

struct Options {
  std::string couplings, rules = "matsumori-1999", x3 = "carbon", report;
  int show = 6;
};

std::string verdict_name(Verdict v) {
  switch (v) {
    case Verdict::Clear: return "clear";
    case Verdict::RotamerAmbiguous: return "configuration clear, rotamers ambiguous";
    case Verdict::ConfigurationAmbiguous: return "ambiguous";
  }
  return "?";
}

// The machine-readable result (--json) and the report's document.
Json analysis_json(const Options& o, const Predictor& predictor, const std::vector<MeasuredCoupling>& measured,
                   const Analysis& a) {
  Json doc = {{"couplings_file", o.couplings}, {"x3", o.x3}, {"rules", predictor.rules().id},
              {"rules_source", predictor.rules().citation}, {"verdict", verdict_name(a.verdict)},
              {"statement", a.statement}, {"poor_fit", a.poor_fit}, {"equally_good_margin", kEquallyGood},
              {"pair_penalty", kPairPenalty}, {"measured", Json::array()}, {"arrangements", Json::array()},
              {"candidates", Json::array()}};
  for (const auto& m : measured)
    doc["measured"].push_back({{"name", m.name}, {"j_hz", m.j_hz}, {"sigma_hz", m.sigma_hz}});
  for (std::size_t i = 0; i < a.arrangements.size(); ++i) {
    Json arr = {{"name", a.arrangements[i].name()}, {"short_name", a.arrangements[i].short_name()},
                {"configuration", configuration_name(a.arrangements[i].configuration)}, {"couplings", Json::array()}};
    for (std::size_t k = 0; k < measured.size(); ++k) {
      const auto& p = a.predictions[i][k];
      arr["couplings"].push_back({{"name", measured[k].name}, {"j_hz", p.j_hz}, {"tolerance_hz", p.tolerance_hz},
                                  {"category", p.category}, {"basis", p.basis}, {"dihedral_deg", p.dihedral_deg}});
    }
    doc["arrangements"].push_back(arr);
  }
  for (const auto& c : a.candidates)
    doc["candidates"].push_back({{"name", c.name}, {"configuration", configuration_name(c.configuration)},
                                 {"members", c.members}, {"fraction_first", c.fraction}, {"score", c.score},
                                 {"ranked_score", c.ranked_score}, {"j_pred_hz", c.j_pred_hz}});
  return doc;
}

void run_analysis(const Options& o, const Globals& g) {
  if (o.x3 != "carbon" && o.x3 != "oxygen")
    throw Error(fmt::format("--x3 must be carbon or oxygen, not '{}'", o.x3), Location::field_in("", "--x3"));
  const Predictor predictor(Rules::load(o.rules), karplus::SetCatalog::shipped(), o.x3 == "oxygen");
  const auto measured = read_measured(o.couplings, predictor);
  const Analysis a = analyse(predictor, measured);

  const Json doc = analysis_json(o, predictor, measured, a);
  if (!o.report.empty())
    save_result_report(doc, report::kConfigurationFormat, fmt::format("Relative configuration from {}", o.couplings),
                       o.report, g);
  if (g.json) return g.print_json(doc);

  // Predicted vs measured, one column per staggered arrangement.
  std::vector<std::string> header = {"coupling", "measured"};
  for (const auto& arr : a.arrangements) header.push_back(arr.short_name());
  report::TextTable t(header);
  for (std::size_t k = 0; k < measured.size(); ++k) {
    std::vector<std::string> row = {measured[k].name, fmt::format("{:.1f} +- {:.1f}", measured[k].j_hz, measured[k].sigma_hz)};
    for (std::size_t i = 0; i < a.arrangements.size(); ++i) {
      const auto& p = a.predictions[i][k];
      const double z = (std::fabs(measured[k].j_hz) - p.j_hz) /
                       std::sqrt(measured[k].sigma_hz * measured[k].sigma_hz + p.tolerance_hz * p.tolerance_hz);
      row.push_back(fmt::format("{}{:.1f}{}", p.category == "large" ? "L " : "s ", p.j_hz, std::fabs(z) > 2 ? " x" : ""));
    }
    t.add_row(row);
  }
  report::TextTable s({"rank", "candidate", "score", "with penalty"});
  for (int i = 0; i < std::min<int>(o.show, static_cast<int>(a.candidates.size())); ++i) {
    const auto& c = a.candidates[i];
    s.add_row({fmt::format("{}{}", i + 1, c.ranked_score <= a.candidates.front().ranked_score + kEquallyGood ? " *" : ""),
               c.name, fmt::format("{:.2f}", c.score), fmt::format("{:.2f}", c.ranked_score)});
  }
  std::string text = "Staggered arrangements about C2-C3 (E = erythro, T = threo; the atom named is anti to H2):\n";
  for (const auto& arr : a.arrangements) text += fmt::format("  {:6} {}\n", arr.short_name(), arr.name());
  text += "\nPredicted couplings (Hz; L = large, s = small category; x = more than 2 sigma from the measurement):\n";
  text += t.render();
  text += "\nCandidates (score = sum of squared deviations in units of sqrt(sigma^2 + tolerance^2);\n"
          "a pair in exchange pays 2 for its fitted fraction; * = within 2 of the best):\n";
  text += s.render();
  text += "\n" + a.statement + "\n";
  text += fmt::format("Categories: {} ({}).\n", predictor.rules().citation, predictor.rules().file);
  g.print(text);
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<Options>();
  auto* c = root.add_subcommand("configuration",
                                "Relative configuration of two adjacent stereocentres from 3J(H,H), 3J(C,H), 2J(C,H)");
  c->add_option("--couplings", o->couplings, "CSV with columns coupling, j_hz, sigma_hz")->required();
  c->add_option("--x3", o->x3, "What C3 carries besides H3 and C4: carbon (e.g. a methyl) or oxygen")
      ->capture_default_str();
  c->add_option("--rules", o->rules, "Category file in db/acyclic/ (id) or a path")->capture_default_str();
  c->add_option("--report", o->report,
                "Folder for the HTML report (report.html, figures/, tables/) and configuration.json, from which "
                "`vicinal report` rebuilds it");
  c->add_option("--show", o->show, "Candidates to list")->capture_default_str()->check(CLI::Range(1, 100));
  c->footer(
      "The fragment is C1-C2(H2)(X2=O)-C3(H3)(X3)-C4. Coupling names in the CSV:\n"
      "  H2-H3  3J(H2,H3)     H2-C4, H3-C1  3J(C,H) across C2-C3\n"
      "  H2-X3  3J(H2,X3) when X3 is a carbon   C2-H3  2J(C2,H3)   C3-H2  2J(C3,H2) when X3 is an oxygen\n"
      "Example: vicinal configuration --couplings examples/acyclic/methyl-carbinol.csv\n"
      "Each of the six staggered rotamers (and pairs in fast exchange) is scored against the\n"
      "measured values (method of Matsumori et al., J. Org. Chem. 64, 866, 1999). Signs are ignored.\n"
      "--report DIR adds an HTML page: the predictions beside the measurements, how far each coupling\n"
      "lies from each arrangement, and the candidates' scores.");
  c->callback([o, &g] { run_analysis(*o, g); });
}

const bool registered = register_command(55, setup);

}  // namespace

}  // namespace vicinal::cli
