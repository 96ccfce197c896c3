#include "cli/command.h"

#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <iostream>
#include <thread>
#include <vector>

#include "cli/terminal_progress.h"
#include "core/error.h"

namespace vicinal::cli {

namespace {

struct Registration {
  int order;
  CommandSetup setup;
};

std::vector<Registration>& registrations() {
  static std::vector<Registration> list;
  return list;
}

}  // namespace

bool register_command(int order, CommandSetup setup) {
  registrations().push_back({order, setup});
  return true;
}

CLI::App& command_group(CLI::App& parent, const std::string& name, const std::string& description) {
  for (CLI::App* sub : parent.get_subcommands([](const CLI::App*) { return true; }))
    if (sub->get_name() == name) return *sub;
  CLI::App* sub = parent.add_subcommand(name, description);
  sub->require_subcommand(1);
  return *sub;
}

std::string Globals::library_path() const {
  if (!library.empty()) return library;
  if (const char* env = std::getenv("VICINAL_LIBRARY"); env && *env) return env;
  std::filesystem::path base;
  if (const char* xdg = std::getenv("XDG_DATA_HOME"); xdg && *xdg)
    base = xdg;
  else if (const char* home = std::getenv("HOME"); home && *home)
    base = std::filesystem::path(home) / ".local" / "share";
  else
    base = ".";
  return (base / "vicinal" / "library.sqlite").string();
}

int Globals::thread_count() const {
  if (threads > 0) return threads;
  return std::max(1u, std::thread::hardware_concurrency());
}

std::unique_ptr<Progress> Globals::progress() const {
  if (quiet || json || !::isatty(STDERR_FILENO)) return std::make_unique<NoProgress>();
  return std::make_unique<TerminalProgress>(std::cerr);
}

void Globals::print(std::string_view text) const {
  if (json) return;
  std::cout << text;
  if (!text.empty() && text.back() != '\n') std::cout << '\n';
}

void Globals::note(std::string_view text) const {
  if (!quiet) std::cerr << text << (text.empty() || text.back() != '\n' ? "\n" : "");
}

void Globals::print_json(const Json& doc) const { std::cout << doc.dump(2) << '\n'; }

int run(int argc, char** argv) {
  Globals globals;
  for (int i = 0; i < argc; ++i) globals.command_line += (i ? " " : "") + std::string(argv[i]);

  CLI::App app{
      "vicinal: turn measured three-bond coupling constants into geometry.\n"
      "Keeps a group's couplings in a local library, maps J to dihedral angles with\n"
      "published Karplus relations, back-calculates couplings over conformer\n"
      "ensembles, fits populations and ranks candidate configurations.\n"
      "Assignments from couplings are model-based: confirm them independently.",
      "vicinal"};
  app.set_version_flag("--version", std::string("vicinal ") + VICINAL_VERSION);
  app.require_subcommand(1);
  app.fallthrough();
  app.add_flag("--json", globals.json, "Machine-readable JSON on stdout (nothing else on stdout)");
  app.add_flag("-q,--quiet", globals.quiet, "No notes or progress on stderr");
  app.add_option("--threads", globals.threads, "Worker threads (default: all cores)")
      ->check(CLI::Range(1, 1024));
  app.add_option("--library", globals.library,
                 "Coupling library file (default: $VICINAL_LIBRARY, else ~/.local/share/vicinal/library.sqlite)");

  auto& list = registrations();
  std::stable_sort(list.begin(), list.end(),
                   [](const Registration& a, const Registration& b) { return a.order < b.order; });
  for (const auto& r : list) r.setup(app, globals);

  try {
    app.parse(argc, argv);
    return 0;
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForVersion& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    std::cerr << "vicinal: error: " << e.what() << " (run with --help for usage)\n";
    return 2;
  } catch (const Error& e) {
    std::cerr << "vicinal: error: " << e.one_line() << "\n";
    return 2;
  } catch (const std::exception& e) {
    std::cerr << "vicinal: internal error: " << e.what() << "\n";
    return 1;
  }
}

}  // namespace vicinal::cli
