// A five-membered ring type as the pseudorotation analysis needs it
// (db/pucker/<id>.json): its ring atoms in torsion order, and for each
// proton-proton coupling across a ring bond the linear relation
// phi(H,H) = a * nu_j + b to an endocyclic torsion plus the substituents the
// generalized Karplus equation (Haasnoot, de Leeuw and Altona, Tetrahedron 36,
// 2783, 1980) needs. Couplings then follow from (phase, amplitude).
#pragma once

#include <array>
#include <string>
#include <vector>

#include "karplus/karplus.h"

namespace vicinal::pucker {

struct RingSubstituent {
  std::string atom, on, element;  // e.g. "O4'" on "C1'", element "O"
  std::vector<std::string> beta;  // elements of its own non-H neighbours (not the fragment carbon)
  int orientation = 1;            // xi of Haasnoot et al. (+1 / -1)
};

struct RingCoupling {
  std::string name;  // "H1'-H2'"
  int nu = 0;        // index j of the endocyclic torsion
  double a = 1, b = 0;
  std::string source;
  std::string karplus_set;  // set id for this coupling; empty = the ring's
  std::vector<RingSubstituent> substituents;
};

struct RingModel {
  std::string id, title, torsion_convention, karplus_set, relations_source, substituent_notes, file;
  std::array<std::string, 5> ring_atoms;
  bool endo_exo_swapped = false;  // the ring's trade names the envelope sides the other way (see envelope_name)
  std::vector<RingCoupling> couplings;

  // The nearest envelope form under the ring's own naming, e.g. "CG-endo".
  std::string envelope(double phase_deg) const;

  // A shipped ring (db/pucker/<id>.json) or, when `id_or_path` names a file,
  // that file. vicinal::Error lists the shipped ids when it is unknown.
  static RingModel load(const std::string& id_or_path);
  static RingModel load_file(const std::string& path);
  static std::vector<std::string> shipped_ids();

  // Index into `couplings`; vicinal::Error listing the known names when absent.
  std::size_t index_of(const std::string& name) const;
};

double hh_dihedral_deg(const RingCoupling& coupling, double phase_deg, double amplitude_deg);

// The couplings of a ring as a function of (phase, amplitude), with the
// substituent terms computed once from db/electronegativity.json and each
// set's beta factor P7. Each coupling uses the set its ring file names (its
// own karplus_set, else the ring's), unless `override_set` is given.
class RingCouplings {
 public:
  RingCouplings(const RingModel& ring, const karplus::SetCatalog& catalog, const std::string& override_set = {});
  double j_hz(std::size_t coupling, double phase_deg, double amplitude_deg) const;
  const RingModel& ring() const { return ring_; }
  const karplus::ParameterSet& set(std::size_t coupling) const { return sets_[coupling]; }

 private:
  RingModel ring_;
  std::vector<karplus::ParameterSet> sets_;
  std::vector<std::vector<karplus::Substituent>> substituents_;
};

}  // namespace vicinal::pucker
