#include "cli/multiplet_store.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/error.h"
#include "library/entry_builder.h"
#include "library/query.h"
#include "library/store.h"
#include "predict/coupling_list.h"

namespace vicinal::cli {

void MultipletStoreOptions::add_options(CLI::App& command) {
  command.add_option("--store", compound, "Store the couplings in the library under this compound (name, InChIKey or id)");
  command.add_option("--nucleus", nucleus, "With --store: the observed nucleus (label or index), e.g. H-3");
  command.add_option("--partners", partners,
                     "With --store: the partner of each coupling, largest J first, comma-separated; "
                     "'|' for stereo-unassigned alternatives, e.g. H-4a|H-4b,H-2,H-4b|H-4a");
  command.add_option("--measurement", measurement, "With --store: name of the measurement set");
  command.add_option("--solvent", solvent, "With --store: solvent");
  command.add_option("--temperature-k", temperature_k, "With --store: temperature in K");
  command.add_option("--source", source, "With --store: notebook page, spectrum file or DOI");
  command.add_option("--sigma-hz", sigma_hz,
                     "With --store: uncertainty of each J (default: the reading's RMS deviation, at least 0.1 Hz)");
}

std::string store_multiplet(const MultipletStoreOptions& o, const spin::TreeFit& reading,
                            std::optional<double> field_mhz, const std::string& origin, const Globals& g) {
  if (o.nucleus.empty() || o.partners.empty())
    throw Error("--store needs the observed nucleus and its partners", Location::field_in("", "--store"),
                "add --nucleus H-3 --partners H-4a,H-2,H-4b (largest J first)");
  if (o.sigma_hz && !(*o.sigma_hz > 0))
    throw Error("the uncertainty must be positive", Location::field_in("", "--sigma-hz"));

  // One J per partner: a group of n equivalent partners (t, q) gives n rows.
  std::vector<double> j_per_partner;
  for (const auto& group : reading.groups) j_per_partner.insert(j_per_partner.end(), group.partners, group.j_hz);
  std::vector<std::string> partner_refs;
  for (std::size_t start = 0;;) {
    const auto comma = o.partners.find(',', start);
    partner_refs.push_back(o.partners.substr(start, comma == std::string::npos ? std::string::npos : comma - start));
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  if (partner_refs.size() != j_per_partner.size())
    throw Error(fmt::format("{} partners given, but the reading {} has {} couplings", partner_refs.size(),
                            reading.notation(), j_per_partner.size()),
                Location::field_in("", "--partners"), "name one partner per coupling, largest J first");

  library::Library lib(g.library_path());
  const auto compound_id = library::find_compound(lib.db(), o.compound);
  const auto stored = lib.read_entries({compound_id});
  const auto& record = stored.front().compound;
  library::StructureSpec spec;
  spec.kind = library::StructureSpec::Kind::Molfile;
  spec.text = record.molfile;
  library::CompoundBuilder builder(record.name, spec, Location(g.library_path()));

  library::SetRecord set;
  set.conditions.name = o.measurement.empty() ? "multiplet of " + o.nucleus : o.measurement;
  set.conditions.solvent = o.solvent;
  set.conditions.temperature_k = o.temperature_k;
  set.conditions.field_mhz = field_mhz;
  set.conditions.method = "multiplet analysis: " + reading.notation();
  set.conditions.source = o.source;
  set.imported_from = origin;
  library::check_conditions(set.conditions, Location::field_in("", "--store"));
  const double sigma = o.sigma_hz.value_or(std::max(0.1, reading.residual_hz));
  for (std::size_t k = 0; k < partner_refs.size(); ++k) {
    Location at = Location::field_in("", "--partners");
    at.field = fmt::format("--partners item {}", k + 1);
    const auto nuclei = predict::split_nuclei(o.nucleus + "," + partner_refs[k], at);
    // A multiplet gives J to a few hundredths of a hertz at best; the refined
    // value's further digits are noise and would only clutter the library.
    const double j_hz = std::round(j_per_partner[k] * 1000) / 1000;
    auto coupling = builder.coupling(nuclei, j_hz, sigma, at);
    coupling.origin = origin;
    coupling.note = fmt::format("read from the multiplet of {}: {}", o.nucleus, reading.notation());
    set.couplings.push_back(std::move(coupling));
  }
  library::number_unassigned_groups(set);
  auto progress = g.progress();
  const auto report = lib.store({library::Entry{builder.record(), {std::move(set)}}}, *progress);
  return fmt::format("stored in {}: {} coupling(s) added, {} already present, {} conflicting value(s) kept side by side",
                     g.library_path(), report.couplings_added, report.couplings_duplicate, report.conflicts.size());
}

}  // namespace vicinal::cli
