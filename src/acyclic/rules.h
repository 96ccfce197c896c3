// The categorical coupling values of J-based configuration analysis
// (Matsumori, Kaneno, Murata, Nakamura, Tachibana, J. Org. Chem. 64, 866,
// 1999) as shipped in db/acyclic/<id>.json: small/large ranges for 3J(H,H),
// 3J(C,H) and 2J(C,H), the Karplus set (if any) that gives numbers instead of
// ranges, and the substituent model the generalized H-C-C-H equation needs.
#pragma once

#include <map>
#include <string>
#include <vector>

namespace vicinal::acyclic {

enum class Kind { ThreeBondHH, ThreeBondCH, TwoBondCH };
std::string kind_name(Kind kind);  // "3J(H,H)", "3J(C,H)", "2J(C,H)"

struct CategoryRule {
  Kind kind{};
  double small_from_hz = 0, small_to_hz = 0, large_from_hz = 0, large_to_hz = 0;  // of |J|
  std::string karplus_set;  // empty: categories only
  std::string source;
};

struct GroupModel {
  std::string element;
  std::vector<std::string> beta;  // non-H atoms beyond the substituent atom
};

struct Rules {
  std::string id, title, citation, doi, notes, file;
  std::vector<CategoryRule> categories;
  std::map<std::string, GroupModel> groups;  // "X2", "X3_oxygen", "X3_carbon", "C1", "C4"

  // db/acyclic/<id>.json, or a file path. vicinal::Error names the file and key.
  static Rules load(const std::string& id_or_path);
  const CategoryRule& rule(Kind kind) const;
  const GroupModel& group(const std::string& name) const;
};

}  // namespace vicinal::acyclic
