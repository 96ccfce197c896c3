// How commands plug into the executable. Each command is one file in src/cli/
// that calls register_command() from a static initialiser; main() sorts the
// registrations by `order` (the order of `vicinal --help`) and sets them up.
#pragma once

#include <CLI/CLI.hpp>
#include <memory>
#include <string>
#include <string_view>

#include "core/json_file.h"
#include "core/progress.h"

namespace vicinal::cli {

// Options every command accepts (before or after the command name).
struct Globals {
  bool json = false;
  bool quiet = false;
  int threads = 0;          // 0 = all cores
  std::string library;      // --library, else $VICINAL_LIBRARY, else the user data folder
  std::string command_line; // as typed, for reports

  // The library path after applying the fallbacks above.
  std::string library_path() const;
  // Threads to use after resolving 0 to the number of cores.
  int thread_count() const;
  // A progress reporter on stderr that is silent unless stderr is a terminal
  // and neither --quiet nor --json was given.
  std::unique_ptr<Progress> progress() const;
  // Human text to stdout unless --json; notes to stderr unless --quiet.
  void print(std::string_view text) const;
  void note(std::string_view text) const;
  // JSON document to stdout (pretty, one trailing newline).
  void print_json(const Json& doc) const;
};

using CommandSetup = void (*)(CLI::App& root, Globals& globals);

bool register_command(int order, CommandSetup setup);

// The subcommand `name` of `parent`, created with `description` if it does not
// exist yet; lets several files add verbs under one noun (library init, ...).
CLI::App& command_group(CLI::App& parent, const std::string& name, const std::string& description);

// Runs the CLI; returns the process exit code.
int run(int argc, char** argv);

}  // namespace vicinal::cli
