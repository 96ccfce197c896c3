#include "calibrate/library_points.h"

#include <fmt/format.h>

#include <algorithm>
#include <map>
#include <stdexcept>

#include "core/error.h"
#include "library/entry_builder.h"
#include "library/store.h"
#include "predict/j_matrix.h"

namespace vicinal::calibrate {

namespace {

// The stored structure's coordinates, 3 per atom; refused when flat (2D).
std::vector<double> stored_coordinates(const library::CompoundRecord& compound, const std::string& library_path) {
  OpenBabel::OBMol mol = library::molecule_from_molfile(compound.molfile, compound.name);
  std::vector<double> xyz(mol.GetCoordinates(), mol.GetCoordinates() + 3 * mol.NumAtoms());
  bool flat = true;
  for (std::size_t i = 2; i < xyz.size(); i += 3) flat = flat && xyz[i] == 0.0;
  if (flat)
    throw Error(fmt::format("compound '{}' has no 3D coordinates (every z = 0): no dihedral can be measured",
                            compound.name),
                Location(library_path), "import it again from SMILES (built in 3D) or from a 3D SDF");
  return xyz;
}

}  // namespace

LibraryPoints points_from_library(library::Database& db, library::FindQuery query,
                                  std::optional<double> default_sigma_hz, const std::string& library_path) {
  query.bonds = 3;
  const library::FindResult found = library::find_couplings(db, query);
  if (found.couplings.empty())
    throw Error("no 3-bond coupling in the library matches the query", Location(library_path),
                "check the filters with `vicinal library find --bonds 3 ...`");

  // read_entries returns entries in id order: pair them with the sorted ids.
  std::vector<std::int64_t> sorted;
  for (const auto& f : found.couplings) sorted.push_back(f.compound_id);
  std::sort(sorted.begin(), sorted.end());
  sorted.erase(std::unique(sorted.begin(), sorted.end()), sorted.end());
  const auto entries = library::read_entries(db, sorted);
  std::map<std::int64_t, std::vector<double>> xyz_of;
  if (entries.size() != sorted.size())
    throw std::logic_error("library entries do not match the compounds found");
  for (std::size_t i = 0; i < sorted.size(); ++i)
    xyz_of[sorted[i]] = stored_coordinates(entries[i].compound, library_path);

  LibraryPoints out;
  for (const auto& f : found.couplings) {
    const auto& c = f.coupling;
    const std::string nuclei = c.nucleus_a + "," + c.nucleus_b;
    if (c.stereo_unassigned) {
      out.skipped.push_back(fmt::format("{} {}: stereo-unassigned, the atom is not known", f.compound, nuclei));
      continue;
    }
    if (c.path.size() != 4)
      throw std::logic_error(fmt::format("3-bond coupling {} of {} has a path of {} atoms", nuclei, f.compound, c.path.size()));
    if (!c.sigma_hz && !default_sigma_hz)
      throw Error(fmt::format("coupling {} of '{}' has no sigma", nuclei, f.compound), Location(library_path),
                  "give --default-sigma-hz to use one value for such couplings");
    CalibrationPoint p;
    p.j_hz = c.j_hz;
    p.sigma_hz = c.sigma_hz ? *c.sigma_hz : *default_sigma_hz;
    p.dihedral_deg = predict::dihedral_deg(xyz_of.at(f.compound_id), {c.path[0], c.path[1], c.path[2], c.path[3]});
    out.points.push_back(p);
    out.origins.push_back({f.compound, nuclei, c.path, !c.sigma_hz.has_value()});
  }
  if (out.points.empty())
    throw Error("every matching 3-bond coupling is stereo-unassigned: no point to calibrate on", Location(library_path));
  return out;
}

}  // namespace vicinal::calibrate
