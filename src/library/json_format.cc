// The library JSON and SDF formats. JSON:
//   {"format": "vicinal-library", "version": 1, "compounds": [
//     {"name": ..., "inchikey": ... (optional, checked),
//      one of "smiles" | "structure" (path relative to the file) | "molfile",
//      "labels_file": ... (optional), "notes": [...],
//      "sets": [{"name", "solvent", "temperature_k", "field_mhz", "ph",
//                "instrument", "method", "measured_by", "measured_on",
//                "source", "imported_from", "notes": [...],
//                "couplings": [{"nuclei": "H-2,H-3", "j_hz", "sigma_hz",
//                               "sign_known", "set", "note", "origin",
//                               "derived": [{"karplus_set", "from_deg", "to_deg",
//                                            "created_utc"}] (library derive's
//                               rows, optional)}]}]}]}
// SDF: each record's mol block is the structure; the data field
// `vicinal_compound` holds the compound object above (without a structure) as
// one line of JSON, and `vicinal_atom_labels` the atom labels.
#include <fmt/format.h>
#include <openbabel/generic.h>
#include <openbabel/obconversion.h>

#include <filesystem>
#include <fstream>
#include <set>

#include "core/atomic_file.h"
#include "core/csv.h"
#include "core/json_file.h"
#include "library/derived.h"
#include "library/entry_builder.h"
#include "library/formats.h"
#include "predict/coupling_list.h"
#include "structure/atom_labels.h"
#include "structure/openbabel_log.h"

