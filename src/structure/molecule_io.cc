#include "structure/molecule_io.h"

#include <fmt/format.h>
#include <openbabel/builder.h>
#include <openbabel/forcefield.h>
#include <openbabel/obfunctions.h>
#include <openbabel/obconversion.h>
#include <openbabel/op.h>
#include <openbabel/stereo/stereo.h>

#include <algorithm>
#include <filesystem>
#include <fstream>

#include "core/error.h"
#include "core/parse.h"
#include "structure/molecule_format.h"
#include "structure/openbabel_log.h"

namespace vicinal::structure {

namespace {

std::string join_messages(const std::vector<std::string>& messages) {
  std::string out;
  for (const auto& m : messages) out += (out.empty() ? "" : "; ") + m;
  return out;
}

// Canonical isomeric SMILES of the heavy-atom skeleton. With `from_3d` the
// stereo is perceived from the coordinates rather than taken from the input.
std::string canonical_smiles(const OpenBabel::OBMol& mol, bool from_3d) {
  OpenBabel::OBMol copy(mol);
  if (from_3d) {
    copy.SetDimension(3);
    copy.DeleteData(OpenBabel::OBGenericDataType::StereoData);
    OpenBabel::StereoFrom3D(&copy, true);
  }
  copy.DeleteHydrogens();
  OpenBabel::OBConversion conv;
  conv.SetOutFormat("can");
  conv.AddOption("n", OpenBabel::OBConversion::OUTOPTIONS);
  std::string text = conv.WriteString(&copy, true);
  while (!text.empty() && std::isspace(static_cast<unsigned char>(text.back()))) text.pop_back();
  return text;
}

void minimise_mmff94(OpenBabel::OBMol& mol, int steps) {
  OpenBabel::OBForceField* ff = OpenBabel::OBForceField::FindForceField("MMFF94");
  if (!ff || !ff->Setup(mol)) {
    ff = OpenBabel::OBForceField::FindForceField("UFF");
    if (!ff || !ff->Setup(mol)) return;  // keep the builder's geometry
  }
  ff->ConjugateGradients(steps, 1e-4);
  ff->GetCoordinates(mol);
}

// One way of making coordinates; `attempt` picks the method so that a retry
// does something different (the builder, then Open Babel's gen3D at two
// thoroughness levels, which adds a rotor search).
bool build_once(OpenBabel::OBMol& mol, int attempt) {
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
// of `mol` (compared as canonical isomeric SMILES); never returns a structure
// with other stereo.
void build_3d_checked(OpenBabel::OBMol& mol, const std::string& what, ReadNotes* notes) {
  const std::string wanted = canonical_smiles(mol, false);
  std::string last;
  for (int attempt = 0; attempt < 3; ++attempt) {
    OpenBabel::OBMol trial(mol);
    LogCapture log;
    if (!build_once(trial, attempt)) continue;
    last = canonical_smiles(trial, true);
    if (last == wanted) {
      mol = trial;
      if (notes) {
        notes->built_3d = true;
        notes->messages.push_back(attempt == 0 ? "3D coordinates built and MMFF94-minimised; stereo checked"
                                               : fmt::format("3D coordinates rebuilt (attempt {}) to keep the "
                                                             "stereochemistry; stereo checked",
                                                             attempt + 1));
      }
      return;
    }
  }
  throw Error(fmt::format("could not build 3D coordinates of {} that keep its stereochemistry "
                          "(wanted {}, got {})",
                          what, wanted, last.empty() ? "no structure" : last),
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
  const bool ok = conv.ReadFile(&mol, path);
  if (!ok || mol.NumAtoms() == 0 || !log.errors().empty())
    throw Error(fmt::format("could not read a {} structure{}", format.name,
                            log.errors().empty() ? "" : ": " + join_messages(log.errors())),
                Location(path), "the file may be truncated or not in the format its extension says");
  if (notes)
    for (const auto& w : log.warnings()) notes->messages.push_back(w);
  if (mol.GetDimension() != 3 || !mol.HasNonZeroCoords()) {
    make_hydrogens_explicit(mol, notes);
    build_3d_checked(mol, fmt::format("the structure in {}", path), notes);
    return mol;
  }
  make_hydrogens_explicit(mol, notes);
  return mol;
}

}  // namespace vicinal::structure
