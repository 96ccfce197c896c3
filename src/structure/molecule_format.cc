#include "structure/molecule_format.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <fstream>

#include "core/error.h"

namespace vicinal::structure {

MoleculeFormat molecule_format_of(const std::string& path) {
  std::string ext = std::filesystem::path(path).extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return std::tolower(c); });
  if (ext == ".sdf" || ext == ".sd" || ext == ".mol") return {"sdf", ext == ".mol" ? "MOL" : "SDF"};
  if (ext == ".mol2") return {"mol2", "MOL2"};
  if (ext == ".pdb" || ext == ".ent") return {"pdb", "PDB"};
  if (ext == ".xyz") return {"xyz", "XYZ"};
  if (ext == ".smi" || ext == ".smiles") return {"smi", "SMILES"};
  throw Error(ext.empty() ? std::string("structure file has no extension to tell its format")
                          : fmt::format("unknown structure file extension '{}'", ext),
              Location(path), "use .sdf/.mol, .mol2, .pdb, .xyz or .smi (or --smiles for a SMILES string)");
}

void require_readable_file(const std::string& path) {
  std::error_code ec;
  if (!std::filesystem::exists(path, ec)) throw Error("file not found", Location(path));
  if (std::filesystem::is_directory(path, ec)) throw Error("is a folder, not a file", Location(path));
  std::ifstream in(path);
  if (!in) throw Error("cannot open file for reading", Location(path), "check its permissions");
  if (in.peek() == std::ifstream::traits_type::eof()) throw Error("file is empty", Location(path));
}

}  // namespace vicinal::structure
