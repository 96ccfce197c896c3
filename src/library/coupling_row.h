// One place that knows how a CouplingRecord is stored in the couplings
// table, and a set's Conditions in measurement_sets, for every query that
// reads them back.
#pragma once

#include <string>

#include "library/records.h"
#include "library/sqlite.h"

namespace vicinal::library {

// The columns read_coupling() expects, each prefixed with `alias.` when an
// alias is given; kCouplingColumnCount of them.
std::string coupling_columns(const std::string& alias = "");
inline constexpr int kCouplingColumnCount = 18;

// The query that reads one compound's couplings (parameter 1: the compound
// id), in set and coupling order: coupling_columns("k"), then the coupling id
// and its set id.
std::string compound_couplings_query();

// The record from a statement whose columns first..first+17 are coupling_columns().
CouplingRecord read_coupling(const Statement& st, int first);

// The conditions from a statement whose columns first..first+9 are the
// measurement_sets columns name, solvent, temperature_k, field_mhz, ph,
// instrument, method, measured_by, measured_on, source.
Conditions read_conditions(const Statement& st, int first);

}  // namespace vicinal::library
