// Fuzz target: the spin-system JSON (spin/spin_system.h) read as
// `multiplet simulate` reads it, then simulated. The block size is capped
// lower than the command's default so that one input stays fast; larger
// systems are refused with vicinal::Error, as the command refuses its cap.
#include <cmath>

#include "core/json_file.h"
#include "fuzz_support.h"
#include "spin/simulate.h"
#include "spin/spin_system.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  fuzz::expect_only_vicinal_errors([&] {
    const Json doc = parse_json(fuzz::as_text(data, size), "fuzz.json");
    const spin::SpinSystem system = spin::spin_system_from_json(doc, "fuzz.json");
    spin::SimulationOptions options;
    options.threads = 1;
    options.max_block_states = 64;
    const spin::Simulation sim = spin::simulate(system, options);
    for (std::size_t i = 0; i < sim.lines.size(); ++i) {
      if (!std::isfinite(sim.lines[i].hz) || !std::isfinite(sim.lines[i].intensity))
        fuzz::broken_promise("a simulated line is not finite");
      if (i > 0 && sim.lines[i].hz < sim.lines[i - 1].hz) fuzz::broken_promise("lines are not ascending");
    }
  });
  return 0;
}
