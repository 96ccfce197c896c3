#include "library/rekey.h"

#include <fmt/format.h>

#include <cstdint>
#include <string>

#include "core/error.h"
#include "library/entry_builder.h"
#include "library/identity.h"

namespace vicinal::library {

namespace {

// The key the coupling between `a` and `b` gets now, keeping the "#n" that
// numbers stereo-unassigned couplings sharing a key within their set.
std::string rekeyed(CompoundIdentity& identity, const std::vector<int>& a, const std::vector<int>& b,
                    const std::string& old_key) {
  const auto hash = old_key.find('#');
  return identity.coupling_key(a, b) + (hash == std::string::npos ? "" : old_key.substr(hash));
}

// The identity of a compound from its stored molfile. A molfile that no
// longer reads means a damaged library: say so, not how to write an import.
CompoundIdentity stored_identity(const std::string& library, const std::string& name, const std::string& molfile) {
  try {
    return CompoundIdentity(molecule_from_molfile(molfile, library), name, CompoundIdentity::Names::KeysOnly);
  } catch (const Error& e) {
    throw Error(fmt::format("compound '{}': cannot recompute coupling keys: {}", name, e.what_happened()), {library},
                "the library holding it is damaged; nothing was changed");
  }
}

}  // namespace

int rekey_stored_couplings(Database& db, Progress& progress) {
  Statement compounds(db, "SELECT id, name, molfile FROM compounds ORDER BY id");
  Statement couplings(db,
                      "SELECT k.id, k.atoms_a, k.atoms_b, k.identity FROM couplings k "
                      "JOIN measurement_sets s ON s.id = k.set_id WHERE s.compound_id = ?");
  Statement update(db, "UPDATE couplings SET identity = ? WHERE id = ?");
  struct Todo {
    std::int64_t id;
    std::string name, molfile;
  };
  std::vector<Todo> todo;
  while (compounds.step()) todo.push_back({compounds.integer(0), compounds.text(1), compounds.text(2)});

  int changed = 0;
  progress.start("recomputing coupling keys", todo.size());
  std::size_t done = 0;
  for (const auto& compound : todo) {
    progress.advance(done++);
    CompoundIdentity identity = stored_identity(db.path(), compound.name, compound.molfile);
    std::vector<std::pair<std::int64_t, std::string>> updates;
    couplings.bind(1, compound.id);
    while (couplings.step()) {
      const std::string old_key = couplings.text(3);
      std::string key = rekeyed(identity, split_atoms(couplings.text(1), '|'), split_atoms(couplings.text(2), '|'), old_key);
      if (key != old_key) updates.emplace_back(couplings.integer(0), std::move(key));
    }
    couplings.reset();
    for (const auto& [id, key] : updates) {
      update.bind(1, key).bind(2, id);
      update.run();
    }
    changed += static_cast<int>(updates.size());
  }
  progress.finish();
  return changed;
}

void rekey_entries(std::vector<Entry>& entries, const std::string& library) {
  for (auto& entry : entries) {
    CompoundIdentity identity = stored_identity(library, entry.compound.name, entry.compound.molfile);
    for (auto& set : entry.sets)
      for (auto& c : set.couplings) c.identity = rekeyed(identity, c.atoms_a, c.atoms_b, c.identity);
  }
}

}  // namespace vicinal::library
