// Fuzz target: our SDF data fields. One input is SDF text (one or more
// records); it goes through the library's SDF import (the `vicinal_compound`
// JSON field with its couplings, the `vicinal_atom_labels` field), both on
// the first bad record and with bad records skipped, and the first record
// alone through the inline-molfile reader and the atom-label field reader.
#include "exchange_file_support.h"
#include "library/entry_builder.h"
#include "structure/atom_labels.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  const std::string_view text = fuzz::as_text(data, size);
  const std::string path = fuzz::scratch_file(text, ".sdf");
  fuzz::read_exchange_both_ways(path, [](const library::ImportResult&) {});
  fuzz::expect_only_vicinal_errors([&] {
    const auto end = text.find("$$$$");
    const std::string record(text.substr(0, end == std::string_view::npos ? text.size() : end + 4));
    const OpenBabel::OBMol mol = library::molecule_from_molfile(record, "fuzz.sdf");
    const auto labels = structure::AtomLabels::from_sdf_field(mol, "fuzz.sdf");
    for (const auto& [label, atom] : labels.all())
      if (atom < 1 || atom > static_cast<int>(mol.NumAtoms())) fuzz::broken_promise("a label names no atom");
  });
  return 0;
}
