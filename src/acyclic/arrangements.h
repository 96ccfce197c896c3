// The six staggered arrangements of two adjacent stereocentres C2-C3 in a
// chain C1-C2-C3-C4, where C2 carries H2 and an oxygen X2 and C3 carries H3 and
// a substituent X3 (an oxygen or a carbon). Positions are Newman angles in
// degrees, clockwise, viewed along C2 -> C3 with C2 in front: H2 at 0, X2 at
// 120, C1 at 240. The relative configuration is named as in a Fischer
// projection of the main chain: erythro when X2 and X3 lie on the same side,
// that is when, eclipsed with C1 over C4, X3 also sits over X2; threo otherwise.
#pragma once

#include <string>
#include <vector>

namespace vicinal::acyclic {

enum class Configuration { Erythro, Threo };
std::string configuration_name(Configuration c);

// Atoms that take part: front "H2", "X2", "C1"; back "H3", "X3", "C4".
struct Arrangement {
  Configuration configuration{};
  double h3_deg = 180;  // Newman angle of H3: 60, 180 or 300

  double angle_deg(const std::string& atom) const;
  // Torsion front-C2-C3-back in (-180, 180] (IUPAC sign).
  double dihedral_deg(const std::string& front, const std::string& back) const;
  // Our own name: the configuration and what lies anti to H2, e.g. "erythro, H2 anti H3".
  std::string name() const;
  std::string short_name() const;  // e.g. "E-H3", "T-C4"
};

// Erythro then threo, each with H3, X3, C4 anti to H2 in turn.
std::vector<Arrangement> staggered_arrangements();

}  // namespace vicinal::acyclic
