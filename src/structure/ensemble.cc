#include "structure/ensemble.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/elements.h>
#include <openbabel/generic.h>
#include <openbabel/obconversion.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <optional>

#include "core/atomic_file.h"
#include "core/error.h"
#include "core/parse.h"
#include "structure/frame_reader.h"
#include "structure/molecule_format.h"
#include "structure/openbabel_log.h"
#include "structure/openbabel_read.h"

namespace vicinal::structure {

std::size_t Ensemble::frame_count() const {
  const std::size_t per_frame = 3 * static_cast<std::size_t>(atom_count());
  return per_frame == 0 ? 0 : xyz.size() / per_frame;
}

std::span<const double> Ensemble::frame(std::size_t f) const {
  const std::size_t per_frame = 3 * static_cast<std::size_t>(atom_count());
  return std::span<const double>(xyz).subspan(f * per_frame, per_frame);
}

void Ensemble::add_frame(std::span<const double> coords) {
  if (coords.size() != 3 * static_cast<std::size_t>(atom_count()))
    throw std::logic_error("Ensemble::add_frame: coordinate count does not match the topology");
  xyz.insert(xyz.end(), coords.begin(), coords.end());
}

std::vector<double> coordinates_of(const OpenBabel::OBMol& mol) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  std::vector<double> out;
  out.reserve(3 * m.NumAtoms());
  for (auto it = m.BeginAtoms(); it != m.EndAtoms(); ++it) {
    out.push_back((*it)->GetX());
    out.push_back((*it)->GetY());
    out.push_back((*it)->GetZ());
  }
  return out;
}

Ensemble single_frame(const OpenBabel::OBMol& mol, const std::string& source) {
  Ensemble e;
  e.topology = mol;
  e.source = source;
  e.add_frame(coordinates_of(mol));
  return e;
}

