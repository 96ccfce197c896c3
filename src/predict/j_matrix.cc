#include "predict/j_matrix.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/elements.h>

#include <algorithm>
#include <cmath>
#include <set>
#include <thread>

#include "core/error.h"
#include "predict/set_choice.h"
#include "structure/coupling_path.h"
#include "structure/frame_reader.h"

namespace vicinal::predict {

namespace {

std::vector<std::string> atom_names(const OpenBabel::OBMol& mol, const structure::AtomLabels& labels) {
  std::vector<std::string> names;
  const int n = static_cast<int>(const_cast<OpenBabel::OBMol&>(mol).NumAtoms());
  names.reserve(n);
  for (int i = 1; i <= n; ++i) names.push_back(labels.describe(i, mol));
  return names;
}

Error with_location(const Error& e, const Location& where) {
  if (where.file.empty()) return e;
  Location at = where;
  at.atom = e.where().atom;
  return Error(e.what_happened(), at, e.hint());
}

bool is_hcch(OpenBabel::OBMol& mol, const std::array<int, 4>& p) {
  const auto z = [&](int i) { return mol.GetAtom(p[i])->GetAtomicNum(); };
  return z(0) == 1 && z(1) == 6 && z(2) == 6 && z(3) == 1;
}

// The Haasnoot set fitted for `count` substituents, else the one for all
// substitution patterns (substituent_count 0).
const karplus::ParameterSet* haasnoot_for(int count, std::string* reason) {
  const karplus::ParameterSet* general = nullptr;
  for (const auto& set : karplus::SetCatalog::shipped().all()) {
    if (!set.is_haasnoot()) continue;
    if (set.substituent_count == count) {
      *reason = fmt::format("auto: H-C-C-H with {} substituents -> Haasnoot set for {} substituents", count, count);
      return &set;
    }
    if (set.substituent_count == 0 && !general) general = &set;
  }
  if (general)
    *reason = fmt::format("auto: H-C-C-H with {} substituents -> Haasnoot set for all substitution patterns", count);
  return general;
}

void fill_substituents(const OpenBabel::OBMol& mol, CouplingSpec& spec) {
  if (!spec.set->is_haasnoot()) return;
  // The orientation signs depend on the configuration at each carbon only, not
  // on the conformation, so the first frame's geometry serves every frame.
  spec.substituents = structure::haasnoot_substituents(mol, spec.path, spec.set->beta_factor());
  if (spec.substituents.size() > karplus::kMaxSubstituents)
    throw Error(fmt::format("{} has {} substituents; the Haasnoot equation allows at most {}", spec.name,
                            spec.substituents.size(), karplus::kMaxSubstituents));
  spec.karplus_substituents = structure::as_karplus(spec.substituents);
}

CouplingSpec resolve_pair(const OpenBabel::OBMol& mol, const std::vector<std::string>& names, SetMatcher& matcher,
                          int a, int b, const std::string& set_choice) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  CouplingSpec spec;
  spec.nuclei = {a, b};
  spec.name = names[a - 1] + "/" + names[b - 1];
  const structure::CouplingPath path = structure::coupling_path(mol, a, b, 3, names);
  spec.bond_path = path.four();
  Location where;
  where.atom = fmt::format("{},{}", names[a - 1], names[b - 1]);

