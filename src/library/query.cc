#include "library/query.h"

#include <fmt/format.h>
#include <openbabel/mol.h>
#include <openbabel/obconversion.h>
#include <openbabel/parsmart.h>

#include <algorithm>
#include <cctype>
#include <map>
#include <functional>
#include <set>

#include "core/error.h"
#include "core/parse.h"
#include "library/coupling_row.h"
#include "library/fingerprint.h"
#include "structure/openbabel_log.h"

namespace vicinal::library {

namespace {

// The compounds whose structure contains the SMARTS.
std::set<std::int64_t> substructure_matches(Database& db, const FindQuery& query, FindResult& result) {
  structure::LogCapture quiet;
  OpenBabel::OBSmartsPattern pattern;
  if (!pattern.Init(query.smarts))
    throw Error(fmt::format("Open Babel cannot read the SMARTS '{}'", query.smarts),
                Location::field_in("", "--smarts"), "check brackets and atom symbols");
  const auto screen = query.fingerprint_screen ? query_fingerprint(query.smarts) : std::nullopt;
  Statement s(db,
              "SELECT c.id, c.smiles, f.bits FROM compounds c LEFT JOIN compound_fingerprints f ON f.compound_id = c.id");
  std::set<std::int64_t> out;
  OpenBabel::OBConversion conv;
  conv.SetInFormat("smi");
  while (s.step()) {
    if (screen && !s.is_null(2) && !may_contain(s.blob(2), *screen)) {
      ++result.compounds_screened_out;
      continue;
    }
    OpenBabel::OBMol mol;
    if (!conv.ReadString(&mol, s.text(1))) continue;
    if (pattern.Match(mol, true)) out.insert(s.integer(0));
  }
  result.compounds_matched_smarts = out.size();
  return out;
}

}  // namespace

FindResult find_couplings(Database& db, const FindQuery& q) {
  ReadTransaction snapshot(db);
  FindResult result;
  std::optional<std::set<std::int64_t>> allowed;
  if (!q.smarts.empty()) allowed = substructure_matches(db, q, result);

  std::string from_where =
      " FROM couplings k JOIN measurement_sets s ON s.id = k.set_id JOIN compounds c ON c.id = s.compound_id WHERE 1";
  std::vector<std::function<void(Statement&, int)>> binders;
  auto add = [&](const std::string& clause, auto value) {
    from_where += " AND " + clause;
    binders.push_back([value](Statement& st, int i) { st.bind(i, value); });
  };
  if (allowed) {
    if (allowed->empty()) return result;
    // The matching compounds as a bound JSON array, so that SQLite reads only
    // their couplings instead of every coupling in the library.
    std::string ids;
    for (const auto id : *allowed) ids += (ids.empty() ? "[" : ",") + std::to_string(id);
    add("c.id IN (SELECT value FROM json_each(?))", ids + "]");
  }
  if (!q.name.empty()) add("instr(lower(c.name), lower(?)) > 0", q.name);
  if (!q.inchikey.empty()) {
    if (q.inchikey.size() == 14) add("substr(c.inchikey, 1, 14) = ?", q.inchikey);
    else add("c.inchikey = ?", q.inchikey);
  }
  if (q.j_min_hz) add("k.j_hz >= ?", *q.j_min_hz);
  if (q.j_max_hz) add("k.j_hz <= ?", *q.j_max_hz);
  if (q.bonds) add("k.bond_count = ?", static_cast<std::int64_t>(*q.bonds));
  if (!q.solvent.empty()) add("lower(s.solvent) = lower(?)", q.solvent);
  if (!q.source.empty()) add("instr(lower(s.source), lower(?)) > 0", q.source);
  if (!q.nuclei.empty()) {
    const auto comma = q.nuclei.find(',');
    if (comma == std::string::npos)
      throw Error(fmt::format("'{}' is not a pair of nuclei", q.nuclei), Location::field_in("", "--nuclei"),
                  "write two elements or isotopes, e.g. H,H or 1H,13C");
    const std::string x{trim(q.nuclei.substr(0, comma))}, y{trim(q.nuclei.substr(comma + 1))};
    // An element matches any isotope of it; an isotope ("13C") only itself.
    auto term = [](const char* column, const std::string& v) {
      return std::isdigit(static_cast<unsigned char>(v[0])) ? fmt::format("{} = ?", column)
                                                            : fmt::format("ltrim({}, '0123456789') = ?", column);
    };
    from_where += fmt::format(" AND (({} AND {}) OR ({} AND {}))", term("k.isotope_a", x), term("k.isotope_b", y),
                              term("k.isotope_a", y), term("k.isotope_b", x));
    for (const auto& v : {x, y, y, x}) binders.push_back([v](Statement& st, int i) { st.bind(i, v); });
  }
  const std::string count_sql = "SELECT count(*)" + from_where;
  const std::string rows_sql =
      "SELECT c.id, c.name, c.inchikey, s.id, s.name, s.solvent, s.temperature_k, s.field_mhz, s.ph, s.instrument, "
      "s.method, s.measured_by, s.measured_on, s.source, k.id, " + coupling_columns("k") +
      ", (SELECT count(*) FROM couplings o WHERE o.set_id = k.set_id AND o.identity = k.identity AND o.j_hz <> k.j_hz)" +
      from_where + " ORDER BY c.id, s.id, k.id LIMIT ?";
  Statement count(db, count_sql);
  for (std::size_t i = 0; i < binders.size(); ++i) binders[i](count, static_cast<int>(i) + 1);
  count.step();
  result.total = static_cast<std::size_t>(count.integer(0));
  Statement st(db, rows_sql);
  for (std::size_t i = 0; i < binders.size(); ++i) binders[i](st, static_cast<int>(i) + 1);
  // SQLite reads a negative LIMIT as no limit.
  st.bind(static_cast<int>(binders.size()) + 1, q.limit ? static_cast<std::int64_t>(*q.limit) : std::int64_t{-1});
  while (st.step()) {
    FoundCoupling f;
    f.compound_id = st.integer(0);
    f.compound = st.text(1);
    f.inchikey = st.text(2);
    f.set_id = st.integer(3);
    f.conditions = read_conditions(st, 4);
    f.coupling_id = st.integer(14);
    f.coupling = read_coupling(st, 15);
    f.in_conflict = st.integer(15 + kCouplingColumnCount) > 0;
    result.couplings.push_back(std::move(f));
  }
  return result;
}

std::int64_t find_compound(Database& db, const std::string& what) {
  const std::string text{trim(what)};
  if (!text.empty() && std::all_of(text.begin(), text.end(), [](char c) { return std::isdigit(static_cast<unsigned char>(c)); })) {
    Statement s(db, "SELECT id FROM compounds WHERE id = ?");
    s.bind(1, static_cast<std::int64_t>(std::stoll(text)));
    if (s.step()) return s.integer(0);
  }
  {
    Statement s(db, "SELECT id FROM compounds WHERE inchikey = ?");
    s.bind(1, text);
    if (s.step()) return s.integer(0);
  }
  Statement s(db, "SELECT id FROM compounds WHERE name = ? ORDER BY id");
  s.bind(1, what);
  std::vector<std::int64_t> ids;
  while (s.step()) ids.push_back(s.integer(0));
  if (ids.size() == 1) return ids.front();
  if (ids.empty()) {
    Statement like(db, "SELECT name FROM compounds WHERE instr(lower(name), lower(?)) > 0 ORDER BY id LIMIT 5");
    like.bind(1, text);
    std::string near;
    while (like.step()) near += (near.empty() ? "" : ", ") + like.text(0);
    throw Error(fmt::format("no compound '{}' in the library", what), {},
                near.empty() ? "list compounds with 'vicinal library find'" : "did you mean: " + near);
  }
  throw Error(fmt::format("{} compounds are named '{}'", ids.size(), what), {},
              "give the InChIKey or the id number shown by 'vicinal library find'");
}

}  // namespace vicinal::library
