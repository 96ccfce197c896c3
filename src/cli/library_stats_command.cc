// vicinal library stats     counts and J distributions by fragment type
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/library_common.h"
#include "library/stats.h"
#include "report/plot.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string svg;
  std::size_t fragments = 4;
};

void run_stats(const Options& o, const Globals& g) {
  auto lib = open_library(g);
  const auto s = library::library_stats(lib->db());
  if (!o.svg.empty()) {
    if (s.fragments.empty()) g.note("no couplings: the histogram is not written");
    else report::save_figure(library::j_histogram(s, o.fragments), o.svg);
  }
  if (g.json) {
    Json doc = {{"compounds", s.compounds}, {"measurement_sets", s.sets}, {"couplings", s.couplings},
                {"conflicting_couplings", s.conflicts}, {"stereo_unassigned", s.stereo_unassigned},
                {"solvents", s.solvents}, {"sources", s.sources}, {"fragments", Json::array()}};
    for (const auto& f : s.fragments)
      doc["fragments"].push_back({{"fragment", f.fragment}, {"count", f.j_hz.size()}, {"mean_j_hz", f.mean_hz},
                                  {"sd_j_hz", f.sd_hz}, {"median_j_hz", f.median_hz}, {"min_j_hz", f.j_hz.front()},
                                  {"max_j_hz", f.j_hz.back()}});
    if (!o.svg.empty() && !s.fragments.empty()) doc["histogram"] = o.svg;
    g.print_json(doc);
    return;
  }
  report::TextTable counts({"", "count"});
  counts.add_row({"compounds", std::to_string(s.compounds)});
  counts.add_row({"measurement sets", std::to_string(s.sets)});
  counts.add_row({"couplings", std::to_string(s.couplings)});
  counts.add_row({"  stereo-unassigned", std::to_string(s.stereo_unassigned)});
  counts.add_row({"  with conflicting values", std::to_string(s.conflicts)});
  counts.add_row({"solvents", std::to_string(s.solvents)});
  counts.add_row({"sources", std::to_string(s.sources)});
  std::string text = counts.render();
  if (!s.fragments.empty()) {
    report::TextTable t({"fragment", "n", "mean J/Hz", "sd/Hz", "median/Hz", "min/Hz", "max/Hz"});
    for (const auto& f : s.fragments)
      t.add_row({f.fragment, std::to_string(f.j_hz.size()), fmt::format("{:.2f}", f.mean_hz),
                 fmt::format("{:.2f}", f.sd_hz), fmt::format("{:.2f}", f.median_hz), fmt::format("{:.2f}", f.j_hz.front()),
                 fmt::format("{:.2f}", f.j_hz.back())});
    text += "\nJ by fragment (elements along the coupling path):\n" + t.render();
  }
  if (!o.svg.empty() && !s.fragments.empty()) text += "histogram: " + o.svg + "\n";
  g.print(text);
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<Options>();
  auto* cmd = library_group(root).add_subcommand("stats", "Counts and J distributions by fragment type");
  cmd->add_option("--plot", o->svg, "Write a histogram of J per fragment type (.svg, .pdf or .png)");
  cmd->add_option("--fragments", o->fragments, "Fragment types in the histogram (most common first)")
      ->capture_default_str()
      ->check(CLI::Range(1, 12));
  cmd->footer("Example: vicinal library stats --plot j-by-fragment.svg\n"
              "A fragment type is the elements along the bonded path between the two nuclei,\n"
              "e.g. H-C-C-H for vicinal proton couplings.");
  cmd->callback([o, &g] { run_stats(*o, g); });
}

const bool registered = register_command(15, setup);

}  // namespace

}  // namespace vicinal::cli
