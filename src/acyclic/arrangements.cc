#include "acyclic/arrangements.h"

#include <cmath>
#include <stdexcept>

namespace vicinal::acyclic {

std::string configuration_name(Configuration c) { return c == Configuration::Erythro ? "erythro" : "threo"; }

double Arrangement::angle_deg(const std::string& atom) const {
  if (atom == "H2") return 0;
  if (atom == "X2") return 120;
  if (atom == "C1") return 240;
  // Back substituents clockwise H3, X3, C4 (erythro: the same order as the
  // front) or H3, C4, X3 (threo: the mirror order).
  const double step = configuration == Configuration::Erythro ? 120 : 240;
  if (atom == "H3") return h3_deg;
  if (atom == "X3") return std::fmod(h3_deg + step, 360.0);
  if (atom == "C4") return std::fmod(h3_deg + 2 * step, 360.0);
  throw std::invalid_argument("unknown atom " + atom);
}

double Arrangement::dihedral_deg(const std::string& front, const std::string& back) const {
  // Viewed from the front atom, the torsion is the clockwise turn from the
  // front bond to the back bond.
  double d = std::fmod(angle_deg(back) - angle_deg(front), 360.0);
  if (d <= -180) d += 360;
  if (d > 180) d -= 360;
  return d;
}

namespace {
std::string anti_to_h2(const Arrangement& a) {
  for (const char* atom : {"H3", "X3", "C4"})
    if (std::fabs(std::fabs(a.dihedral_deg("H2", atom)) - 180) < 1) return atom;
  return "?";
}
}  // namespace

std::string Arrangement::name() const { return configuration_name(configuration) + ", H2 anti " + anti_to_h2(*this); }

std::string Arrangement::short_name() const {
  return std::string(configuration == Configuration::Erythro ? "E-" : "T-") + anti_to_h2(*this);
}

std::vector<Arrangement> staggered_arrangements() {
  std::vector<Arrangement> out;
  for (Configuration c : {Configuration::Erythro, Configuration::Threo})
    for (const char* anti : {"H3", "X3", "C4"})
      for (double h3 : {180.0, 300.0, 60.0}) {
        Arrangement a{c, h3};
        if (std::fabs(std::fabs(a.dihedral_deg("H2", anti)) - 180) < 1) out.push_back(a);
      }
  return out;
}

}  // namespace vicinal::acyclic
