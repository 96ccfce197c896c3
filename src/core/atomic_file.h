// Output files appear whole or not at all: content goes to a temporary file
// beside the target, which is renamed over it only after a successful write.
#pragma once

#include <filesystem>
#include <functional>
#include <string_view>

namespace vicinal {

void write_file_atomically(const std::filesystem::path& target, std::string_view content);

// For writers that need a path of their own (cairo, SQLite backups): `write`
// receives a temporary path in the target's folder; on success it is renamed
// to `target`, on any exception it is removed and the exception rethrown.
void write_via_temporary(const std::filesystem::path& target,
                         const std::function<void(const std::filesystem::path&)>& write);

// Creates `folder` and its parents if missing; a folder that cannot be made
// (no permission, a file in the way) is a vicinal::Error naming it.
void create_output_folder(const std::filesystem::path& folder);

}  // namespace vicinal
