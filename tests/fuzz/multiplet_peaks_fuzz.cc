// Fuzz target: a multiplet peak list as `multiplet analyse` reads it from a
// CSV file (columns position_hz and intensity), then the first-order analysis.
#include <cmath>

#include "core/csv.h"
#include "core/parse.h"
#include "fuzz_support.h"
#include "spin/first_order.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  fuzz::expect_only_vicinal_errors([&] {
    const CsvTable table = CsvTable::parse(fuzz::as_text(data, size), "fuzz.csv");
    const std::size_t hz = table.require_column("position_hz");
    const auto intensity = table.column("intensity");
    spin::PeakList peaks;
    for (const auto& row : table.rows()) {
      peaks.hz.push_back(parse_double(row.fields[hz], table.where(row, hz)));
      if (intensity) {
        const double v = parse_double(row.fields[*intensity], table.where(row, *intensity));
        if (!(v > 0)) return;  // the command refuses non-positive intensities before the analysis
        peaks.intensity.push_back(v);
      }
    }
    const auto result = spin::analyse_first_order(peaks);
    if (result.trees.empty()) fuzz::broken_promise("the analysis returned no tree");
    for (const auto& tree : result.trees) {
      if (tree.peaks.size() != peaks.hz.size()) fuzz::broken_promise("a tree does not cover every peak");
      if (!std::isfinite(tree.residual_hz)) fuzz::broken_promise("a tree residual is not finite");
    }
  });
  return 0;
}