  if (set_choice != kAutoSet) {
    const karplus::ParameterSet& set = karplus::SetCatalog::shipped().find(set_choice);
    const SetOccurrence* occ = matcher.occurrence_for(set, a, b);
    if (!occ)
      throw Error(fmt::format("set '{}' ({}, pattern {}) does not describe the coupling {}", set.id, set.coupling,
                              set.pattern_smarts, spec.name),
                  where, "see `vicinal karplus sets` for the sets and the couplings they describe, or use --set auto");
    spec.set = &set;
    spec.path = occ->dihedral;
    spec.set_reason = "chosen: " + set.id;
  } else if (is_hcch(m, spec.bond_path)) {
    spec.set = haasnoot_for(substituent_count(mol, spec.bond_path), &spec.set_reason);
    if (!spec.set) throw Error("no Haasnoot parameter set is installed", where);
    const SetOccurrence* occ = matcher.occurrence_for(*spec.set, a, b);
    if (!occ)
      throw Error(fmt::format("the H-C-C-H fragment of {} is not covered by set '{}' (pattern {}); are both carbons "
                              "sp3?",
                              spec.name, spec.set->id, spec.set->pattern_smarts),
                  where, "choose a set with --set");
    spec.path = occ->dihedral;
  } else {
    std::vector<const karplus::ParameterSet*> fitting;
    const SetOccurrence* first = nullptr;
    for (const auto& set : karplus::SetCatalog::shipped().all()) {
      if (set.is_haasnoot()) continue;
      if (const SetOccurrence* occ = matcher.occurrence_for(set, a, b)) {
        if (!first) first = occ;
        fitting.push_back(&set);
      }
    }
    if (fitting.empty())
      throw Error(fmt::format("no shipped Karplus set describes the coupling {} ({}-{}-{}-{})", spec.name,
                              names[spec.bond_path[0] - 1], names[spec.bond_path[1] - 1], names[spec.bond_path[2] - 1],
                              names[spec.bond_path[3] - 1]),
                  where, "see `vicinal karplus sets`; a set of your own can be added to $VICINAL_KARPLUS_DIR");
    spec.set = fitting.front();
    spec.path = first->dihedral;
    spec.set_reason = fmt::format("auto: {} ", spec.set->id);
    if (fitting.size() > 1) {
      spec.set_reason += "(first of";
      for (const auto* s : fitting) spec.set_reason += " " + s->id;
      spec.set_reason += "; choose one with --set)";
    }
  }
  fill_substituents(mol, spec);
  return spec;
}

}  // namespace

CouplingSpec resolve_coupling(const OpenBabel::OBMol& mol, const structure::AtomLabels& labels,
                              const std::array<std::string, 2>& refs, const std::string& set_choice,
                              const Location& where) {
  SetMatcher matcher(mol);
  const auto names = atom_names(mol, labels);
  try {
    const int a = labels.resolve(refs[0], &mol);
    const int b = labels.resolve(refs[1], &mol);
    return resolve_pair(mol, names, matcher, a, b, set_choice);
  } catch (const Error& e) {
    throw with_location(e, where);
  }
}

std::vector<CouplingSpec> resolve_couplings(const OpenBabel::OBMol& mol, const structure::AtomLabels& labels,
                                            const CouplingList& list, const std::string& set_choice) {
  SetMatcher matcher(mol);
  const auto names = atom_names(mol, labels);
  std::vector<CouplingSpec> specs;
  for (const auto& row : list.rows) {
    Location where(list.source, row.line);
    where.field = "nuclei";
    if (row.has_alternatives())
      throw Error(fmt::format("'{}' lists alternative nuclei; prediction needs one atom on each side",
                              row.nuclei_text()),
                  where, "write one row per assignment, or use `vicinal fit`, which tries each assignment");
    try {
      const int a = labels.resolve(row.nuclei[0][0], &mol);
      const int b = labels.resolve(row.nuclei[1][0], &mol);
      CouplingSpec spec = resolve_pair(mol, names, matcher, a, b, row.set.empty() ? set_choice : row.set);
      spec.j_obs_hz = row.j_hz;
      spec.sigma_hz = row.sigma_hz;
      spec.line = row.line;
      specs.push_back(std::move(spec));
    } catch (const Error& e) {
      throw with_location(e, where);
    }
  }
  return specs;
}

