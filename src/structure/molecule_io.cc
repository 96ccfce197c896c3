#include "structure/molecule_io.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/bond.h>
#include <openbabel/builder.h>
#include <openbabel/forcefield.h>
#include <openbabel/obfunctions.h>
#include <openbabel/obconversion.h>
#include <openbabel/op.h>
#include <openbabel/stereo/cistrans.h>
#include <openbabel/stereo/stereo.h>
#include <openbabel/stereo/tetrahedral.h>

#include <algorithm>
#include <filesystem>
#include <fstream>

#include "core/error.h"
#include "core/parse.h"
#include "structure/force_field_minimiser.h"
#include "structure/molecule_format.h"
#include "structure/openbabel_log.h"
#include "structure/openbabel_read.h"

namespace vicinal::structure {

namespace {

std::string join_messages(const std::vector<std::string>& messages) {
  std::string out;
  for (const auto& m : messages) out += (out.empty() ? "" : "; ") + m;
  return out;
}

// Canonical isomeric SMILES of the heavy-atom skeleton with the stereo data
// `mol` carries (changes `mol`: hydrogens are deleted).
std::string canonical_smiles_of(OpenBabel::OBMol& mol) {
  mol.DeleteHydrogens();
  OpenBabel::OBConversion conv;
  conv.SetOutFormat("can");
  conv.AddOption("n", OpenBabel::OBConversion::OUTOPTIONS);
  std::string text = conv.WriteString(&mol, true);
  while (!text.empty() && std::isspace(static_cast<unsigned char>(text.back()))) text.pop_back();
  return text;
}

std::string atom_list(const std::vector<int>& atoms) {
  std::string out;
  for (int a : atoms) out += (out.empty() ? "" : ", ") + std::to_string(a);
  return out;
}

// Names the stereo units the input left open, for the user.
std::string unspecified_note(const StereoCheck& check) {
  std::vector<std::string> parts;
  if (!check.unspecified_centres.empty())
    parts.push_back(fmt::format("stereocentre{} at atom{} {}", check.unspecified_centres.size() == 1 ? "" : "s",
                                check.unspecified_centres.size() == 1 ? "" : "s", atom_list(check.unspecified_centres)));
  if (!check.unspecified_double_bonds.empty()) {
    std::string bonds;
    for (const auto& [a, b] : check.unspecified_double_bonds) bonds += (bonds.empty() ? "" : ", ") + fmt::format("{}={}", a, b);
    parts.push_back(fmt::format("double bond{} {}", check.unspecified_double_bonds.size() == 1 ? "" : "s", bonds));
  }
  return fmt::format("{} not specified in the input: the 3D structure took an arbitrary configuration there "
                     "(specify it to choose)",
                     parts.size() == 1 ? parts[0] : parts[0] + " and " + parts[1]);
}

void minimise_mmff94(OpenBabel::OBMol& mol, int steps) {
  OpenBabel::OBForceField* ff = OpenBabel::OBForceField::FindForceField("MMFF94");
  if (!ff || !ff->Setup(mol)) {
    ff = OpenBabel::OBForceField::FindForceField("UFF");
    if (!ff || !ff->Setup(mol)) return;  // keep the builder's geometry
  }
  minimise_fully(*ff, mol, steps);
}

// One way of making coordinates; `attempt` picks the method so that a retry
// does something different (the builder, then Open Babel's gen3D at two
// thoroughness levels, which adds a rotor search).
bool build_once(OpenBabel::OBMol& mol, int attempt) {
  use_one_openbabel_thread();
  if (attempt == 0) {
    OpenBabel::OBBuilder builder;
    if (!builder.Build(mol, false)) return false;
    mol.SetDimension(3);
    OpenBabel::OBBuilder::CorrectStereoBonds(mol);
    OpenBabel::OBBuilder::CorrectStereoAtoms(mol, false);
    minimise_mmff94(mol, 250);
    return true;
  }
  OpenBabel::OBOp* gen3d = OpenBabel::OBOp::FindType("gen3D");
  if (!gen3d) return false;
  return gen3d->Do(&mol, attempt == 1 ? "med" : "best");
}

// Builds 3D coordinates and checks that the result keeps the stereochemistry
// `mol` specifies; never returns a structure with other stereo.
void build_3d_checked(OpenBabel::OBMol& mol, const std::string& what, ReadNotes* notes) {
  StereoCheck last;
  bool built = false;
  for (int attempt = 0; attempt < 3; ++attempt) {
    OpenBabel::OBMol trial(mol);
    LogCapture log;
    if (!build_once(trial, attempt)) continue;
    built = true;
    last = compare_specified_stereo(mol, trial);
    if (last.same) {
      mol = trial;
      if (notes) {
        notes->built_3d = true;
        notes->messages.push_back(attempt == 0 ? "3D coordinates built and MMFF94-minimised; stereo checked"
                                               : fmt::format("3D coordinates rebuilt (attempt {}) to keep the "
                                                             "stereochemistry; stereo checked",
                                                             attempt + 1));
        if (!last.unspecified_centres.empty() || !last.unspecified_double_bonds.empty())
          notes->messages.push_back(unspecified_note(last));
      }
      return;
    }
  }
  throw Error(fmt::format("could not build 3D coordinates of {} that keep its stereochemistry "
                          "(wanted {}, got {})",
                          what, built ? last.wanted : "a structure", built ? last.got : "no structure"),
              {}, "give a 3D structure file instead (SDF, MOL2, PDB)");
}

void make_hydrogens_explicit(OpenBabel::OBMol& mol, ReadNotes* notes) {
  const unsigned before = mol.NumAtoms();
  const int added = add_missing_hydrogens(mol);
  if (added == 0) return;
  if (notes) {
    notes->added_hydrogens = true;
    notes->messages.push_back(fmt::format("added {} hydrogen atoms (numbered {} to {}, after the file's atoms)", added,
                                          before + 1, mol.NumAtoms()));
  }
}

}  // namespace

StereoCheck compare_specified_stereo(const OpenBabel::OBMol& wanted, const OpenBabel::OBMol& built) {
  using namespace OpenBabel;
  StereoCheck out;
  OBMol ref(wanted);
  OBStereoFacade asked(&ref, false);  // the stereo data as read, not re-perceived
  OBMol have(built);
  have.SetDimension(3);
  have.DeleteData(OBGenericDataType::StereoData);
  StereoFrom3D(&have, true);
  const auto centre_specified = [&](unsigned idx) {
    OBAtom* a = ref.GetAtom(idx);
    return a && asked.HasTetrahedralStereo(a->GetId()) && asked.GetTetrahedralStereo(a->GetId())->IsSpecified();
  };
  const auto bond_specified = [&](unsigned begin, unsigned end) {
    OBBond* b = ref.GetBond(begin, end);
    return b && asked.HasCisTransStereo(b->GetId()) && asked.GetCisTransStereo(b->GetId())->IsSpecified();
  };
  // Stereo units perceived in 3D that the input leaves open are dropped before
  // the comparison: any configuration is acceptable there.
  std::vector<OBGenericData*> open;
  for (OBGenericData* data : have.GetAllData(OBGenericDataType::StereoData)) {
    const auto type = static_cast<OBStereoBase*>(data)->GetType();
    if (type == OBStereo::Tetrahedral) {
      const unsigned idx = have.GetAtomById(static_cast<OBTetrahedralStereo*>(data)->GetConfig().center)->GetIdx();
      if (centre_specified(idx)) continue;
      out.unspecified_centres.push_back(static_cast<int>(idx));
    } else if (type == OBStereo::CisTrans) {
      const auto config = static_cast<OBCisTransStereo*>(data)->GetConfig();
      const unsigned first = have.GetAtomById(config.begin)->GetIdx();
      const unsigned second = have.GetAtomById(config.end)->GetIdx();
      if (bond_specified(first, second)) continue;
      out.unspecified_double_bonds.emplace_back(static_cast<int>(std::min(first, second)),
                                                static_cast<int>(std::max(first, second)));
    } else {
      continue;
    }
    open.push_back(data);
  }
  for (OBGenericData* data : open) have.DeleteData(data);
  std::sort(out.unspecified_centres.begin(), out.unspecified_centres.end());
  std::sort(out.unspecified_double_bonds.begin(), out.unspecified_double_bonds.end());
  out.wanted = canonical_smiles_of(ref);
  out.got = canonical_smiles_of(have);
  out.same = out.wanted == out.got;
  return out;
}

int add_missing_hydrogens(OpenBabel::OBMol& mol) {
  bool any_h = false;
  int implicit = 0;
  for (auto it = mol.BeginAtoms(); it != mol.EndAtoms(); ++it) {
    any_h = any_h || (*it)->GetAtomicNum() == 1;
    implicit += (*it)->GetImplicitHCount();
  }
  if (implicit == 0 && !any_h)
    for (auto it = mol.BeginAtoms(); it != mol.EndAtoms(); ++it) OpenBabel::OBAtomAssignTypicalImplicitHydrogens(*it);
  const unsigned before = mol.NumAtoms();
  mol.AddHydrogens();
  return static_cast<int>(mol.NumAtoms() - before);
}

OpenBabel::OBMol molecule_from_smiles(const std::string& smiles, bool build_3d, ReadNotes* notes) {
  const std::string text{trim(smiles)};
  OpenBabel::OBMol mol;
  LogCapture log;
  OpenBabel::OBConversion conv;
  conv.SetInFormat("smi");
  const bool looks_empty = text.empty() || text.find_first_of(" \t\n") != std::string::npos;
  if (looks_empty || !conv.ReadString(&mol, text) || mol.NumAtoms() == 0 || !log.errors().empty())
    throw Error(fmt::format("SMILES '{}' does not parse{}", text,
                            log.errors().empty() ? "" : ": " + join_messages(log.errors())),
                Location::field_in("", "--smiles"), "check brackets, ring-closure digits and element symbols");
  mol.SetTitle("");
  mol.AddHydrogens();
  if (notes) notes->added_hydrogens = true;
  if (build_3d) build_3d_checked(mol, fmt::format("SMILES '{}'", text), notes);
  return mol;
}

OpenBabel::OBMol read_molecule(const std::string& path, ReadNotes* notes) {
  const MoleculeFormat format = molecule_format_of(path);
  require_readable_file(path);
  if (format.openbabel_id == "smi") {
    std::ifstream in(path);
    std::string line;
    std::getline(in, line);
    const std::string smiles{trim(line.substr(0, line.find_first_of(" \t")))};
    try {
      return molecule_from_smiles(smiles, true, notes);
    } catch (const Error& e) {
      throw Error(e.what_happened(), Location(path, 1), e.hint());
    }
  }
  OpenBabel::OBMol mol;
  LogCapture log;
  OpenBabel::OBConversion conv;
  conv.SetInFormat(format.openbabel_id.c_str());
  const bool ok = guarded_read([&] { return conv.ReadFile(&mol, path); }, path, format.name);
  if (!ok || mol.NumAtoms() == 0 || !log.errors().empty())
    throw Error(fmt::format("could not read a {} structure{}", format.name,
                            log.errors().empty() ? "" : ": " + join_messages(log.errors())),
                Location(path), "the file may be truncated or not in the format its extension says");
  if (notes)
    for (const auto& w : log.warnings()) notes->messages.push_back(w);
  std::vector<double> xyz;
  for (auto it = mol.BeginAtoms(); it != mol.EndAtoms(); ++it)
    for (double v : {(*it)->GetX(), (*it)->GetY(), (*it)->GetZ()}) xyz.push_back(v);
  require_sane_coordinates(xyz, mol.NumAtoms(), path);
  if (mol.GetDimension() != 3 || !mol.HasNonZeroCoords()) {
    make_hydrogens_explicit(mol, notes);
    build_3d_checked(mol, fmt::format("the structure in {}", path), notes);
    return mol;
  }
  make_hydrogens_explicit(mol, notes);
  return mol;
}

}  // namespace vicinal::structure
