// Fuzz target: a Karplus parameter-set file (db/karplus/*.json format) as
// SetCatalog::load_file reads user sets, then the forward curve, its range and
// the inverse map J -> dihedral intervals that `karplus angles` uses.
#include <cmath>
#include <vector>

#include "fuzz_support.h"
#include "karplus/karplus.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  const std::string path = fuzz::scratch_file(fuzz::as_text(data, size), ".json");
  fuzz::expect_only_vicinal_errors([&] {
    const karplus::ParameterSet set = karplus::SetCatalog::load_file(path);
    std::vector<karplus::Substituent> substituents;
    if (set.is_haasnoot()) substituents = {{0.4, 1}, {1.3, -1}};
    const auto range = karplus::j_range(set, substituents);
    if (!(range.min_hz <= range.max_hz)) return;  // a curve with no finite range is refused below
    for (const double dihedral_deg : {-180.0, -60.0, 0.0, 60.0, 179.0})
      (void)karplus::j_hz(set, dihedral_deg, substituents);
    const double mid_hz = 0.5 * (range.min_hz + range.max_hz);
    const auto solution = karplus::allowed_dihedrals(set, mid_hz, 0.5, 2.0, substituents);
    for (const auto& interval : solution.intervals)
      if (!(interval.from_deg <= interval.to_deg) || interval.from_deg < -180 || interval.to_deg > 180)
        fuzz::broken_promise("an angle interval is empty or outside [-180, 180]");
  });
  return 0;
}
