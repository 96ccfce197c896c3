// Parameter-set files (db/karplus/*.json and $VICINAL_KARPLUS_DIR): one JSON
// object per published set. Every key is checked, unknown keys included, so a
// typo in a hand-written set is an error that names the file and the key
// rather than a silently ignored value.
#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <map>
#include <set>

#include "core/data_dir.h"
#include "core/error.h"
#include "core/json_file.h"
#include "core/parse.h"
#include "karplus/curve.h"
#include "karplus/karplus.h"

namespace vicinal::karplus {

namespace {

const std::set<std::string> kKeys = {"id",     "title",   "nuclei",   "coupling",          "pattern_smarts",
                                     "angle_name", "offset_deg", "form", "coefficients", "substituent_count",
                                     "rms_hz", "valid_range_deg", "citation", "table", "doi", "notes"};

// Coefficient names of each form, in the order ParameterSet::coefficients keeps them.
std::vector<std::string> names_for(Form form, const Json& given) {
  switch (form) {
    case Form::ThreeTerm: return {"A", "B", "C"};
    case Form::PiecewiseThreeTerm: return {"A1", "B1", "C1", "A2", "B2", "C2"};
    case Form::Haasnoot: return {"P1", "P2", "P3", "P4", "P5", "P6", "P7"};
    case Form::Fourier: {
      // C0, then C1 S1 ... up to the highest order named in the file.
      int order = 0;
      for (const auto& [key, value] : given.items()) {
        if (key.size() < 2 || (key[0] != 'C' && key[0] != 'S')) continue;
        if (!std::all_of(key.begin() + 1, key.end(), [](char c) { return std::isdigit(static_cast<unsigned char>(c)); }))
          continue;
        order = std::max(order, std::atoi(key.c_str() + 1));
      }
      std::vector<std::string> names{"C0"};
      for (int k = 1; k <= order; ++k) names.push_back(fmt::format("C{}", k)), names.push_back(fmt::format("S{}", k));
      return names;
    }
  }
  return {};
}

std::string surname(std::string author) {
  while (!author.empty() && author.back() == ' ') author.pop_back();
  const auto space = author.find_last_of(' ');
  return space == std::string::npos ? author : author.substr(space + 1);
}

std::string short_citation(const std::string& authors, int year) {
  std::vector<std::string> names;
  std::size_t pos = 0;
  while (pos <= authors.size()) {
    const auto comma = authors.find(',', pos);
    names.push_back(surname(authors.substr(pos, comma == std::string::npos ? std::string::npos : comma - pos)));
    if (comma == std::string::npos) break;
    pos = comma + 1;
  }
  const std::string who = names.size() == 1   ? names[0]
                          : names.size() == 2 ? names[0] + " & " + names[1]
                                              : names[0] + " et al.";
  return fmt::format("{} {}", who, year);
}

std::size_t edit_distance(const std::string& a, const std::string& b) {
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diag = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t up = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diag = up;
    }
  }
  return row[b.size()];
}

}  // namespace

