// vicinal library export FILE     write the library (or some compounds) to CSV, JSON or SDF
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/library_common.h"
#include "library/formats.h"
#include "library/query.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string file;
  std::vector<std::string> compounds;
};

void run_export(const Options& o, const Globals& g) {
  library::exchange_format(o.file);  // refuse an unknown extension before any work
  auto lib = open_library(g);
  std::vector<std::int64_t> ids;
  for (const auto& c : o.compounds) ids.push_back(library::find_compound(lib->db(), c));
  const auto entries = lib->read_entries(ids);
  library::write_exchange_file(entries, o.file);
  std::size_t couplings = 0, derived = 0;
  for (const auto& e : entries)
    for (const auto& s : e.sets) {
      couplings += s.couplings.size();
      for (const auto& c : s.couplings) derived += c.derived.size();
    }
  if (derived > 0 && library::exchange_format(o.file) == "csv")
    g.note(fmt::format("{} derived dihedral interval{} left out: CSV has no place for them (export to .json or .sdf)",
                       derived, derived == 1 ? "" : "s"));
  if (g.json) {
    g.print_json({{"file", o.file}, {"compounds", entries.size()}, {"couplings", couplings}});
    return;
  }
  g.print(fmt::format("wrote {} compound{} with {} coupling{} to {}", entries.size(), entries.size() == 1 ? "" : "s",
                      couplings, couplings == 1 ? "" : "s", o.file));
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<Options>();
  auto* cmd = library_group(root).add_subcommand("export", "Write the library to a CSV, JSON or SDF file");
  cmd->add_option("file", o->file, "Output file; its extension (.csv, .json, .sdf) chooses the format")->required();
  cmd->add_option("--compound", o->compounds, "Only this compound (name, InChIKey or id; repeatable)");
  cmd->footer("Example: vicinal library export everything.json\n"
              "Structures are written as molfiles with their atom numbering and labels, so\n"
              "importing the file into an empty library gives the same content back. CSV and\n"
              "SDF carry the couplings and conditions; JSON also carries compound and set notes.\n"
              "JSON and SDF also carry the derived dihedral intervals (library derive); CSV,\n"
              "one row per coupling, has no place for them and leaves them out.");
  cmd->callback([o, &g] { run_export(*o, g); });
}

const bool registered = register_command(12, setup);

}  // namespace

}  // namespace vicinal::cli
