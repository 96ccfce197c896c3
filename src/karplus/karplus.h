// Karplus relations: published parameter sets (db/karplus/*.json), the
// forward map dihedral -> J and the inverse map J -> allowed dihedrals.
//
// Angles: the dihedral is measured on the set's four-atom pattern (atom maps
// 1-4 of `pattern_smarts`); the equation is evaluated at
// theta = dihedral + offset_deg. All angles in degrees at this interface.
#pragma once

#include <array>
#include <cstddef>
#include <span>
#include <string>
#include <vector>

namespace vicinal::karplus {

enum class Form {
  ThreeTerm,           // A cos^2 t + B cos t + C;          coefficients {A, B, C}
  PiecewiseThreeTerm,  // {A1,B1,C1} for |t| <= 90, {A2,B2,C2} beyond (Karplus 1959)
  Fourier,             // C0 + sum_k Ck cos(k t) + Sk sin(k t); {C0, C1, S1, C2, S2, ...}
  Haasnoot,            // generalized H-C-C-H equation, Haasnoot, de Leeuw, Altona 1980:
                       // P1 cos^2 t + P2 cos t + P3
                       //   + sum_i dchi_i (P4 + P5 cos^2(xi_i t + P6 |dchi_i|));
                       // coefficients {P1..P6, P7}, P7 = beta-substituent factor
};

// One non-hydrogen substituent on the H-C-C-H fragment, as the Haasnoot
// equation needs it: its group electronegativity difference from hydrogen
// (beta correction already applied) and its orientation sign xi (+1 or -1).
struct Substituent {
  double delta_chi = 0;
  int orientation = 1;
};

// An H-C-C-H fragment carries at most four non-hydrogen substituents; more is
// a vicinal::Error (the evaluation keeps them in a fixed-size buffer).
inline constexpr std::size_t kMaxSubstituents = 4;

// The beta-substituent correction of the Haasnoot equation:
// delta_chi = delta_chi_alpha - p7 * sum_j delta_chi_beta_j.
double beta_corrected_delta_chi(double delta_chi_alpha, std::span<const double> delta_chi_beta, double p7);

struct ParameterSet {
  std::string id;              // our own identifier, e.g. "hh-haasnoot-1980-general"
  std::string title;           // one-line description for tables
  std::array<std::string, 2> nuclei;  // isotopes of the coupled nuclei, e.g. {"1H","1H"}
  std::string coupling;        // trade name of the coupling, e.g. "3J(HN,HA)"
  std::string pattern_smarts;  // four mapped atoms [..:1]~[..:2]~[..:3]~[..:4]
  std::string angle_name;      // what the dihedral is called, e.g. "phi", "H-C-C-H"
  double offset_deg = 0;
  Form form = Form::ThreeTerm;
  std::vector<double> coefficients;
  double rms_hz = 0;           // the set's own stated RMS deviation (0 if none stated)
  double valid_from_deg = -180, valid_to_deg = 180;
  std::string citation;        // authors, year, journal, volume, page
  std::string table;           // table/equation in the paper the values come from
  std::string doi;
  std::string notes;
  std::string file;            // the file it was loaded from
  std::string short_citation;  // "Hu & Bax 1997", for tables and legends
  std::vector<std::string> coefficient_names;  // names in `coefficients` order, as in the file
  int substituent_count = 0;   // Haasnoot sets: substituents the set was fitted for (0 = all patterns)

  bool is_haasnoot() const { return form == Form::Haasnoot; }
  // P7 of a Haasnoot set; vicinal::Error for other forms.
  double beta_factor() const;
};

// The number of substituents a Haasnoot set applies to is part of its id and
// notes; the evaluation itself takes whatever substituents are given.
double j_hz(const ParameterSet& set, double dihedral_deg, std::span<const Substituent> substituents = {});

// The hot loop of ensemble prediction: J for many dihedrals at once with no
// substituents (or one fixed substituent list for every angle).
void j_hz(const ParameterSet& set, std::span<const double> dihedral_deg, std::span<double> out,
          std::span<const Substituent> substituents = {});

// Smallest and largest J the curve reaches over [-180, 180): every local
// extremum is found on a 0.1 degree scan and refined, so the J values are exact
// to ~1e-12 Hz and their positions to ~1e-6 degrees (a flat extremum cannot be
// located better from double-precision function values).
struct JRange {
  double min_hz, min_at_deg, max_hz, max_at_deg;
};
JRange j_range(const ParameterSet& set, std::span<const Substituent> substituents = {});

struct AngleInterval {
  double from_deg, to_deg;  // within [-180, 180]; from < to, or from == to where the band
                            // only touches an extremum of the curve
  double best_deg;          // where the curve equals J (or comes closest) inside the interval
  // An interval that runs through +-180 is split into [from, 180] and
  // [-180, to]; both pieces carry wraps = true.
  bool wraps = false;
};

struct AngleSolution {
  double j_hz, sigma_hz, k;
  double tolerance_hz;                  // k * sqrt(sigma^2 + rms^2)
  std::vector<AngleInterval> intervals; // sorted by from_deg
  std::vector<double> exact_deg;        // every angle where the curve equals J exactly
  JRange range;
};

// Every dihedral interval in [-180, 180) where |J(curve) - j| <= k*sqrt(sigma^2 + rms^2).
// Interval ends and exact roots are found by bisection on the monotonic pieces
// between extrema (to ~1e-10 degrees), so a root at an extremum (tangential
// touch) is found too; exact_deg lists up to four roots for cos^2 curves.
// Throws vicinal::Error when j lies further than the tolerance outside the curve's
// range (naming the nearest attainable J), or on negative sigma / non-finite input.
AngleSolution allowed_dihedrals(const ParameterSet& set, double j_hz, double sigma_hz, double k = 2.0,
                                std::span<const Substituent> substituents = {});

// All sets shipped in db/karplus/ plus user sets found in $VICINAL_KARPLUS_DIR
// (where `karplus calibrate` writes).
class SetCatalog {
 public:
  static const SetCatalog& shipped();
  static SetCatalog load_directory(const std::string& folder);
  static ParameterSet load_file(const std::string& path);

  const std::vector<ParameterSet>& all() const { return sets_; }
  // Throws vicinal::Error naming close matches when the id is unknown.
  const ParameterSet& find(const std::string& id) const;

 private:
  std::vector<ParameterSet> sets_;
};

std::string form_name(Form form);
// "three-term", "piecewise-three-term", "fourier", "haasnoot"; vicinal::Error otherwise.
Form parse_form(const std::string& name);

}  // namespace vicinal::karplus