ParameterSet SetCatalog::load_file(const std::string& path) {
  const Json doc = read_json_file(path);
  if (!doc.is_object()) throw Error("a Karplus set file must hold one JSON object", {path});
  for (const auto& [key, value] : doc.items())
    if (!kKeys.count(key))
      throw Error(fmt::format("unknown key '{}'", key), Location::field_in(path, key),
                  fmt::format("known keys: {}", fmt::join(kKeys, ", ")));
  const auto str = [&](const char* key) { return json_string(json_member(doc, key, path, ""), path, key); };
  const auto num = [&](const char* key) { return json_number(json_member(doc, key, path, ""), path, key); };
  const auto bad = [&](const std::string& key, const std::string& what) {
    return Error(what, Location::field_in(path, key));
  };

  ParameterSet set;
  set.file = path;
  set.id = str("id");
  if (set.id.empty() || !std::all_of(set.id.begin(), set.id.end(), [](char c) {
        return (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '-';
      }))
    throw bad("id", fmt::format("id '{}' must be lower-case letters, digits and '-'", set.id));
  set.title = str("title");
  const Json& nuclei = json_member(doc, "nuclei", path, "");
  if (!nuclei.is_array() || nuclei.size() != 2) throw bad("nuclei", "'nuclei' must be a list of two isotopes");
  for (int i = 0; i < 2; ++i) set.nuclei[i] = json_string(nuclei[i], path, fmt::format("nuclei[{}]", i));
  set.coupling = str("coupling");
  set.pattern_smarts = str("pattern_smarts");
  for (int m = 1; m <= 4; ++m)
    if (set.pattern_smarts.find(fmt::format(":{}]", m)) == std::string::npos)
      throw bad("pattern_smarts", fmt::format("the pattern must map four atoms :1 to :4; ':{}]' is missing", m));
  set.angle_name = str("angle_name");
  set.offset_deg = num("offset_deg");
  try {
    set.form = parse_form(str("form"));
  } catch (const Error& e) {
    throw Error(e.what_happened(), Location::field_in(path, "form"), e.hint());
  }

  const Json& coeff = json_member(doc, "coefficients", path, "");
  if (!coeff.is_object()) throw bad("coefficients", "'coefficients' must be an object of named numbers");
  set.coefficient_names = names_for(set.form, coeff);
  for (const auto& [key, value] : coeff.items())
    if (std::find(set.coefficient_names.begin(), set.coefficient_names.end(), key) == set.coefficient_names.end())
      throw bad("coefficients." + key, fmt::format("coefficient '{}' does not belong to the {} form (expected {})", key,
                                                   form_name(set.form), fmt::join(set.coefficient_names, " ")));
  for (const auto& name : set.coefficient_names) {
    // A Fourier series may leave out terms that are zero; other forms need every coefficient.
    if (set.form == Form::Fourier && !coeff.contains(name)) {
      set.coefficients.push_back(0.0);
      continue;
    }
    const double c = json_number(json_member(coeff, name, path, "coefficients"), path, "coefficients." + name);
    if (std::fabs(c) > kMaxCouplingHz)
      throw bad("coefficients." + name, fmt::format("coefficient {:g} is outside -{:g}..{:g}", c, kMaxCouplingHz,
                                                    kMaxCouplingHz));
    set.coefficients.push_back(c);
  }
  if (set.form == Form::Haasnoot) {
    const double count = doc.contains("substituent_count") ? num("substituent_count") : 0;
    if (count != std::floor(count) || count < 0 || count > kMaxSubstituents)
      throw bad("substituent_count", "'substituent_count' must be 0 (all patterns) or 1 to 4");
    set.substituent_count = static_cast<int>(count);
  } else if (doc.contains("substituent_count")) {
    throw bad("substituent_count", "'substituent_count' applies to Haasnoot sets only");
  }

  set.rms_hz = num("rms_hz");
  if (set.rms_hz < 0) throw bad("rms_hz", "'rms_hz' must be >= 0 (0 when the paper states none)");
  if (doc.contains("valid_range_deg")) {
    const Json& range = doc["valid_range_deg"];
    if (!range.is_array() || range.size() != 2) throw bad("valid_range_deg", "'valid_range_deg' must be [from, to]");
    set.valid_from_deg = json_number(range[0], path, "valid_range_deg[0]");
    set.valid_to_deg = json_number(range[1], path, "valid_range_deg[1]");
    if (!(set.valid_from_deg < set.valid_to_deg) || set.valid_from_deg < -180 || set.valid_to_deg > 180)
      throw bad("valid_range_deg", "'valid_range_deg' must satisfy -180 <= from < to <= 180");
  }

  const Json& cite = json_member(doc, "citation", path, "");
  const auto cite_str = [&](const char* key) {
    return json_string(json_member(cite, key, path, "citation"), path, std::string("citation.") + key);
  };
  const std::string authors = cite_str("authors"), journal = cite_str("journal"), volume = cite_str("volume"),
                    page = cite_str("first_page");
  const double year = json_number(json_member(cite, "year", path, "citation"), path, "citation.year");
  if (year != std::floor(year) || year < 1900 || year > 2100) throw bad("citation.year", "'year' must be a year");
  set.citation = fmt::format("{}, {} {}, {} ({})", authors, journal, volume, page, static_cast<int>(year));
  set.short_citation = short_citation(authors, static_cast<int>(year));
  if (doc.contains("table")) set.table = str("table");
  if (doc.contains("doi")) set.doi = str("doi");
  if (doc.contains("notes")) set.notes = str("notes");

  try {
    detail::compile(set, {});
  } catch (const Error& e) {
    throw Error(e.what_happened(), Location::field_in(path, "coefficients"), e.hint());
  }
  return set;
}

SetCatalog SetCatalog::load_directory(const std::string& folder) {
  namespace fs = std::filesystem;
  if (!fs::is_directory(folder)) throw Error("not a folder of Karplus set files", {folder});
  std::vector<fs::path> files;
  for (const auto& entry : fs::directory_iterator(folder)) {
    if (entry.path().extension() != ".json") continue;
    if (!entry.is_regular_file()) throw Error("is not a regular file", {entry.path().string()}, "remove or rename it");
    files.push_back(entry.path());
  }
  std::sort(files.begin(), files.end());
  SetCatalog catalog;
  for (const auto& f : files) catalog.sets_.push_back(load_file(f.string()));
  std::map<std::string, std::string> seen;
  for (const auto& s : catalog.sets_)
    if (auto [it, fresh] = seen.emplace(s.id, s.file); !fresh)
      throw Error(fmt::format("set id '{}' is defined twice (also in {})", s.id, it->second),
                  Location::field_in(s.file, "id"), "give each set its own id");
  return catalog;
}

const SetCatalog& SetCatalog::shipped() {
  static const SetCatalog catalog = [] {
    SetCatalog all = load_directory(data_file("db/karplus").string());
    // User sets (written by `karplus calibrate`) join the shipped ones; a user
    // folder that does not exist yet simply holds none.
    if (const char* user = std::getenv("VICINAL_KARPLUS_DIR"); user && *user && std::filesystem::exists(user)) {
      const SetCatalog mine = load_directory(user);
      for (const auto& s : mine.sets_) {
        for (const auto& t : all.sets_)
          if (t.id == s.id)
            throw Error(fmt::format("user set id '{}' is already taken by a shipped set ({})", s.id, t.file),
                        Location::field_in(s.file, "id"), "rename the user set");
        all.sets_.push_back(s);
      }
    }
    return all;
  }();
  return catalog;
}

const ParameterSet& SetCatalog::find(const std::string& id) const {
  for (const auto& s : sets_)
    if (s.id == id) return s;
  // Suggest ids that are a few edits away or share the typed text.
  std::vector<std::pair<std::size_t, std::string>> close;
  for (const auto& s : sets_) {
    const std::size_t d = edit_distance(id, s.id);
    const bool contains = !id.empty() && s.id.find(id) != std::string::npos;
    if (d <= std::max<std::size_t>(3, id.size() / 4) || contains) close.emplace_back(contains ? 0 : d, s.id);
  }
  std::sort(close.begin(), close.end());
  std::vector<std::string> names;
  for (std::size_t i = 0; i < close.size() && i < 4; ++i) names.push_back(close[i].second);
  const std::string hint = names.empty() ? "list the sets with `vicinal karplus sets`"
                                         : fmt::format("did you mean {}?", fmt::join(names, ", "));
  throw Error(fmt::format("unknown Karplus set '{}'", id), {}, hint);
}

}  // namespace vicinal::karplus
