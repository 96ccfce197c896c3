// Fuzz target: SMILES handed to Open Babel through our wrapper
// (structure::molecule_from_smiles, without the 3D build), then the stereo
// bookkeeping every SMILES input goes through (compare_specified_stereo).
// Inputs above kMaxSmiles characters are skipped: Open Babel's own cost grows
// with size, and our code adds nothing size-specific beyond a handful of atoms.
#include "fuzz_support.h"
#include "structure/molecule_io.h"

namespace {
constexpr std::size_t kMaxSmiles = 200;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  if (size > kMaxSmiles) return 0;
  fuzz::expect_only_vicinal_errors([&] {
    const std::string smiles(fuzz::as_text(data, size));
    OpenBabel::OBMol mol = structure::molecule_from_smiles(smiles, false);
    if (mol.NumAtoms() == 0) fuzz::broken_promise("an accepted SMILES has no atoms");
    const auto check = structure::compare_specified_stereo(mol, mol);
    for (const int atom : check.unspecified_centres)
      if (atom < 1 || atom > static_cast<int>(mol.NumAtoms())) fuzz::broken_promise("stereocentre index out of range");
  });
  return 0;
}
