// vicinal nuclei            list the nuclear data table
// vicinal nuclei scale      convert a coupling between isotopologues
#include <fmt/format.h>

#include "cli/command.h"
#include "core/error.h"
#include "core/nuclei.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

std::string spin_text(double spin) {
  const int twice = static_cast<int>(spin * 2 + 0.5);
  return twice % 2 == 0 ? fmt::format("{}", twice / 2) : fmt::format("{}/2", twice);
}

void list_nuclei(const Globals& g) {
  const auto& table = NuclearTable::shipped();
  if (g.json) {
    Json doc = {{"source", table.citation()}, {"nuclei", Json::array()}};
    for (const auto& n : table.all())
      doc["nuclei"].push_back({{"isotope", n.isotope},
                               {"spin", n.spin},
                               {"gamma_1e7_rad_per_t_s", n.gamma_1e7_rad_per_t_s},
                               {"abundance_percent", n.abundance_percent}});
    g.print_json(doc);
    return;
  }
  report::TextTable t({"isotope", "spin I", "gamma / 10^7 rad T^-1 s^-1", "abundance %"});
  for (const auto& n : table.all())
    t.add_row({n.isotope, spin_text(n.spin), fmt::format("{:.6f}", n.gamma_1e7_rad_per_t_s),
               n.abundance_percent > 0 ? fmt::format("{:g}", n.abundance_percent) : "(radioactive)"});
  g.print(t.render() + "Source: " + table.citation() + "\n");
}

std::pair<const Nucleus*, const Nucleus*> parse_pair(const std::string& text, const char* option) {
  const auto comma = text.find(',');
  if (comma == std::string::npos)
    throw Error(fmt::format("'{}' is not a pair of isotopes", text), Location::field_in("", option),
                "write two isotopes separated by a comma, e.g. 1H,2H");
  const auto& table = NuclearTable::shipped();
  return {&table.find(text.substr(0, comma)), &table.find(text.substr(comma + 1))};
}

struct ScaleOptions {
  double j_hz = 0;
  std::string measured = "1H,1H";
  std::string wanted;
};

void scale(const ScaleOptions& o, const Globals& g) {
  const auto [a1, b1] = parse_pair(o.measured, "--between");
  const auto [a2, b2] = parse_pair(o.wanted, "--to");
  const double j2 = scale_coupling_hz(o.j_hz, *a1, *b1, *a2, *b2);
  const double k = reduced_coupling_1e19(o.j_hz, *a1, *b1);
  if (g.json) {
    g.print_json({{"from", {{"nuclei", {a1->isotope, b1->isotope}}, {"j_hz", o.j_hz}}},
                  {"to", {{"nuclei", {a2->isotope, b2->isotope}}, {"j_hz", j2}}},
                  {"reduced_coupling_1e19_n_a2_m3", k},
                  {"source", NuclearTable::shipped().citation()}});
    return;
  }
  g.print(fmt::format("J({},{}) = {:.4g} Hz  ->  J({},{}) = {:.4g} Hz\n"
                      "reduced coupling K = {:.4g} x 10^19 N A^-2 m^-3 (the same for both)\n"
                      "J scales with gamma(a) x gamma(b); isotope effects on K itself are ignored.\n",
                      a1->isotope, b1->isotope, o.j_hz, a2->isotope, b2->isotope, j2, k));
}

void setup(CLI::App& root, Globals& g) {
  auto* nuclei = root.add_subcommand("nuclei", "Nuclear spin data and isotopologue conversion of couplings");
  nuclei->require_subcommand(0, 1);
  nuclei->footer("With no subcommand: list spin, gyromagnetic ratio and abundance of each isotope\n"
                 "(IUPAC Recommendations 2001, Harris et al., Pure Appl. Chem. 73, 1795).");
  nuclei->callback([nuclei, &g] {
    if (nuclei->get_subcommands().empty()) list_nuclei(g);
  });

  auto opts = std::make_shared<ScaleOptions>();
  auto* s = nuclei->add_subcommand("scale", "Convert a coupling between isotopologues, e.g. J(H,D) from J(H,H)");
  s->add_option("--j", opts->j_hz, "Measured coupling in Hz")->required();
  s->add_option("--between", opts->measured, "Isotopes of the measured coupling")->capture_default_str();
  s->add_option("--to", opts->wanted, "Isotopes of the wanted coupling, e.g. 1H,2H")->required();
  s->footer("Example: vicinal nuclei scale --j 7.2 --between 1H,1H --to 1H,2H\n"
            "J scales with the product of the two gyromagnetic ratios; the reduced\n"
            "coupling K = 4 pi^2 J / (h gamma_a gamma_b) is printed as well.");
  s->callback([opts, &g] { scale(*opts, g); });
}

const bool registered = register_command(90, setup);

}  // namespace

}  // namespace vicinal::cli
