// The library CSV: one row per coupling. Columns (any order; header names as
// below; unknown columns are refused so that a misspelt one is not lost):
//   compound                 name; rows without a structure reuse the compound
//                            of that name given earlier in the file
//   smiles | structure | molfile   the structure, one of them: SMILES, a file
//                            path relative to the CSV, or a molfile/SDF record inline
//   labels                   optional labels CSV (label,atom), relative to the CSV
//   inchikey                 optional; checked against the structure
//   measurement, solvent, temperature_k, field_mhz, ph, instrument, method,
//   measured_by, measured_on, source, imported_from      the measurement set
//   nuclei, j_hz, sigma_hz, set, note                    predict/coupling_list.h
//   sign_known               yes/no (blank = no): the sign of J was determined
//   origin                   where the value came from (default: this file)
#include <fmt/format.h>

#include <algorithm>
#include <filesystem>
#include <map>
#include <memory>
#include <set>
#include <utility>

#include "core/csv.h"
#include "core/parse.h"
#include "library/compound_cache.h"
#include "library/entry_builder.h"
#include "library/formats.h"
#include "predict/coupling_list.h"

namespace vicinal::library {

namespace {

const std::vector<std::string> kCompoundColumns = {"compound", "smiles", "structure", "molfile", "labels", "inchikey"};
const std::vector<std::string> kSetColumns = {"measurement", "solvent",     "temperature_k", "field_mhz",
                                              "ph",          "instrument",  "method",        "measured_by",
                                              "measured_on", "source",      "imported_from"};
const std::vector<std::string> kCouplingColumns = {"sign_known", "origin"};

std::string resolve_relative(const std::string& csv_path, const std::string& file) {
  std::filesystem::path p(file);
  if (p.is_absolute()) return p.string();
  return (std::filesystem::path(csv_path).parent_path() / p).lexically_normal().string();
}

bool parse_yes_no(const std::string& text, const Location& where) {
  const std::string t{trim(text)};
  if (t.empty() || t == "no" || t == "0" || t == "false") return false;
  if (t == "yes" || t == "1" || t == "true") return true;
  throw Error(fmt::format("'{}' is not yes or no", t), where);
}

std::string fmt_optional(const std::optional<double>& v) { return v ? fmt::format("{}", *v) : std::string(); }

}  // namespace

namespace {

// Entries being gathered from rows, with where each compound and set is.
struct Gathered {
  std::vector<Entry> entries;
  std::vector<std::string> entry_keys;              // builder key of each entry
  std::vector<std::vector<std::string>> set_texts;  // set text of each entry's sets
  std::map<std::string, std::size_t> entry_of_key;  // builder key -> entry index
  std::map<std::string, std::size_t> set_of_key;    // entry index + set text -> set index
  std::size_t couplings = 0;
  // The previous row's compound and set: rows of a set mostly come together.
  std::string last_key, last_set_text;
  std::size_t last_entry = 0, last_set = 0;

  // `set_text` is equal for equal conditions and imported_from; `set` gives
  // them (its couplings are not copied).
  void add(const std::string& key, const CompoundRecord& compound, const SetRecord& set, const std::string& set_text,
           CouplingRecord&& c) {
    if (couplings == 0 || key != last_key || set_text != last_set_text) {
      auto it = entry_of_key.find(key);
      if (it == entry_of_key.end()) {
        it = entry_of_key.emplace(key, entries.size()).first;
        entries.push_back({compound, {}});
        entry_keys.push_back(key);
        set_texts.emplace_back();
      }
      Entry& entry = entries[it->second];
      auto [s, new_set] = set_of_key.emplace(std::to_string(it->second) + '\x1e' + set_text, entry.sets.size());
      if (new_set) {
        entry.sets.push_back({set.conditions, set.imported_from, set.notes, {}});
        set_texts[it->second].push_back(set_text);
      }
      last_key = key;
      last_set_text = set_text;
      last_entry = it->second;
      last_set = s->second;
    }
    entries[last_entry].sets[last_set].couplings.push_back(std::move(c));
    ++couplings;
  }

  // Moves the stereo-unassigned couplings gathered so far to `other`.
  void move_unassigned_to(Gathered& other) {
    for (std::size_t e = 0; e < entries.size(); ++e)
      for (std::size_t s = 0; s < entries[e].sets.size(); ++s) {
        auto& list = entries[e].sets[s].couplings;
        const auto held = std::stable_partition(list.begin(), list.end(),
                                                [](const CouplingRecord& c) { return !c.stereo_unassigned; });
        for (auto it = held; it != list.end(); ++it)
          other.add(entry_keys[e], entries[e].compound, entries[e].sets[s], set_texts[e][s], std::move(*it));
        couplings -= static_cast<std::size_t>(list.end() - held);
        list.erase(held, list.end());
      }
  }

