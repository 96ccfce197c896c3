#include "library/store.h"

#include <fmt/format.h>

#include <deque>
#include <filesystem>
#include <map>
#include <set>

#include "core/atomic_file.h"
#include "core/error.h"
#include "library/coupling_inserter.h"
#include "library/coupling_row.h"
#include "library/derived.h"
#include "library/fingerprint.h"
#include "library/rekey.h"
#include "structure/atom_labels.h"

namespace vicinal::library {

namespace {

// Re-expresses a nucleus text ("H-2|H-3") for the stored compound: a reference
// is kept when the stored labels give it the same atom, else it becomes
// element + stored index ("H7").
std::string restate_nucleus(const std::string& text, const std::vector<int>& atoms,
                            const std::map<std::string, int>& stored_labels,
                            const std::map<int, std::string>& stored_elements) {
  std::vector<std::string> refs;
  std::size_t start = 0;
  for (;;) {
    const auto bar = text.find('|', start);
    refs.push_back(text.substr(start, bar == std::string::npos ? std::string::npos : bar - start));
    if (bar == std::string::npos) break;
    start = bar + 1;
  }
  std::string out;
  for (std::size_t i = 0; i < atoms.size(); ++i) {
    const auto it = i < refs.size() ? stored_labels.find(refs[i]) : stored_labels.end();
    const std::string ref = it != stored_labels.end() && it->second == atoms[i]
                                ? refs[i]
                                : fmt::format("{}{}", stored_elements.at(atoms[i]), atoms[i]);
    out += (out.empty() ? "" : "|") + ref;
  }
  return out;
}

struct StoredCoupling {
  double j_hz;
  std::optional<double> sigma_hz;
  bool sign_known;
  std::string_view origin;
};

}  // namespace

Library::Library(std::unique_ptr<Database> db, std::string path) : db_(std::move(db)), path_(std::move(path)) {
  upgrade(nullptr);
}

Library::Library(const std::string& path, Progress* upgrade_progress) : path_(path) {
  std::error_code ec;
  if (!std::filesystem::exists(path, ec))
    throw Error("the library does not exist", {path}, "create it with 'vicinal library init' or check --library");
  if (std::filesystem::is_regular_file(path, ec) && std::filesystem::file_size(path, ec) == 0)
    throw Error("the library file is empty", {path}, "create a library with 'vicinal library init' or check --library");
  db_ = std::make_unique<Database>(path, Database::Mode::ReadWrite);
  upgrade(upgrade_progress);
}

void Library::upgrade(Progress* progress) {
  upgrade_ = upgrade_schema(*db_, [this, progress](int from_version) {
    insert_missing_fingerprints();
    NoProgress quiet;
    if (from_version < kCurrentKeysVersion) rekey_stored_couplings(*db_, progress ? *progress : quiet);
  });
}

std::unique_ptr<Library> Library::create(const std::string& path) {
  const auto folder = std::filesystem::path(path).parent_path();
  if (!folder.empty()) create_output_folder(folder);
  return std::unique_ptr<Library>(
      new Library(std::make_unique<Database>(path, Database::Mode::ReadWriteCreate), path));
}

int Library::insert_missing_fingerprints() {
  Statement missing(*db_,
                    "SELECT c.id, c.smiles FROM compounds c LEFT JOIN compound_fingerprints f ON f.compound_id = c.id "
                    "WHERE f.compound_id IS NULL");
  Statement insert(*db_, "INSERT INTO compound_fingerprints (compound_id, kind, bits) VALUES (?, ?, ?)");
  std::vector<std::pair<std::int64_t, std::string>> todo;
  while (missing.step()) todo.emplace_back(missing.integer(0), missing.text(1));
  for (const auto& [id, smiles] : todo) {
    insert.bind(1, id).bind(2, kFingerprintKind).bind_blob(3, compound_fingerprint(smiles));
    insert.run();
  }
  return static_cast<int>(todo.size());
}

StoreReport Library::store(const std::vector<Entry>& entries, Progress& progress) {
  std::size_t total = 0;
  for (const auto& e : entries)
    for (const auto& s : e.sets) total += s.couplings.size();
  progress.start("storing couplings", total);
  StoreTransaction tx(*this, &progress);
  tx.add(entries);
  auto report = tx.commit();
  progress.finish();
  return report;
}

// What a store transaction keeps between batches: its statements, its report,
// and which compounds and sets it created itself.
struct StoreTransaction::Session {
  Session(Database& db, Progress* progress)
      : db(db),
        progress(progress),
        tx(db),
        find_compound(db, "SELECT id, name FROM compounds WHERE inchikey = ?"),
        same_molfile(db, "SELECT molfile = ?2 FROM compounds WHERE id = ?1"),
        insert_compound(db, "INSERT INTO compounds (name, smiles, inchi, inchikey, molfile) VALUES (?, ?, ?, ?, ?)"),
        touch_compound(db, "UPDATE compounds SET updated_utc = strftime('%Y-%m-%dT%H:%M:%SZ', 'now') WHERE id = ?"),
        insert_atom(db, "INSERT INTO atoms (compound_id, atom_index, element, canonical_rank) VALUES (?, ?, ?, ?)"),
        insert_label(db, "INSERT INTO atom_labels (compound_id, label, atom_index) VALUES (?, ?, ?)"),
        read_atoms(db, "SELECT atom_index, element, canonical_rank FROM atoms WHERE compound_id = ?"),
        read_labels(db, "SELECT label, atom_index FROM atom_labels WHERE compound_id = ?"),
        read_sets(db,
                  "SELECT id, name, solvent, temperature_k, field_mhz, ph, instrument, method, measured_by, "
                  "measured_on, source FROM measurement_sets WHERE compound_id = ?"),
        insert_set(db,
                   "INSERT INTO measurement_sets (compound_id, name, solvent, temperature_k, field_mhz, ph, "
                   "instrument, method, measured_by, measured_on, source, imported_from) "
                   "VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)"),
        read_couplings(db, "SELECT identity, j_hz, sigma_hz, sign_known, origin FROM couplings WHERE set_id = ?"),
        find_note(db, "SELECT 1 FROM notes WHERE compound_id IS ? AND set_id IS ? AND text = ?"),
        insert_note(db, "INSERT INTO notes (compound_id, set_id, text) VALUES (?, ?, ?)"),
        insert_fingerprint(db, "INSERT INTO compound_fingerprints (compound_id, kind, bits) VALUES (?, ?, ?)"),
        couplings(db),
        derived(db) {}

