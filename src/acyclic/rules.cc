#include "acyclic/rules.h"

#include <fmt/format.h>

#include "core/data_dir.h"
#include "core/error.h"
#include "core/json_file.h"

namespace vicinal::acyclic {

std::string kind_name(Kind kind) {
  switch (kind) {
    case Kind::ThreeBondHH: return "3J(H,H)";
    case Kind::ThreeBondCH: return "3J(C,H)";
    case Kind::TwoBondCH: return "2J(C,H)";
  }
  return "?";
}

namespace {

std::array<double, 2> range(const Json& c, const std::string& key, const std::string& file, const std::string& at) {
  const Json& r = json_member(c, key, file, at);
  if (!r.is_array() || r.size() != 2)
    throw Error("expected [from, to] in Hz", Location::field_in(file, at + "." + key));
  const double a = json_number(r[0], file, at + "." + key), b = json_number(r[1], file, at + "." + key);
  if (!(a >= 0 && b > a)) throw Error("expected 0 <= from < to", Location::field_in(file, at + "." + key));
  return {a, b};
}

}  // namespace

Rules Rules::load(const std::string& id_or_path) {
  const bool is_path = id_or_path.find('/') != std::string::npos || id_or_path.ends_with(".json");
  const std::string file = is_path ? id_or_path : data_file("db/acyclic/" + id_or_path + ".json").string();
  const Json doc = read_json_file(file);
  // Rule files are written by hand: a misspelt key must not be silently ignored.
  json_require_keys(doc, {"id", "title", "citation", "notes", "doi", "categories", "substituent_model"}, file, "");
  Rules r;
  r.file = file;
  r.id = json_string(json_member(doc, "id", file, ""), file, "id");
  r.title = json_string(json_member(doc, "title", file, ""), file, "title");
  r.citation = json_string(json_member(doc, "citation", file, ""), file, "citation");
  r.notes = json_string(json_member(doc, "notes", file, ""), file, "notes");
  if (doc.contains("doi")) r.doi = json_string(doc["doi"], file, "doi");
  const Json& cats = json_member(doc, "categories", file, "");
  if (!cats.is_array()) throw Error("categories must be a list", Location::field_in(file, "categories"));
  for (std::size_t i = 0; i < cats.size(); ++i) {
    const std::string at = fmt::format("categories[{}]", i);
    const Json& c = cats[i];
    json_require_keys(c, {"kind", "small_hz", "large_hz", "karplus_set", "source"}, file, at);
    CategoryRule rule;
    const std::string kind = json_string(json_member(c, "kind", file, at), file, at + ".kind");
    if (kind == "3J(H,H)") rule.kind = Kind::ThreeBondHH;
    else if (kind == "3J(C,H)") rule.kind = Kind::ThreeBondCH;
    else if (kind == "2J(C,H)") rule.kind = Kind::TwoBondCH;
    else throw Error(fmt::format("unknown kind '{}'", kind), Location::field_in(file, at + ".kind"),
                     "use 3J(H,H), 3J(C,H) or 2J(C,H)");
    const auto small = range(c, "small_hz", file, at), large = range(c, "large_hz", file, at);
    rule.small_from_hz = small[0];
    rule.small_to_hz = small[1];
    rule.large_from_hz = large[0];
    rule.large_to_hz = large[1];
    if (c.contains("karplus_set")) rule.karplus_set = json_string(c["karplus_set"], file, at + ".karplus_set");
    rule.source = json_string(json_member(c, "source", file, at), file, at + ".source");
    r.categories.push_back(rule);
  }
  const Json& model = json_member(doc, "substituent_model", file, "");
  for (const char* name : {"X2", "X3_oxygen", "X3_carbon", "C1", "C4"}) {
    const std::string at = std::string("substituent_model.") + name;
    const Json& g = json_member(model, name, file, "substituent_model");
    json_require_keys(g, {"element", "beta"}, file, at);
    GroupModel gm;
    gm.element = json_string(json_member(g, "element", file, at), file, at + ".element");
    const Json& beta = json_member(g, "beta", file, at);
    for (std::size_t k = 0; k < beta.size(); ++k) gm.beta.push_back(json_string(beta[k], file, at + ".beta"));
    r.groups[name] = gm;
  }
  for (Kind k : {Kind::ThreeBondHH, Kind::ThreeBondCH, Kind::TwoBondCH}) r.rule(k);
  return r;
}

const CategoryRule& Rules::rule(Kind kind) const {
  for (const auto& c : categories)
    if (c.kind == kind) return c;
  throw Error(fmt::format("no category for {}", kind_name(kind)), Location::field_in(file, "categories"),
              "add small_hz and large_hz ranges for it");
}

const GroupModel& Rules::group(const std::string& name) const { return groups.at(name); }

}  // namespace vicinal::acyclic
