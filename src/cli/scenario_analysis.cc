#include "cli/scenario_analysis.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/bond.h>
#include <openbabel/mol.h>
#include <openbabel/obconversion.h>

#include <algorithm>
#include <cmath>
#include <map>

#include "cli/fit_inputs.h"
#include "cli/fit_report.h"
#include "core/atomic_file.h"
#include "core/csv.h"
#include "core/data_dir.h"
#include "core/error.h"
#include "core/parse.h"
#include "fit/assignments.h"
#include "fit/ranking.h"
#include "karplus/karplus.h"
#include "library/formats.h"
#include "library/store.h"
#include "predict/j_matrix.h"
#include "report/analysis_report.h"
#include "spin/first_order.h"
#include "structure/conformer_search.h"
#include "structure/molecule_io.h"

namespace vicinal::cli {

namespace {

std::string text_of(const Json& j, const char* key, const std::string& source) {
  return json_string(json_member(j, key, source, key), source, key);
}

std::vector<std::string> split(const std::string& text, char separator) {
  std::vector<std::string> out;
  std::size_t start = 0;
  for (;;) {
    const auto at = text.find(separator, start);
    out.emplace_back(trim(text.substr(start, at == std::string::npos ? std::string::npos : at - start)));
    if (at == std::string::npos) return out;
    start = at + 1;
  }
}

// ------------------------------------------------------------ measurements

struct Measurements {
  library::Entry entry;            // as read back from the library
  OpenBabel::OBMol molecule;       // the compound's molfile (the labels' numbering)
  structure::AtomLabels labels;
  MeasuredCouplings measured;
  library::Conditions conditions;
};

// A fresh library in the output folder, the scenario's file imported into it,
// and the compound read back: what the analysis uses is what was stored.
Measurements measurements_via_library(const std::string& couplings_csv, const std::string& compound,
                                      const std::filesystem::path& library_path, const Globals& g) {
  std::filesystem::remove(library_path);
  const auto imported = library::read_exchange_file(couplings_csv, {});
  auto lib = library::Library::create(library_path.string());
  auto progress = g.progress();
  const auto stored = lib->store(imported.entries, *progress);
  g.note(fmt::format("  library {}: {} compound, {} couplings stored", library_path.string(), stored.compounds_added,
                     stored.couplings_added));
  Measurements m;
  bool found = false;
  for (auto& e : lib->read_entries())
    if (e.compound.name == compound) m.entry = std::move(e), found = true;
  if (!found || m.entry.sets.empty())
    throw Error(fmt::format("the library holds no measurements of compound '{}'", compound), Location(couplings_csv),
                "the scenario's `compound` must name a compound of its couplings file");
  if (m.entry.sets.size() > 1)
    g.note(fmt::format("note: '{}' has {} measurement sets; the first is analysed", compound, m.entry.sets.size()));
  const library::SetRecord& set = m.entry.sets.front();
  m.conditions = set.conditions;

  OpenBabel::OBConversion conv;
  conv.SetInFormat("mol");
  if (!conv.ReadString(&m.molecule, m.entry.compound.molfile))
    throw Error("the library's structure of the compound cannot be read back", Location(library_path.string()));
  const std::string source = library_path.string() + ": " + compound;
  m.labels = structure::AtomLabels(static_cast<int>(m.molecule.NumAtoms()), source);
  for (const auto& [label, atom] : m.entry.compound.labels) m.labels.add(label, atom);

  m.measured.list.source = source;
  long line = 0;
  for (const auto& c : set.couplings) {
    predict::CouplingRow row;
    row.line = ++line;
    row.nuclei = {split(c.nucleus_a, '|'), split(c.nucleus_b, '|')};
    row.j_hz = c.j_hz;
    row.sigma_hz = c.sigma_hz;
    row.set = c.karplus_set;
    row.note = c.note;
    if (!c.sigma_hz)
      throw Error(fmt::format("the coupling {},{} has no uncertainty", c.nucleus_a, c.nucleus_b), Location(couplings_csv),
                  "give sigma_hz for every coupling");
    m.measured.sigma_hz.push_back(*c.sigma_hz);
    m.measured.list.rows.push_back(std::move(row));
  }
  if (m.measured.list.rows.empty())
    throw Error("no couplings to analyse", Location(couplings_csv), "list the measured couplings");
  return m;
}

// ------------------------------------------------------------ candidates

struct CandidateRun {
  std::string name, smiles, conformers_file, origin;
  LoadedEnsemble in;
  std::vector<Assignment> assignments;
  std::vector<EnsembleProblem> problems;  // one per assignment
  fit::AssignmentComparison comparison;
  const EnsembleProblem& best() const { return problems[comparison.best]; }
};

// Candidates share the compound's numbering: same elements atom by atom and
// every bond of the compound present in the candidate.
void check_same_numbering(OpenBabel::OBMol& compound, OpenBabel::OBMol& candidate, const std::string& name,
                          const std::string& source) {
  auto fail = [&](const std::string& what) {
    throw Error(fmt::format("candidate {} is not numbered like the measured compound: {}", name, what), Location(source),
                "write the candidate's SMILES with the atoms in the order of the compound's labels");
  };
  if (compound.NumAtoms() != candidate.NumAtoms())
    fail(fmt::format("{} atoms instead of {}", candidate.NumAtoms(), compound.NumAtoms()));
  for (unsigned i = 1; i <= compound.NumAtoms(); ++i)
    if (compound.GetAtom(i)->GetAtomicNum() != candidate.GetAtom(i)->GetAtomicNum())
      fail(fmt::format("atom {} is a different element", i));
  for (auto it = compound.BeginBonds(); it != compound.EndBonds(); ++it) {
    const OpenBabel::OBBond* b = *it;
    if (!candidate.GetBond(b->GetBeginAtomIdx(), b->GetEndAtomIdx()))
      fail(fmt::format("no bond between atoms {} and {}", b->GetBeginAtomIdx(), b->GetEndAtomIdx()));
  }
}

structure::Ensemble candidate_conformers(const std::string& name, const std::string& smiles,
                                         const std::filesystem::path& shipped, const std::filesystem::path& out_dir,
                                         double temperature_k, const Globals& g, std::string& origin) {
  if (std::filesystem::exists(shipped)) {
    structure::ReadNotes notes;
    auto e = structure::read_ensemble(shipped.string(), &notes);
    origin = fmt::format("{} MMFF94 conformers from {}", e.frame_count(), shipped.filename().string());
    return e;
  }
  // Regenerated only when the shipped file is missing, into the output folder.
  const auto target = out_dir / "conformers" / shipped.filename();
  g.note(fmt::format("  {} missing: generating conformers of {} into {}", shipped.string(), name, target.string()));
  structure::ReadNotes notes;
  const OpenBabel::OBMol mol = structure::molecule_from_smiles(smiles, /*build_3d=*/true, &notes);
  structure::ConformerOptions co;
  co.temperature_k = temperature_k;
  auto progress = g.progress();
  co.progress = progress.get();
  structure::ConformerReport report;
  auto e = structure::generate_conformers(mol, co, &report);
  create_output_folder(target.parent_path());
  structure::write_ensemble_sdf(e, target.string());
  origin = fmt::format("{} MMFF94 conformers generated ({})", e.frame_count(), report.method);
  return e;
}

// ------------------------------------------------------------ pieces of the document

std::string labels_text(const structure::AtomLabels& labels, const OpenBabel::OBMol& mol, std::span<const int> atoms) {
  std::string out;
  for (int a : atoms) out += (out.empty() ? "" : "-") + labels.describe(a, mol);
  return out;
}

Json set_json(const karplus::ParameterSet& s) {
  Json coefficients = Json::object();
  for (std::size_t i = 0; i < s.coefficients.size(); ++i)
    coefficients[i < s.coefficient_names.size() ? s.coefficient_names[i] : fmt::format("c{}", i + 1)] = s.coefficients[i];
  return {{"id", s.id},           {"title", s.title},         {"coupling", s.coupling},
          {"angle_name", s.angle_name}, {"form", karplus::form_name(s.form)}, {"coefficients", coefficients},
          {"offset_deg", s.offset_deg}, {"rms_hz", s.rms_hz}, {"citation", s.citation},
          {"table", s.table},     {"doi", s.doi},             {"short_citation", s.short_citation}};
}

// Allowed dihedral angles and the curve of one coupling, with the set and
// substituents of `spec` (the favoured candidate's reading of the coupling).
Json coupling_json(const predict::CouplingRow& row, double sigma_hz, const predict::CouplingSpec& spec,
                   const std::string& candidate, const structure::AtomLabels& labels, const OpenBabel::OBMol& mol) {
  const auto& set = *spec.set;
  Json c = {{"nuclei", row.nuclei_text()}, {"j_hz", *row.j_hz}, {"sigma_hz", sigma_hz}, {"note", row.note},
            {"set", set.id}, {"set_citation", set.short_citation.empty() ? set.citation : set.short_citation},
            {"set_reason", spec.set_reason}, {"k", 2.0}};
  c["tolerance_hz"] = 2.0 * std::sqrt(sigma_hz * sigma_hz + set.rms_hz * set.rms_hz);
  try {
    const auto sol = karplus::allowed_dihedrals(set, *row.j_hz, sigma_hz, 2.0, spec.karplus_substituents);
    c["tolerance_hz"] = sol.tolerance_hz;
    c["allowed_deg"] = Json::array();
    for (const auto& iv : sol.intervals)
      c["allowed_deg"].push_back({{"from", iv.from_deg}, {"to", iv.to_deg}, {"best", iv.best_deg}});
    c["exact_deg"] = sol.exact_deg;
  } catch (const Error& e) {
    c["angle_error"] = e.what_happened();
  }
  Json curve = {{"of", candidate}, {"atoms", labels_text(labels, mol, spec.path)}};
  std::vector<double> x, y;
  for (int d = -180; d <= 180; ++d) {
    x.push_back(d);
    y.push_back(karplus::j_hz(set, d, spec.karplus_substituents));
  }
  curve["dihedral_deg"] = x;
  curve["j_hz"] = y;
  c["curve"] = curve;
  return c;
}

// gg / gt / tg: first letter the ring-atom...end-atom torsion, second the
// other-ring-atom...end-atom torsion (gauche within 120 degrees of 0).
std::string side_chain_rotamer(std::span<const double> xyz, const std::array<int, 4>& first,
                               const std::array<int, 4>& second) {
  auto letter = [&](const std::array<int, 4>& atoms) {
    return std::abs(predict::dihedral_deg(xyz, atoms)) < 120 ? 'g' : 't';
  };
  return std::string{letter(first), letter(second)};
}

Json multiplet_json(const Json& spec, const std::filesystem::path& folder, double field_mhz, const std::string& source) {
  const std::string path = (folder / text_of(spec, "peaks", source)).string();
  const auto table = CsvTable::read_file(path);
  const auto ppm_col = table.column("position_ppm"), hz_col = table.column("position_hz");
  const auto int_col = table.column("intensity");
  if (!ppm_col && !hz_col)
    throw Error("needs a column 'position_ppm' or 'position_hz'", Location(path, 1), "header e.g.: position_ppm,intensity");
  std::vector<std::pair<double, double>> peaks;  // hz, intensity
  for (const auto& row : table.rows()) {
    const double hz = hz_col ? parse_double(row.fields[*hz_col], table.where(row, *hz_col))
                             : parse_double(row.fields[*ppm_col], table.where(row, *ppm_col)) * field_mhz;
    peaks.emplace_back(hz, int_col ? parse_double(row.fields[*int_col], table.where(row, *int_col)) : 1.0);
  }
  std::sort(peaks.begin(), peaks.end());
  spin::PeakList list;
  for (const auto& [hz, intensity] : peaks) list.hz.push_back(hz), list.intensity.push_back(intensity);
  const auto result = spin::analyse_first_order(list);
  const auto& tree = result.trees.front();
  Json m = {{"proton", text_of(spec, "proton", source)}, {"source", path}, {"field_mhz", field_mhz},
            {"notation", tree.notation()}, {"multiplicity", tree.multiplicity()}, {"couplings_hz", tree.couplings_hz()},
            {"center_ppm", tree.center_hz / field_mhz}, {"residual_hz", tree.residual_hz},
            {"max_deviation_hz", tree.max_deviation_hz}, {"ambiguous", result.ambiguous},
            {"peaks", Json::array()}, {"alternatives", Json::array()}, {"tree_lines", Json::array()}};
  for (std::size_t i = 0; i < peaks.size(); ++i)
    m["peaks"].push_back({{"hz", peaks[i].first}, {"ppm", peaks[i].first / field_mhz}, {"intensity", peaks[i].second},
                          {"fitted_hz", i < tree.peaks.size() ? tree.peaks[i].hz : peaks[i].first}});
  if (result.ambiguous)
    for (std::size_t t = 1; t < result.trees.size(); ++t) m["alternatives"].push_back(result.trees[t].notation());
  // The tree's lines: one doublet per partner, convolved (binomial multiplets).
  std::map<double, double> lines{{tree.center_hz, 1.0}};
  for (const auto& group : tree.groups)
    for (int p = 0; p < group.partners; ++p) {
      std::map<double, double> next;
      for (const auto& [hz, weight] : lines) {
        next[hz - group.j_hz / 2] += weight / 2;
        next[hz + group.j_hz / 2] += weight / 2;
      }
      lines = std::move(next);
    }
  for (const auto& [hz, weight] : lines) m["tree_lines"].push_back({{"hz", hz}, {"intensity", weight}});
  return m;
}

}  // namespace

Json run_scenario_analysis(const ScenarioRun& run, const Globals& g) {
  const std::string scenario_source = run.scenario.string();
  const Json scenario = read_json_file(scenario_source);
  const auto folder = run.scenario.parent_path();
  create_output_folder(run.out_dir);

  g.note("[1/6] importing the measured couplings into a fresh library");
  const std::string compound = text_of(scenario, "compound", scenario_source);
  Measurements m = measurements_via_library((folder / text_of(scenario, "couplings", scenario_source)).string(), compound,
                                            run.out_dir / "library.sqlite", g);
  const double temperature_k = m.conditions.temperature_k.value_or(298.15);
  const double field_mhz = m.conditions.field_mhz.value_or(0);

  g.note("[2/6] loading the candidates' conformers");
  std::vector<CandidateRun> candidates;
  for (const auto& c : json_member(scenario, "candidates", scenario_source, "candidates")) {
    CandidateRun cr;
    cr.name = text_of(c, "name", scenario_source);
    cr.smiles = text_of(c, "smiles", scenario_source);
    cr.conformers_file = text_of(c, "conformers", scenario_source);
    cr.in.ensemble = candidate_conformers(cr.name, cr.smiles, data_dir() / cr.conformers_file, run.out_dir,
                                          temperature_k, g, cr.origin);
    cr.in.source = cr.conformers_file;
    check_same_numbering(m.molecule, cr.in.ensemble.topology, cr.name, cr.conformers_file);
    cr.in.labels = m.labels;
    g.note(fmt::format("  {}: {}", cr.name, cr.origin));
    candidates.push_back(std::move(cr));
  }
  if (candidates.size() < 2)
    throw Error("a ranking needs at least two candidates", Location::field_in(scenario_source, "candidates"));

  g.note("[3/6] back-calculating couplings for every assignment of the unassigned protons");
  for (auto& cr : candidates) {
    cr.assignments = enumerate_assignments(m.measured.list);
    std::vector<fit::AssignmentOption> options;
    for (const auto& a : cr.assignments) {
      cr.problems.push_back(problem_from_ensemble(cr.in, m.measured, a, predict::kAutoSet, g.thread_count()));
      options.push_back({a.label, cr.problems.back().problem});
    }
    cr.comparison = fit::compare_assignments(options);
  }

  g.note("[4/6] ranking the candidates and fitting populations");
  std::vector<fit::Candidate> ranked_input;
  for (const auto& cr : candidates)
    ranked_input.push_back({cr.name, cr.best().problem, cr.in.ensemble.energy_kcal_mol});
  fit::RankOptions ro;
  ro.temperature_k = temperature_k;
  const fit::Ranking ranking = fit::rank_candidates(ranked_input, ro);
  const std::string favoured = ranking.candidates.front().name;

  std::optional<std::array<int, 4>> key_atoms;
  std::string key_name, key_ends;
  if (const auto it = scenario.find("key_dihedral"); it != scenario.end()) {
    std::array<int, 4> atoms{};
    for (int k = 0; k < 4; ++k) {
      const std::string label = it->at(k).get<std::string>();
      atoms[k] = m.labels.resolve(label, &m.molecule);
      key_name += (k ? "/" : "") + label;
    }
    key_atoms = atoms;
    key_ends = it->at(0).get<std::string>() + " and " + it->at(3).get<std::string>();
    key_name = "dihedral " + key_name + " / deg";
  }
  std::optional<std::pair<std::array<int, 4>, std::array<int, 4>>> side_atoms;
  if (const auto it = scenario.find("side_chain"); it != scenario.end()) {
    auto atom = [&](const char* key) { return m.labels.resolve(text_of(*it, key, scenario_source), &m.molecule); };
    const int ring = atom("ring_atom"), branch = atom("branch_atom"), side = atom("side_atom"), end = atom("end_atom"),
              other = atom("other_ring_atom");
    side_atoms = {{ring, branch, side, end}, {other, branch, side, end}};
  }

  AnalysisOptions ao;
  ao.draws = run.draws;
  ao.threads = g.thread_count();
  Json doc_candidates = Json::array();
  const CandidateRun* favoured_run = nullptr;
  for (const auto& score : ranking.candidates) {
    const CandidateRun& cr = *std::find_if(candidates.begin(), candidates.end(),
                                           [&](const CandidateRun& c) { return c.name == score.name; });
    if (cr.name == favoured) favoured_run = &cr;
    const EnsembleProblem& ep = cr.best();
    const LinearAnalysis free = analyse_linear(ep.problem, ao, g);
    const Eigen::VectorXd predicted = ep.problem.j_hz * score.weights;
    const auto& ens = cr.in.ensemble;
    Json c = {{"name", cr.name}, {"smiles", cr.smiles}, {"conformers_file", cr.conformers_file}, {"origin", cr.origin},
              {"assignment", cr.comparison.scores[cr.comparison.best].label}, {"assignments", Json::array()},
              {"couplings", Json::array()}, {"conformers", Json::array()}, {"side_chain", Json::array()},
              {"chi2_free", score.free_misfit}, {"chi2_boltzmann", score.has_energies ? Json(score.boltzmann_misfit) : Json()},
              {"misfit", score.misfit}, {"prior_penalty", score.prior_penalty}, {"score", score.score},
              {"probability", score.probability}, {"fit_verdict", free.goodness.verdict},
              {"key_dihedral_name", key_name},
              {"conditioning", {{"rank", free.conditioning.rank}, {"condition_number", free.conditioning.condition_number}}}};
    for (const auto& a : cr.comparison.scores)
      c["assignments"].push_back({{"label", a.label}, {"chi2", a.fit.chi2}, {"probability", a.probability}});
    for (int r = 0; r < ep.problem.couplings(); ++r)
      c["couplings"].push_back({{"name", ep.problem.coupling_names[r]}, {"predicted_hz", predicted(r)},
                                {"free_fit_hz", free.fit.predicted_hz(r)}, {"contribution", score.contributions(r)}});
    std::map<std::string, std::array<double, 3>> rotamers;  // boltzmann, energy-tied, free
    for (int i = 0; i < ep.problem.conformers(); ++i) {
      const auto xyz = ens.frame(i);
      Json conf = {{"name", ep.problem.conformer_names[i]},
                   {"energy_kcal_mol", i < static_cast<int>(ens.energy_kcal_mol.size())
                                           ? Json(ens.energy_kcal_mol[i] - ens.energy_kcal_mol.front())
                                           : Json()},
                   {"boltzmann", score.has_energies ? Json(score.boltzmann_weights(i)) : Json()},
                   {"population", score.weights(i)},
                   {"free_population", free.fit.weights(i)},
                   {"range", {free.ranges[i].min, free.ranges[i].max}}};
      if (free.monte_carlo)
        conf["ci95"] = {free.monte_carlo->populations[i].low95, free.monte_carlo->populations[i].high95};
      std::vector<double> dihedrals, js;
      for (int r = 0; r < ep.problem.couplings(); ++r) {
        dihedrals.push_back(ep.matrix.dihedral(i, r));
        js.push_back(ep.matrix.j(i, r));
      }
      conf["dihedral_deg"] = dihedrals;
      conf["j_hz"] = js;
      if (key_atoms) conf["key_dihedral_deg"] = predict::dihedral_deg(xyz, *key_atoms);
      if (side_atoms) {
        const std::string rot = side_chain_rotamer(xyz, side_atoms->first, side_atoms->second);
        conf["side_chain"] = rot;
        auto& sums = rotamers[rot];
        sums[0] += score.has_energies ? score.boltzmann_weights(i) : NAN;
        sums[1] += score.weights(i);
        sums[2] += free.fit.weights(i);
      }
      c["conformers"].push_back(conf);
    }
    std::string side_summary;
    for (const auto& [rot, sums] : rotamers) {
      c["side_chain"].push_back({{"rotamer", rot}, {"boltzmann", sums[0]}, {"population", sums[1]}, {"free_population", sums[2]}});
      side_summary += fmt::format("{}{} {:.0f}%", side_summary.empty() ? "" : ", ", rot, 100 * sums[1]);
    }
    c["summary"] = Json::array();
    if (!side_summary.empty())
      c["summary"].push_back(fmt::format("Side-chain rotamers of {} (energy-tied fit): {}.", cr.name, side_summary));
    if (key_atoms) {
      double anti = 0;
      for (const auto& conf : c["conformers"])
        if (std::abs(conf["key_dihedral_deg"].get<double>()) > 120) anti += conf["population"].get<double>();
      c["summary"].push_back(fmt::format("{}: {} anti (|dihedral| > 120 deg) in {:.0f}% of the energy-tied population.",
                                         cr.name, key_ends, 100 * anti));
    }
    doc_candidates.push_back(c);
  }

  g.note("[5/6] allowed dihedral angles and the multiplet");
  Json couplings = Json::array();
  std::map<std::string, Json> sets;
  for (std::size_t r = 0; r < m.measured.list.rows.size(); ++r) {
    const auto& spec = favoured_run->best().specs[r];
    couplings.push_back(coupling_json(m.measured.list.rows[r], m.measured.sigma_hz[r], spec, favoured, m.labels,
                                      favoured_run->in.ensemble.topology));
  }
  for (const auto& cr : candidates)
    for (const auto& spec : cr.best().specs) sets.emplace(spec.set->id, set_json(*spec.set));

  Json doc = {{"format", report::kAnalysisFormat}, {"version", report::kAnalysisVersion},
              {"title", text_of(scenario, "title", scenario_source)},
              {"program", "vicinal " VICINAL_VERSION}, {"command_line", g.command_line},
              {"created_by", "vicinal demo (" + run.scenario.filename().string() + ")"},
              {"library", (run.out_dir / "library.sqlite").string()}};
  Json labels = Json::object(), depict = Json::object();
  for (const auto& [label, atom] : m.entry.compound.labels) labels[label] = atom;
  if (const auto it = scenario.find("depict_labels"); it != scenario.end())
    for (const auto& l : *it) depict[l.get<std::string>()] = m.labels.resolve(l.get<std::string>(), &m.molecule);
  // With the configuration open, only what is known is shown: the constitution
  // and the skeleton block of the InChIKey.
  const bool open = scenario.value("configuration_open", false);
  doc["compound"] = {{"name", m.entry.compound.name},
                     {"smiles", open ? scenario.value("constitution_smiles", "") : m.entry.compound.smiles},
                     {"inchikey", open ? m.entry.compound.inchikey.substr(0, 14) : m.entry.compound.inchikey}, {"molfile", m.entry.compound.molfile},
                     {"labels", labels}, {"depict_labels", depict},
                     {"configuration_open", open}};
  const auto& k = m.conditions;
  doc["conditions"] = {{"measurement", k.name}, {"solvent", k.solvent}, {"instrument", k.instrument},
                       {"method", k.method}, {"measured_by", k.measured_by}, {"measured_on", k.measured_on},
                       {"source", k.source}};
  if (k.temperature_k) doc["conditions"]["temperature_k"] = *k.temperature_k;
  if (k.field_mhz) doc["conditions"]["field_mhz"] = *k.field_mhz;
  doc["couplings"] = couplings;
  doc["alternatives_note"] =
      "Nuclei written a|b are stereo-unassigned: the value belongs to one of them, and which one is not known. Each "
      "candidate is scored under the assignment that fits it best; the others are listed with the candidate.";
  doc["sets"] = Json::array();
  for (auto& [id, s] : sets) doc["sets"].push_back(s);
  doc["candidates"] = doc_candidates;
  doc["ranking"] = {{"verdict", ranking.verdict}, {"confidence", ranking.confidence},
                    {"energies_used", ranking.energies_used}, {"energies_decided", ranking.energies_decided},
                    {"error_model", "Gaussian"}, {"temperature_k", ro.temperature_k},
                    {"energy_sigma_kcal_mol", ro.energy_sigma_kcal_mol}, {"favoured", favoured}};
  if (const auto it = scenario.find("multiplet"); it != scenario.end()) {
    if (field_mhz <= 0)
      throw Error("the multiplet needs the spectrometer frequency", Location(scenario_source),
                  "give field_mhz with the measurements");
    doc["multiplet"] = multiplet_json(*it, folder, field_mhz, scenario_source);
  }
  return doc;
}

}  // namespace vicinal::cli