  void add_note(std::optional<std::int64_t> compound, std::optional<std::int64_t> set, const std::string& text) {
    find_note.bind(1, compound).bind(2, set).bind(3, text);
    const bool present = find_note.step();
    find_note.reset();
    if (present) return;
    insert_note.bind(1, compound).bind(2, set).bind(3, text);
    insert_note.run();
  }

  void add(const Entry& entry);

  Database& db;
  Progress* progress;
  WriteTransaction tx;
  Statement find_compound, same_molfile, insert_compound, touch_compound, insert_atom, insert_label, read_atoms,
      read_labels, read_sets, insert_set, read_couplings, find_note, insert_note, insert_fingerprint;
  CouplingInserter couplings;
  DerivedRowWriter derived;
  StoreReport report;
  std::size_t done = 0;
  // Compounds this transaction inserted: a later batch of the same structure
  // (the same molfile, compared with the stored one rather than a copy kept
  // here, 3 kB a compound) continues them rather than meeting them as known.
  std::set<std::int64_t> added_compounds;
  // Compounds and sets already counted in the report, as added or as known.
  std::set<std::int64_t> counted_compounds, counted_sets;
};

StoreTransaction::StoreTransaction(Library& library, Progress* progress) {
  // A large file's transaction outgrows SQLite's default 2 MB page cache, which
  // then spills pages to the WAL mid-transaction and reads them back for every
  // index update (a third of the time at 100,000 rows). The cache only holds
  // pages the transaction touches; it is this connection's, not the file's.
  // 1 GB holds the 320 MB that 1,000,000 couplings take: with 256 MB, the
  // pages spilled and written again made that import 8% slower.
  library.db().exec("PRAGMA cache_size = -1048576");  // KiB: up to 1 GB
  // A statement that inserts many rows (CouplingInserter) keeps a journal of
  // the pages it changes, to undo just itself should a CHECK fail half-way; in
  // memory, not in a temporary file, where it multiplied the writes tenfold.
  library.db().exec("PRAGMA temp_store = MEMORY");
  session_ = std::make_unique<Session>(library.db(), progress);
}

StoreTransaction::~StoreTransaction() = default;

void StoreTransaction::add(const std::vector<Entry>& entries) {
  for (const auto& entry : entries) session_->add(entry);
}

StoreReport StoreTransaction::commit() {
  session_->tx.commit();
  return std::move(session_->report);
}

void StoreTransaction::Session::add(const Entry& entry) {
  const CompoundRecord& c = entry.compound;
  std::int64_t compound_id = 0;
  std::string stored_name = c.name;
  // Incoming atom index -> stored atom index (identity unless the compound
  // was stored before from a file with another numbering).
  std::vector<int> to_stored(c.atoms.size() + 1);
  for (std::size_t i = 0; i <= c.atoms.size(); ++i) to_stored[i] = static_cast<int>(i);
  std::map<std::string, int> stored_labels;
  std::map<int, std::string> stored_elements;
  bool known = false;

  find_compound.bind(1, c.inchikey);
  if (find_compound.step()) {
    known = true;
    compound_id = find_compound.integer(0);
    stored_name = find_compound.text(1);
  }
  find_compound.reset();
  if (known && added_compounds.count(compound_id)) {
    same_molfile.bind(1, compound_id).bind_in_place(2, c.molfile);
    known = !(same_molfile.step() && same_molfile.integer(0) == 1);
    same_molfile.reset();
  }

  if (compound_id == 0) {
    insert_compound.bind(1, c.name).bind(2, c.smiles).bind(3, c.inchi).bind(4, c.inchikey).bind(5, c.molfile);
    insert_compound.run();
    compound_id = db.last_insert_id();
    for (const auto& a : c.atoms) {
      insert_atom.bind(1, compound_id).bind(2, a.index).bind(3, a.element).bind(4, static_cast<std::int64_t>(a.canonical_rank));
      insert_atom.run();
    }
    for (const auto& [label, atom] : c.labels) {
      insert_label.bind(1, compound_id).bind(2, label).bind(3, atom);
      insert_label.run();
    }
    insert_fingerprint.bind(1, compound_id).bind(2, kFingerprintKind);
    insert_fingerprint.bind_blob(3, c.fingerprint ? *c.fingerprint : compound_fingerprint(c.smiles));
    insert_fingerprint.run();
    added_compounds.insert(compound_id);
    counted_compounds.insert(compound_id);
    ++report.compounds_added;
  } else if (known) {
    if (counted_compounds.insert(compound_id).second) ++report.compounds_known;
    std::map<unsigned, int> by_rank;
    read_atoms.bind(1, compound_id);
    while (read_atoms.step()) {
      const int index = static_cast<int>(read_atoms.integer(0));
      stored_elements[index] = read_atoms.text(1);
      by_rank[static_cast<unsigned>(read_atoms.integer(2))] = index;
    }
    read_atoms.reset();
    read_labels.bind(1, compound_id);
    while (read_labels.step()) stored_labels[read_labels.text(0)] = static_cast<int>(read_labels.integer(1));
    read_labels.reset();
    for (const auto& a : c.atoms) {
      auto it = by_rank.find(a.canonical_rank);
      if (it == by_rank.end() || stored_elements[it->second] != a.element || by_rank.size() != c.atoms.size())
        throw Error(fmt::format("compound '{}' has the InChIKey {} of the stored compound '{}', but its atoms "
                                "do not correspond (a tautomer or a different hydrogen count?)",
                                c.name, c.inchikey, stored_name),
                    {}, "store it under the structure already in the library");
      to_stored[a.index] = it->second;
    }
    touch_compound.bind(1, compound_id);
    touch_compound.run();
  }
  for (const auto& note : c.notes) add_note(compound_id, std::nullopt, note);

  // Sets of this compound already stored, with their couplings by identity.
  std::map<std::string, std::int64_t> stored_sets;
  read_sets.bind(1, compound_id);
  while (read_sets.step()) stored_sets.emplace(conditions_key(read_conditions(read_sets, 1)), read_sets.integer(0));
  read_sets.reset();

  for (const auto& set : entry.sets) {
    std::int64_t set_id = 0;
    // The set's couplings by identity: those stored before (their texts kept
    // in `stored_texts`) and those added from this entry (viewed in place).
    std::deque<std::string> stored_texts;
    std::multimap<std::string_view, StoredCoupling> present;
    const std::string set_key = conditions_key(set.conditions);
    if (auto it = stored_sets.find(set_key); it != stored_sets.end()) set_id = it->second;
    if (set_id != 0) {
      if (counted_sets.insert(set_id).second) ++report.sets_known;
      read_couplings.bind(1, set_id);
      while (read_couplings.step()) {
        const std::string& identity = stored_texts.emplace_back(read_couplings.text(0));
        const std::string& origin = stored_texts.emplace_back(read_couplings.text(4));
        present.emplace(identity, StoredCoupling{read_couplings.real(1), read_couplings.optional_real(2),
                                                 read_couplings.integer(3) != 0, origin});
      }
      read_couplings.reset();
    } else {
      const Conditions& k = set.conditions;
      insert_set.bind(1, compound_id).bind(2, k.name).bind(3, k.solvent).bind(4, k.temperature_k);
      insert_set.bind(5, k.field_mhz).bind(6, k.ph).bind(7, k.instrument).bind(8, k.method);
      insert_set.bind(9, k.measured_by).bind(10, k.measured_on).bind(11, k.source).bind(12, set.imported_from);
      insert_set.run();
      set_id = db.last_insert_id();
      stored_sets.emplace(set_key, set_id);
      counted_sets.insert(set_id);
      ++report.sets_added;
    }
    for (const auto& note : set.notes) add_note(std::nullopt, set_id, note);

    for (const auto& in : set.couplings) {
      if (progress) progress->advance(++done);
      const auto [first, last] = present.equal_range(in.identity);
      bool duplicate = false;
      for (auto it = first; it != last; ++it)
        duplicate |= it->second.j_hz == in.j_hz && it->second.sigma_hz == in.sigma_hz &&
                     it->second.sign_known == in.sign_known;
      if (duplicate) {
        ++report.couplings_duplicate;
        // Derived rows go to the stored coupling, which may still be queued.
        if (!in.derived.empty()) couplings.flush();
        derived.add_to_duplicate(set_id, in);
        continue;
      }
      if (first != last)
        report.conflicts.push_back({stored_name, c.inchikey, set.conditions.name, in.nucleus_a + "," + in.nucleus_b,
                                    first->second.j_hz, first->second.sigma_hz, std::string(first->second.origin),
                                    in.j_hz, in.sigma_hz, in.origin});
      auto map_atoms = [&](const std::vector<int>& atoms) {
        std::vector<int> out;
        for (int a : atoms) out.push_back(to_stored.at(static_cast<std::size_t>(a)));
        return out;
      };
      const auto atoms_a = map_atoms(in.atoms_a), atoms_b = map_atoms(in.atoms_b);
      CouplingInserter::Row row;
      row.set_id = set_id;
      row.record = &in;
      row.nucleus_a = known ? restate_nucleus(in.nucleus_a, atoms_a, stored_labels, stored_elements) : in.nucleus_a;
      row.nucleus_b = known ? restate_nucleus(in.nucleus_b, atoms_b, stored_labels, stored_elements) : in.nucleus_b;
      row.atoms_a = join_atoms(atoms_a, '|');
      row.atoms_b = join_atoms(atoms_b, '|');
      row.path = join_atoms(map_atoms(in.path), '-');
      if (in.derived.empty()) couplings.add(std::move(row));
      else derived.add(couplings.insert_now(std::move(row)), in.derived);
      present.emplace(in.identity, StoredCoupling{in.j_hz, in.sigma_hz, in.sign_known, in.origin});
      ++report.couplings_added;
    }
  }
  // Queued rows point into this entry's records.
  couplings.flush();
}

std::vector<Entry> read_other_library(const std::string& path) {
  if (!std::filesystem::exists(path)) throw Error("the library to merge does not exist", {path});
  Database other(path, Database::Mode::ReadOnly);
  const int version = other.user_version();
  if (version < 1) throw Error("the file is not a vicinal library", {path});
  if (version > current_schema_version())
    throw Error(fmt::format("the library is at schema version {}, newer than this vicinal understands ({})", version,
                            current_schema_version()),
                {path}, "use a newer vicinal");
  auto entries = read_entries(other);
  // Derived rows enter this library on the same terms as from an import file.
  for (const auto& e : entries)
    for (const auto& s : e.sets)
      for (const auto& c : s.couplings)
        for (std::size_t i = 0; i < c.derived.size(); ++i)
          check_derived(c.derived[i], path,
                        fmt::format("compound \"{}\", set \"{}\", coupling {},{}, derived[{}]", e.compound.name,
                                    s.conditions.name, c.nucleus_a, c.nucleus_b, i));
  if (version < kCurrentKeysVersion) rekey_entries(entries, path);
  return entries;
}

std::vector<Entry> read_entries(Database& db, const std::vector<std::int64_t>& wanted) {
  ReadTransaction snapshot(db);
  std::vector<std::int64_t> ids = wanted;
  if (ids.empty()) {
    Statement all(db, "SELECT id FROM compounds ORDER BY id");
    while (all.step()) ids.push_back(all.integer(0));
  }
  Statement compound(db, "SELECT name, smiles, inchi, inchikey, molfile FROM compounds WHERE id = ?");
  Statement atoms(db, "SELECT atom_index, element, canonical_rank FROM atoms WHERE compound_id = ? ORDER BY atom_index");
  Statement labels(db, "SELECT label, atom_index FROM atom_labels WHERE compound_id = ? ORDER BY label");
  Statement notes(db, "SELECT text FROM notes WHERE compound_id = ? ORDER BY id");
  Statement sets(db,
                 "SELECT id, name, solvent, temperature_k, field_mhz, ph, instrument, method, measured_by, "
                 "measured_on, source, imported_from FROM measurement_sets WHERE compound_id = ? ORDER BY id");
  // A compound's set notes, couplings and derived rows are read with one
  // query each, not one per set: a compound may have many sets.
  Statement set_notes(db,
                      "SELECT n.set_id, n.text FROM measurement_sets s JOIN notes n ON n.set_id = s.id "
                      "WHERE s.compound_id = ? ORDER BY n.id");
  Statement couplings(db, compound_couplings_query());
  DerivedRowReader derived(db);
  std::vector<Entry> out;
  for (const auto id : ids) {
    compound.bind(1, id);
    if (!compound.step()) {
      compound.reset();
      continue;
    }
    Entry e;
    auto& c = e.compound;
    c.name = compound.text(0);
    c.smiles = compound.text(1);
    c.inchi = compound.text(2);
    c.inchikey = compound.text(3);
    c.molfile = compound.text(4);
    compound.reset();
    atoms.bind(1, id);
    while (atoms.step())
      c.atoms.push_back({static_cast<int>(atoms.integer(0)), atoms.text(1), static_cast<unsigned>(atoms.integer(2))});
    atoms.reset();
    labels.bind(1, id);
    while (labels.step()) c.labels.emplace_back(labels.text(0), static_cast<int>(labels.integer(1)));
    labels.reset();
    notes.bind(1, id);
    while (notes.step()) c.notes.push_back(notes.text(0));
    notes.reset();
    std::map<std::int64_t, std::size_t> set_index;  // set id -> index in e.sets
    sets.bind(1, id);
    while (sets.step()) {
      SetRecord s;
      s.conditions = read_conditions(sets, 1);
      s.imported_from = sets.text(11);
      set_index.emplace(sets.integer(0), e.sets.size());
      e.sets.push_back(std::move(s));
    }
    sets.reset();
    set_notes.bind(1, id);
    while (set_notes.step()) e.sets[set_index.at(set_notes.integer(0))].notes.push_back(set_notes.text(1));
    set_notes.reset();
    auto derived_rows = derived.of_compound(id);
    couplings.bind(1, id);
    std::int64_t set_id = 0;
    std::vector<CouplingRecord>* into = nullptr;
    while (couplings.step()) {
      if (!into || couplings.integer(kCouplingColumnCount + 1) != set_id) {
        set_id = couplings.integer(kCouplingColumnCount + 1);
        into = &e.sets[set_index.at(set_id)].couplings;
      }
      into->push_back(read_coupling(couplings, 0));
      if (auto it = derived_rows.find(couplings.integer(kCouplingColumnCount)); it != derived_rows.end())
        into->back().derived = std::move(it->second);
    }
    couplings.reset();
    out.push_back(std::move(e));
  }
  return out;
}

}  // namespace vicinal::library
