#include "cli/library_common.h"

#include <fmt/format.h>

#include <filesystem>

#include "report/table.h"

namespace vicinal::cli {

namespace {

std::string optional_text(const std::optional<double>& v) { return v ? fmt::format("{}", *v) : "-"; }

}  // namespace

CLI::App& library_group(CLI::App& root) {
  return command_group(root, "library",
                       "The group's coupling library (SQLite): import, search, show, merge, check, back up");
}

std::unique_ptr<library::Library> open_library(const Globals& g, bool create) {
  // A new library is announced by the command itself (init, import).
  const std::string path = g.library_path();
  std::unique_ptr<library::Library> lib;
  if (create && !std::filesystem::exists(path)) {
    lib = library::Library::create(path);
  } else {
    lib = std::make_unique<library::Library>(path, g.progress().get());
  }
  const auto& up = lib->upgrade_report();
  if (up.from_version > 0 && up.from_version != up.to_version)
    g.note(fmt::format("upgraded the library from schema version {} to {}; the old file is kept as {}",
                       up.from_version, up.to_version, up.backup_path));
  return lib;
}

void report_store(const Globals& g, const library::StoreReport& r, Json& doc) {
  doc["compounds_added"] = r.compounds_added;
  doc["compounds_already_present"] = r.compounds_known;
  doc["sets_added"] = r.sets_added;
  doc["sets_already_present"] = r.sets_known;
  doc["couplings_added"] = r.couplings_added;
  doc["couplings_already_present"] = r.couplings_duplicate;
  doc["conflicts"] = Json::array();
  for (const auto& c : r.conflicts) {
    Json j = {{"compound", c.compound}, {"inchikey", c.inchikey},    {"set", c.set_name},
              {"nuclei", c.nuclei},     {"stored_j_hz", c.stored_j_hz}, {"stored_origin", c.stored_origin},
              {"new_j_hz", c.new_j_hz}, {"new_origin", c.new_origin}};
    j["stored_sigma_hz"] = c.stored_sigma_hz ? Json(*c.stored_sigma_hz) : Json();
    j["new_sigma_hz"] = c.new_sigma_hz ? Json(*c.new_sigma_hz) : Json();
    doc["conflicts"].push_back(std::move(j));
  }
  if (g.json) return;
  report::TextTable t({"", "added", "already present"});
  t.add_row({"compounds", std::to_string(r.compounds_added), std::to_string(r.compounds_known)});
  t.add_row({"measurement sets", std::to_string(r.sets_added), std::to_string(r.sets_known)});
  t.add_row({"couplings", std::to_string(r.couplings_added), std::to_string(r.couplings_duplicate)});
  std::string text = t.render();
  if (!r.conflicts.empty()) {
    report::TextTable c({"compound", "set", "nuclei", "stored J/Hz", "stored sigma", "from", "new J/Hz", "new sigma", "from"});
    for (const auto& x : r.conflicts)
      c.add_row({x.compound, x.set_name, x.nuclei, fmt::format("{}", x.stored_j_hz), optional_text(x.stored_sigma_hz),
                 x.stored_origin, fmt::format("{}", x.new_j_hz), optional_text(x.new_sigma_hz), x.new_origin});
    text += fmt::format("\n{} conflicting value{} kept side by side (nothing was overwritten):\n", r.conflicts.size(),
                        r.conflicts.size() == 1 ? "" : "s") +
            c.render();
  }
  g.print(text);
}

}  // namespace vicinal::cli
