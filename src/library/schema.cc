#include "library/schema.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>

#include "core/atomic_file.h"
#include "core/csv.h"
#include "core/data_dir.h"
#include "core/error.h"

namespace vicinal::library {

std::vector<Migration> shipped_migrations() {
  std::vector<Migration> list;
  const auto folder = data_file("schema");
  for (const auto& entry : std::filesystem::directory_iterator(folder)) {
    const auto name = entry.path().filename().string();
    if (entry.path().extension() != ".sql" || name.size() < 5 || !std::isdigit(name[0]) ||
        !std::isdigit(name[1]) || !std::isdigit(name[2]) || name[3] != '_')
      continue;
    list.push_back({std::stoi(name.substr(0, 3)), name, entry.path()});
  }
  std::sort(list.begin(), list.end(), [](const auto& a, const auto& b) { return a.version < b.version; });
  for (std::size_t i = 0; i < list.size(); ++i)
    if (list[i].version != static_cast<int>(i) + 1)
      throw Error(fmt::format("schema migrations are not numbered 1, 2, 3, ...: {}", list[i].name),
                  {folder.string()});
  if (list.empty()) throw Error("no schema migrations found", {folder.string()});
  return list;
}

int current_schema_version() { return static_cast<int>(shipped_migrations().size()); }

std::string pre_upgrade_backup_path(const std::string& library_path, int version) {
  std::filesystem::path p(library_path);
  return (p.parent_path() / fmt::format("{}.v{}.backup{}", p.stem().string(), version, p.extension().string()))
      .string();
}

UpgradeReport upgrade_schema(Database& db, const std::function<void(int from_version)>& complete) {
  const auto migrations = shipped_migrations();
  const int target = static_cast<int>(migrations.size());
  UpgradeReport report;
  report.from_version = report.to_version = db.user_version();
  if (report.from_version > target)
    throw Error(fmt::format("the library is at schema version {}, newer than this vicinal understands ({})",
                            report.from_version, target),
                {db.path()}, "use a newer vicinal to open it");
  if (report.from_version == target) return report;

  if (report.from_version == 0) {
    Statement tables(db, "SELECT count(*) FROM sqlite_master");
    tables.step();
    if (tables.integer(0) != 0)
      throw Error("the file is an SQLite database but not a vicinal library", {db.path()},
                  "point --library at a vicinal library or a new file");
  } else {
    report.backup_path = pre_upgrade_backup_path(db.path(), report.from_version);
    if (!std::filesystem::exists(report.backup_path))
      write_via_temporary(report.backup_path,
                          [&](const std::filesystem::path& temporary) { db.backup_to(temporary.string()); });
  }

  // All pending migrations in one transaction: an interrupted upgrade leaves
  // the old version or the whole new one, never a version in between.
  WriteTransaction tx(db);
  // Another process may have upgraded the file while we waited for the lock.
  const int found = db.user_version();
  for (const auto& m : migrations) {
    if (m.version <= found) continue;
    db.exec(read_text_file(m.path.string()));
    db.exec(fmt::format("PRAGMA user_version = {}", m.version));  // an int; PRAGMA takes no bound parameters
  }
  if (found < target && complete) complete(found);
  tx.commit();
  report.to_version = db.user_version();
  return report;
}

}  // namespace vicinal::library
