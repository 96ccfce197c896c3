// vicinal library init     create a coupling library (or bring one up to date)
#include <fmt/format.h>

#include <filesystem>

#include "cli/command.h"
#include "cli/library_common.h"
#include "library/schema.h"

namespace vicinal::cli {

namespace {

void setup(CLI::App& root, Globals& g) {
  auto* cmd = library_group(root).add_subcommand("init", "Create an empty coupling library");
  cmd->footer("Example: vicinal --library group.sqlite library init\n"
              "The library is one SQLite file (default: $VICINAL_LIBRARY, else\n"
              "~/.local/share/vicinal/library.sqlite). Running init on an existing library\n"
              "changes nothing except upgrading an older schema (after a backup copy).");
  cmd->callback([&g] {
    const bool existed = std::filesystem::exists(g.library_path());
    auto lib = open_library(g, true);
    const int version = lib->db().user_version();
    if (g.json) {
      g.print_json({{"library", lib->path()}, {"created", !existed}, {"schema_version", version}});
      return;
    }
    g.print(fmt::format("{} {} (schema version {})", existed ? "library already present:" : "created library", lib->path(),
                        version));
  });
}

const bool registered = register_command(10, setup);

}  // namespace

}  // namespace vicinal::cli
