#include "library/check.h"

#include <fmt/format.h>

namespace vicinal::library {

namespace {

// Each rule: a name and a query returning one text per offending row.
struct Rule {
  const char* name;
  const char* sql;
};

constexpr Rule kRules[] = {
    {"orphan atoms", "SELECT 'atom ' || compound_id || ':' || atom_index FROM atoms "
                     "WHERE compound_id NOT IN (SELECT id FROM compounds)"},
    {"orphan labels", "SELECT 'label ' || compound_id || ':' || label FROM atom_labels l WHERE NOT EXISTS "
                      "(SELECT 1 FROM atoms a WHERE a.compound_id = l.compound_id AND a.atom_index = l.atom_index)"},
    {"orphan sets", "SELECT 'set ' || id FROM measurement_sets WHERE compound_id NOT IN (SELECT id FROM compounds)"},
    {"orphan couplings", "SELECT 'coupling ' || id FROM couplings WHERE set_id NOT IN (SELECT id FROM measurement_sets)"},
    {"orphan derived results",
     "SELECT 'derived result ' || id FROM derived_results WHERE coupling_id NOT IN (SELECT id FROM couplings)"},
    {"orphan notes", "SELECT 'note ' || id FROM notes WHERE (compound_id IS NOT NULL AND compound_id NOT IN "
                     "(SELECT id FROM compounds)) OR (set_id IS NOT NULL AND set_id NOT IN (SELECT id FROM "
                     "measurement_sets)) OR (coupling_id IS NOT NULL AND coupling_id NOT IN (SELECT id FROM couplings))"},
    {"compounds without atoms",
     "SELECT 'compound ' || id || ' (' || name || ')' FROM compounds c WHERE NOT EXISTS "
     "(SELECT 1 FROM atoms a WHERE a.compound_id = c.id)"},
    {"J out of range", "SELECT 'coupling ' || id || ': J = ' || j_hz FROM couplings "
                       "WHERE typeof(j_hz) NOT IN ('real', 'integer') OR abs(j_hz) > 1000"},
    {"sigma out of range", "SELECT 'coupling ' || id || ': sigma = ' || sigma_hz FROM couplings "
                           "WHERE sigma_hz IS NOT NULL AND (typeof(sigma_hz) NOT IN ('real', 'integer') OR sigma_hz < 0)"},
    {"temperature out of range",
     "SELECT 'set ' || id || ': T = ' || temperature_k FROM measurement_sets WHERE temperature_k IS NOT NULL AND "
     "(typeof(temperature_k) NOT IN ('real', 'integer') OR temperature_k <= 0 OR temperature_k >= 1000)"},
    {"field out of range", "SELECT 'set ' || id || ': field = ' || field_mhz FROM measurement_sets WHERE field_mhz "
                           "IS NOT NULL AND (typeof(field_mhz) NOT IN ('real', 'integer') OR field_mhz <= 0)"},
    {"pH out of range", "SELECT 'set ' || id || ': pH = ' || ph FROM measurement_sets WHERE ph IS NOT NULL AND "
                        "(typeof(ph) NOT IN ('real', 'integer') OR ph < 0 OR ph > 14)"},
    {"nuclei not in the compound",
     "SELECT 'coupling ' || k.id || ': atoms ' || k.atoms_a || ',' || k.atoms_b FROM couplings k "
     "JOIN measurement_sets s ON s.id = k.set_id WHERE "
     "CAST(k.atoms_a AS INTEGER) < 1 OR CAST(k.atoms_b AS INTEGER) < 1 OR "
     "CAST(k.atoms_a AS INTEGER) > (SELECT max(atom_index) FROM atoms WHERE compound_id = s.compound_id) OR "
     "CAST(k.atoms_b AS INTEGER) > (SELECT max(atom_index) FROM atoms WHERE compound_id = s.compound_id)"},
    {"missing identity", "SELECT 'coupling ' || id FROM couplings WHERE identity = '' OR ranks_a = '' OR ranks_b = ''"},
    {"bond count disagrees with path",
     "SELECT 'coupling ' || id || ': path ' || path || ', ' || bond_count || ' bonds' FROM couplings "
     "WHERE length(path) - length(replace(path, '-', '')) <> bond_count"},
    {"missing fingerprints", "SELECT 'compound ' || id FROM compounds WHERE id NOT IN "
                             "(SELECT compound_id FROM compound_fingerprints)"},
};

}  // namespace

CheckReport check_library(Database& db) {
  CheckReport report;
  report.schema_version = db.user_version();
  ReadTransaction snapshot(db);
  {
    report.checks_run.push_back("integrity_check");
    Statement s(db, "PRAGMA integrity_check");
    while (s.step())
      if (s.text(0) != "ok") report.findings.push_back({"integrity_check", s.text(0)});
  }
  {
    report.checks_run.push_back("foreign_key_check");
    Statement s(db, "PRAGMA foreign_key_check");
    while (s.step())
      report.findings.push_back(
          {"foreign_key_check", fmt::format("{} row {} refers to a missing {} row", s.text(0), s.text(1), s.text(2))});
  }
  for (const auto& rule : kRules) {
    report.checks_run.push_back(rule.name);
    Statement s(db, rule.sql);
    while (s.step()) report.findings.push_back({rule.name, s.text(0)});
  }
  return report;
}

}  // namespace vicinal::library
