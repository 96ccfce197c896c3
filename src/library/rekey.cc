#include "library/rekey.h"

#include <cstdint>
#include <string>

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

}  // namespace

int rekey_stored_couplings(Database& db) {
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
  for (const auto& compound : todo) {
    CompoundIdentity identity(molecule_from_molfile(compound.molfile, "stored compound '" + compound.name + "'"),
                              compound.name);
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
  return changed;
}

void rekey_entries(std::vector<Entry>& entries) {
  for (auto& entry : entries) {
    CompoundIdentity identity(
        molecule_from_molfile(entry.compound.molfile, "stored compound '" + entry.compound.name + "'"),
        entry.compound.name);
    for (auto& set : entry.sets)
      for (auto& c : set.couplings) c.identity = rekeyed(identity, c.atoms_a, c.atoms_b, c.identity);
  }
}

}  // namespace vicinal::library
