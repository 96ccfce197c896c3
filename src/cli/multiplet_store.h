// `multiplet analyse --store`: the couplings read from a multiplet go into the
// coupling library as a measurement of a compound already stored there.
#pragma once

#include <optional>
#include <string>

#include <CLI/CLI.hpp>

#include "cli/command.h"
#include "spin/first_order.h"

namespace vicinal::cli {

struct MultipletStoreOptions {
  std::string compound;  // name, InChIKey or id of a compound in the library
  std::string nucleus;   // the observed nucleus, e.g. H-3
  std::string partners;  // one partner per coupling, largest J first: "H-4a|H-4b,H-2,H-4b|H-4a"
  std::string measurement, solvent, source;
  std::optional<double> temperature_k;
  std::optional<double> sigma_hz;

  void add_options(CLI::App& command);
  bool requested() const { return !compound.empty(); }
};

// Stores the reading; returns a one-line summary for the terminal.
// `field_mhz` and `origin` (the peak file) are recorded with the measurement.
std::string store_multiplet(const MultipletStoreOptions& options, const spin::TreeFit& reading,
                            std::optional<double> field_mhz, const std::string& origin, const Globals& g);

}  // namespace vicinal::cli