namespace vicinal::library {

namespace {

constexpr const char* kFormatName = "vicinal-library";
constexpr const char* kSdfCompoundField = "vicinal_compound";

const std::set<std::string> kCompoundKeys = {"name", "inchikey", "smiles", "structure", "molfile", "labels_file",
                                             "notes", "sets"};
const std::set<std::string> kSetKeys = {"name",        "solvent",     "temperature_k", "field_mhz",
                                        "ph",          "instrument",  "method",        "measured_by",
                                        "measured_on", "source",      "imported_from", "notes",
                                        "couplings"};
const std::set<std::string> kCouplingKeys = {"nuclei", "j_hz",   "sigma_hz", "sign_known",
                                             "set",    "note",   "origin",   "derived"};
const std::set<std::string> kDerivedKeys = {"karplus_set", "from_deg", "to_deg", "created_utc"};

void check_keys(const Json& object, const std::set<std::string>& allowed, const std::string& source,
                const std::string& context) {
  if (!object.is_object()) throw Error("expected an object", Location::field_in(source, context));
  for (const auto& [key, value] : object.items())
    if (!allowed.count(key))
      throw Error(fmt::format("unknown key '{}'", key), Location::field_in(source, context),
                  "see 'vicinal library import --help' for the keys");
}

std::string text_or(const Json& object, const std::string& key, const std::string& source, const std::string& context) {
  if (!object.contains(key) || object[key].is_null()) return {};
  return json_string(object[key], source, context + "." + key);
}

std::optional<double> number_or(const Json& object, const std::string& key, const std::string& source,
                                const std::string& context) {
  if (!object.contains(key) || object[key].is_null()) return std::nullopt;
  return json_number(object[key], source, context + "." + key);
}

std::vector<std::string> notes_of(const Json& object, const std::string& source, const std::string& context) {
  std::vector<std::string> out;
  if (!object.contains("notes")) return out;
  if (!object["notes"].is_array()) throw Error("expected a list of texts", Location::field_in(source, context + ".notes"));
  for (std::size_t i = 0; i < object["notes"].size(); ++i)
    out.push_back(json_string(object["notes"][i], source, fmt::format("{}.notes[{}]", context, i)));
  return out;
}

// The "derived" rows of one coupling object, checked as check_derived does.
std::vector<DerivedRecord> derived_of(const Json& coupling, const std::string& source, const std::string& context) {
  std::vector<DerivedRecord> out;
  if (!coupling.contains("derived")) return out;
  const std::string dc = context + ".derived";
  if (!coupling["derived"].is_array()) throw Error("expected a list", Location::field_in(source, dc));
  for (std::size_t i = 0; i < coupling["derived"].size(); ++i) {
    const std::string rc = fmt::format("{}[{}]", dc, i);
    const Json& r = coupling["derived"][i];
    check_keys(r, kDerivedKeys, source, rc);
    DerivedRecord row;
    row.karplus_set = text_or(r, "karplus_set", source, rc);
    if (row.karplus_set.empty()) throw Error("the Karplus set is missing", Location::field_in(source, rc + ".karplus_set"));
    auto end = [&](const std::string& key) {
      const auto deg = number_or(r, key, source, rc);
      if (!deg) throw Error("the interval end is missing", Location::field_in(source, rc + "." + key));
      return *deg;
    };
    row.from_deg = end("from_deg");
    row.to_deg = end("to_deg");
    row.created_utc = text_or(r, "created_utc", source, rc);
    check_derived(row, source, rc);
    out.push_back(std::move(row));
  }
  return out;
}

// The sets of one compound object, resolved against `builder`.
void read_sets(const Json& compound, CompoundBuilder& builder, Entry& entry, const std::string& source,
               const std::string& context, const ImportOptions& options, ImportResult& result) {
  if (!compound.contains("sets")) return;
  if (!compound["sets"].is_array()) throw Error("expected a list", Location::field_in(source, context + ".sets"));
  for (std::size_t si = 0; si < compound["sets"].size(); ++si) {
    const std::string sc = fmt::format("{}.sets[{}]", context, si);
    const Json& s = compound["sets"][si];
    SetRecord set;
    try {
      check_keys(s, kSetKeys, source, sc);
      Conditions& k = set.conditions;
      k.name = text_or(s, "name", source, sc);
      k.solvent = text_or(s, "solvent", source, sc);
      k.temperature_k = number_or(s, "temperature_k", source, sc);
      k.field_mhz = number_or(s, "field_mhz", source, sc);
      k.ph = number_or(s, "ph", source, sc);
      k.instrument = text_or(s, "instrument", source, sc);
      k.method = text_or(s, "method", source, sc);
      k.measured_by = text_or(s, "measured_by", source, sc);
      k.measured_on = text_or(s, "measured_on", source, sc);
      k.source = text_or(s, "source", source, sc);
      check_conditions(k, Location::field_in(source, sc));
      set.imported_from = text_or(s, "imported_from", source, sc);
      if (set.imported_from.empty()) set.imported_from = source;
      set.notes = notes_of(s, source, sc);
      if (s.contains("couplings") && !s["couplings"].is_array())
        throw Error("expected a list", Location::field_in(source, sc + ".couplings"));
    } catch (const Error& e) {
      if (!options.skip_bad) throw;
      result.rejects.push_back({fmt::format("{}: {}", source, sc), e.one_line()});
      continue;
    }
    const Json empty = Json::array();
    const Json& couplings = s.contains("couplings") ? s["couplings"] : empty;
    for (std::size_t ci = 0; ci < couplings.size(); ++ci) {
      const std::string cc = fmt::format("{}.couplings[{}]", sc, ci);
      try {
        const Json& j = couplings[ci];
        check_keys(j, kCouplingKeys, source, cc);
        const Location at = Location::field_in(source, cc);
        const auto nuclei = predict::split_nuclei(text_or(j, "nuclei", source, cc), at);
        const auto j_hz = number_or(j, "j_hz", source, cc);
        if (!j_hz) throw Error("the measured coupling is missing", Location::field_in(source, cc + ".j_hz"));
        CouplingRecord c = builder.coupling(nuclei, *j_hz, number_or(j, "sigma_hz", source, cc), at);
        if (j.contains("sign_known")) {
          if (!j["sign_known"].is_boolean())
            throw Error("expected true or false", Location::field_in(source, cc + ".sign_known"));
          c.sign_known = j["sign_known"].get<bool>();
        }
        c.karplus_set = text_or(j, "set", source, cc);
        c.note = text_or(j, "note", source, cc);
        c.origin = text_or(j, "origin", source, cc);
        if (c.origin.empty()) c.origin = source;
        c.derived = derived_of(j, source, cc);
        set.couplings.push_back(std::move(c));
        ++result.couplings;
      } catch (const Error& e) {
        if (!options.skip_bad) throw;
        result.rejects.push_back({fmt::format("{}: {}", source, cc), e.one_line()});
      }
    }
    entry.sets.push_back(std::move(set));
  }
}

Json compound_body(const Entry& e) {
  Json c = {{"name", e.compound.name}, {"inchikey", e.compound.inchikey}};
  if (!e.compound.notes.empty()) c["notes"] = e.compound.notes;
  c["sets"] = Json::array();
  for (const auto& s : e.sets) {
    const auto& k = s.conditions;
    Json set = {{"name", k.name},
                {"solvent", k.solvent},
                {"instrument", k.instrument},
                {"method", k.method},
                {"measured_by", k.measured_by},
                {"measured_on", k.measured_on},
                {"source", k.source},
                {"imported_from", s.imported_from}};
    if (k.temperature_k) set["temperature_k"] = *k.temperature_k;
    if (k.field_mhz) set["field_mhz"] = *k.field_mhz;
    if (k.ph) set["ph"] = *k.ph;
    if (!s.notes.empty()) set["notes"] = s.notes;
    set["couplings"] = Json::array();
    for (const auto& x : s.couplings) {
      Json cj = {{"nuclei", x.nucleus_a + "," + x.nucleus_b}, {"j_hz", x.j_hz}, {"sign_known", x.sign_known},
                 {"set", x.karplus_set}, {"note", x.note}, {"origin", x.origin}};
      if (x.sigma_hz) cj["sigma_hz"] = *x.sigma_hz;
      for (const auto& d : x.derived)
        cj["derived"].push_back({{"karplus_set", d.karplus_set}, {"from_deg", d.from_deg}, {"to_deg", d.to_deg},
                                 {"created_utc", d.created_utc}});
      set["couplings"].push_back(std::move(cj));
    }
    c["sets"].push_back(std::move(set));
  }
  return c;
}

void check_inchikey(const Json& compound, const CompoundBuilder& builder, const std::string& source,
                    const std::string& context) {
  const std::string given = text_or(compound, "inchikey", source, context);
  if (!given.empty() && given != builder.record().inchikey)
    throw Error(fmt::format("the InChIKey {} does not match the structure ({})", given, builder.record().inchikey),
                Location::field_in(source, context + ".inchikey"), "check that the structure is the intended compound");
}

// The part of a compound record that JSON and SDF share: name, identity check,
// notes and measurement sets, once the structure is known.
void read_compound(const Json& c, const StructureSpec& spec, const std::string& path, const std::string& context,
                   const ImportOptions& options, ImportResult& result) {
  const std::string name = text_or(c, "name", path, context);
  if (name.empty()) throw Error("the compound has no name", Location::field_in(path, context + ".name"));
  CompoundBuilder builder(name, spec, Location::field_in(path, context));
  check_inchikey(c, builder, path, context);
  Entry entry{builder.record(), {}};
  entry.compound.notes = notes_of(c, path, context);
  read_sets(c, builder, entry, path, context, options, result);
  result.entries.push_back(std::move(entry));
}

}  // namespace

ImportResult read_json(const std::string& path, const ImportOptions& options) {
  const Json doc = read_json_file(path);
  json_require_keys(doc, {"format", "version", "compounds"}, path, "");
  if (!doc.is_object() || text_or(doc, "format", path, "") != kFormatName)
    throw Error(fmt::format("not a vicinal library file (\"format\" must be \"{}\")", kFormatName),
                Location::field_in(path, "format"));
  if (!doc.contains("version") || !doc["version"].is_number_integer() || doc["version"].get<int>() != 1)
    throw Error("unsupported version", Location::field_in(path, "version"), "this vicinal reads version 1");
  const Json& compounds = json_member(doc, "compounds", path, "compounds");
  if (!compounds.is_array()) throw Error("expected a list", Location::field_in(path, "compounds"));
  ImportResult result;
  for (std::size_t i = 0; i < compounds.size(); ++i) {
    const std::string context = fmt::format("compounds[{}]", i);
    const Json& c = compounds[i];
    try {
      check_keys(c, kCompoundKeys, path, context);
      StructureSpec spec;
      int given = 0;
      for (const char* key : {"smiles", "structure", "molfile"}) {
        if (!c.contains(key)) continue;
        ++given;
        spec.text = json_string(c[key], path, context + "." + key);
        spec.kind = std::string(key) == "smiles"      ? StructureSpec::Kind::Smiles
                    : std::string(key) == "structure" ? StructureSpec::Kind::File
                                                      : StructureSpec::Kind::Molfile;
      }
      if (given != 1)
        throw Error("give the structure once: smiles, structure or molfile", Location::field_in(path, context));
      const auto folder = std::filesystem::path(path).parent_path();
      if (spec.kind == StructureSpec::Kind::File && std::filesystem::path(spec.text).is_relative())
        spec.text = (folder / spec.text).lexically_normal().string();
      if (const std::string labels = text_or(c, "labels_file", path, context); !labels.empty())
        spec.labels_file = std::filesystem::path(labels).is_relative() ? (folder / labels).lexically_normal().string()
                                                                       : labels;
      read_compound(c, spec, path, context, options, result);
    } catch (const Error& e) {
      if (!options.skip_bad) throw;
      result.rejects.push_back({fmt::format("{}: {}", path, context), e.one_line()});
    }
  }
  return result;
}

std::string write_json(const std::vector<Entry>& entries) {
  Json doc = {{"format", kFormatName}, {"version", 1}, {"compounds", Json::array()}};
  for (const auto& e : entries) {
    Json c = compound_body(e);
    c["molfile"] = e.compound.molfile;
    doc["compounds"].push_back(std::move(c));
  }
  return doc.dump(2) + "\n";
}

ImportResult read_sdf(const std::string& path, const ImportOptions& options) {
  const std::string text = read_text_file(path);
  require_utf8_text(text, path);
  ImportResult result;
  // Records are split on "$$$$" lines so that each keeps its exact text.
  std::size_t start = 0, index = 0;
  while (start < text.size()) {
    auto end = text.find("\n$$$$", start);
    std::size_t next = end == std::string::npos ? text.size() : text.find('\n', end + 1);
    next = next == std::string::npos ? text.size() : next + 1;
    const std::string record = text.substr(start, next - start);
    start = next;
    if (record.find_first_not_of(" \t\r\n") == std::string::npos) continue;
    const std::string context = fmt::format("record {}", ++index);
    try {
      OpenBabel::OBMol mol = molecule_from_molfile(record, fmt::format("{} ({})", path, context));
      auto* data = dynamic_cast<OpenBabel::OBPairData*>(mol.GetData(kSdfCompoundField));
      if (!data)
        throw Error(fmt::format("the record has no '{}' data field", kSdfCompoundField),
                    Location::field_in(path, context), "vicinal reads SDF files that it wrote (library export)");
      const Json c = parse_json(data->GetValue(), fmt::format("{} ({})", path, context));
      check_keys(c, kCompoundKeys, path, context);
      StructureSpec spec{StructureSpec::Kind::Molfile, record, {}};
      read_compound(c, spec, path, context, options, result);
    } catch (const Error& e) {
      if (!options.skip_bad) throw;
      result.rejects.push_back({fmt::format("{}: {}", path, context), e.one_line()});
    }
  }
  if (index == 0) throw Error("the file holds no SDF record", {path}, "export one with 'vicinal library export FILE.sdf'");
  return result;
}

std::string write_sdf(const std::vector<Entry>& entries) {
  std::string out;
  for (const auto& e : entries) {
    std::string block = e.compound.molfile;  // ends with "$$$$\n", labels field included
    const auto end = block.rfind("$$$$");
    block = block.substr(0, end);
    block += fmt::format("> <{}>\n{}\n\n$$$$\n", kSdfCompoundField, compound_body(e).dump());
    out += block;
  }
  return out;
}

std::string exchange_format(const std::string& path) {
  std::string ext = std::filesystem::path(path).extension().string();
  for (auto& ch : ext) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  if (ext == ".csv") return "csv";
  if (ext == ".json") return "json";
  if (ext == ".sdf" || ext == ".sd") return "sdf";
  throw Error(fmt::format("unknown file type '{}'", ext), {path}, "use .csv, .json or .sdf");
}

ImportResult read_exchange_file(const std::string& path, const ImportOptions& options, const EntrySink& sink) {
  auto number = [](std::vector<Entry>& entries) {
    for (auto& entry : entries)
      for (auto& set : entry.sets) number_unassigned_groups(set);
  };
  const std::string format = exchange_format(path);
  if (format == "csv" && sink)
    return read_csv(path, options, [&](EntryBatch&& batch) {
      number(batch.entries);
      sink(std::move(batch));
    });
  ImportResult result = format == "csv"    ? read_csv(path, options)
                        : format == "json" ? read_json(path, options)
                                           : read_sdf(path, options);
  number(result.entries);
  if (sink) {
    sink({std::move(result.entries), result.couplings, result.couplings});
    result.entries.clear();
  }
  return result;
}

void write_exchange_file(const std::vector<Entry>& entries, const std::string& path) {
  const std::string format = exchange_format(path);
  write_file_atomically(path, format == "csv" ? write_csv(entries) : format == "json" ? write_json(entries)
                                                                                      : write_sdf(entries));
}

}  // namespace vicinal::library
