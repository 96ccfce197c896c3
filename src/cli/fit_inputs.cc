#include "cli/fit_inputs.h"

#include <fmt/format.h>

#include <algorithm>
#include <filesystem>
#include <map>
#include <set>

#include "core/csv.h"
#include "core/error.h"
#include "core/parse.h"
#include "karplus/karplus.h"
#include "structure/molecule_io.h"

#include <openbabel/atom.h>

namespace vicinal::cli {

MeasuredCouplings read_measured_couplings(const std::string& path, std::optional<double> default_sigma_hz) {
  MeasuredCouplings m;
  m.list = predict::read_coupling_list(path, /*require_j=*/true);
  if (m.list.rows.empty())
    throw Error("the couplings file lists no couplings", Location(path), "add one row per measured coupling");
  for (const auto& row : m.list.rows) {
    Location where(path, row.line);
    if (!row.j_hz) {
      where.field = "j_hz";
      throw Error("a fit needs the measured value of every coupling", where, "fill in j_hz");
    }
    if (row.sigma_hz) {
      m.sigma_hz.push_back(*row.sigma_hz);
    } else if (default_sigma_hz) {
      m.sigma_hz.push_back(*default_sigma_hz);
    } else {
      where.field = "sigma_hz";
      throw Error("no uncertainty for this coupling", where, "add a sigma_hz column or give --sigma-hz");
    }
  }
  return m;
}

std::vector<Assignment> enumerate_assignments(const predict::CouplingList& list) {
  // Groups: the sorted set of alternatives on one side of a row.
  std::map<std::vector<std::string>, int> group_of;
  std::vector<std::vector<std::string>> groups;
  for (const auto& row : list.rows)
    for (const auto& side : row.nuclei)
      if (side.size() > 1) {
        std::vector<std::string> key = side;
        std::sort(key.begin(), key.end());
        if (std::adjacent_find(key.begin(), key.end()) != key.end())
          throw Error(fmt::format("'{}' repeats an alternative", row.nuclei_text()), Location(list.source, row.line));
        if (group_of.emplace(key, static_cast<int>(groups.size())).second) groups.push_back(key);
      }
  // Every combination of one permutation per group (identity first).
  std::vector<std::vector<std::vector<std::string>>> perms(groups.size());
  std::size_t total = 1;
  for (std::size_t g = 0; g < groups.size(); ++g) {
    auto p = groups[g];
    do perms[g].push_back(p);
    while (std::next_permutation(p.begin(), p.end()));
    total *= perms[g].size();
    if (total > 5040)
      throw Error("too many possible assignments of the '|' alternatives", Location(list.source),
                  "assign some of the diastereotopic nuclei in the couplings file");
  }
  std::vector<Assignment> out;
  for (std::size_t index = 0; index < total; ++index) {
    Assignment a;
    std::map<std::string, std::string> mapping;
    std::size_t rest = index;
    for (std::size_t g = 0; g < groups.size(); ++g) {
      const auto& perm = perms[g][rest % perms[g].size()];
      rest /= perms[g].size();
      for (std::size_t k = 0; k < perm.size(); ++k) {
        mapping[groups[g][k]] = perm[k];
        if (groups[g][k] != perm[k]) a.label += (a.label.empty() ? "" : ", ") + groups[g][k] + "->" + perm[k];
      }
    }
    if (a.label.empty()) a.label = "as written";
    for (const auto& row : list.rows) {
      std::array<std::string, 2> refs;
      for (int s = 0; s < 2; ++s)
        refs[s] = row.nuclei[s].size() > 1 ? mapping.at(row.nuclei[s][0]) : row.nuclei[s][0];
      a.refs.push_back(refs);
    }
    out.push_back(std::move(a));
  }
  return out;
}

namespace {

double set_rms(const std::string& set_id) { return karplus::SetCatalog::shipped().find(set_id).rms_hz; }

std::string strip_suffix(std::string name) {
  const std::string suffix = " j_hz";
  name = std::string(trim(name));
  if (name.size() > suffix.size() && name.compare(name.size() - suffix.size(), suffix.size(), suffix) == 0)
    name.resize(name.size() - suffix.size());
  return name;
}

}  // namespace

fit::PopulationProblem problem_from_matrix(const std::string& matrix_csv, const MeasuredCouplings& measured,
                                           const std::string& set_choice, std::optional<double> rms_hz) {
  const CsvTable table = CsvTable::read_file(matrix_csv);
  std::map<std::string, std::size_t> column_of;
  for (std::size_t c = 0; c < table.header().size(); ++c) column_of[strip_suffix(table.header()[c])] = c;
  const auto& rows = measured.list.rows;
  fit::PopulationProblem p;
  const int m = static_cast<int>(rows.size()), n = static_cast<int>(table.rows().size());
  if (n == 0) throw Error("the J matrix has no conformer rows", Location(matrix_csv), "one row per conformer");
  p.j_hz.resize(m, n);
  p.j_obs_hz.resize(m);
  p.sigma_hz.resize(m);
  p.rms_hz.resize(m);
  for (int r = 0; r < m; ++r) {
    const auto& row = rows[r];
    Location where(measured.list.source, row.line);
    where.field = "nuclei";
    if (row.has_alternatives())
      throw Error(fmt::format("'{}' lists alternative nuclei; a J matrix has one column per coupling", row.nuclei_text()),
                  where, "give the structure (--ensemble) so that every assignment can be predicted");
    const std::string a = row.nuclei[0][0], b = row.nuclei[1][0];
    std::optional<std::size_t> column;
    for (const auto& name : {a + "," + b, b + "," + a, a + "/" + b, b + "/" + a})
      if (auto it = column_of.find(name); it != column_of.end()) column = it->second;
    if (!column)
      throw Error(fmt::format("the J matrix has no column for the coupling {},{}", a, b), Location(matrix_csv),
                  fmt::format("name a column \"{},{}\" (or \"{}/{} j_hz\" as `vicinal predict --csv` writes)", a, b, a, b));
    for (int i = 0; i < n; ++i) {
      const auto& csv_row = table.rows()[i];
      p.j_hz(r, i) = parse_coupling_hz(csv_row.fields[*column], table.where(csv_row, *column));
    }
    p.j_obs_hz(r) = *row.j_hz;
    p.sigma_hz(r) = measured.sigma_hz[r];
    const std::string set = row.set.empty() ? set_choice : row.set;
    if (rms_hz) p.rms_hz(r) = *rms_hz;
    else if (!set.empty() && set != predict::kAutoSet) p.rms_hz(r) = set_rms(set);
    else p.rms_hz(r) = 0;
    p.coupling_names.push_back(a + "/" + b);
  }
  const auto title = table.column("title");
  const auto number = table.column("conformer");
  for (int i = 0; i < n; ++i) {
    const auto& f = table.rows()[i].fields;
    std::string name = title && !f[*title].empty() ? f[*title] : number ? "conformer " + f[*number] : "";
    p.conformer_names.push_back(name.empty() ? fmt::format("conformer {}", i + 1) : name);
  }
  return p;
}

LoadedEnsemble load_ensemble(const std::string& ensemble_path, const std::string& structure_path,
                             const std::string& labels_csv, std::vector<std::string>* notes) {
  structure::ReadNotes read;
  LoadedEnsemble in;
  in.ensemble = structure::read_ensemble(ensemble_path, &read);
  in.source = ensemble_path;
  if (in.ensemble.frame_count() == 0)
    throw Error("the ensemble has no conformers", Location(ensemble_path), "give a file with at least one structure");
  if (!structure_path.empty()) {
    OpenBabel::OBMol mol = structure::read_molecule(structure_path, &read);
    if (mol.NumAtoms() != in.ensemble.topology.NumAtoms())
      throw Error(fmt::format("the ensemble has {} atoms but the structure {}", in.ensemble.atom_count(), mol.NumAtoms()),
                  Location(ensemble_path), "the ensemble must list the structure's atoms in the same order");
    for (unsigned i = 1; i <= mol.NumAtoms(); ++i)
      if (mol.GetAtom(i)->GetAtomicNum() != in.ensemble.topology.GetAtom(i)->GetAtomicNum())
        throw Error(fmt::format("atom {} differs between the ensemble and the structure", i), Location(ensemble_path),
                    "the ensemble must list the structure's atoms in the same order");
    in.ensemble.topology = mol;
    in.ensemble.topology.SetCoordinates(in.ensemble.xyz.data());
    in.source = structure_path;
  }
  in.labels = structure::AtomLabels::for_molecule(in.ensemble.topology, in.source, labels_csv);
  if (notes) notes->insert(notes->end(), read.messages.begin(), read.messages.end());
  return in;
}

EnsembleProblem problem_from_ensemble(const LoadedEnsemble& in, const MeasuredCouplings& measured,
                                      const Assignment& assignment, const std::string& set_choice, int threads) {
  EnsembleProblem out;
  const auto& rows = measured.list.rows;
  for (std::size_t r = 0; r < rows.size(); ++r) {
    Location where(measured.list.source, rows[r].line);
    where.field = "nuclei";
    auto spec = predict::resolve_coupling(in.ensemble.topology, in.labels, assignment.refs[r],
                                          rows[r].set.empty() ? set_choice : rows[r].set, where);
    spec.j_obs_hz = rows[r].j_hz;
    spec.sigma_hz = measured.sigma_hz[r];
    spec.line = rows[r].line;
    out.specs.push_back(std::move(spec));
  }
  out.matrix = predict::compute_j_matrix(out.specs, in.ensemble, threads);
  auto& p = out.problem;
  const int m = static_cast<int>(out.specs.size()), n = static_cast<int>(out.matrix.frames);
  p.j_hz.resize(m, n);
  p.j_obs_hz.resize(m);
  p.sigma_hz.resize(m);
  p.rms_hz.resize(m);
  for (int r = 0; r < m; ++r) {
    for (int i = 0; i < n; ++i) p.j_hz(r, i) = out.matrix.j(i, r);
    p.j_obs_hz(r) = *out.specs[r].j_obs_hz;
    p.sigma_hz(r) = *out.specs[r].sigma_hz;
    p.rms_hz(r) = out.specs[r].set->rms_hz;
    p.coupling_names.push_back(out.specs[r].name);
  }
  for (int i = 0; i < n; ++i)
    p.conformer_names.push_back(i < static_cast<int>(in.ensemble.titles.size()) && !in.ensemble.titles[i].empty()
                                    ? in.ensemble.titles[i]
                                    : fmt::format("conformer {}", i + 1));
  return out;
}

fit::StateGeometry state_geometry(const EnsembleProblem& p) {
  fit::StateGeometry g;
  const int m = static_cast<int>(p.specs.size()), n = static_cast<int>(p.matrix.frames);
  g.dihedral_deg.resize(m, n);
  std::map<std::pair<int, int>, int> bond_index;
  for (int r = 0; r < m; ++r) {
    for (int i = 0; i < n; ++i) g.dihedral_deg(r, i) = p.matrix.dihedral(i, r);
    const auto& path = p.specs[r].path;
    const std::pair<int, int> bond{std::min(path[1], path[2]), std::max(path[1], path[2])};
    g.torsion.push_back(bond_index.emplace(bond, static_cast<int>(bond_index.size())).first->second);
  }
  return g;
}

fit::CouplingCurve coupling_curve(const EnsembleProblem& p) {
  const auto* specs = &p.specs;
  return [specs](int row, double dihedral_deg) {
    const auto& s = (*specs)[row];
    return karplus::j_hz(*s.set, dihedral_deg, s.karplus_substituents);
  };
}

}  // namespace vicinal::cli
