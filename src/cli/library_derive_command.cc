// vicinal library derive     store the dihedral intervals each 3J coupling allows
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/library_common.h"
#include "karplus/karplus.h"
#include "library/derived.h"
#include "library/query.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string compound;
  std::string set = "auto";
};

void run_derive(const Options& o, const Globals& g) {
  // A misspelt --set would otherwise skip every coupling as "fits no set".
  if (o.set != "auto") karplus::SetCatalog::shipped().find(o.set);
  auto lib = open_library(g);
  library::DeriveOptions options;
  options.set_choice = o.set;
  if (!o.compound.empty()) options.compound_id = library::find_compound(lib->db(), o.compound);
  auto progress = g.progress();
  const auto report = library::derive_dihedral_intervals(lib->db(), options, *progress);
  if (g.json) {
    g.print_json({{"couplings_derived", report.couplings_derived},
                  {"intervals_stored", report.rows_written},
                  {"coverage_k", library::kDerivedCoverage},
                  {"skipped", report.skipped}});
    return;
  }
  report::TextTable t({"", "couplings"});
  t.add_row({"dihedral intervals stored for", std::to_string(report.couplings_derived)});
  for (const auto& [reason, count] : report.skipped) t.add_row({"skipped: " + reason, std::to_string(count)});
  g.print(t.render() + fmt::format("{} interval rows written (k = {:g}); see them with 'vicinal library show'\n",
                                   report.rows_written, library::kDerivedCoverage));
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<Options>();
  auto* cmd = library_group(root).add_subcommand("derive", "Store the dihedral intervals each 3J coupling allows");
  cmd->add_option("compound", o->compound, "Only this compound (name, InChIKey or id; default: all)");
  cmd->add_option("--set", o->set,
                  "Karplus set for couplings without a preferred set of their own ('auto': chosen by path)")
      ->capture_default_str();
  cmd->footer(
      "Example: vicinal library derive --set hh-haasnoot-1980-general\n"
      "For every 3J coupling: the dihedral intervals where |J(curve) - J| <= 2 sqrt(sigma^2 + rms^2)\n"
      "(as 'vicinal karplus angles' with --k 2), rms being the set's own error, computed on the\n"
      "stored structure (Haasnoot substituents from its 3D geometry). A coupling's own preferred\n"
      "set wins over --set. Deriving again with a set replaces that set's intervals; intervals\n"
      "from other sets stay. Couplings that are not 3J, stereo-unassigned, fit no set or whose\n"
      "J the curve cannot reach are skipped and counted.");
  cmd->callback([o, &g] { run_derive(*o, g); });
}

const bool registered = register_command(19, setup);

}  // namespace

}  // namespace vicinal::cli
