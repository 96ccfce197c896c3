// Measured ring couplings for the pseudorotation fit: a CSV with a header row
// and the columns
//   coupling   the ring coupling's name as the ring file spells it, e.g. H1'-H2'
//   j_hz       measured value (the sign is ignored: H-H 3J in rings is positive)
//   sigma_hz   its uncertainty, > 0
// Other columns (a note, say) are ignored. Errors name the line and column.
#pragma once

#include <string>
#include <vector>

#include "pucker/ring_model.h"

namespace vicinal::pucker {

struct MeasuredRingCoupling {
  std::size_t coupling = 0;  // index into RingModel::couplings
  double j_hz = 0, sigma_hz = 0;
  long line = 0;
};

std::vector<MeasuredRingCoupling> read_ring_couplings(const std::string& path, const RingModel& ring);
std::vector<MeasuredRingCoupling> parse_ring_couplings(const std::string& text, const std::string& source,
                                                       const RingModel& ring);

}  // namespace vicinal::pucker
