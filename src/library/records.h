// The library's content in memory: what importers produce, exporters write,
// and the store reads and writes. Atom indices are 1-based, in the numbering
// of the compound's own molfile.
#pragma once

#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace vicinal::library {

struct AtomRecord {
  int index = 0;
  std::string element;
  unsigned canonical_rank = 0;
};

struct CompoundRecord {
  std::string name;
  std::string smiles;    // canonical isomeric SMILES
  std::string inchi;
  std::string inchikey;
  std::string molfile;   // the structure with the numbering the couplings use
  std::vector<std::pair<std::string, int>> labels;  // label -> atom, sorted by label
  std::vector<AtomRecord> atoms;
  std::vector<std::string> notes;
  // Substructure-screen bits (library/fingerprint.h) when the importer worked
  // them out; the store computes them when absent.
  std::optional<std::vector<unsigned char>> fingerprint;
};

// Conditions and provenance of one measurement set; two sets of a compound are
// the same set when all of these agree.
struct Conditions {
  std::string name;  // the group's name for the set ("batch 3, CDCl3")
  std::string solvent;
  std::optional<double> temperature_k, field_mhz, ph;
  std::string instrument, method, measured_by, measured_on, source;
  bool operator==(const Conditions&) const = default;
};

// One stored row of derived_results (library/derived.h): an interval of the
// dihedral that a Karplus set allows for the coupling, with when it was derived.
struct DerivedRecord {
  std::string karplus_set;
  double from_deg = 0, to_deg = 0;
  std::string created_utc;  // "YYYY-MM-DDTHH:MM:SSZ"; empty = now, when stored
};

struct CouplingRecord {
  std::string nucleus_a, nucleus_b;       // as written: labels, alternatives '|'-joined
  std::vector<int> atoms_a, atoms_b;      // resolved atoms
  std::vector<int> path;                  // bonded path between atoms_a[0] and atoms_b[0]
  int bond_count = 0;
  std::string isotope_a, isotope_b;
  double j_hz = 0;
  std::optional<double> sigma_hz;
  bool sign_known = false;
  bool stereo_unassigned = false;         // a side lists alternatives
  std::string ranks_a, ranks_b;           // canonical ranks, '|'-joined
  std::string identity;                   // numbering-independent key within the compound
  std::string karplus_set;                // preferred Karplus set for this coupling, if any
  std::string note;
  std::string origin;                     // file or library the value came from
  std::vector<DerivedRecord> derived;     // by karplus_set, from_deg (travels with the coupling)
  long line = 0;                          // input line, for messages (not stored)
};

struct SetRecord {
  Conditions conditions;
  std::string imported_from;
  std::vector<std::string> notes;
  std::vector<CouplingRecord> couplings;
};

// One compound with its measurement sets.
struct Entry {
  CompoundRecord compound;
  std::vector<SetRecord> sets;
};

// Rows of one measurement set that share the same stereo-unassigned
// alternatives ("H-3,H-4a|H-4b" = 10.9 and "H-3,H-4b|H-4a" = 4.6) are one
// group: the couplings to H-4a and H-4b in an unknown order. They share one
// atom-set key, so each row's identity gets its place in the group by
// decreasing J ("#1" the larger); the group then matches the same group
// imported again, and is not mistaken for two values of one coupling.
void number_unassigned_groups(SetRecord& set);

// One string that is equal for equal conditions (for map lookups).
std::string conditions_key(const Conditions& c);

// Text forms shared by the formats: "12|13" <-> {12, 13}, "1-2-3-4" <-> path.
std::string join_atoms(const std::vector<int>& atoms, char separator);
std::vector<int> split_atoms(const std::string& text, char separator);

}  // namespace vicinal::library
