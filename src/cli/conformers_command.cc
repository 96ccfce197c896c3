// vicinal conformers generate   build an MMFF94 conformer ensemble with Boltzmann weights
// vicinal conformers info       summarise an ensemble file
#include <fmt/format.h>

#include <algorithm>

#include "cli/command.h"
#include "core/error.h"
#include "report/table.h"
#include "structure/conformer_search.h"
#include "structure/ensemble.h"
#include "structure/molecule_io.h"

namespace vicinal::cli {

namespace {

struct GenerateOptions {
  std::string smiles, structure, out;
  structure::ConformerOptions search;
};

Json conformer_rows(const structure::Ensemble& e, std::span<const double> weights) {
  Json rows = Json::array();
  const double e_min = e.energy_kcal_mol.empty() ? 0
                                                 : *std::min_element(e.energy_kcal_mol.begin(), e.energy_kcal_mol.end());
  for (std::size_t f = 0; f < e.frame_count(); ++f) {
    Json r = {{"index", f + 1}, {"title", f < e.titles.size() ? e.titles[f] : ""}, {"weight", weights[f]}};
    if (!e.energy_kcal_mol.empty()) {
      r["energy_kcal_mol"] = e.energy_kcal_mol[f];
      r["relative_kcal_mol"] = e.energy_kcal_mol[f] - e_min;
    }
    rows.push_back(r);
  }
  return rows;
}

std::string conformer_table(const structure::Ensemble& e, std::span<const double> weights) {
  const bool energies = !e.energy_kcal_mol.empty();
  report::TextTable t(energies ? std::vector<std::string>{"#", "title", "E / kcal mol-1", "dE / kcal mol-1", "weight"}
                               : std::vector<std::string>{"#", "title", "weight"});
  const double e_min = energies ? *std::min_element(e.energy_kcal_mol.begin(), e.energy_kcal_mol.end()) : 0;
  for (std::size_t f = 0; f < e.frame_count(); ++f) {
    std::vector<std::string> row{std::to_string(f + 1), f < e.titles.size() ? e.titles[f] : ""};
    if (energies) {
      row.push_back(fmt::format("{:.3f}", e.energy_kcal_mol[f]));
      row.push_back(fmt::format("{:.3f}", e.energy_kcal_mol[f] - e_min));
    }
    row.push_back(fmt::format("{:.4f}", weights[f]));
    t.add_row(row);
  }
  return t.render();
}

void generate(GenerateOptions o, const Globals& g) {
  if (o.smiles.empty() == o.structure.empty())
    throw Error("give exactly one of --smiles and --structure", Location::field_in("", "--smiles"));
  structure::ReadNotes notes;
  const OpenBabel::OBMol mol = o.smiles.empty() ? structure::read_molecule(o.structure, &notes)
                                                : structure::molecule_from_smiles(o.smiles, true, &notes);
  for (const auto& m : notes.messages) g.note("note: " + m);
  auto progress = g.progress();
  o.search.progress = progress.get();
  structure::ConformerReport report;
  const structure::Ensemble e = structure::generate_conformers(mol, o.search, &report);
  structure::write_ensemble_sdf(e, o.out);
  if (g.json) {
    g.print_json({{"out", o.out},
                  {"method", report.method},
                  {"rotors", report.rotors},
                  {"flexible_rings", report.flexible_rings},
                  {"ring_starts", report.ring_starts},
                  {"ring_shapes", report.ring_shapes},
                  {"searched", report.searched},
                  {"duplicates", report.duplicates},
                  {"above_window", report.above_window},
                  {"rmsd_angstrom", o.search.rmsd_angstrom},
                  {"torsion_deg", o.search.torsion_deg},
                  {"temperature_k", o.search.temperature_k},
                  {"force_field", "MMFF94"},
                  {"conformers", conformer_rows(e, e.weight)}});
    return;
  }
  g.print(conformer_table(e, e.weight) +
          fmt::format("{} conformers written to {}\nsearch: {}; {} candidates, {} duplicates of a lower one (RMSD < {:g} A and torsions within {:g} deg) "
                      "dropped, {} above the {:g} kcal/mol window dropped\nMMFF94 energies; Boltzmann weights "
                      "at {:g} K\n",
                      e.frame_count(), o.out, report.method, report.searched, report.duplicates,
                      o.search.rmsd_angstrom, o.search.torsion_deg, report.above_window, o.search.energy_window_kcal_mol,
                      o.search.temperature_k) +
          (report.flexible_rings == 0
               ? std::string()
               : fmt::format("ring conformations: {} distinct among the conformers kept ({} ring starting structure{} "
                             "searched)\n",
                             report.ring_shapes, report.ring_starts, report.ring_starts == 1 ? "" : "s")));
}

void info(const std::string& path, double temperature_k, const Globals& g) {
  structure::ReadNotes notes;
  const structure::Ensemble e = structure::read_ensemble(path, &notes);
  for (const auto& m : notes.messages) g.note("note: " + m);
  std::string basis;
  const auto weights = structure::frame_weights(e, temperature_k, &basis);
  auto& mol = const_cast<OpenBabel::OBMol&>(e.topology);
  if (g.json) {
    Json doc = {{"file", path},         {"atoms", mol.NumAtoms()},        {"formula", mol.GetFormula()},
                {"frames", e.frame_count()}, {"weights", basis},         {"conformers", conformer_rows(e, weights)}};
    if (basis == "energies") doc["temperature_k"] = temperature_k;
    g.print_json(doc);
    return;
  }
  g.print(fmt::format("{}: {} ({} atoms), {} conformers, weights from {}{}\n", path, mol.GetFormula(), mol.NumAtoms(),
                      e.frame_count(), basis, basis == "energies" ? fmt::format(" at {:g} K", temperature_k) : "") +
          conformer_table(e, weights));
}

void setup(CLI::App& root, Globals& g) {
  auto& group = command_group(root, "conformers", "Generate and inspect conformer ensembles");
  auto o = std::make_shared<GenerateOptions>();
  auto* gen = group.add_subcommand("generate", "Build conformers (MMFF94) with energies and Boltzmann weights");
  gen->add_option("--smiles", o->smiles, "Molecule as SMILES (stereo it specifies is kept and checked; unspecified centres are chosen arbitrarily)");
  gen->add_option("--structure", o->structure, "Molecule from a structure file instead");
  gen->add_option("--out", o->out, "Output SDF (energies and weights as data fields)")->required();
  gen->add_option("--temperature-k", o->search.temperature_k, "Temperature for the Boltzmann weights")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  gen->add_option("--max", o->search.max_conformers, "Keep at most this many conformers (lowest energies)")
      ->capture_default_str()
      ->check(CLI::Range(1, 10000));
  gen->add_option("--rmsd", o->search.rmsd_angstrom,
                  "Conformers count as one when their heavy-atom RMSD (Angstrom, after superposition) is below this...")
      ->capture_default_str()
      ->check(CLI::NonNegativeNumber);
  gen->add_option("--torsion-deg", o->search.torsion_deg,
                  "...and every chain and ring torsion agrees within this many degrees (keeps mirror-image gauche forms apart)")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  gen->add_option("--window", o->search.energy_window_kcal_mol, "Drop conformers this far above the lowest (kcal/mol)")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  gen->footer("Example: vicinal conformers generate --smiles 'OC[C@@H](O)[C@H](O)C' --out diol.sdf\n"
              "3D build, MMFF94 minimisation, ring flips (the torsions of each non-aromatic 4- to 8-membered\n"
              "ring inverted, for up to 3 rings), a rotor search from every ring shape (systematic for up to\n"
              "5 rotatable bonds, weighted random beyond), full minimisation of every candidate, duplicates\n"
              "removed by heavy-atom RMSD together with chain and ring torsions. Boats and twist forms are\n"
              "not searched on purpose: give them as input if they matter.");
  gen->callback([o, &g] { generate(*o, g); });

  auto path = std::make_shared<std::string>();
  auto temperature = std::make_shared<double>(298.15);
  auto* inf = group.add_subcommand("info", "Conformers, energies and weights of an ensemble file");
  inf->add_option("file", *path, "Ensemble (SDF, multi-model PDB, multi-frame XYZ)")->required();
  inf->add_option("--temperature-k", *temperature, "Temperature for Boltzmann weights from energies")
      ->capture_default_str()
      ->check(CLI::PositiveNumber);
  inf->footer("Example: vicinal conformers info conformers/diol-chain/diol-chain.sdf");
  inf->callback([path, temperature, &g] { info(*path, *temperature, g); });
}

const bool registered = register_command(30, setup);

}  // namespace

}  // namespace vicinal::cli
