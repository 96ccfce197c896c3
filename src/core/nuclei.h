// Nuclear data (spin, gyromagnetic ratio, natural abundance) from
// db/nuclei.json, and conversions of couplings between isotopologues.
#pragma once

#include <string>
#include <vector>

namespace vicinal {

struct Nucleus {
  std::string isotope;           // "1H", "13C", ...
  std::string element;           // "H", "C", ...
  int mass_number = 0;
  double spin = 0;               // I, in units of hbar
  double gamma_1e7_rad_per_t_s = 0;  // gyromagnetic ratio / (10^7 rad T^-1 s^-1)
  double abundance_percent = 0;  // natural abundance; 0 for radioactive nuclides
  std::string source;
};

class NuclearTable {
 public:
  // Loads db/nuclei.json (or the given file).
  static const NuclearTable& shipped();
  static NuclearTable load(const std::string& path);

  const std::vector<Nucleus>& all() const { return nuclei_; }
  // Throws vicinal::Error listing the known isotopes when the name is unknown.
  // Accepts "1H", "H1", "^1H" and "D"/"T" for 2H/3H.
  const Nucleus& find(const std::string& isotope) const;
  const std::string& citation() const { return citation_; }

 private:
  std::vector<Nucleus> nuclei_;
  std::string citation_;
};

// J between (a2, b2) from J between (a1, b1) for the same bonded pair in another
// isotopologue: J scales with the product of the two gyromagnetic ratios.
double scale_coupling_hz(double j_hz, const Nucleus& a1, const Nucleus& b1, const Nucleus& a2,
                         const Nucleus& b2);

// Reduced coupling constant K = 4 pi^2 J / (h gamma_a gamma_b), in
// 10^19 N A^-2 m^-3 (= 10^19 T^2 J^-1), the unit in which K is usually quoted.
double reduced_coupling_1e19(double j_hz, const Nucleus& a, const Nucleus& b);

}  // namespace vicinal
