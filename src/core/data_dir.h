// Finds the shipped data (db/, schema/, examples/, conformers/): the folder
// named by $VICINAL_DATA_DIR if set, else the source tree the binary was built
// from. A missing file is a vicinal::Error that says which folder was searched.
#pragma once

#include <filesystem>
#include <string>

namespace vicinal {

std::filesystem::path data_dir();
// data_file("db/nuclei.json") -> absolute path, checked to exist.
std::filesystem::path data_file(const std::string& relative);

}  // namespace vicinal
