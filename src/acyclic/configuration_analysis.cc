#include "acyclic/configuration_analysis.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <set>

#include "core/csv.h"
#include "core/error.h"
#include "core/parse.h"

namespace vicinal::acyclic {

namespace {

std::vector<MeasuredCoupling> from_table(const CsvTable& table, const Predictor& predictor) {
  const std::size_t name_col = table.require_column("coupling");
  const std::size_t j_col = table.require_column("j_hz");
  const std::size_t sigma_col = table.require_column("sigma_hz");
  std::vector<MeasuredCoupling> out;
  for (const auto& row : table.rows()) {
    MeasuredCoupling m;
    m.line = row.line;
    m.name = std::string(trim(row.fields[name_col]));
    try {
      predictor.spec(m.name);
    } catch (const Error& e) {
      throw Error(e.what_happened(), table.where(row, name_col), e.hint());
    }
    for (const auto& seen : out)
      if (seen.name == m.name)
        throw Error(fmt::format("coupling {} is listed twice (first on line {})", m.name, seen.line),
                    table.where(row, name_col), "give each coupling once");
    m.j_hz = parse_coupling_hz(row.fields[j_col], table.where(row, j_col));
    m.sigma_hz = parse_coupling_hz(row.fields[sigma_col], table.where(row, sigma_col));
    if (!(m.sigma_hz > 0))
      throw Error("sigma_hz must be positive", table.where(row, sigma_col), "give the uncertainty, e.g. 0.5");
    out.push_back(m);
  }
  if (out.empty()) throw Error("no couplings in the file", {table.source()}, "add one row per coupling");
  return out;
}

double term(const MeasuredCoupling& m, double pred, double tol) {
  const double z = (std::fabs(m.j_hz) - pred) / std::sqrt(m.sigma_hz * m.sigma_hz + tol * tol);
  return z * z;
}

}  // namespace

std::vector<MeasuredCoupling> read_measured(const std::string& path, const Predictor& predictor) {
  return from_table(CsvTable::read_file(path), predictor);
}

std::vector<MeasuredCoupling> parse_measured(const std::string& text, const std::string& source,
                                             const Predictor& predictor) {
  return from_table(CsvTable::parse(text, source), predictor);
}

Analysis analyse(const Predictor& predictor, const std::vector<MeasuredCoupling>& measured) {
  Analysis a;
  a.arrangements = staggered_arrangements();
  for (const auto& arr : a.arrangements) {
    std::vector<Prediction> row;
    for (const auto& m : measured) row.push_back(predictor.predict(arr, predictor.spec(m.name)));
    a.predictions.push_back(std::move(row));
  }
  const int n = static_cast<int>(a.arrangements.size());
  for (int i = 0; i < n; ++i) {
    Candidate c;
    c.members = {i};
    c.configuration = a.arrangements[i].configuration;
    c.name = a.arrangements[i].name();
    for (std::size_t k = 0; k < measured.size(); ++k) {
      c.j_pred_hz.push_back(a.predictions[i][k].j_hz);
      c.tolerance_hz.push_back(a.predictions[i][k].tolerance_hz);
      c.score += term(measured[k], a.predictions[i][k].j_hz, a.predictions[i][k].tolerance_hz);
    }
    c.ranked_score = c.score;
    a.candidates.push_back(c);
  }
  // Pairs of rotamers of one configuration in fast exchange: the fraction on a
  // 0.01 grid (the score is a smooth function of one variable; a grid is exact
  // enough and cannot miss the minimum). Fractions that leave one member
  // below 10 % are the single rotamer already listed.
  for (int i = 0; i < n; ++i)
    for (int j = i + 1; j < n; ++j) {
      if (a.arrangements[i].configuration != a.arrangements[j].configuration) continue;
      Candidate best;
      best.score = INFINITY;
      for (int step = 10; step <= 90; ++step) {
        const double w = step / 100.0;
        double s = 0;
        for (std::size_t k = 0; k < measured.size(); ++k) {
          const auto& p = a.predictions[i][k];
          const auto& q = a.predictions[j][k];
          s += term(measured[k], w * p.j_hz + (1 - w) * q.j_hz, w * p.tolerance_hz + (1 - w) * q.tolerance_hz);
        }
        if (s < best.score) {
          best.score = s;
          best.fraction = w;
        }
      }
      // An optimum on the edge of the grid means the minor member wants less
      // than 10 %: that is the single rotamer, already a candidate.
      if (best.fraction <= 0.1 || best.fraction >= 0.9) continue;
      best.members = {i, j};
      best.configuration = a.arrangements[i].configuration;
      best.name = fmt::format("{} in exchange: {:.0f} % H2 anti {}, {:.0f} % H2 anti {}",
                              configuration_name(best.configuration), 100 * best.fraction,
                              a.arrangements[i].short_name().substr(2), 100 * (1 - best.fraction),
                              a.arrangements[j].short_name().substr(2));
      for (std::size_t k = 0; k < measured.size(); ++k) {
        const auto& p = a.predictions[i][k];
        const auto& q = a.predictions[j][k];
        best.j_pred_hz.push_back(best.fraction * p.j_hz + (1 - best.fraction) * q.j_hz);
        best.tolerance_hz.push_back(best.fraction * p.tolerance_hz + (1 - best.fraction) * q.tolerance_hz);
      }
      best.ranked_score = best.score + kPairPenalty;
      a.candidates.push_back(best);
    }
  std::stable_sort(a.candidates.begin(), a.candidates.end(),
                   [](const Candidate& x, const Candidate& y) { return x.ranked_score < y.ranked_score; });

  const double best = a.candidates.front().ranked_score;
  std::set<Configuration> configurations;
  a.equally_good = 0;
  for (const auto& c : a.candidates)
    if (c.ranked_score <= best + kEquallyGood) {
      ++a.equally_good;
      configurations.insert(c.configuration);
    }
  a.poor_fit = a.candidates.front().score / static_cast<double>(measured.size()) > 4.0;
  const auto& top = a.candidates.front();
  bool both_hh_anti = true;
  for (int i = 0; i < a.equally_good; ++i)
    for (int m : a.candidates[i].members)
      both_hh_anti &= std::fabs(a.arrangements[m].dihedral_deg("H2", "H3")) > 120;
  if (configurations.size() > 1) {
    a.verdict = Verdict::ConfigurationAmbiguous;
    a.statement = fmt::format(
        "Ambiguous: {} arrangements explain the couplings equally well (scores within {:g}), and they include both "
        "erythro and threo. These couplings do not decide the configuration; measure further couplings (see the "
        "table for the ones that differ between the leading candidates){}.",
        a.equally_good, kEquallyGood,
        both_hh_anti ? " - with H2 and H3 anti no proton coupling differs between erythro and threo, so an NOE "
                       "between the substituents of C2 and C3 is needed"
                     : "");
  } else if (a.equally_good > 1) {
    a.verdict = Verdict::RotamerAmbiguous;
    a.statement = fmt::format(
        "The couplings support the {} configuration; {} rotamer descriptions explain them equally well "
        "(scores within {:g}), the best being: {}.",
        configuration_name(top.configuration), a.equally_good, kEquallyGood, top.name);
  } else {
    a.verdict = Verdict::Clear;
    a.statement = fmt::format("The couplings support {} (score {:.2f}); the next candidate scores {:.2f}.", top.name,
                              top.ranked_score, a.candidates[1].ranked_score);
  }
  if (a.poor_fit)
    a.statement += " Even the best candidate fits poorly: consider other conformers, a wrong assignment or "
                   "substituents unlike those assumed.";
  return a;
}

}  // namespace vicinal::acyclic
