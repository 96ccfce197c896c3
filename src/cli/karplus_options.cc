#include "cli/karplus_options.h"

#include <fmt/format.h>

#include <cctype>
#include <filesystem>

#include "core/error.h"
#include "core/parse.h"

namespace vicinal::cli {

std::vector<karplus::Substituent> parse_substituents(const std::vector<std::string>& texts) {
  std::vector<karplus::Substituent> subs;
  const Location where = Location::field_in("", "--substituent");
  const std::string hint = "write DCHI:SIGN, the electronegativity difference from H and the orientation sign, e.g. 1.26:+1";
  for (const std::string& text : texts) {
    const auto colon = text.find(':');
    if (colon == std::string::npos) throw Error(fmt::format("'{}' has no ':SIGN'", text), where, hint);
    karplus::Substituent s;
    try {
      s.delta_chi = parse_double(text.substr(0, colon), where);
    } catch (const Error& e) {
      throw Error(e.what_happened(), where, hint);
    }
    const std::string sign = std::string(trim(text.substr(colon + 1)));
    if (sign == "+1" || sign == "1" || sign == "+")
      s.orientation = 1;
    else if (sign == "-1" || sign == "-")
      s.orientation = -1;
    else
      throw Error(fmt::format("orientation sign '{}' must be +1 or -1", sign), where, hint);
    subs.push_back(s);
  }
  if (subs.size() > karplus::kMaxSubstituents)
    throw Error(fmt::format("{} substituents given; an H-C-C-H fragment has at most {}", subs.size(),
                            karplus::kMaxSubstituents),
                where);
  return subs;
}

Json substituents_json(const std::vector<karplus::Substituent>& subs) {
  Json list = Json::array();
  for (const auto& s : subs) list.push_back({{"delta_chi", s.delta_chi}, {"orientation", s.orientation}});
  return list;
}

double parse_option_number(const std::string& text, const std::string& option, const std::string& example) {
  try {
    return parse_double(text, Location::field_in("", option));
  } catch (const Error& e) {
    throw Error(e.what_happened(), e.where(), "give a plain number, e.g. " + option + " " + example);
  }
}

void note_substituent_use(const Globals& g, const karplus::ParameterSet& set, std::size_t given) {
  if (!set.is_haasnoot()) return;
  if (given == 0) {
    g.note(fmt::format("note: '{}' is a Haasnoot set and no --substituent was given: the curve is that of an "
                       "H-C-C-H fragment without non-hydrogen substituents (P1 cos^2 + P2 cos + P3 only).",
                       set.id));
  } else if (set.substituent_count > 0 && static_cast<int>(given) != set.substituent_count) {
    g.note(fmt::format("note: '{}' was fitted for fragments with {} substituents; {} given.", set.id,
                       set.substituent_count, given));
  }
}

void PlotTargets::add_options(CLI::App& app) {
  app.add_option("--svg", svg, "Write the plot as SVG to this file");
  app.add_option("--pdf", pdf, "Write the plot as PDF to this file");
  app.add_option("--png", png, "Write the plot as PNG to this file");
}

void PlotTargets::check() const {
  const std::pair<const std::string*, const char*> targets[] = {{&svg, "svg"}, {&pdf, "pdf"}, {&png, "png"}};
  for (const auto& [path, ext] : targets) {
    if (path->empty()) continue;
    std::string got = std::filesystem::path(*path).extension().string();
    for (char& c : got) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    if (got != std::string(".") + ext)
      throw Error(fmt::format("'{}' does not end in .{}", *path, ext), Location::field_in("", std::string("--") + ext),
                  fmt::format("name the file e.g. plot.{}", ext));
  }
}

void PlotTargets::save(const report::Figure& figure, const Globals& g) const {
  for (const std::string& path : {svg, pdf, png}) {
    if (path.empty()) continue;
    report::save_figure(figure, path);
    g.note("wrote " + path);
  }
}

void dihedral_axis(report::Figure& figure, const std::string& angle_name) {
  figure.x_label = fmt::format("dihedral {} / deg", angle_name);
  figure.x_range = std::make_pair(-180.0, 180.0);
  figure.x_ticks = {-180, -120, -60, 0, 60, 120, 180};
}

}  // namespace vicinal::cli
