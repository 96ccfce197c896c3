// The library's exchange formats, chosen by file extension:
//   .csv   the couplings CSV (predict/coupling_list.h) plus compound and
//          condition columns (see kCsvColumns in csv_format.cc and DEVELOPERS.md)
//   .json  {"format": "vicinal-library", "version": 1, "compounds": [...]}
//   .sdf   one record per compound; its couplings in the data field
//          `vicinal_compound` (one line of JSON, the compound object without
//          the structure), atom labels in `vicinal_atom_labels`
// Export followed by import gives back the same library content; JSON and SDF
// also carry each coupling's derived results, CSV (one row per coupling) not.
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "core/progress.h"
#include "library/compound_cache.h"
#include "library/records.h"

namespace vicinal::library {

// Couplings and compounds per batch by default: large enough that files of
// everyday size come whole. The compound bound keeps a file of many compounds
// with few couplings each from holding tens of thousands of records in a batch.
inline constexpr std::size_t kBatchCouplings = 50000;
inline constexpr std::size_t kBatchCompounds = 2000;

struct ImportOptions {
  // Store the good rows and return the bad ones as rejects instead of failing
  // on the first bad row.
  bool skip_bad = false;
  // Limits of a batch handed to a sink (read_exchange_file); tests make them small.
  std::size_t batch_couplings = kBatchCouplings;
  std::size_t batch_compounds = kBatchCompounds;
  // Compounds kept whole while a CSV file is read (library/compound_cache.h);
  // tests make it small.
  std::size_t compounds_whole = CompoundCache::kWholeByDefault;
};

struct Reject {
  std::string where;   // file:line (CSV) or file: compound[i].sets[j]... (JSON, SDF)
  std::string reason;
};

struct ImportResult {
  std::vector<Entry> entries;
  std::vector<Reject> rejects;
  std::size_t couplings = 0;  // couplings read successfully
};

// Entries handed over while a file is still being read, so that a large file
// need not be held in memory whole. A compound or set may continue in a later
// batch. Stereo-unassigned rows come in the last batch, with every other such
// row of their set, as their identities are numbered within the set
// (number_unassigned_groups).
struct EntryBatch {
  std::vector<Entry> entries;
  // How far through the file the batch ends, and the whole (bytes for CSV,
  // couplings for JSON and SDF): for progress.
  std::size_t read_so_far = 0, file_total = 0;
  Progress::Unit unit = Progress::Unit::Items;
};
using EntrySink = std::function<void(EntryBatch&&)>;

// vicinal::Error (file, line, column and reason) on the first bad row unless
// options.skip_bad; then nothing is returned. With a sink, the entries go to
// it (CSV in batches, JSON and SDF whole) and the result holds none.
ImportResult read_exchange_file(const std::string& path, const ImportOptions& options, const EntrySink& sink = {});

ImportResult read_csv(const std::string& path, const ImportOptions& options, const EntrySink& sink = {});
ImportResult read_json(const std::string& path, const ImportOptions& options);
ImportResult read_sdf(const std::string& path, const ImportOptions& options);

std::string write_csv(const std::vector<Entry>& entries);
std::string write_json(const std::vector<Entry>& entries);
std::string write_sdf(const std::vector<Entry>& entries);

// Writes entries to `path` atomically in the format its extension names.
void write_exchange_file(const std::vector<Entry>& entries, const std::string& path);

// The format an extension names ("csv", "json", "sdf"); vicinal::Error otherwise.
std::string exchange_format(const std::string& path);

}  // namespace vicinal::library
