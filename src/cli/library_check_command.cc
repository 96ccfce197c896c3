// vicinal library check     integrity, foreign keys, orphans and value ranges
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/library_common.h"
#include "core/error.h"
#include "library/check.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

void setup(CLI::App& root, Globals& g) {
  auto* cmd = library_group(root).add_subcommand("check", "Check the library's integrity and values");
  cmd->footer("Example: vicinal library check\n"
              "Runs SQLite's integrity_check and foreign_key_check, then looks for rows that\n"
              "lost their parent, values outside physical ranges and atoms missing from their\n"
              "compound. Exit code 0 when healthy, 2 when anything was found.");
  cmd->callback([&g] {
    auto lib = open_library(g);
    const auto report = library::check_library(lib->db());
    if (g.json) {
      Json doc = {{"library", lib->path()}, {"schema_version", report.schema_version},
                  {"checks", report.checks_run}, {"ok", report.ok()}, {"findings", Json::array()}};
      for (const auto& f : report.findings) doc["findings"].push_back({{"check", f.check}, {"detail", f.detail}});
      g.print_json(doc);
    } else if (report.ok()) {
      g.print(fmt::format("{}: schema version {}, {} checks, no problems", lib->path(), report.schema_version,
                          report.checks_run.size()));
    } else {
      report::TextTable t({"check", "finding"});
      for (const auto& f : report.findings) t.add_row({f.check, f.detail});
      g.print(t.render());
    }
    if (!report.ok())
      throw Error(fmt::format("the library check found {} problem{}", report.findings.size(),
                              report.findings.size() == 1 ? "" : "s"),
                  {lib->path()}, "restore from a backup, or export what is readable and import it anew");
  });
}

const bool registered = register_command(16, setup);

}  // namespace

}  // namespace vicinal::cli
