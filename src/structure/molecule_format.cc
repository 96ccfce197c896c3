#include "structure/molecule_format.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <filesystem>
#include <fstream>

#include "core/csv.h"
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
  // Checked a block of whole lines at a time, so big ensembles are not held twice.
  std::string pending;  // bytes after the last line end seen
  long line = 1;
  char buffer[1 << 16];
  while (in.read(buffer, sizeof buffer) || in.gcount() > 0) {
    const std::string_view fresh(buffer, static_cast<std::size_t>(in.gcount()));
    const auto cut = fresh.rfind('\n');
    const std::size_t end = cut == std::string_view::npos ? 0 : pending.size() + cut + 1;
    pending.append(fresh);
    if (end == 0) continue;
    require_utf8_text(std::string_view(pending).substr(0, end), path, line);
    line += static_cast<long>(std::count(pending.begin(), pending.begin() + static_cast<long>(end), '\n'));
    pending.erase(0, end);
  }
  require_utf8_text(pending, path, line);
}

void require_sane_coordinates(const std::vector<double>& xyz, std::size_t atoms_per_frame, const std::string& path) {
  for (std::size_t i = 0; i < xyz.size(); ++i)
    if (!(std::fabs(xyz[i]) <= kMaxCoordinateAngstrom)) {
      const std::size_t atom = i / 3, frame = atoms_per_frame ? atom / atoms_per_frame : 0;
      Location at(path);
      at.atom = std::to_string(atoms_per_frame ? atom % atoms_per_frame + 1 : atom + 1);
      throw Error(fmt::format("{}a coordinate is {:g} angstrom, not a finite value within {:g}",
                              frame > 0 ? fmt::format("frame {}: ", frame + 1) : "", xyz[i], kMaxCoordinateAngstrom),
                  at, "the file may be damaged");
    }
}

}  // namespace vicinal::structure
