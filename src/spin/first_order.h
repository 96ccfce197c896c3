// First-order multiplet analysis: which set of coupling constants, each to one
// or more equivalent spin-1/2 partners, splits one line into the observed
// peaks? A first-order multiplet is the convolution of one doublet per
// partner, so every coupling J and every sum of couplings appears as a
// distance from the lowest peak, and all couplings add up to the span of the
// multiplet. Candidate trees are built from those distances, checked line by
// line (coincident lines are allowed and merge), refined by least squares and
// ranked; when several trees reproduce the peaks they are all reported.
#pragma once

#include <string>
#include <vector>

namespace vicinal::spin {

struct PeakList {
  std::vector<double> hz;         // peak positions
  std::vector<double> intensity;  // empty, or one per peak (any scale)
};

struct CouplingGroup {
  double j_hz = 0;
  int partners = 1;  // equivalent spin-1/2 neighbours: 1 d, 2 t, 3 q, ...
};

struct PredictedPeak {
  double hz = 0;
  int lines = 1;     // coincident first-order lines in this peak
};

struct TreeFit {
  std::vector<CouplingGroup> groups;  // J descending
  double center_hz = 0;
  double residual_hz = 0;       // RMS distance of observed peaks from the refined tree
  double max_deviation_hz = 0;
  double intensity_error = -1;  // RMS relative intensity misfit; -1 when no intensities
  std::vector<PredictedPeak> peaks;  // one per observed peak, same order (ascending)

  int coupling_count() const;               // partners summed over groups
  std::vector<double> couplings_hz() const; // one entry per group, descending
  std::string multiplicity() const;         // "ddd", "td", "s"
  // Journal notation, e.g. "ddd, J = 11.8, 4.9, 2.1 Hz".
  std::string notation() const;
};

struct FirstOrderOptions {
  double tolerance_hz = 0.3;         // how far an observed peak may lie from its tree line
  double intensity_tolerance = 0.3;  // RMS relative misfit still called consistent
  int max_couplings = 7;             // partners in total (a 128-line multiplet)
  std::size_t max_results = 6;       // best tree plus alternatives
};

struct FirstOrderResult {
  std::vector<TreeFit> trees;  // best first; never empty
  bool ambiguous = false;      // another tree fits as well as the best one
  bool search_truncated = false;  // the search hit its node limit; rarer trees may be missing
};

// Peaks must number at least two, be finite and distinct within the
// tolerance; no tree within tolerance is a vicinal::Error with a hint.
FirstOrderResult analyse_first_order(const PeakList& peaks, const FirstOrderOptions& options = {});

// Multiplicity letters for a number of equivalent partners: d, t, q, quint, sext, sept, oct.
std::string multiplicity_letter(int partners);

}  // namespace vicinal::spin
