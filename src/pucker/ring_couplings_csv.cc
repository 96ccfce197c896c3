#include "pucker/ring_couplings_csv.h"

#include <fmt/format.h>

#include <cmath>

#include "core/csv.h"
#include "core/error.h"
#include "core/parse.h"

namespace vicinal::pucker {

namespace {

std::vector<MeasuredRingCoupling> from_table(const CsvTable& table, const RingModel& ring) {
  const std::size_t name_col = table.require_column("coupling");
  const std::size_t j_col = table.require_column("j_hz");
  const std::size_t sigma_col = table.require_column("sigma_hz");
  std::vector<MeasuredRingCoupling> out;
  for (const auto& row : table.rows()) {
    MeasuredRingCoupling m;
    m.line = row.line;
    const std::string name(trim(row.fields[name_col]));
    try {
      m.coupling = ring.index_of(name);
    } catch (const Error& e) {
      throw Error(e.what_happened(), table.where(row, name_col), e.hint());
    }
    for (const auto& seen : out)
      if (seen.coupling == m.coupling)
        throw Error(fmt::format("coupling {} is listed twice (first on line {})", name, seen.line),
                    table.where(row, name_col), "give each ring coupling once");
    m.j_hz = std::fabs(parse_coupling_hz(row.fields[j_col], table.where(row, j_col)));
    m.sigma_hz = parse_coupling_hz(row.fields[sigma_col], table.where(row, sigma_col));
    if (!(m.sigma_hz > 0))
      throw Error("sigma_hz must be positive", table.where(row, sigma_col),
                  "give the measurement uncertainty, e.g. 0.3");
    out.push_back(m);
  }
  if (out.empty()) throw Error("no couplings in the file", {table.source()}, "add one row per ring coupling");
  return out;
}

}  // namespace

std::vector<MeasuredRingCoupling> read_ring_couplings(const std::string& path, const RingModel& ring) {
  return from_table(CsvTable::read_file(path), ring);
}

std::vector<MeasuredRingCoupling> parse_ring_couplings(const std::string& text, const std::string& source,
                                                       const RingModel& ring) {
  return from_table(CsvTable::parse(text, source), ring);
}

}  // namespace vicinal::pucker