std::vector<CouplingSpec> couplings_from_pattern(const OpenBabel::OBMol& mol, const structure::AtomLabels& labels,
                                                 const std::string& set_choice, std::vector<std::string>* skipped) {
  SetMatcher matcher(mol);
  const auto names = atom_names(mol, labels);
  // Candidate pairs: from the chosen set's pattern, or (auto) from every
  // H-C-C-H, i.e. the pattern of the general Haasnoot set.
  const karplus::ParameterSet* pattern_set = nullptr;
  if (set_choice != kAutoSet) {
    pattern_set = &karplus::SetCatalog::shipped().find(set_choice);
  } else {
    std::string reason;
    pattern_set = haasnoot_for(0, &reason);
    if (!pattern_set) throw Error("no Haasnoot parameter set is installed; choose a set with --set");
  }
  std::set<std::array<int, 2>> seen;
  std::vector<CouplingSpec> specs;
  for (const auto& occ : matcher.occurrences(*pattern_set))
    for (const auto& pair : occ.nuclei_pairs) {
      const std::array<int, 2> key{std::min(pair[0], pair[1]), std::max(pair[0], pair[1])};
      if (!seen.insert(key).second) continue;
      try {
        specs.push_back(resolve_pair(mol, names, matcher, pair[0], pair[1], set_choice));
      } catch (const Error& e) {
        if (skipped) skipped->push_back(e.what_happened());
      }
    }
  std::sort(specs.begin(), specs.end(), [](const CouplingSpec& x, const CouplingSpec& y) { return x.nuclei < y.nuclei; });
  return specs;
}

double dihedral_deg(std::span<const double> xyz, const std::array<int, 4>& atoms) {
  const double* p[4];
  for (int k = 0; k < 4; ++k) p[k] = xyz.data() + 3 * static_cast<std::size_t>(atoms[k] - 1);
  double b1[3], b2[3], b3[3];
  for (int i = 0; i < 3; ++i) {
    b1[i] = p[1][i] - p[0][i];
    b2[i] = p[2][i] - p[1][i];
    b3[i] = p[3][i] - p[2][i];
  }
  const auto cross = [](const double* u, const double* v, double* w) {
    w[0] = u[1] * v[2] - u[2] * v[1];
    w[1] = u[2] * v[0] - u[0] * v[2];
    w[2] = u[0] * v[1] - u[1] * v[0];
  };
  double n1[3], n2[3];
  cross(b1, b2, n1);
  cross(b2, b3, n2);
  const double b2_len = std::sqrt(b2[0] * b2[0] + b2[1] * b2[1] + b2[2] * b2[2]);
  // atan2(|b2| b1.(b2 x b3), (b1 x b2).(b2 x b3)) (Blondel & Karplus, J. Comput. Chem. 17, 1132,
  // 1996): IUPAC sign, positive when, looking along 2->3, bond 1-2 turns clockwise onto 3-4.
  const double y = b2_len * (b1[0] * n2[0] + b1[1] * n2[1] + b1[2] * n2[2]);
  const double x = n1[0] * n2[0] + n1[1] * n2[1] + n1[2] * n2[2];
  double deg = std::atan2(y, x) * 180.0 / M_PI;
  if (deg <= -180.0) deg += 360.0;
  return deg;
}

std::vector<double> JMatrix::average_j_hz(std::span<const double> weights) const {
  if (weights.size() != frames) throw std::logic_error("JMatrix::average_j_hz: one weight per frame needed");
  std::vector<double> mean(couplings, 0.0);
  for (std::size_t f = 0; f < frames; ++f)
    for (std::size_t k = 0; k < couplings; ++k) mean[k] += weights[f] * j_hz[f * couplings + k];
  return mean;
}

namespace {

// Frames [from, to) of `xyz` into rows [from, to) of the matrix.
void fill_rows(const std::vector<CouplingSpec>& specs, std::span<const double> xyz, int atom_count, std::size_t from,
               std::size_t to, JMatrix& out) {
  const std::size_t per_frame = 3 * static_cast<std::size_t>(atom_count);
  const std::size_t nk = specs.size();
  std::vector<double> angles(to - from), js(to - from);
  for (std::size_t k = 0; k < nk; ++k) {
    for (std::size_t f = from; f < to; ++f)
      angles[f - from] = dihedral_deg(xyz.subspan(f * per_frame, per_frame), specs[k].path);
    karplus::j_hz(*specs[k].set, angles, js, specs[k].karplus_substituents);
    for (std::size_t f = from; f < to; ++f) {
      out.dihedral_deg[f * nk + k] = angles[f - from];
      out.j_hz[f * nk + k] = js[f - from];
    }
  }
}

}  // namespace

