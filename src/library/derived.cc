#include "library/derived.h"

#include <fmt/format.h>

#include <memory>
#include <optional>
#include <set>
#include <string_view>

#include "core/error.h"
#include "karplus/karplus.h"
#include "library/entry_builder.h"
#include "library/records.h"
#include "predict/j_matrix.h"
#include "structure/atom_labels.h"

namespace vicinal::library {

namespace {

struct StoredPair {
  std::int64_t coupling_id = 0, compound_id = 0;
  std::vector<int> atoms_a, atoms_b;
  int bond_count = 0;
  double j_hz = 0;
  std::optional<double> sigma_hz;
  bool stereo_unassigned = false;
  std::string karplus_set;
};

// The stored structure of a compound, read once for all its couplings.
struct Structure {
  OpenBabel::OBMol mol;
  structure::AtomLabels labels;
};

// SQLite's strftime('%Y-%m-%dT%H:%M:%SZ'), the form created_utc is stored in.
bool is_utc_timestamp(const std::string& text) {
  constexpr std::string_view pattern = "dddd-dd-ddTdd:dd:ddZ";
  if (text.size() != pattern.size()) return false;
  for (std::size_t i = 0; i < pattern.size(); ++i) {
    const bool digit = text[i] >= '0' && text[i] <= '9';
    if (pattern[i] == 'd' ? !digit : text[i] != pattern[i]) return false;
  }
  return true;
}

}  // namespace

DeriveReport derive_dihedral_intervals(Database& db, const DeriveOptions& options, Progress& progress) {
  // One write transaction from reading to storing, so that no coupling can
  // vanish in between.
  WriteTransaction tx(db);
  std::vector<StoredPair> pairs;
  std::map<std::int64_t, std::string> molfiles;
  {
    Statement read(db,
                   "SELECT k.id, s.compound_id, k.atoms_a, k.atoms_b, k.bond_count, k.j_hz, k.sigma_hz, k.assignment, "
                   "k.karplus_set FROM couplings k JOIN measurement_sets s ON s.id = k.set_id "
                   "WHERE ?1 = 0 OR s.compound_id = ?1 ORDER BY s.compound_id, k.id");
    read.bind(1, options.compound_id);
    while (read.step()) {
      StoredPair p;
      p.coupling_id = read.integer(0);
      p.compound_id = read.integer(1);
      p.atoms_a = split_atoms(read.text(2), '|');
      p.atoms_b = split_atoms(read.text(3), '|');
      p.bond_count = static_cast<int>(read.integer(4));
      p.j_hz = read.real(5);
      p.sigma_hz = read.optional_real(6);
      p.stereo_unassigned = read.text(7) == "stereo-unassigned";
      p.karplus_set = read.text(8);
      pairs.push_back(std::move(p));
    }
    Statement molfile(db, "SELECT id, molfile FROM compounds WHERE ?1 = 0 OR id = ?1");
    molfile.bind(1, options.compound_id);
    while (molfile.step()) molfiles[molfile.integer(0)] = molfile.text(1);
  }

  DeriveReport report;
  std::vector<std::pair<std::int64_t, DerivedResult>> results;
  std::map<std::int64_t, std::unique_ptr<Structure>> structures;
  progress.start("deriving dihedral intervals", pairs.size());
  std::size_t done = 0;
  for (const auto& p : pairs) {
    progress.advance(++done);
    if (p.bond_count != 3) {
      ++report.skipped["not a 3J coupling"];
      continue;
    }
    if (p.stereo_unassigned) {
      ++report.skipped["stereo-unassigned (which atom is meant is not known)"];
      continue;
    }
    auto& s = structures[p.compound_id];
    if (!s) {
      s = std::make_unique<Structure>();
      const std::string source = fmt::format("the stored structure of compound {}", p.compound_id);
      s->mol = molecule_from_molfile(molfiles.at(p.compound_id), source);
      s->labels = structure::AtomLabels::from_sdf_field(s->mol, source);
    }
    predict::CouplingSpec spec;
    try {
      spec = predict::resolve_coupling(s->mol, s->labels,
                                       {std::to_string(p.atoms_a.front()), std::to_string(p.atoms_b.front())},
                                       p.karplus_set.empty() ? options.set_choice : p.karplus_set);
    } catch (const Error&) {
      ++report.skipped["no Karplus set fits its path"];
      continue;
    }
    karplus::AngleSolution solution;
    try {
      solution = karplus::allowed_dihedrals(*spec.set, p.j_hz, p.sigma_hz.value_or(0.0), kDerivedCoverage,
                                            spec.karplus_substituents);
    } catch (const Error&) {
      ++report.skipped["J outside what the set's curve reaches"];
      continue;
    }
    DerivedResult r{spec.set->id, {}};
    for (const auto& iv : solution.intervals) r.intervals.push_back({iv.from_deg, iv.to_deg});
    results.emplace_back(p.coupling_id, std::move(r));
  }

  Statement clear(db, "DELETE FROM derived_results WHERE coupling_id = ? AND karplus_set = ?");
  Statement insert(db, "INSERT INTO derived_results (coupling_id, karplus_set, from_deg, to_deg) VALUES (?, ?, ?, ?)");
  for (const auto& [id, r] : results) {
    clear.bind(1, id).bind(2, r.karplus_set);
    clear.run();
    for (const auto& iv : r.intervals) {
      insert.bind(1, id).bind(2, r.karplus_set).bind(3, iv.from_deg).bind(4, iv.to_deg);
      insert.run();
      ++report.rows_written;
    }
    ++report.couplings_derived;
  }
  tx.commit();
  progress.finish();
  return report;
}

std::vector<DerivedResult> by_karplus_set(const std::vector<DerivedRecord>& rows) {
  std::vector<DerivedResult> out;
  for (const auto& row : rows) {
    if (out.empty() || out.back().karplus_set != row.karplus_set) out.push_back({row.karplus_set, {}});
    out.back().intervals.push_back({row.from_deg, row.to_deg});
  }
  return out;
}

void check_derived(const DerivedRecord& row, const std::string& source, const std::string& context) {
  const auto& catalog = karplus::SetCatalog::shipped();
  try {
    catalog.find(row.karplus_set);
  } catch (const Error& e) {
    throw Error(e.what_happened(), Location::field_in(source, context + ".karplus_set"),
                e.hint() + "; a set of your own must be in $VICINAL_KARPLUS_DIR");
  }
  for (const auto& [key, deg] : {std::pair{"from_deg", row.from_deg}, std::pair{"to_deg", row.to_deg}})
    if (!(deg >= -180 && deg <= 180))
      throw Error(fmt::format("{} degrees is outside [-180, 180]", deg), Location::field_in(source, context + "." + key),
                  "an interval through +-180 is written as two, [from, 180] and [-180, to]");
  if (row.from_deg > row.to_deg)
    throw Error(fmt::format("the interval ends before it starts ({} > {})", row.from_deg, row.to_deg),
                Location::field_in(source, context + ".to_deg"),
                "give from_deg <= to_deg; an interval through +-180 is written as two, [from, 180] and [-180, to]");
  if (!row.created_utc.empty() && !is_utc_timestamp(row.created_utc))
    throw Error(fmt::format("'{}' is not a UTC time such as 2024-05-01T09:30:00Z", row.created_utc),
                Location::field_in(source, context + ".created_utc"));
}

DerivedRowReader::DerivedRowReader(Database& db)
    : read_(db,
            "SELECT d.coupling_id, d.karplus_set, d.from_deg, d.to_deg, d.created_utc FROM measurement_sets s "
            "JOIN couplings k ON k.set_id = s.id JOIN derived_results d ON d.coupling_id = k.id "
            "WHERE s.compound_id = ? ORDER BY d.coupling_id, d.karplus_set, d.from_deg, d.to_deg, d.id") {}

std::map<std::int64_t, std::vector<DerivedRecord>> DerivedRowReader::of_compound(std::int64_t compound_id) {
  std::map<std::int64_t, std::vector<DerivedRecord>> out;
  read_.bind(1, compound_id);
  while (read_.step())
    out[read_.integer(0)].push_back({read_.text(1), read_.real(2), read_.real(3), read_.text(4)});
  read_.reset();
  return out;
}

DerivedRowWriter::DerivedRowWriter(Database& db)
    : sets_present_(db, "SELECT DISTINCT karplus_set FROM derived_results WHERE coupling_id = ?"),
      insert_(db,
              "INSERT INTO derived_results (coupling_id, karplus_set, from_deg, to_deg, created_utc) VALUES "
              "(?1, ?2, ?3, ?4, COALESCE(NULLIF(?5, ''), strftime('%Y-%m-%dT%H:%M:%SZ', 'now')))"),
      find_duplicate_(db,
                      "SELECT id FROM couplings WHERE set_id = ? AND identity = ? AND j_hz = ? AND sigma_hz IS ? "
                      "AND sign_known = ? ORDER BY id LIMIT 1") {}

void DerivedRowWriter::add(std::int64_t coupling_id, const std::vector<DerivedRecord>& rows) {
  if (rows.empty()) return;
  std::set<std::string> present;
  sets_present_.bind(1, coupling_id);
  while (sets_present_.step()) present.insert(sets_present_.text(0));
  sets_present_.reset();
  for (const auto& r : rows) {
    if (present.count(r.karplus_set)) continue;
    insert_.bind(1, coupling_id).bind(2, r.karplus_set).bind(3, r.from_deg).bind(4, r.to_deg).bind(5, r.created_utc);
    insert_.run();
  }
}

void DerivedRowWriter::add_to_duplicate(std::int64_t set_id, const CouplingRecord& in) {
  if (in.derived.empty()) return;
  find_duplicate_.bind(1, set_id).bind(2, in.identity).bind(3, in.j_hz).bind(4, in.sigma_hz);
  find_duplicate_.bind(5, in.sign_known ? 1 : 0);
  const bool found = find_duplicate_.step();
  const std::int64_t id = found ? find_duplicate_.integer(0) : 0;
  find_duplicate_.reset();
  if (found) add(id, in.derived);
}

}  // namespace vicinal::library
