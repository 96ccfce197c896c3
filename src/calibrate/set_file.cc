#include "calibrate/set_file.h"

#include <fmt/format.h>

#include <chrono>
#include <cstdlib>
#include <ctime>
#include <regex>

#include "core/atomic_file.h"
#include "core/error.h"

namespace vicinal::calibrate {

NewSet new_set_like(const karplus::ParameterSet& like) {
  NewSet s;
  s.nuclei = like.nuclei;
  s.coupling = like.coupling;
  s.pattern_smarts = like.pattern_smarts;
  s.angle_name = like.angle_name;
  s.offset_deg = like.offset_deg;
  return s;
}

std::string utc_now() {
  const std::time_t t = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
  std::tm tm{};
  gmtime_r(&t, &tm);
  char buffer[32];
  std::strftime(buffer, sizeof buffer, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buffer;
}

Json set_json(const NewSet& s) {
  Json coefficients = Json::object();
  for (std::size_t i = 0; i < s.names.size(); ++i) coefficients[s.names[i]] = s.coefficients[i];
  const std::string year = utc_now().substr(0, 4);
  return {{"id", s.id},
          {"title", s.title},
          {"nuclei", s.nuclei},
          {"coupling", s.coupling},
          {"pattern_smarts", s.pattern_smarts},
          {"angle_name", s.angle_name},
          {"offset_deg", s.offset_deg},
          {"form", karplus::form_name(s.form)},
          {"coefficients", coefficients},
          {"rms_hz", s.rms_hz},
          {"valid_range_deg", {-180, 180}},
          {"citation",
           {{"authors", "local calibration"},
            {"year", std::stoi(year)},
            {"journal", "vicinal karplus calibrate"},
            {"volume", "-"},
            {"first_page", "-"}}},
          {"table", s.table},
          {"notes", s.notes}};
}

std::filesystem::path default_set_path(const std::string& id) {
  const char* dir = std::getenv("VICINAL_KARPLUS_DIR");
  if (!dir || !*dir)
    throw Error("no place to write the new set", Location::field_in("", "--out"),
                "give --out FILE, or set VICINAL_KARPLUS_DIR to the folder of your own sets");
  return std::filesystem::path(dir) / (id + ".json");
}

void write_set(const NewSet& set, const std::filesystem::path& path) {
  if (!std::regex_match(set.id, std::regex("[a-z0-9][a-z0-9.-]*")))
    throw Error(fmt::format("'{}' is not a usable set id", set.id), Location::field_in("", "--id"),
                "use lower-case letters, digits, '-' and '.', e.g. hh-my-lab-2026");
  const std::string text = set_json(set).dump(2) + "\n";
  write_via_temporary(path, [&](const std::filesystem::path& temporary) {
    write_file_atomically(temporary, text);
    // The catalogue wants .json files; check the content through its reader.
    const auto check = std::filesystem::path(temporary.string() + ".json");
    std::filesystem::rename(temporary, check);
    try {
      karplus::SetCatalog::load_file(check.string());
    } catch (...) {
      std::filesystem::remove(check);
      throw;
    }
    std::filesystem::rename(check, temporary);
  });
}

}  // namespace vicinal::calibrate