JMatrix compute_j_matrix(const std::vector<CouplingSpec>& specs, std::span<const double> xyz, int atom_count,
                         int threads, Progress* progress) {
  const std::size_t per_frame = 3 * static_cast<std::size_t>(atom_count);
  JMatrix out;
  out.frames = per_frame ? xyz.size() / per_frame : 0;
  out.couplings = specs.size();
  out.dihedral_deg.assign(out.frames * out.couplings, 0.0);
  out.j_hz.assign(out.frames * out.couplings, 0.0);
  for (const auto& s : specs)
    if (!s.set) throw std::logic_error("compute_j_matrix: coupling without a set");
  // Blocks of frames keep progress moving; each block is split over the workers.
  constexpr std::size_t kBlock = 1 << 14;
  const std::size_t workers = static_cast<std::size_t>(std::max(1, threads));
  if (progress) progress->start("J matrix", out.frames);
  for (std::size_t start = 0; start < out.frames; start += kBlock) {
    const std::size_t stop = std::min(out.frames, start + kBlock);
    const std::size_t n = stop - start;
    const std::size_t use = std::min(workers, std::max<std::size_t>(1, n / 64));
    std::vector<std::thread> pool;
    for (std::size_t w = 1; w < use; ++w)
      pool.emplace_back(fill_rows, std::cref(specs), xyz, atom_count, start + n * w / use, start + n * (w + 1) / use,
                        std::ref(out));
    fill_rows(specs, xyz, atom_count, start, start + n / use, out);
    for (auto& t : pool) t.join();
    if (progress) progress->advance(stop);
  }
  if (progress) progress->finish();
  return out;
}

JMatrix compute_j_matrix(const std::vector<CouplingSpec>& specs, const structure::Ensemble& ensemble, int threads,
                         Progress* progress) {
  return compute_j_matrix(specs, ensemble.xyz, ensemble.atom_count(), threads, progress);
}

StreamedAverage stream_average(const std::vector<CouplingSpec>& specs, const OpenBabel::OBMol& topology,
                               const std::string& trajectory, int threads, Progress* progress) {
  auto& mol = const_cast<OpenBabel::OBMol&>(topology);
  const int atoms = static_cast<int>(mol.NumAtoms());
  std::vector<int> elements;
  for (auto it = mol.BeginAtoms(); it != mol.EndAtoms(); ++it) elements.push_back((*it)->GetAtomicNum());
  const std::size_t nk = specs.size();
  StreamedAverage avg;
  avg.mean_j_hz.assign(nk, 0.0);
  avg.mean_dihedral_cos.assign(nk, 0.0);
  avg.mean_dihedral_sin.assign(nk, 0.0);
  // Frames are gathered into a fixed-size batch and evaluated in parallel, so
  // memory stays at one batch whatever the trajectory length.
  constexpr std::size_t kBatch = 4096;
  std::vector<double> batch;
  batch.reserve(kBatch * 3 * atoms);
  if (progress) progress->start("frames", 0);
  const auto flush = [&] {
    if (batch.empty()) return;
    const JMatrix m = compute_j_matrix(specs, batch, atoms, threads, nullptr);
    for (std::size_t f = 0; f < m.frames; ++f)
      for (std::size_t k = 0; k < nk; ++k) {
        avg.mean_j_hz[k] += m.j(f, k);
        avg.mean_dihedral_cos[k] += std::cos(m.dihedral(f, k) * M_PI / 180.0);
        avg.mean_dihedral_sin[k] += std::sin(m.dihedral(f, k) * M_PI / 180.0);
      }
    avg.frames += m.frames;
    batch.clear();
    if (progress) progress->advance(avg.frames);
  };
  structure::stream_frames(trajectory, elements, [&](std::size_t, std::span<const double> xyz) {
    batch.insert(batch.end(), xyz.begin(), xyz.end());
    if (batch.size() == kBatch * 3 * static_cast<std::size_t>(atoms)) flush();
  });
  flush();
  if (progress) progress->finish();
  for (std::size_t k = 0; k < nk; ++k) {
    avg.mean_j_hz[k] /= static_cast<double>(avg.frames);
    avg.mean_dihedral_cos[k] /= static_cast<double>(avg.frames);
    avg.mean_dihedral_sin[k] /= static_cast<double>(avg.frames);
  }
  return avg;
}

}  // namespace vicinal::predict
