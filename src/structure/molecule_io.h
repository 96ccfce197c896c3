// Reading structures through Open Babel. Open Babel's OBMol is the molecule
// type throughout vicinal; its atom indices are 1-based, as in structure files
// and everything a person sees.
#pragma once

#include <openbabel/mol.h>

#include <string>
#include <vector>

namespace vicinal::structure {

struct ReadNotes {
  bool added_hydrogens = false;  // explicit H were added because the input had none
  bool built_3d = false;         // coordinates were generated (SMILES or 2D input)
  std::vector<std::string> messages;  // for the CLI to show the user
};

// First (or only) structure in a file; format from the extension (.smi, .mol,
// .sdf, .mol2, .pdb, .xyz). Hydrogens are made explicit.
OpenBabel::OBMol read_molecule(const std::string& path, ReadNotes* notes = nullptr);

// From SMILES; with `build_3d` coordinates are generated and the stereo of the
// 3D result is checked against the SMILES (vicinal::Error if it cannot be kept).
OpenBabel::OBMol molecule_from_smiles(const std::string& smiles, bool build_3d, ReadNotes* notes = nullptr);

}  // namespace vicinal::structure
