// Pieces shared by the `karplus` commands: Haasnoot substituents from the
// command line, numbers with the option named in errors, plot output options.
#pragma once

#include <CLI/CLI.hpp>
#include <string>
#include <vector>

#include "cli/command.h"
#include "karplus/karplus.h"
#include "report/plot.h"

namespace vicinal::cli {

// "--substituent DCHI:SIGN", e.g. 1.26:+1 or 0.4:-; repeatable.
std::vector<karplus::Substituent> parse_substituents(const std::vector<std::string>& texts);
Json substituents_json(const std::vector<karplus::Substituent>& subs);

// A number given to `option`; errors name the option.
double parse_option_number(const std::string& text, const std::string& option, const std::string& example);

// Notes on stderr about how a set is used: a Haasnoot set with no substituents
// (the curve of an unsubstituted fragment), or a substituent count the set was
// not fitted for.
void note_substituent_use(const Globals& g, const karplus::ParameterSet& set, std::size_t given);

// --svg/--pdf/--png: where to write the figure, in any of the three formats.
struct PlotTargets {
  std::string svg, pdf, png;
  void add_options(CLI::App& app);
  bool any() const { return !svg.empty() || !pdf.empty() || !png.empty(); }
  // Each file name must end in its option's extension; checked before any work.
  void check() const;
  // Writes every requested file (each atomically); notes each path.
  void save(const report::Figure& figure, const Globals& g) const;
};

// x axis over one turn with ticks every 60 degrees.
void dihedral_axis(report::Figure& figure, const std::string& angle_name);

}  // namespace vicinal::cli
