// Which relative configuration and rotamer(s) of the C2-C3 fragment the
// measured couplings support. Every staggered arrangement, and every pair of
// arrangements of one configuration in fast exchange (with the fraction that
// fits best), gets a score
//   S = sum ((|J_obs| - J_pred) / sqrt(sigma^2 + tolerance^2))^2;
// a pair pays 2 for its fitted fraction (as in Akaike's criterion). Candidates
// within kEquallyGood of the best explain the data equally well (our own
// threshold); when they span both configurations the configuration is
// reported as ambiguous.
#pragma once

#include <string>
#include <vector>

#include "acyclic/predict_couplings.h"

namespace vicinal::acyclic {

inline constexpr double kEquallyGood = 2.0;
inline constexpr double kPairPenalty = 2.0;

struct MeasuredCoupling {
  std::string name;
  double j_hz = 0, sigma_hz = 0;  // j_hz as given (sign kept for the report)
  long line = 0;
};

// CSV with a header row and columns coupling, j_hz, sigma_hz (others ignored).
// Errors name the line and column.
std::vector<MeasuredCoupling> read_measured(const std::string& path, const Predictor& predictor);
std::vector<MeasuredCoupling> parse_measured(const std::string& text, const std::string& source,
                                             const Predictor& predictor);

struct Candidate {
  std::vector<int> members;  // indices into staggered_arrangements(): one, or two in exchange
  double fraction = 1;       // of the first member
  double score = 0;          // S without penalty
  double ranked_score = 0;   // S plus the pair penalty
  std::vector<double> j_pred_hz, tolerance_hz;  // per measured coupling
  std::string name;
  Configuration configuration{};
};

enum class Verdict { Clear, RotamerAmbiguous, ConfigurationAmbiguous };

struct Analysis {
  std::vector<Arrangement> arrangements;
  std::vector<std::vector<Prediction>> predictions;  // [arrangement][measured coupling]
  std::vector<Candidate> candidates;                 // best first
  int equally_good = 1;                              // leading candidates within kEquallyGood
  Verdict verdict = Verdict::Clear;
  bool poor_fit = false;  // even the best leaves S / n > 4
  std::string statement;  // plain-language conclusion
};

Analysis analyse(const Predictor& predictor, const std::vector<MeasuredCoupling>& measured);

}  // namespace vicinal::acyclic
