#include "core/atomic_file.h"

#include <fmt/format.h>
#include <unistd.h>

#include <fstream>

#include "core/error.h"

namespace vicinal {

namespace {

std::filesystem::path temporary_beside(const std::filesystem::path& target) {
  static int counter = 0;
  auto name = fmt::format(".{}.tmp-{}-{}", target.filename().string(), ::getpid(), ++counter);
  return target.parent_path() / name;
}

}  // namespace

void write_via_temporary(const std::filesystem::path& target,
                         const std::function<void(const std::filesystem::path&)>& write) {
  if (target.empty()) throw Error("an output file name is empty");
  const auto folder = target.parent_path();
  if (!folder.empty() && !std::filesystem::is_directory(folder))
    throw Error("the output folder does not exist", {folder.string()}, "create it first");
  const auto temporary = temporary_beside(target);
  try {
    write(temporary);
    std::filesystem::rename(temporary, target);
  } catch (const std::filesystem::filesystem_error& e) {
    std::error_code ignored;
    std::filesystem::remove(temporary, ignored);
    throw Error(fmt::format("cannot write the file: {}", e.code().message()), {target.string()});
  } catch (...) {
    std::error_code ignored;
    std::filesystem::remove(temporary, ignored);
    throw;
  }
}

void write_file_atomically(const std::filesystem::path& target, std::string_view content) {
  write_via_temporary(target, [&](const std::filesystem::path& temporary) {
    std::ofstream out(temporary, std::ios::binary | std::ios::trunc);
    out.write(content.data(), static_cast<std::streamsize>(content.size()));
    out.flush();
    if (!out) throw Error("cannot write the file", {target.string()}, "check free space and permissions");
  });
}

void create_output_folder(const std::filesystem::path& folder) {
  std::error_code ec;
  std::filesystem::create_directories(folder, ec);
  if (ec)
    throw Error(fmt::format("cannot create the folder: {}", ec.message()), {folder.string()},
                "choose a folder you can write to");
}

}  // namespace vicinal
