// vicinal predict   back-calculate couplings from a structure or an ensemble
#include <fmt/format.h>

#include <openbabel/atom.h>

#include <algorithm>
#include <cmath>

#include "cli/command.h"
#include "core/atomic_file.h"
#include "core/csv.h"
#include "core/error.h"
#include "predict/coupling_list.h"
#include "predict/j_matrix.h"
#include "report/table.h"
#include "structure/atom_labels.h"
#include "structure/ensemble.h"
#include "structure/molecule_io.h"

namespace vicinal::cli {

namespace {

struct PredictOptions {
  std::string structure, ensemble, couplings, labels, csv;
  std::string set = predict::kAutoSet;
  double temperature_k = 298.15;
  bool explain = false;
  bool stream = false;
};

std::vector<int> elements_of(const OpenBabel::OBMol& mol) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  std::vector<int> z;
  for (auto it = m.BeginAtoms(); it != m.EndAtoms(); ++it) z.push_back((*it)->GetAtomicNum());
  return z;
}

// The structure gives topology and labels; the ensemble, when given, the frames.
struct Input {
  structure::Ensemble ensemble;
  std::string labels_source;
};

Input load_input(const PredictOptions& o, const Globals& g) {
  if (o.structure.empty() && o.ensemble.empty())
    throw Error("nothing to predict from", Location::field_in("", "--structure"),
                "give --structure FILE (one structure) and/or --ensemble FILE (conformers)");
  structure::ReadNotes notes;
  Input in;
  if (!o.ensemble.empty() && !o.stream) {
    in.ensemble = structure::read_ensemble(o.ensemble, &notes);
    in.labels_source = o.ensemble;
  }
  if (!o.structure.empty()) {
    OpenBabel::OBMol mol = structure::read_molecule(o.structure, &notes);
    if (!o.ensemble.empty() && !o.stream) {
      if (elements_of(mol) != elements_of(in.ensemble.topology))
        throw Error(fmt::format("the ensemble's atoms ({}) differ from the structure's ({})",
                                in.ensemble.atom_count(), mol.NumAtoms()),
                    Location(o.ensemble), "the ensemble must list the structure's atoms in the same order");
      // Labels and residue names come from the structure file.
      in.ensemble.topology = mol;
      in.ensemble.topology.SetCoordinates(in.ensemble.xyz.data());
    } else {
      in.ensemble = structure::single_frame(mol, o.structure);
    }
    in.labels_source = o.structure;
  } else if (o.stream) {
    throw Error("--stream needs --structure for the topology", Location::field_in("", "--stream"));
  }
  for (const auto& m : notes.messages) g.note("note: " + m);
  return in;
}

std::string fixed(double v, int digits) { return std::isfinite(v) ? fmt::format("{:.{}f}", v, digits) : "-"; }

// Circular mean of angles (degrees) with weights.
double circular_mean_deg(const predict::JMatrix& m, std::size_t k, std::span<const double> w) {
  double c = 0, s = 0;
  for (std::size_t f = 0; f < m.frames; ++f) {
    c += w[f] * std::cos(m.dihedral(f, k) * M_PI / 180.0);
    s += w[f] * std::sin(m.dihedral(f, k) * M_PI / 180.0);
  }
  return std::atan2(s, c) * 180.0 / M_PI;
}

void explain(const std::vector<predict::CouplingSpec>& specs, const OpenBabel::OBMol& mol,
             const structure::AtomLabels& labels, const Globals& g) {
  std::string text = "\nSet choice and substituents (Haasnoot: dchi = dchi_alpha - P7 * sum dchi_beta; xi = orientation sign):\n";
  for (const auto& s : specs) {
    text += fmt::format("{}: {} -- dihedral atoms {}-{}-{}-{}\n", s.name, s.set_reason,
                        labels.describe(s.path[0], mol), labels.describe(s.path[1], mol),
                        labels.describe(s.path[2], mol), labels.describe(s.path[3], mol));
    if (s.substituents.empty()) continue;
    report::TextTable t({"  substituent", "on", "dchi_alpha", "sum dchi_beta", "dchi", "xi"});
    for (const auto& d : s.substituents)
      t.add_row({"  " + labels.describe(d.atom, mol), labels.describe(d.carbon, mol), fixed(d.delta_chi_alpha, 3),
                 fixed(d.sum_delta_chi_beta, 3), fixed(d.delta_chi, 3), d.orientation > 0 ? "+1" : "-1"});
    text += t.render();
  }
  g.print(text);
}

void write_matrix_csv(const std::string& path, const std::vector<predict::CouplingSpec>& specs,
                      const predict::JMatrix& m, std::span<const double> weights,
                      const std::vector<std::string>& titles) {
  std::string text = "conformer,title,weight";
  for (const auto& s : specs) text += "," + csv_escape(s.name + " j_hz");
  for (const auto& s : specs) text += "," + csv_escape(s.name + " dihedral_deg");
  text += "\n";
  for (std::size_t f = 0; f < m.frames; ++f) {
    text += fmt::format("{},{},{:.6g}", f + 1, csv_escape(f < titles.size() ? titles[f] : ""), weights[f]);
    for (std::size_t k = 0; k < m.couplings; ++k) text += fmt::format(",{:.4f}", m.j(f, k));
    for (std::size_t k = 0; k < m.couplings; ++k) text += fmt::format(",{:.3f}", m.dihedral(f, k));
    text += "\n";
  }
  write_file_atomically(path, text);
}

void predict_couplings(const PredictOptions& o, const Globals& g) {
  Input in = load_input(o, g);
  const OpenBabel::OBMol& mol = in.ensemble.topology;
  const auto labels = structure::AtomLabels::for_molecule(mol, in.labels_source, o.labels);
  std::vector<predict::CouplingSpec> specs;
  if (!o.couplings.empty()) {
    specs = predict::resolve_couplings(mol, labels, predict::read_coupling_list(o.couplings), o.set);
  } else {
    std::vector<std::string> skipped;
    specs = predict::couplings_from_pattern(mol, labels, o.set, &skipped);
    for (const auto& s : skipped) g.note("note: skipped: " + s);
    if (specs.empty())
      throw Error(fmt::format("no coupling in the structure matches {}",
                              o.set == predict::kAutoSet ? std::string("H-C-C-H (sp3 carbons)") : "set '" + o.set + "'"),
                  Location(in.labels_source), "give the couplings with --couplings, or another --set");
  }

  if (o.stream) {
    auto progress = g.progress();
    const auto avg = predict::stream_average(specs, mol, o.ensemble, g.thread_count(), progress.get());
    if (!o.csv.empty()) throw Error("--csv needs the per-conformer matrix; leave out --stream", Location::field_in("", "--csv"));
    Json doc = {{"conformers", avg.frames}, {"weights", "uniform"}, {"couplings", Json::array()}};
    report::TextTable t({"coupling", "atoms", "set", "mean dihedral", "J calc / Hz", "J obs / Hz"});
    for (std::size_t k = 0; k < specs.size(); ++k) {
      const auto& s = specs[k];
      const double mean_deg = std::atan2(avg.mean_dihedral_sin[k], avg.mean_dihedral_cos[k]) * 180.0 / M_PI;
      Json c = {{"name", s.name}, {"nuclei", s.nuclei}, {"path", s.bond_path}, {"dihedral_atoms", s.path},
                {"set", s.set->id}, {"dihedral_deg", mean_deg}, {"j_hz", avg.mean_j_hz[k]}};
      if (s.j_obs_hz) c["j_obs_hz"] = *s.j_obs_hz;
      doc["couplings"].push_back(c);
      t.add_row({s.name, fmt::format("{},{}", s.nuclei[0], s.nuclei[1]), s.set->id, fixed(mean_deg, 1),
                 fixed(avg.mean_j_hz[k], 2), s.j_obs_hz ? fixed(*s.j_obs_hz, 2) : ""});
    }
    if (g.json) g.print_json(doc);
    else g.print(t.render() + fmt::format("{} frames, equal weights (streamed)\n", avg.frames));
    return;
  }

  std::string basis;
  const auto weights = structure::frame_weights(in.ensemble, o.temperature_k, &basis);
  auto progress = g.progress();
  const predict::JMatrix m = predict::compute_j_matrix(specs, in.ensemble, g.thread_count(), progress.get());
  const auto mean = m.average_j_hz(weights);
  if (!o.csv.empty()) write_matrix_csv(o.csv, specs, m, weights, in.ensemble.titles);

  if (g.json) {
    Json doc = {{"conformers", m.frames}, {"weights", basis}, {"couplings", Json::array()}};
    if (basis == "energies") doc["temperature_k"] = o.temperature_k;
    for (std::size_t k = 0; k < specs.size(); ++k) {
      const auto& s = specs[k];
      Json c = {{"name", s.name},
                {"nuclei", s.nuclei},
                {"path", s.bond_path},
                {"dihedral_atoms", s.path},
                {"set", s.set->id},
                {"set_reason", s.set_reason},
                {"dihedral_deg", circular_mean_deg(m, k, weights)},
                {"j_hz", mean[k]},
                {"per_conformer", Json::array()}};
      for (std::size_t f = 0; f < m.frames; ++f)
        c["per_conformer"].push_back({{"dihedral_deg", m.dihedral(f, k)}, {"j_hz", m.j(f, k)}});
      if (s.j_obs_hz) c["j_obs_hz"] = *s.j_obs_hz;
      if (s.sigma_hz) c["sigma_hz"] = *s.sigma_hz;
      if (!s.substituents.empty()) {
        c["substituents"] = Json::array();
        for (const auto& d : s.substituents)
          c["substituents"].push_back({{"atom", d.atom}, {"carbon", d.carbon}, {"element", d.element},
                                       {"delta_chi_alpha", d.delta_chi_alpha},
                                       {"sum_delta_chi_beta", d.sum_delta_chi_beta}, {"delta_chi", d.delta_chi},
                                       {"orientation", d.orientation}});
      }
      doc["couplings"].push_back(c);
    }
    g.print_json(doc);
    return;
  }
  const bool many = m.frames > 1;
  const bool any_obs = std::any_of(specs.begin(), specs.end(), [](const auto& s) { return s.j_obs_hz.has_value(); });
  std::vector<std::string> header{"coupling", "atoms", "set", many ? "mean dihedral" : "dihedral", "J calc / Hz"};
  if (any_obs) {
    header.push_back("J obs / Hz");
    header.push_back("obs - calc");
  }
  report::TextTable t(header);
  for (std::size_t k = 0; k < specs.size(); ++k) {
    const auto& s = specs[k];
    std::vector<std::string> row{s.name, fmt::format("{},{}", s.nuclei[0], s.nuclei[1]), s.set->id,
                                 fixed(circular_mean_deg(m, k, weights), 1), fixed(mean[k], 2)};
    if (any_obs) {
      row.push_back(s.j_obs_hz ? fixed(*s.j_obs_hz, 2) : "");
      row.push_back(s.j_obs_hz ? fixed(*s.j_obs_hz - mean[k], 2) : "");
    }
    t.add_row(row);
  }
  std::string footer;
  if (many)
    footer = fmt::format("{} conformers, weights from {}{}; dihedrals are weighted circular means\n", m.frames, basis,
                         basis == "energies" ? fmt::format(" at {:g} K", o.temperature_k) : "");
  g.print(t.render() + footer);
  if (o.explain) explain(specs, mol, labels, g);
  if (!o.csv.empty()) g.note(fmt::format("wrote the J matrix ({} conformers x {} couplings) to {}", m.frames, m.couplings, o.csv));
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<PredictOptions>();
  auto* c = root.add_subcommand("predict", "Back-calculate couplings from a structure or a conformer ensemble");
  c->add_option("--structure", o->structure, "Structure (SDF/MOL, MOL2, PDB, XYZ, SMILES file): topology and labels");
  c->add_option("--ensemble", o->ensemble,
                "Conformers (multi-conformer SDF with energies/weights, multi-model PDB, multi-frame XYZ)");
  c->add_option("--couplings", o->couplings,
                "Couplings CSV: nuclei[,j_hz,sigma_hz,set,note]; without it every match of the set is predicted");
  c->add_option("--labels", o->labels, "Atom labels CSV (label,atom) for the nuclei column");
  c->add_option("--set", o->set, "Karplus set id, or auto (Haasnoot for H-C-C-H, the matching set otherwise)")
      ->capture_default_str();
  c->add_option("--temperature-k", o->temperature_k, "Temperature for Boltzmann weights from conformer energies")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  c->add_flag("--explain", o->explain, "Show the set chosen for each coupling and the Haasnoot substituents");
  c->add_option("--csv", o->csv, "Write the J matrix (conformer x coupling, with dihedrals) to this CSV file");
  c->add_flag("--stream", o->stream,
              "Average over a long PDB/XYZ trajectory in constant memory (equal weights, no per-conformer output)");
  c->footer(
      "Example: vicinal predict --structure conformers/diol-chain/diol-chain.sdf --ensemble "
      "conformers/diol-chain/diol-chain.sdf --explain\n"
      "Atoms are named by labels (from --labels, the SDF field vicinal_atom_labels, or PDB names as\n"
      "CHAIN:RESNUM:ATOM, e.g. A:12:HA), by 1-based index (12) or element+index (H12).\n"
      "Ensemble averages are Boltzmann-weighted when the SDF has vicinal_energy_kcal_mol fields,\n"
      "else use vicinal_weight fields when given, and are uniform otherwise.");
  c->callback([o, &g] { predict_couplings(*o, g); });
}

const bool registered = register_command(40, setup);

}  // namespace

}  // namespace vicinal::cli
