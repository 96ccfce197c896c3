// Reading structures through Open Babel. Open Babel's OBMol is the molecule
// type throughout vicinal; its atom indices are 1-based, as in structure files
// and everything a person sees.
#pragma once

#include <openbabel/mol.h>

#include <string>
#include <utility>
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

// From SMILES; with `build_3d` coordinates are generated and the stereo the
// SMILES specifies is checked in the 3D result (vicinal::Error if it cannot be
// kept). Stereocentres and double bonds the SMILES leaves open take whatever
// configuration the build gives; a message in `notes` names them.
OpenBabel::OBMol molecule_from_smiles(const std::string& smiles, bool build_3d, ReadNotes* notes = nullptr);

// The stereo a structure was asked to have (`wanted`, from SMILES or a 2D file)
// against the stereo perceived from the 3D coordinates of `built` (same atoms
// in the same order). Only the stereocentres and double bonds that `wanted`
// specifies are compared; the others are listed as unspecified.
struct StereoCheck {
  bool same = false;
  std::string wanted;  // canonical isomeric SMILES of `wanted`
  std::string got;     // canonical isomeric SMILES of `built`, without the unspecified units
  std::vector<int> unspecified_centres;                      // 1-based atom indices
  std::vector<std::pair<int, int>> unspecified_double_bonds;  // 1-based atom indices of the bond ends
};
StereoCheck compare_specified_stereo(const OpenBabel::OBMol& wanted, const OpenBabel::OBMol& built);

}  // namespace vicinal::structure
