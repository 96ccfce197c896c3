// vicinal multiplet simulate   spectrum of a spin system: line list, lineshape, plot
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/karplus_options.h"
#include "core/atomic_file.h"
#include "core/csv.h"
#include "core/error.h"
#include "report/plot.h"
#include "report/table.h"
#include "spin/lineshape.h"
#include "spin/simulate.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string system_path;
  std::vector<std::string> decouple;
  std::string csv_path, spectrum_path;
  double linewidth_hz = 1.0;
  std::string shape = "lorentzian";
  double merge_hz = 0.001;
  PlotTargets plot;
};

std::string lines_csv(const std::vector<spin::Line>& lines) {
  std::string out = "hz,ppm,intensity\n";
  for (const auto& l : lines) out += fmt::format("{:.4f},{:.6f},{:.6g}\n", l.hz, l.ppm, l.intensity);
  return out;
}

std::string trace_csv(const spin::Trace& t) {
  std::string out = "hz,ppm,intensity\n";
  for (std::size_t k = 0; k < t.hz.size(); ++k)
    out += fmt::format("{:.4f},{:.6f},{:.6g}\n", t.hz[k], t.ppm[k], t.intensity[k]);
  return out;
}

void run_simulate(const Options& o, const Globals& g) {
  // Everything the user typed is checked before any work or any file is written.
  const auto shape = spin::parse_line_shape(o.shape);
  if (!(o.linewidth_hz > 0))
    throw Error(fmt::format("line width must be positive, found {} Hz", o.linewidth_hz),
                Location::field_in("", "--linewidth-hz"));
  if (!(o.merge_hz > 0)) throw Error("the merge tolerance must be positive", Location::field_in("", "--merge-hz"));
  o.plot.check();
  const auto system = spin::read_spin_system(o.system_path);

  spin::SimulationOptions options;
  options.decouple = o.decouple;
  options.merge_tolerance_hz = o.merge_hz;
  options.threads = g.thread_count();
  for (const auto& iso : o.decouple) {
    bool present = false;
    for (const auto& grp : system.groups) present |= grp.nucleus.isotope == NuclearTable::shipped().find(iso).isotope;
    if (!present) g.note(fmt::format("note: no {} in {}; --decouple {} changes nothing", iso, o.system_path, iso));
  }
  const auto sim = spin::simulate(system, options);
  const bool need_trace = !o.spectrum_path.empty() || o.plot.any();
  const auto trace = need_trace ? spin::render_spectrum(sim.lines, sim.observe_mhz, shape, o.linewidth_hz)
                                : spin::Trace{};

  if (g.json) {
    Json doc = {{"observe", system.observe.isotope},
                {"field_mhz", system.field_mhz},
                {"observe_mhz", sim.observe_mhz},
                {"decoupled", o.decouple},
                {"largest_block_states", sim.largest_block},
                {"lines", Json::array()}};
    for (const auto& l : sim.lines) doc["lines"].push_back({{"hz", l.hz}, {"ppm", l.ppm}, {"intensity", l.intensity}});
    g.print_json(doc);
  } else {
    report::TextTable t({"ppm", "Hz", "intensity"});
    for (const auto& l : sim.lines)
      t.add_row({fmt::format("{:.4f}", l.ppm), fmt::format("{:.2f}", l.hz), fmt::format("{:.4f}", l.intensity)});
    g.print(fmt::format("{} spectrum at {:.2f} MHz ({} MHz for 1H): {} lines; intensities sum to the number of "
                        "observed nuclei\n",
                        system.observe.isotope, sim.observe_mhz, system.field_mhz, sim.lines.size()) +
            t.render());
  }

  if (!o.csv_path.empty()) {
    write_file_atomically(o.csv_path, lines_csv(sim.lines));
    g.note("wrote " + o.csv_path);
  }
  if (!o.spectrum_path.empty()) {
    write_file_atomically(o.spectrum_path, trace_csv(trace));
    g.note("wrote " + o.spectrum_path);
  }
  if (o.plot.any()) {
    report::Figure fig;
    fig.title = fmt::format("{} spectrum of {}", system.observe.isotope, o.system_path);
    fig.x_label = fmt::format("{} shift / ppm", system.observe.isotope);
    fig.y_label = "intensity";
    fig.reverse_x = true;
    report::Series curve;
    curve.label = fmt::format("{} {:g} Hz", o.shape, o.linewidth_hz);
    curve.x = trace.ppm;
    curve.y = trace.intensity;
    report::Series sticks;
    sticks.label = "lines";
    sticks.style = report::Series::Style::Sticks;
    for (const auto& l : sim.lines) {
      sticks.x.push_back(l.ppm);
      sticks.y.push_back(l.intensity);
    }
    fig.series = {std::move(curve), std::move(sticks)};
    fig.footnote = fmt::format("Simulated at {:g} MHz (1H); exact for {} nuclei, first order in other isotopes.",
                               system.field_mhz, system.observe.isotope);
    o.plot.save(fig, g);
  }
}

void setup(CLI::App& root, Globals& g) {
  auto& group = command_group(root, "multiplet", "Spin-system spectra and coupling constants read from multiplets");
  auto opts = std::make_shared<Options>();
  auto* cmd = group.add_subcommand("simulate", "Simulate the spectrum of a spin system (JSON file)");
  cmd->add_option("system", opts->system_path, "Spin system file (JSON)")->required();
  cmd->add_option("--decouple", opts->decouple, "Remove the couplings to this isotope, e.g. 2H (repeatable)");
  cmd->add_option("--csv", opts->csv_path, "Write the line list (hz, ppm, intensity) as CSV");
  cmd->add_option("--spectrum", opts->spectrum_path, "Write the lineshape (hz, ppm, intensity) as CSV");
  cmd->add_option("--linewidth-hz", opts->linewidth_hz, "Full width at half height of each line")
      ->capture_default_str();
  cmd->add_option("--shape", opts->shape, "Line shape: lorentzian or gaussian")->capture_default_str();
  cmd->add_option("--merge-hz", opts->merge_hz, "Lines closer than this are reported as one")->capture_default_str();
  opts->plot.add_options(*cmd);
  cmd->footer(
      "Example:\n"
      "  vicinal multiplet simulate examples/multiplets/vinyl.json --spectrum vinyl.csv --svg vinyl.svg\n"
      "The file: {\"field_mhz\": 400, \"observe\": \"1H\",\n"
      "  \"spins\": [{\"label\": \"A\", \"isotope\": \"1H\", \"shift_ppm\": 3.95, \"count\": 1}, ...],\n"
      "  \"couplings\": [{\"between\": [\"A\", \"M\"], \"j_hz\": 1.1}, ...]}\n"
      "field_mhz is the spectrometer's 1H frequency; 'count' groups magnetically equivalent\n"
      "nuclei. Nuclei of the observed isotope are treated exactly (strong coupling, roof\n"
      "effect); other isotopes to first order (shift_ppm optional for them). Up to about 12\n"
      "independent spin-1/2 nuclei of the observed isotope; equivalent groups cost less.\n"
      "--json: {\"lines\": [{\"hz\", \"ppm\", \"intensity\"}], \"observe_mhz\", ...}; hz = ppm x observe_mhz.");
  cmd->callback([opts, &g] { run_simulate(*opts, g); });
}

const bool registered = register_command(70, setup);

}  // namespace

}  // namespace vicinal::cli