namespace {

std::vector<int> atomic_numbers(OpenBabel::OBMol& mol) {
  std::vector<int> z;
  for (auto it = mol.BeginAtoms(); it != mol.EndAtoms(); ++it) z.push_back((*it)->GetAtomicNum());
  return z;
}

// Checks that `frame` (1-based) has the first frame's elements in order.
void require_same_atoms(const std::vector<int>& first, OpenBabel::OBMol& mol, std::size_t frame, const std::string& path) {
  const auto here = atomic_numbers(mol);
  if (here.size() != first.size())
    throw Error(fmt::format("frame {} has {} atoms, but the first frame has {}", frame, here.size(), first.size()),
                Location(path), "every frame of an ensemble must have the same atoms in the same order");
  for (std::size_t i = 0; i < here.size(); ++i)
    if (here[i] != first[i])
      throw Error(fmt::format("frame {}: atom {} is {}, but {} in the first frame", frame, i + 1,
                              OpenBabel::OBElements::GetSymbol(here[i]), OpenBabel::OBElements::GetSymbol(first[i])),
                  Location(path), "every frame of an ensemble must have the same atoms in the same order");
}

std::optional<double> data_number(OpenBabel::OBMol& mol, const char* field, std::size_t frame, const std::string& path) {
  auto* data = dynamic_cast<OpenBabel::OBPairData*>(mol.GetData(field));
  if (!data) return std::nullopt;
  const Location at = Location::field_in(path, fmt::format("{} of frame {}", field, frame));
  const double value = parse_double(trim(data->GetValue()), at);
  // Conformer energies span a few tens of kcal/mol; 10^6 is damage, not data.
  if (std::fabs(value) > 1e6) throw Error(fmt::format("{:g} is out of range", value), at);
  return value;
}

// Frames of SDF or MOL2 through Open Babel, with our data fields.
Ensemble read_openbabel_frames(const std::string& path, const MoleculeFormat& format, ReadNotes* notes) {
  OpenBabel::OBConversion conv;
  conv.SetInFormat(format.openbabel_id.c_str());
  std::ifstream in(path, std::ios::binary);
  Ensemble e;
  e.source = path;
  std::vector<int> first_atoms;
  bool add_h = false;
  std::vector<bool> has_energy, has_weight;
  for (std::size_t frame = 1;; ++frame) {
    OpenBabel::OBMol mol;
    LogCapture log;
    const bool ok = guarded_read([&] { return frame == 1 ? conv.Read(&mol, &in) : conv.Read(&mol); }, path, format.name);
    if (!ok || mol.NumAtoms() == 0) {
      if (frame == 1 || !log.errors().empty())
        throw Error(fmt::format("could not read {} of the {} file{}", frame == 1 ? "a structure" : fmt::format("frame {}", frame),
                                format.name, log.errors().empty() ? "" : ": " + log.errors().front()),
                    Location(path), "the file may be truncated");
      break;
    }
    if (frame == 1) {
      first_atoms = atomic_numbers(mol);
      if (mol.GetDimension() != 3 && !mol.Has3D())
        throw Error("the ensemble has no 3D coordinates", Location(path), "give 3D conformers (e.g. from `vicinal conformers generate`)");
      OpenBabel::OBMol probe(mol);
      add_h = add_missing_hydrogens(probe) > 0;
    } else {
      require_same_atoms(first_atoms, mol, frame, path);
    }
    if (add_h) add_missing_hydrogens(mol);
    if (frame == 1) e.topology = mol;
    e.add_frame(coordinates_of(mol));
    const auto energy = data_number(mol, kSdfEnergyField, frame, path);
    const auto weight = data_number(mol, kSdfWeightField, frame, path);
    has_energy.push_back(energy.has_value());
    has_weight.push_back(weight.has_value());
    e.energy_kcal_mol.push_back(energy.value_or(0));
    e.weight.push_back(weight.value_or(0));
    e.titles.push_back(mol.GetTitle());
  }
  const auto all_or_none = [&](const std::vector<bool>& has, std::vector<double>& values, const char* field) {
    const auto count = std::count(has.begin(), has.end(), true);
    if (count == 0) values.clear();
    else if (count != static_cast<long>(has.size()))
      throw Error(fmt::format("frame {} has no {} data field, but other frames do",
                              std::find(has.begin(), has.end(), false) - has.begin() + 1, field),
                  Location(path), "give the field for every conformer or for none");
  };
  all_or_none(has_energy, e.energy_kcal_mol, kSdfEnergyField);
  all_or_none(has_weight, e.weight, kSdfWeightField);
  for (double w : e.weight)
    if (w < 0) throw Error(fmt::format("negative {} ({})", kSdfWeightField, w), Location(path));
  if (add_h && notes) {
    notes->added_hydrogens = true;
    notes->messages.push_back(fmt::format("added missing hydrogens to every frame (numbered after the file's {} atoms)",
                                          first_atoms.size()));
  }
  return e;
}

// Multi-model PDB / multi-frame XYZ: Open Babel reads the first frame for the
// topology, the fast reader every frame's coordinates.
Ensemble read_trajectory(const std::string& path, const MoleculeFormat& format, ReadNotes* notes) {
  OpenBabel::OBMol first;
  {
    LogCapture log;
    OpenBabel::OBConversion conv;
    conv.SetInFormat(format.openbabel_id.c_str());
    if (!guarded_read([&] { return conv.ReadFile(&first, path); }, path, format.name) || first.NumAtoms() == 0)
      throw Error(fmt::format("could not read a {} structure{}", format.name,
                              log.errors().empty() ? "" : ": " + log.errors().front()),
                  Location(path), "the file may be truncated");
  }
  const std::vector<int> elements = atomic_numbers(first);
  OpenBabel::OBMol probe(first);
  const bool add_h = add_missing_hydrogens(probe) > 0;
  Ensemble e;
  e.source = path;
  OpenBabel::OBMol heavy(first);
  if (add_h) add_missing_hydrogens(first);
  e.topology = first;
  stream_frames(path, elements, [&](std::size_t index, std::span<const double> xyz) {
    if (!add_h) {
      e.xyz.insert(e.xyz.end(), xyz.begin(), xyz.end());
      return;
    }
    OpenBabel::OBMol frame(heavy);
    frame.SetCoordinates(const_cast<double*>(xyz.data()));
    add_missing_hydrogens(frame);
    // Open Babel can add a different number of hydrogens to a damaged frame
    // (found by the frame_reader fuzz target): bad input, not an internal error.
    const std::vector<double> coords = coordinates_of(frame);
    if (coords.size() != 3 * static_cast<std::size_t>(e.atom_count()))
      throw Error(fmt::format("frame {}: adding the missing hydrogens gave {} atoms, but the first frame has {}",
                              index + 1, coords.size() / 3, e.atom_count()),
                  Location(path), "give a trajectory with explicit hydrogens in every frame");
    e.add_frame(coords);
  });
  // Open Babel's own view of frame 0 is the topology; keep them identical.
  if (!add_h) e.topology.SetCoordinates(e.xyz.data());
  if (add_h && notes) {
    notes->added_hydrogens = true;
    notes->messages.push_back(
        fmt::format("added missing hydrogens to every frame (numbered after the file's {} atoms)", elements.size()));
  }
  return e;
}

}  // namespace

