// The library file: opening (with schema upgrades), storing entries with the
// identity rules, and reading entries back. Every write is one transaction:
// a file's content is stored whole or not at all.
#pragma once

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/progress.h"
#include "library/records.h"
#include "library/schema.h"
#include "library/sqlite.h"

namespace vicinal::library {

// Two different values for the same coupling (same compound, same conditions,
// same nuclei by identity): both are kept, and the clash is reported.
struct Conflict {
  std::string compound, inchikey, set_name, nuclei;
  double stored_j_hz = 0;
  std::optional<double> stored_sigma_hz;
  std::string stored_origin;
  double new_j_hz = 0;
  std::optional<double> new_sigma_hz;
  std::string new_origin;
};

struct StoreReport {
  int compounds_added = 0, compounds_known = 0;
  int sets_added = 0, sets_known = 0;
  int couplings_added = 0, couplings_duplicate = 0;
  std::vector<Conflict> conflicts;
};

// Entries of the given compounds (all when empty) of any library at schema
// version 1 or later, in id order; one consistent snapshot.
std::vector<Entry> read_entries(Database& db, const std::vector<std::int64_t>& compound_ids = {});

// Entries of another library file, opened read-only and left untouched (for
// merging). vicinal::Error when it is not a library or newer than this program.
std::vector<Entry> read_other_library(const std::string& path);

class Library {
 public:
  // Opens an existing library. An older schema is upgraded, after a backup
  // copy beside it, even for reading: queries need the current tables.
  // vicinal::Error when the file is missing, not a library, or newer than
  // this program.
  // An empty file is refused too (SQLite would take it for a new database).
  // `upgrade_progress` shows the long part of an upgrade (keys recomputed
  // for every compound), if any.
  explicit Library(const std::string& path, Progress* upgrade_progress = nullptr);
  // Creates the file if needed and brings it to the current schema.
  static std::unique_ptr<Library> create(const std::string& path);

  Database& db() { return *db_; }
  const std::string& path() const { return path_; }
  const UpgradeReport& upgrade_report() const { return upgrade_; }

  // Stores entries in one transaction (StoreTransaction, one batch).
  StoreReport store(const std::vector<Entry>& entries, Progress& progress);

  // Entries of the given compounds (all when empty), in id order.
  std::vector<Entry> read_entries(const std::vector<std::int64_t>& compound_ids = {}) {
    return library::read_entries(*db_, compound_ids);
  }

 private:
  // Fills compound_fingerprints for compounds that have none (libraries
  // upgraded from version 1) inside the caller's write transaction.
  int insert_missing_fingerprints();
  // Brings the file to the current schema; what SQL cannot do (fingerprints,
  // identity keys recomputed) runs in the last migration's transaction.
  void upgrade(Progress* progress);
  Library(std::unique_ptr<Database> db, std::string path);
  std::unique_ptr<Database> db_;
  std::string path_;
  UpgradeReport upgrade_;
};

// One write transaction that takes entries in batches, so that a large file
// is stored while it is still being read. Compounds are matched by InChIKey
// (the incoming atom numbering is mapped onto the stored one through canonical
// ranks), sets by their full conditions, couplings by identity key: equal
// values are duplicates, different ones are kept side by side as conflicts.
// A compound or set may continue in a later batch; it is counted once, as
// added. Nothing is visible to others until commit(); destroying an
// uncommitted transaction rolls it all back.
class StoreTransaction {
 public:
  // A given progress gets advance(couplings handled so far); the caller
  // starts and finishes it.
  explicit StoreTransaction(Library& library, Progress* progress = nullptr);
  ~StoreTransaction();
  StoreTransaction(const StoreTransaction&) = delete;
  StoreTransaction& operator=(const StoreTransaction&) = delete;

  void add(const std::vector<Entry>& entries);
  StoreReport commit();

 private:
  struct Session;
  std::unique_ptr<Session> session_;
};

}  // namespace vicinal::library
