// Fuzz target: the fast frame reader (structure/frame_reader.h) on multi-model
// PDB and multi-frame XYZ text, through structure::read_ensemble as the
// commands call it: Open Babel reads the first frame for the topology, the
// fast reader streams every frame against it. The format follows the content:
// PDB records -> .pdb, anything else -> .xyz.
#include "fuzz_support.h"
#include "structure/ensemble.h"

namespace {

bool looks_like_pdb(std::string_view text) {
  for (const char* record : {"ATOM  ", "HETATM", "MODEL", "ENDMDL"})
    if (text.starts_with(record) || text.find(std::string("\n") + record) != std::string_view::npos) return true;
  return false;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  const std::string_view text = fuzz::as_text(data, size);
  const std::string path = fuzz::scratch_file(text, looks_like_pdb(text) ? ".pdb" : ".xyz");
  fuzz::expect_only_vicinal_errors([&] {
    const structure::Ensemble e = structure::read_ensemble(path);
    if (e.frame_count() == 0 || e.atom_count() == 0) fuzz::broken_promise("an ensemble without frames or atoms");
    if (e.xyz.size() != e.frame_count() * 3 * static_cast<std::size_t>(e.atom_count()))
      fuzz::broken_promise("the coordinates are not frames x atoms x 3");
  });
  return 0;
}
