// Library statistics: counts, and J distributions by fragment type (the
// elements along the coupling path, e.g. H-C-C-H), as numbers and as a
// histogram figure.
#pragma once

#include <string>
#include <vector>

#include "library/sqlite.h"
#include "report/plot.h"

namespace vicinal::library {

struct FragmentStats {
  std::string fragment;     // "H-C-C-H", written from the lighter end
  std::vector<double> j_hz; // every value, ascending
  double mean_hz = 0, sd_hz = 0, median_hz = 0;
};

struct LibraryStats {
  long compounds = 0, sets = 0, couplings = 0, conflicts = 0, stereo_unassigned = 0;
  long solvents = 0, sources = 0;
  std::vector<FragmentStats> fragments;  // most values first
};

LibraryStats library_stats(Database& db);

// Histogram of J for the `max_fragments` most common fragment types, 1 Hz bins.
report::Figure j_histogram(const LibraryStats& stats, std::size_t max_fragments = 4);

}  // namespace vicinal::library
