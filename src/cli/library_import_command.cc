// vicinal library import FILE     add measured couplings (CSV, JSON, SDF)
#include <fmt/format.h>

#include <filesystem>

#include "cli/command.h"
#include "cli/library_common.h"
#include "core/atomic_file.h"
#include "core/csv.h"
#include "library/import.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string file;
  bool skip_bad = false;
  std::string rejects;
};

// The outermost folder above `path` that does not exist yet (empty when
// its folder exists): what creating the library there would create.
std::filesystem::path first_missing_folder(const std::string& path) {
  std::filesystem::path missing;
  for (auto folder = std::filesystem::absolute(path).parent_path();
       !folder.empty() && !std::filesystem::exists(folder) && folder != folder.parent_path();
       folder = folder.parent_path())
    missing = folder;
  return missing;
}

// Removes a library this command created, with SQLite's side files and the
// folders made for it (up to `created_from`, each only if empty), so that a
// refused file leaves nothing behind.
void remove_created_library(const std::string& path, const std::filesystem::path& created_from) {
  std::error_code ignored;
  for (const char* suffix : {"", "-wal", "-shm", "-journal"}) std::filesystem::remove(path + suffix, ignored);
  if (created_from.empty()) return;
  for (auto folder = std::filesystem::absolute(path).parent_path();; folder = folder.parent_path()) {
    if (!std::filesystem::remove(folder, ignored) || folder == created_from) break;
  }
}

void run_import(const Options& o, const Globals& g) {
  library::ImportOptions options;
  options.skip_bad = o.skip_bad;
  const bool existed = std::filesystem::exists(g.library_path());
  const auto created_from = existed ? std::filesystem::path() : first_missing_folder(g.library_path());
  auto lib = open_library(g, true);
  auto progress = g.progress();
  library::ImportOutcome outcome;
  try {
    outcome = library::import_file(*lib, o.file, options, *progress, g.thread_count());
  } catch (...) {
    if (!existed) {
      lib.reset();
      remove_created_library(g.library_path(), created_from);
    }
    throw;
  }
  if (!existed) g.note(fmt::format("created the library {}", lib->path()));
  const auto& result = outcome.read;
  const auto& report = outcome.stored;

  Json doc = {{"file", o.file}, {"couplings_read", result.couplings}};
  if (!result.rejects.empty()) {
    const std::string path = o.rejects.empty() ? o.file + ".rejects.csv" : o.rejects;
    std::string text = "where,reason\n";
    for (const auto& r : result.rejects) text += csv_escape(r.where) + "," + csv_escape(r.reason) + "\n";
    write_file_atomically(path, text);
    doc["rejected"] = result.rejects.size();
    doc["rejects_file"] = path;
    g.note(fmt::format("{} row{} rejected; reasons in {}", result.rejects.size(),
                       result.rejects.size() == 1 ? "" : "s", path));
  }
  report_store(g, report, doc);
  if (g.json) g.print_json(doc);
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<Options>();
  auto* cmd = library_group(root).add_subcommand("import", "Add measured couplings from a CSV, JSON or SDF file");
  cmd->add_option("file", o->file, "Couplings file (.csv, .json or .sdf)")->required();
  cmd->add_flag("--skip-bad", o->skip_bad,
                "Store the good rows and write the bad ones, with reasons, to a reject file");
  cmd->add_option("--rejects", o->rejects, "Reject file for --skip-bad (default: FILE.rejects.csv)");
  cmd->footer(
      "Example: vicinal library import batch7.csv\n"
      "CSV columns: compound, one of smiles / structure (file path relative to the CSV)\n"
      "/ molfile, optional labels (label,atom CSV), inchikey (checked); the measurement:\n"
      "measurement (a name), solvent, temperature_k, field_mhz, ph, instrument, method,\n"
      "measured_by, measured_on, source; the coupling: nuclei (\"H-2,H-3\"; a|b for a\n"
      "stereo-unassigned pair), j_hz, sigma_hz, sign_known (yes/no), set, note.\n"
      "A row without a structure belongs to the compound of that name above it.\n"
      "A file is stored whole or not at all: the first bad row stops the import with\n"
      "its line, column and reason. A large file is stored while it is read (the\n"
      "reading, with the structure work, on a second thread unless --threads 1).\n"
      "Compounds are recognised by InChIKey and couplings by their atoms' canonical\n"
      "ranks, so a value seen before is not stored twice, and a different value for\n"
      "the same coupling is kept beside the old one and reported.\n"
      "JSON and SDF files written by library export also bring each coupling's derived\n"
      "dihedral intervals; a coupling keeps those it already has for a Karplus set.");
  cmd->callback([o, &g] { run_import(*o, g); });
}

const bool registered = register_command(11, setup);

}  // namespace

}  // namespace vicinal::cli