  std::vector<Entry> take() {
    entry_keys.clear();
    set_texts.clear();
    entry_of_key.clear();
    set_of_key.clear();
    couplings = 0;
    return std::exchange(entries, {});
  }
};

}  // namespace

ImportResult read_csv(const std::string& path, const ImportOptions& options, const EntrySink& sink) {
  CsvReader reader = CsvReader::open_file(path);
  const CsvTable& table = reader.layout();
  const predict::CouplingRowParser parser(table, true);

  std::set<std::string> known(kCompoundColumns.begin(), kCompoundColumns.end());
  known.insert(kSetColumns.begin(), kSetColumns.end());
  known.insert(kCouplingColumns.begin(), kCouplingColumns.end());
  for (const auto& name : parser.extra_columns())
    if (!known.count(name)) {
      Location at = Location::field_in(path, name);
      at.line = 1;
      throw Error(fmt::format("unknown column '{}'", name), at,
                  "library columns are compound, smiles, structure, molfile, labels, inchikey, measurement, "
                  "solvent, temperature_k, field_mhz, ph, instrument, method, measured_by, measured_on, source, "
                  "imported_from, nuclei, j_hz, sigma_hz, set, note, sign_known, origin");
    }
  auto column = [&](const std::string& name) { return table.column(name); };
  auto field = [&](const CsvRow& row, const std::string& name) -> std::string {
    const auto c = column(name);
    return c ? std::string(trim(row.fields[*c])) : std::string();
  };
  auto number = [&](const CsvRow& row, const std::string& name) -> std::optional<double> {
    const auto c = column(name);
    if (!c || trim(row.fields[*c]).empty()) return std::nullopt;
    return parse_double(trim(row.fields[*c]), table.where(row, *c));
  };
  auto where = [&](const CsvRow& row, const std::string& name) {
    const auto c = column(name);
    return c ? table.where(row, *c) : Location(path, row.line);
  };

  ImportResult result;
  // Compounds by the way they were given; a failed structure stays failed.
  CompoundCache builders(options.compounds_whole);
  std::map<std::string, std::string> failed;
  std::map<std::string, const std::string*> key_of_name;  // compound name -> builder key (in `builders`)
  // A file of more than one batch goes to the sink as it is read, but its
  // stereo-unassigned rows are held back to the end (EntryBatch). A file of
  // one batch comes whole, its rows in file order.
  bool in_batches = false;
  Gathered rows, held_back;
  std::vector<std::size_t> condition_columns;
  for (const auto& name : kSetColumns)
    if (const auto c = column(name)) condition_columns.push_back(*c);
  std::vector<std::string> last_conditions(table.header().size());
  bool have_conditions = false;
  SetRecord set_template;
  std::string set_text;

  CsvRow row;
  while (reader.next(row)) {
    if (sink && (rows.couplings >= options.batch_couplings || rows.entries.size() >= options.batch_compounds)) {
      if (!in_batches) rows.move_unassigned_to(held_back);
      in_batches = true;
      sink({rows.take(), reader.position(), reader.size(), Progress::Unit::Bytes});
    }
    try {
      const predict::CouplingRow parsed = parser.parse(row);
      const std::string name = field(row, "compound");
      StructureSpec spec;
      std::string spec_column;
      int given = 0;
      for (const char* col : {"smiles", "structure", "molfile"}) {
        const auto c = column(col);
        if (!c || trim(row.fields[*c]).empty()) continue;
        ++given;
        spec_column = col;
        // An inline molfile keeps its exact text (leading spaces matter).
        spec.text = spec_column == "molfile" ? row.fields[*c] : std::string(trim(row.fields[*c]));
      }
      if (given > 1)
        throw Error("give the structure once: smiles, structure or molfile", Location(path, row.line));
      std::string key;
      if (given == 0) {
        auto it = key_of_name.find(name);
        if (name.empty() || it == key_of_name.end())
          throw Error(name.empty() ? "the row names no compound and no structure"
                                   : fmt::format("compound '{}' has no structure in an earlier row", name),
                      where(row, "compound"), "give smiles, structure or molfile on the compound's first row");
        key = *it->second;
      } else {
        spec.kind = spec_column == "smiles"      ? StructureSpec::Kind::Smiles
                    : spec_column == "structure" ? StructureSpec::Kind::File
                                                 : StructureSpec::Kind::Molfile;
        if (spec.kind == StructureSpec::Kind::File) spec.text = resolve_relative(path, spec.text);
        if (const std::string labels = field(row, "labels"); !labels.empty())
          spec.labels_file = resolve_relative(path, labels);
        const std::string display = name.empty() ? (spec.kind == StructureSpec::Kind::Molfile ? "unnamed" : spec.text)
                                                 : name;
        key = display + '\x1f' + spec_column + '\x1f' + spec.text + '\x1f' + spec.labels_file;
        if (auto f = failed.find(key); f != failed.end()) throw Error(f->second, where(row, spec_column));
        if (!builders.contains(key)) {
          try {
            builders.add(key, std::make_unique<CompoundBuilder>(display, spec, where(row, spec_column)));
          } catch (const Error& e) {
            failed[key] = e.what_happened();
            throw;
          }
        }
        if (!name.empty()) key_of_name[name] = &builders.stored_key(key);
      }
      CompoundBuilder& builder = builders.at(key);
      if (const std::string key_given = field(row, "inchikey");
          !key_given.empty() && key_given != builder.record().inchikey)
        throw Error(fmt::format("the InChIKey {} does not match the structure ({})", key_given,
                                builder.record().inchikey),
                    where(row, "inchikey"), "check that the structure is the intended compound");

      // A set's conditions are read and checked once for a run of rows that
      // give them identically.
      const bool same_conditions =
          have_conditions && std::all_of(condition_columns.begin(), condition_columns.end(), [&](std::size_t i) {
            return row.fields[i] == last_conditions[i];
          });
      if (!same_conditions) {
        have_conditions = false;
        Conditions& k = set_template.conditions;
        k.name = field(row, "measurement");
        k.solvent = field(row, "solvent");
        k.temperature_k = number(row, "temperature_k");
        k.field_mhz = number(row, "field_mhz");
        k.ph = number(row, "ph");
        k.instrument = field(row, "instrument");
        k.method = field(row, "method");
        k.measured_by = field(row, "measured_by");
        k.measured_on = field(row, "measured_on");
        k.source = field(row, "source");
        check_conditions(k, Location(path, row.line));
        set_template.imported_from = field(row, "imported_from");
        if (set_template.imported_from.empty()) set_template.imported_from = path;
        set_text = conditions_key(k) + '\x1e' + set_template.imported_from;
        for (const auto i : condition_columns) last_conditions[i] = row.fields[i];
        have_conditions = true;
      }

      CouplingRecord c = builder.coupling(parsed.nuclei, *parsed.j_hz, parsed.sigma_hz, Location(path, row.line));
      c.karplus_set = parsed.set;
      c.note = parsed.note;
      c.sign_known = parse_yes_no(field(row, "sign_known"), where(row, "sign_known"));
      c.origin = field(row, "origin");
      if (c.origin.empty()) c.origin = path;

      (in_batches && c.stereo_unassigned ? held_back : rows)
          .add(key, builder.record(), set_template, set_text, std::move(c));
      ++result.couplings;
    } catch (const Error& e) {
      if (!options.skip_bad) throw;
      result.rejects.push_back({fmt::format("{}:{}", path, row.line), e.one_line()});
    }
  }
  if (!sink) {
    result.entries = rows.take();
  } else {
    sink({rows.take(), reader.size(), reader.size(), Progress::Unit::Bytes});
    if (held_back.couplings) sink({held_back.take(), reader.size(), reader.size(), Progress::Unit::Bytes});
  }
  return result;
}

std::string write_csv(const std::vector<Entry>& entries) {
  std::string out =
      "compound,inchikey,molfile,measurement,solvent,temperature_k,field_mhz,ph,instrument,method,measured_by,"
      "measured_on,source,imported_from,nuclei,j_hz,sigma_hz,sign_known,set,note,origin\n";
  for (const auto& e : entries) {
    bool first_row = true;
    for (const auto& s : e.sets) {
      const auto& k = s.conditions;
      for (const auto& c : s.couplings) {
        const std::vector<std::string> fields = {
            e.compound.name, e.compound.inchikey, first_row ? e.compound.molfile : "", k.name, k.solvent,
            fmt_optional(k.temperature_k), fmt_optional(k.field_mhz), fmt_optional(k.ph), k.instrument, k.method,
            k.measured_by, k.measured_on, k.source, s.imported_from, c.nucleus_a + "," + c.nucleus_b,
            fmt::format("{}", c.j_hz), fmt_optional(c.sigma_hz), c.sign_known ? "yes" : "no", c.karplus_set, c.note,
            c.origin};
        for (std::size_t i = 0; i < fields.size(); ++i) out += (i ? "," : "") + csv_escape(fields[i]);
        out += '\n';
        first_row = false;
      }
    }
  }
  return out;
}

}  // namespace vicinal::library
