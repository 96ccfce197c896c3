#include "library/stats.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>

#include "library/records.h"

namespace vicinal::library {

LibraryStats library_stats(Database& db) {
  ReadTransaction snapshot(db);
  LibraryStats out;
  auto count = [&](const char* sql) {
    Statement s(db, sql);
    s.step();
    return static_cast<long>(s.integer(0));
  };
  out.compounds = count("SELECT count(*) FROM compounds");
  out.sets = count("SELECT count(*) FROM measurement_sets");
  out.couplings = count("SELECT count(*) FROM couplings");
  out.stereo_unassigned = count("SELECT count(*) FROM couplings WHERE assignment = 'stereo-unassigned'");
  out.conflicts = count(
      "SELECT count(*) FROM (SELECT set_id, identity FROM couplings GROUP BY set_id, identity "
      "HAVING count(DISTINCT j_hz) > 1)");
  out.solvents = count("SELECT count(DISTINCT solvent) FROM measurement_sets WHERE solvent <> ''");
  out.sources = count("SELECT count(DISTINCT source) FROM measurement_sets WHERE source <> ''");

  // Elements of every atom, then the fragment of each coupling path.
  std::map<std::pair<std::int64_t, int>, std::string> element;
  {
    Statement s(db, "SELECT compound_id, atom_index, element FROM atoms");
    while (s.step()) element[{s.integer(0), static_cast<int>(s.integer(1))}] = s.text(2);
  }
  std::map<std::string, std::vector<double>> by_fragment;
  Statement s(db, "SELECT m.compound_id, k.path, k.j_hz FROM couplings k JOIN measurement_sets m ON m.id = k.set_id");
  while (s.step()) {
    const auto compound = s.integer(0);
    std::vector<std::string> names;
    for (int atom : split_atoms(s.text(1), '-')) {
      auto it = element.find({compound, atom});
      names.push_back(it == element.end() ? "?" : it->second);
    }
    std::vector<std::string> reversed(names.rbegin(), names.rend());
    const auto& chosen = std::min(names, reversed);
    std::string fragment;
    for (const auto& n : chosen) fragment += (fragment.empty() ? "" : "-") + n;
    by_fragment[fragment].push_back(s.real(2));
  }
  for (auto& [fragment, values] : by_fragment) {
    FragmentStats f;
    f.fragment = fragment;
    std::sort(values.begin(), values.end());
    f.j_hz = values;
    double sum = 0;
    for (double v : values) sum += v;
    f.mean_hz = sum / values.size();
    double ss = 0;
    for (double v : values) ss += (v - f.mean_hz) * (v - f.mean_hz);
    f.sd_hz = values.size() > 1 ? std::sqrt(ss / (values.size() - 1)) : 0;
    const std::size_t n = values.size();
    f.median_hz = n % 2 ? values[n / 2] : 0.5 * (values[n / 2 - 1] + values[n / 2]);
    out.fragments.push_back(std::move(f));
  }
  std::stable_sort(out.fragments.begin(), out.fragments.end(),
                   [](const auto& a, const auto& b) { return a.j_hz.size() > b.j_hz.size(); });
  return out;
}

report::Figure j_histogram(const LibraryStats& stats, std::size_t max_fragments) {
  report::Figure fig;
  fig.title = "Measured couplings by fragment";
  fig.x_label = "J / Hz";
  fig.y_label = "couplings per 1 Hz bin";
  double lo = 0, hi = 1;
  bool any = false;
  for (std::size_t i = 0; i < stats.fragments.size() && i < max_fragments; ++i) {
    const auto& v = stats.fragments[i].j_hz;
    lo = any ? std::min(lo, v.front()) : v.front();
    hi = any ? std::max(hi, v.back()) : v.back();
    any = true;
  }
  const double first = std::floor(lo), last = std::floor(hi) + 1;
  for (std::size_t i = 0; i < stats.fragments.size() && i < max_fragments; ++i) {
    report::Series series;
    series.label = fmt::format("{} ({})", stats.fragments[i].fragment, stats.fragments[i].j_hz.size());
    series.style = report::Series::Style::Bars;
    for (double x = first; x < last; x += 1) {
      series.x.push_back(x + 0.5);
      series.y.push_back(static_cast<double>(std::count_if(stats.fragments[i].j_hz.begin(), stats.fragments[i].j_hz.end(),
                                                          [&](double j) { return j >= x && j < x + 1; })));
    }
    fig.series.push_back(std::move(series));
  }
  fig.x_range = std::make_pair(first, last);
  return fig;
}

}  // namespace vicinal::library
