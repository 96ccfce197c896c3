#include "library/coupling_row.h"

namespace vicinal::library {

namespace {

constexpr const char* kColumns[kCouplingColumnCount] = {
    "nucleus_a", "nucleus_b",  "atoms_a",  "atoms_b", "path",    "bond_count",
    "isotope_a", "isotope_b",  "j_hz",     "sigma_hz", "sign_known", "assignment",
    "ranks_a",   "ranks_b",    "identity", "karplus_set", "note",  "origin"};

}  // namespace

std::string coupling_columns(const std::string& alias) {
  std::string out;
  for (const char* column : kColumns) {
    if (!out.empty()) out += ", ";
    if (!alias.empty()) out += alias + ".";
    out += column;
  }
  return out;
}

std::string compound_couplings_query() {
  return "SELECT " + coupling_columns("k") +
         ", k.id, k.set_id FROM measurement_sets s JOIN couplings k ON k.set_id = s.id "
         "WHERE s.compound_id = ? ORDER BY s.id, k.id";
}

CouplingRecord read_coupling(const Statement& st, int first) {
  CouplingRecord c;
  c.nucleus_a = st.text(first);
  c.nucleus_b = st.text(first + 1);
  c.atoms_a = split_atoms(st.text(first + 2), '|');
  c.atoms_b = split_atoms(st.text(first + 3), '|');
  c.path = split_atoms(st.text(first + 4), '-');
  c.bond_count = static_cast<int>(st.integer(first + 5));
  c.isotope_a = st.text(first + 6);
  c.isotope_b = st.text(first + 7);
  c.j_hz = st.real(first + 8);
  c.sigma_hz = st.optional_real(first + 9);
  c.sign_known = st.integer(first + 10) != 0;
  c.stereo_unassigned = st.text(first + 11) == "stereo-unassigned";
  c.ranks_a = st.text(first + 12);
  c.ranks_b = st.text(first + 13);
  c.identity = st.text(first + 14);
  c.karplus_set = st.text(first + 15);
  c.note = st.text(first + 16);
  c.origin = st.text(first + 17);
  return c;
}

Conditions read_conditions(const Statement& st, int first) {
  Conditions k;
  k.name = st.text(first);
  k.solvent = st.text(first + 1);
  k.temperature_k = st.optional_real(first + 2);
  k.field_mhz = st.optional_real(first + 3);
  k.ph = st.optional_real(first + 4);
  k.instrument = st.text(first + 5);
  k.method = st.text(first + 6);
  k.measured_by = st.text(first + 7);
  k.measured_on = st.text(first + 8);
  k.source = st.text(first + 9);
  return k;
}

}  // namespace vicinal::library
