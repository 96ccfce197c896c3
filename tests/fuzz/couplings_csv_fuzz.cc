// Fuzz target: the couplings CSV (predict/coupling_list.h), including the
// '|' alternatives of diastereotopic protons, read as `predict` and `fit` read
// it; every reference is then resolved against a small labelled molecule
// (labels, 1-based indices, element+index), as the commands resolve them.
#include "fuzz_support.h"
#include "predict/coupling_list.h"
#include "structure/atom_labels.h"
#include "structure/molecule_io.h"

namespace {

struct Ethanol {
  OpenBabel::OBMol mol = vicinal::structure::molecule_from_smiles("CCO", false);  // 9 atoms with H
  vicinal::structure::AtomLabels labels{static_cast<int>(mol.NumAtoms()), "ethanol"};
  Ethanol() {
    labels.add("H-1a", 4);
    labels.add("H-1b", 5);
    labels.add("H-2", 7);
    labels.add("O-1", 3);
  }
};

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  fuzz::expect_only_vicinal_errors([&] {
    const CsvTable table = CsvTable::parse(fuzz::as_text(data, size), "fuzz.csv");
    for (const bool require_j : {false, true}) {
      fuzz::expect_only_vicinal_errors([&] {
        const auto list = predict::parse_coupling_list(table, require_j);
        for (const auto& row : list.rows) {
          const auto pairs = row.assignments();
          std::size_t expected = row.nuclei[0].size() * row.nuclei[1].size();
          if (pairs.size() != expected) fuzz::broken_promise("assignments() is not every pair of alternatives");
          for (const auto& side : row.nuclei)
            for (const auto& ref : side) {
              if (ref.empty()) fuzz::broken_promise("an empty atom reference was accepted");
              fuzz::expect_only_vicinal_errors([&] {
                static const Ethanol ethanol;
                const int atom = ethanol.labels.resolve(ref, &ethanol.mol);
                if (atom < 1 || atom > static_cast<int>(ethanol.mol.NumAtoms()))
                  fuzz::broken_promise("a reference resolved to an atom that does not exist");
              });
            }
          if (row.sigma_hz && !(*row.sigma_hz > 0)) fuzz::broken_promise("sigma_hz accepted but not positive");
          if (require_j && !row.j_hz) fuzz::broken_promise("j_hz required but missing");
        }
      });
    }
  });
  return 0;
}
