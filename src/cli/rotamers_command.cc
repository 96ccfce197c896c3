// vicinal rotamers   populations of the three staggered rotamers about one bond
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/ensemble_fit.h"
#include "cli/fit_inputs.h"
#include "core/error.h"
#include "core/parse.h"
#include "structure/molecule_io.h"
#include "structure/rotamers.h"

namespace vicinal::cli {

namespace {

struct RotamerOptions {
  std::string structure, bond, couplings, labels, angles;
  std::optional<double> sigma_hz;
  EnsembleFitOptions fit;
};

std::vector<std::string> split_commas(const std::string& text) {
  std::vector<std::string> out;
  std::size_t start = 0;
  for (;;) {
    const auto comma = text.find(',', start);
    out.emplace_back(trim(text.substr(start, comma - start)));
    if (comma == std::string::npos) return out;
    start = comma + 1;
  }
}

void run_rotamers(const RotamerOptions& o, const Globals& g) {
  const MeasuredCouplings measured = read_measured_couplings(o.couplings, o.sigma_hz);
  if (measured.list.rows.size() < 2)
    throw Error(fmt::format("three rotamer populations need at least two couplings; {} given", measured.list.rows.size()),
                Location(o.couplings), "measure two or more couplings across the bond (e.g. both H-5/H-6 couplings)");
  structure::ReadNotes read;
  LoadedEnsemble in;
  in.source = o.structure;
  const OpenBabel::OBMol mol = structure::read_molecule(o.structure, &read);
  for (const auto& m : read.messages) g.note("note: " + m);
  const auto labels = structure::AtomLabels::for_molecule(mol, o.structure, o.labels);
  const auto ends = split_commas(o.bond);
  if (ends.size() != 2)
    throw Error(fmt::format("'{}' is not a bond", o.bond), Location::field_in("", "--bond"),
                "name the two atoms of the bond, e.g. --bond C-5,C-6");
  structure::RotamerSpec spec;
  spec.a = labels.resolve(ends[0], &mol);
  spec.b = labels.resolve(ends[1], &mol);
  if (!o.angles.empty()) {
    const auto parts = split_commas(o.angles);
    if (parts.size() != 3)
      throw Error("--angles needs three dihedrals, one per rotamer", Location::field_in("", "--angles"),
                  "e.g. --angles 60,180,-60");
    for (int k = 0; k < 3; ++k) spec.dihedral_deg[k] = parse_double(parts[k], Location::field_in("", "--angles"));
  }
  in.ensemble = structure::staggered_rotamers(mol, spec);
  in.labels = labels;
  const auto ref = structure::rotamer_reference(mol, spec);
  Json extra = {{"bond", {spec.a, spec.b}},
                {"reference_dihedral_atoms", ref},
                {"rotamer_dihedral_deg", spec.dihedral_deg}};
  g.note(fmt::format("rotamers about {}-{}: dihedral {}-{}-{}-{} set to {:g}, {:g}, {:g} degrees",
                     labels.describe(spec.a, mol), labels.describe(spec.b, mol), labels.describe(ref[0], mol),
                     labels.describe(ref[1], mol), labels.describe(ref[2], mol), labels.describe(ref[3], mol),
                     spec.dihedral_deg[0], spec.dihedral_deg[1], spec.dihedral_deg[2]));
  fit_ensemble_and_report(in, measured, o.fit, g, extra);
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<RotamerOptions>();
  auto* c = root.add_subcommand("rotamers", "Populations of the three staggered rotamers about one bond");
  c->add_option("--structure", o->structure, "Structure (SDF/MOL, PDB, ...) with the bond")->required();
  c->add_option("--bond", o->bond, "The bond, two atom references: C-5,C-6 or 5,6 (the second atom's side turns)")
      ->required();
  c->add_option("--couplings", o->couplings, "Couplings CSV across the bond: nuclei,j_hz,sigma_hz")->required();
  c->add_option("--labels", o->labels, "Atom labels CSV (label,atom)");
  c->add_option("--angles", o->angles, "Dihedrals of the three rotamers (default 60,180,-60)");
  c->add_option("--sigma-hz", o->sigma_hz, "Uncertainty for couplings without a sigma_hz value")
      ->check(CLI::PositiveNumber);
  add_ensemble_fit_options(*c, o->fit);
  c->footer(
      "Example: vicinal rotamers --structure glucoside.sdf --bond C-5,C-6 --couplings h5h6.csv\n"
      "Builds the staggered rotamers by turning the bond (reference dihedral printed as a note),\n"
      "predicts each coupling in each rotamer with its Karplus set and fits the three populations\n"
      "exactly, with Monte Carlo uncertainties and the range each population can take. For an\n"
      "exocyclic CH2OH, name the rotamers gg/gt/tg from the printed O-C-C-O/O-C-C-C dihedrals.");
  c->callback([o, &g] { run_rotamers(*o, g); });
}

const bool registered = register_command(51, setup);

}  // namespace

}  // namespace vicinal::cli
