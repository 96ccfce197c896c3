// vicinal library backup FILE     consistent copy of the library while others use it
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/library_common.h"
#include "core/atomic_file.h"

namespace vicinal::cli {

namespace {

void setup(CLI::App& root, Globals& g) {
  auto file = std::make_shared<std::string>();
  auto* cmd = library_group(root).add_subcommand("backup", "Copy the library to a file, safely while it is in use");
  cmd->add_option("file", *file, "The copy to write (replaced if it exists)")->required();
  cmd->footer("Example: vicinal library backup /mnt/archive/couplings-2026-12.sqlite\n"
              "Uses SQLite's online backup: the copy is one consistent snapshot even while\n"
              "other vicinal processes read or import. The copy appears only when complete.");
  cmd->callback([file, &g] {
    auto lib = open_library(g);
    write_via_temporary(*file, [&](const std::filesystem::path& temporary) { lib->db().backup_to(temporary.string()); });
    if (g.json) {
      g.print_json({{"library", lib->path()}, {"backup", *file}});
      return;
    }
    g.print(fmt::format("backed up {} to {}", lib->path(), *file));
  });
}

const bool registered = register_command(17, setup);

}  // namespace

}  // namespace vicinal::cli
