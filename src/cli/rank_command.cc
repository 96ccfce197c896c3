// vicinal rank   which candidate configuration do the couplings support?
#include <fmt/format.h>

#include <filesystem>

#include "cli/command.h"
#include "cli/fit_inputs.h"
#include "core/error.h"
#include "fit/linear_fit.h"
#include "fit/ranking.h"
#include "report/table.h"
#include "structure/conformer_search.h"
#include "structure/molecule_io.h"

namespace vicinal::cli {

namespace {

struct RankCommandOptions {
  std::vector<std::string> candidates;
  std::string couplings, labels, set = predict::kAutoSet, errors = "gaussian";
  std::optional<double> sigma_hz;
  double temperature_k = 298.15, energy_sigma_kcal_mol = 1.0, student_nu = 4;
  int max_conformers = 30;
  bool free_populations = false;
};

struct PreparedCandidate {
  std::string name, origin, assignment;
  fit::Candidate candidate;
};

// A multi-conformer file is used as it is; a single structure (3D, 2D with
// wedges) or a SMILES gets conformers generated (MMFF94, energies for the prior).
LoadedEnsemble candidate_ensemble(const std::string& name, const std::string& value, const RankCommandOptions& o,
                                  const Globals& g, std::string& origin) {
  LoadedEnsemble in;
  structure::ReadNotes notes;
  OpenBabel::OBMol mol;
  if (std::filesystem::exists(value)) {
    in.source = value;
    structure::Ensemble given = structure::read_ensemble(value, &notes);
    if (given.frame_count() > 1) {
      in.labels = structure::AtomLabels::for_molecule(given.topology, value, o.labels);
      in.ensemble = std::move(given);
      origin = fmt::format("{} conformers from {}", in.ensemble.frame_count(), value);
      for (const auto& m : notes.messages) g.note(fmt::format("note: {}: {}", name, m));
      return in;
    }
    mol = structure::read_molecule(value, &notes);
  } else {
    in.source = "SMILES of " + name;
    mol = structure::molecule_from_smiles(value, /*build_3d=*/true, &notes);
  }
  for (const auto& m : notes.messages) g.note(fmt::format("note: {}: {}", name, m));
  in.labels = structure::AtomLabels::for_molecule(mol, in.source, o.labels);
  structure::ConformerOptions co;
  co.temperature_k = o.temperature_k;
  co.max_conformers = o.max_conformers;
  auto progress = g.progress();
  co.progress = progress.get();
  structure::ConformerReport report;
  in.ensemble = structure::generate_conformers(mol, co, &report);
  if (in.ensemble.frame_count() == 0)
    throw Error(fmt::format("no conformers could be generated for candidate {}", name), Location(in.source));
  origin = fmt::format("{} generated conformers ({})", in.ensemble.frame_count(), report.method);
  return in;
}

PreparedCandidate prepare(const std::string& text, const MeasuredCouplings& measured, const RankCommandOptions& o,
                          const Globals& g) {
  const auto eq = text.find('=');
  if (eq == std::string::npos || eq == 0 || eq + 1 == text.size())
    throw Error(fmt::format("'{}' is not NAME=FILE or NAME=SMILES", text), Location::field_in("", "--candidate"),
                "e.g. --candidate threo=threo.sdf --candidate erythro='C[C@H](O)[C@@H](C)O'");
  PreparedCandidate p;
  p.name = text.substr(0, eq);
  const LoadedEnsemble in = candidate_ensemble(p.name, text.substr(eq + 1), o, g, p.origin);
  // The '|' alternatives: each candidate is scored under its best-fitting assignment.
  double best = INFINITY;
  for (const auto& a : enumerate_assignments(measured.list)) {
    EnsembleProblem ep;
    try {
      ep = problem_from_ensemble(in, measured, a, o.set, g.thread_count());
    } catch (const Error& e) {
      throw Error(fmt::format("candidate {}: {}", p.name, e.what_happened()), e.where(), e.hint());
    }
    const double chi2 = fit::fit_linear(ep.problem).chi2;
    if (chi2 < best) {
      best = chi2;
      p.candidate.problem = ep.problem;
      p.assignment = a.label;
    }
  }
  p.candidate.name = p.name;
  if (!o.free_populations) p.candidate.energy_kcal_mol = in.ensemble.energy_kcal_mol;
  return p;
}

void run_rank(const RankCommandOptions& o, const Globals& g) {
  if (o.candidates.size() < 2)
    throw Error("ranking needs at least two candidates", Location::field_in("", "--candidate"),
                "give --candidate NAME=FILE|SMILES twice or more");
  const MeasuredCouplings measured = read_measured_couplings(o.couplings, o.sigma_hz);
  std::vector<PreparedCandidate> prepared;
  for (const auto& c : o.candidates) prepared.push_back(prepare(c, measured, o, g));
  std::vector<fit::Candidate> candidates;
  for (const auto& p : prepared) candidates.push_back(p.candidate);
  fit::RankOptions ro;
  ro.error_model = o.errors == "student-t" ? fit::ErrorModel::StudentT : fit::ErrorModel::Gaussian;
  ro.student_nu = o.student_nu;
  ro.temperature_k = o.temperature_k;
  ro.energy_sigma_kcal_mol = o.energy_sigma_kcal_mol;
  const fit::Ranking ranking = fit::rank_candidates(candidates, ro);
  if (!ranking.energies_used)
    g.note(o.free_populations ? "note: energies ignored (--free-populations)"
                              : "note: not every candidate has conformer energies; populations are free");

  auto find = [&](const std::string& name) -> const PreparedCandidate& {
    for (const auto& p : prepared)
      if (p.name == name) return p;
    throw std::logic_error("rank: lost a candidate");
  };
  const auto& names = prepared.front().candidate.problem.coupling_names;
  if (g.json) {
    Json doc = {{"candidates", Json::array()},
                {"verdict", ranking.verdict},
                {"confidence", ranking.confidence},
                {"energies_used", ranking.energies_used},
                {"energies_decided", ranking.energies_decided},
                {"error_model", o.errors},
                {"temperature_k", o.temperature_k},
                {"energy_sigma_kcal_mol", o.energy_sigma_kcal_mol}};
    for (const auto& c : ranking.candidates) {
      const auto& p = find(c.name);
      Json row = {{"name", c.name},
                  {"chi2", c.misfit},
                  {"probability", c.probability},
                  {"score", c.score},
                  {"prior_penalty", c.prior_penalty},
                  {"free_chi2", c.free_misfit},
                  {"conformers", p.candidate.problem.conformers()},
                  {"origin", p.origin},
                  {"assignment", p.assignment},
                  {"populations", std::vector<double>(c.weights.data(), c.weights.data() + c.weights.size())},
                  {"contributions", Json::array()}};
      if (c.has_energies) row["boltzmann_chi2"] = c.boltzmann_misfit;
      for (int r = 0; r < c.contributions.size(); ++r)
        row["contributions"].push_back({{"coupling", p.candidate.problem.coupling_names[r]}, {"value", c.contributions(r)}});
      doc["candidates"].push_back(row);
    }
    g.print_json(doc);
    return;
  }
  const char* misfit = o.errors == "student-t" ? "misfit" : "chi2";
  report::TextTable t({"candidate", "conformers", fmt::format("{} free", misfit), fmt::format("{} Boltzmann", misfit),
                       "energy penalty", "score", "probability"});
  for (const auto& c : ranking.candidates)
    t.add_row({c.name, fmt::format("{}", c.weights.size()), fmt::format("{:.3g}", c.free_misfit),
               c.has_energies ? fmt::format("{:.3g}", c.boltzmann_misfit) : "-",
               ranking.energies_used ? fmt::format("{:.3g}", c.prior_penalty) : "-", fmt::format("{:.3g}", c.score),
               fmt::format("{:.3f}", c.probability)});
  std::vector<std::string> header{"coupling", "J obs / Hz"};
  for (const auto& c : ranking.candidates) header.push_back(c.name);
  report::TextTable contributions(header);
  const auto& first = prepared.front().candidate.problem;
  for (std::size_t r = 0; r < names.size(); ++r) {
    std::vector<std::string> row{names[r], fmt::format("{:.2f}", first.j_obs_hz(r))};
    for (const auto& c : ranking.candidates) row.push_back(fmt::format("{:.2f}", c.contributions(r)));
    contributions.add_row(row);
  }
  std::string text = t.render();
  for (const auto& c : ranking.candidates) {
    const auto& p = find(c.name);
    text += fmt::format("  {}: {}{}\n", c.name, p.origin,
                        p.assignment == "as written" ? "" : "; unassigned nuclei taken as " + p.assignment);
  }
  text += fmt::format("\nPer-coupling contributions to the {} ({}):\n", misfit,
                      o.errors == "student-t" ? fmt::format("Student-t, nu = {:g}", o.student_nu) : "Gaussian");
  text += contributions.render();
  text += "\nScore = misfit at the populations used";
  text += ranking.energies_used ? fmt::format(" + energy penalty (populations tied to conformer energies, sigma_E = "
                                              "{:g} kcal/mol at {:g} K)", o.energy_sigma_kcal_mol, o.temperature_k)
                                : " (free populations)";
  text += "; probability ~ exp(-score/2), equal prior odds.\n" + ranking.verdict + "\n";
  g.print(text);
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<RankCommandOptions>();
  auto* c = root.add_subcommand("rank", "Rank candidate configurations by how well they reproduce the couplings");
  c->add_option("--couplings", o->couplings, "Couplings CSV: nuclei,j_hz,sigma_hz")->required();
  c->add_option("--candidate", o->candidates,
                "NAME=FILE (conformer ensemble, or one structure incl. 2D molfiles with wedges) or NAME=SMILES; "
                "twice or more")
      ->required();
  c->add_option("--labels", o->labels, "Atom labels CSV (label,atom), the same numbering for every candidate");
  c->add_option("--set", o->set, "Karplus set id, or auto")->capture_default_str();
  c->add_option("--sigma-hz", o->sigma_hz, "Uncertainty for couplings without a sigma_hz value")
      ->check(CLI::PositiveNumber);
  c->add_option("--errors", o->errors, "Error model: gaussian, or student-t (heavy tails: one outlier cannot decide)")
      ->capture_default_str()
      ->check(CLI::IsMember({"gaussian", "student-t"}));
  c->add_option("--student-nu", o->student_nu, "Degrees of freedom of the Student-t model")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  c->add_option("--temperature-k", o->temperature_k, "Temperature for Boltzmann weights")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  c->add_option("--energy-sigma-kcal-mol", o->energy_sigma_kcal_mol,
                "Uncertainty of each conformer energy: populations may move only as far as this allows")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  c->add_option("--max-conformers", o->max_conformers, "Conformers to generate per candidate")
      ->capture_default_str()
      ->check(CLI::Range(1, 1000));
  c->add_flag("--free-populations", o->free_populations, "Ignore conformer energies: populations fitted freely");
  c->footer(
      "Example: vicinal rank --couplings couplings.csv --candidate syn='C[C@H](O)[C@@H](C)O' \\\n"
      "           --candidate anti='C[C@H](O)[C@H](C)O'\n"
      "Each candidate's populations are fitted to the couplings; with conformer energies they are tied to\n"
      "the Boltzmann weights (each energy uncertain by --energy-sigma-kcal-mol, a Gaussian prior on\n"
      "log-weights), so that a wrong candidate cannot win by loading a high-energy conformer. Relative\n"
      "probabilities assume equal prior odds. A coupling-based assignment must be confirmed independently.");
  c->callback([o, &g] { run_rank(*o, g); });
}

const bool registered = register_command(52, setup);

}  // namespace

}  // namespace vicinal::cli
