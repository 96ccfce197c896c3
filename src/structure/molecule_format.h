// Structure file formats by extension, shared by the single-structure and
// ensemble readers.
#pragma once

#include <openbabel/mol.h>

#include <cstddef>
#include <string>
#include <vector>

namespace vicinal::structure {

struct MoleculeFormat {
  std::string openbabel_id;  // "sdf", "mol2", "pdb", "xyz", "smi"
  std::string name;          // for messages: "SDF", "PDB", ...
};

// vicinal::Error naming the file and the extensions understood otherwise.
MoleculeFormat molecule_format_of(const std::string& path);

// vicinal::Error naming the file when it does not exist, is a folder, cannot be
// opened, is empty, or is not UTF-8 text (a NUL byte or other bytes that are not
// UTF-8: a binary or UTF-16 file, or damage, which Open Babel would misread).
void require_readable_file(const std::string& path);

// vicinal::Error naming the file (and frame) when a coordinate is not finite or
// lies beyond kMaxCoordinateAngstrom of the origin: damaged input, not a molecule.
inline constexpr double kMaxCoordinateAngstrom = 1e5;
void require_sane_coordinates(const std::vector<double>& xyz, std::size_t atoms_per_frame, const std::string& path);

// Makes hydrogens explicit where the molecule lacks them; returns how many were
// added (numbered after the existing atoms). Formats without implicit hydrogen
// counts (XYZ, PDB) that contain no hydrogen at all get the typical count for
// each atom's valence first.
int add_missing_hydrogens(OpenBabel::OBMol& mol);

}  // namespace vicinal::structure
