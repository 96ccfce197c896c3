// vicinal library merge OTHER.sqlite     bring another group's library into this one
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/library_common.h"
#include "library/store.h"

namespace vicinal::cli {

namespace {

void setup(CLI::App& root, Globals& g) {
  auto other = std::make_shared<std::string>();
  auto* cmd = library_group(root).add_subcommand("merge", "Merge another library file into this one");
  cmd->add_option("other", *other, "The library to merge from (read only, left unchanged)")->required();
  cmd->footer("Example: vicinal --library ours.sqlite library merge theirs.sqlite\n"
              "Compounds are matched by InChIKey, measurement sets by all their conditions and\n"
              "couplings by their atoms' canonical ranks. Equal values are not stored twice; a\n"
              "different value for the same coupling is stored beside ours with its origin and\n"
              "listed. Derived dihedral intervals come along; a coupling keeps those it already\n"
              "has for a Karplus set. The merge is one transaction: all of it is stored or none.");
  cmd->callback([other, &g] {
    auto entries = library::read_other_library(*other);
    for (auto& e : entries)
      for (auto& s : e.sets) {
        if (s.imported_from.empty()) s.imported_from = *other;
        for (auto& c : s.couplings)
          if (c.origin.empty()) c.origin = *other;
      }
    auto lib = open_library(g);
    auto progress = g.progress();
    const auto report = lib->store(entries, *progress);
    Json doc = {{"library", lib->path()}, {"merged_from", *other}};
    report_store(g, report, doc);
    if (g.json) g.print_json(doc);
  });
}

const bool registered = register_command(18, setup);

}  // namespace

}  // namespace vicinal::cli
