// Searching the library: couplings by compound (name, InChIKey, substructure),
// nuclei, J range, bond count, solvent and source; every criterion optional,
// all given criteria must hold.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "library/records.h"
#include "library/sqlite.h"

namespace vicinal::library {

struct FindQuery {
  std::string name;      // part of the compound name (case-insensitive)
  std::string inchikey;  // a whole key, or its first block (14 characters: the skeleton)
  std::string smarts;    // substructure the compound must contain
  std::string nuclei;    // "H,H", "1H,13C": elements or isotopes, either order
  std::optional<double> j_min_hz, j_max_hz;
  std::optional<int> bonds;
  std::string solvent;   // exact, case-insensitive
  std::string source;    // part of the source (case-insensitive)
  bool fingerprint_screen = true;  // off only to check that the screen loses nothing
  // Read at most this many couplings (the first in compound, set, coupling
  // order); FindResult::total still counts every match.
  std::optional<std::size_t> limit;
};

struct FoundCoupling {
  std::int64_t compound_id = 0, set_id = 0, coupling_id = 0;
  std::string compound, inchikey;
  Conditions conditions;
  CouplingRecord coupling;
  bool in_conflict = false;  // another value for the same coupling in the same set
};

struct FindResult {
  std::vector<FoundCoupling> couplings;
  std::size_t total = 0;  // couplings that match, read or not (FindQuery::limit)
  std::size_t compounds_screened_out = 0;  // skipped by the fingerprint pre-screen
  std::size_t compounds_matched_smarts = 0;
};

// vicinal::Error for a SMARTS Open Babel cannot read or a malformed nuclei filter.
FindResult find_couplings(Database& db, const FindQuery& query);

// A compound by id number, exact name or InChIKey; vicinal::Error when none
// or (for a name) several match.
std::int64_t find_compound(Database& db, const std::string& what);

}  // namespace vicinal::library