Ensemble read_ensemble(const std::string& path, ReadNotes* notes) {
  const MoleculeFormat format = molecule_format_of(path);
  require_readable_file(path);
  if (format.openbabel_id == "smi") return single_frame(read_molecule(path, notes), path);
  Ensemble e = format.openbabel_id == "pdb" || format.openbabel_id == "xyz" ? read_trajectory(path, format, notes)
                                                                            : read_openbabel_frames(path, format, notes);
  require_sane_coordinates(e.xyz, static_cast<std::size_t>(e.atom_count()), path);
  return e;
}

std::vector<double> boltzmann_weights(std::span<const double> energy_kcal_mol, double temperature_k) {
  if (!(temperature_k > 0) || !std::isfinite(temperature_k))
    throw Error(fmt::format("temperature must be above 0 K, not {}", temperature_k),
                Location::field_in("", "--temperature-k"));
  if (energy_kcal_mol.empty()) return {};
  const double e_min = *std::min_element(energy_kcal_mol.begin(), energy_kcal_mol.end());
  const double kt = kBoltzmannKcalPerMolK * temperature_k;
  std::vector<double> w;
  double sum = 0;
  for (double e : energy_kcal_mol) sum += w.emplace_back(std::exp(-(e - e_min) / kt));
  for (double& x : w) x /= sum;
  return w;
}

std::vector<double> frame_weights(const Ensemble& ensemble, double temperature_k, std::string* basis) {
  const std::size_t n = ensemble.frame_count();
  if (!ensemble.energy_kcal_mol.empty()) {
    if (basis) *basis = "energies";
    return boltzmann_weights(ensemble.energy_kcal_mol, temperature_k);
  }
  if (!ensemble.weight.empty()) {
    double sum = 0;
    for (double w : ensemble.weight) sum += w;
    if (!(sum > 0)) throw Error("the conformer weights add up to zero", Location(ensemble.source));
    std::vector<double> w = ensemble.weight;
    for (double& x : w) x /= sum;
    if (basis) *basis = "weights";
    return w;
  }
  if (basis) *basis = "uniform";
  return std::vector<double>(n, n ? 1.0 / static_cast<double>(n) : 0.0);
}

void write_ensemble_sdf(const Ensemble& ensemble, const std::string& path) {
  OpenBabel::OBConversion conv;
  conv.SetOutFormat("sdf");
  std::string text;
  for (std::size_t f = 0; f < ensemble.frame_count(); ++f) {
    OpenBabel::OBMol mol(ensemble.topology);
    std::vector<double> coords(ensemble.frame(f).begin(), ensemble.frame(f).end());
    mol.SetCoordinates(coords.data());
    const std::string title = f < ensemble.titles.size() ? ensemble.titles[f] : fmt::format("conformer {}", f + 1);
    mol.SetTitle(title.c_str());
    const auto add_field = [&](const char* name, double value) {
      mol.DeleteData(name);
      auto* data = new OpenBabel::OBPairData;
      data->SetAttribute(name);
      data->SetValue(fmt::format("{:.6f}", value));
      mol.SetData(data);
    };
    if (!ensemble.energy_kcal_mol.empty()) add_field(kSdfEnergyField, ensemble.energy_kcal_mol[f]);
    if (!ensemble.weight.empty()) add_field(kSdfWeightField, ensemble.weight[f]);
    LogCapture log;
    text += conv.WriteString(&mol, false);
  }
  write_file_atomically(path, text);
}

}  // namespace vicinal::structure
