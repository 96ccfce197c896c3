#include "predict/coupling_list.h"

#include <fmt/format.h>

#include "core/parse.h"

namespace vicinal::predict {

namespace {

std::vector<std::string> split(std::string_view text, char sep) {
  std::vector<std::string> parts;
  std::size_t start = 0;
  for (;;) {
    const auto stop = text.find(sep, start);
    parts.emplace_back(trim(text.substr(start, stop == std::string_view::npos ? std::string_view::npos : stop - start)));
    if (stop == std::string_view::npos) return parts;
    start = stop + 1;
  }
}

}  // namespace

std::array<std::vector<std::string>, 2> split_nuclei(std::string_view text, const Location& where) {
  const auto sides = split(text, ',');
  if (sides.size() != 2)
    throw Error(fmt::format("'{}' is not a pair of nuclei", text), where,
                "write two atom labels or 1-based indices separated by a comma, e.g. H-2,H-3 or 12,15 "
                "(quote the field in the CSV)");
  std::array<std::vector<std::string>, 2> out;
  for (int s = 0; s < 2; ++s) {
    out[s] = split(sides[s], '|');
    for (const auto& ref : out[s])
      if (ref.empty())
        throw Error(fmt::format("'{}' has an empty atom reference", text), where,
                    "alternatives are written a|b, e.g. 13,14|15");
  }
  return out;
}

std::vector<std::array<std::string, 2>> CouplingRow::assignments() const {
  std::vector<std::array<std::string, 2>> out;
  for (const auto& a : nuclei[0])
    for (const auto& b : nuclei[1]) out.push_back({a, b});
  return out;
}

std::string CouplingRow::nuclei_text() const {
  std::string text;
  for (int s = 0; s < 2; ++s) {
    if (s) text += ',';
    for (std::size_t i = 0; i < nuclei[s].size(); ++i) text += (i ? "|" : "") + nuclei[s][i];
  }
  return text;
}

CouplingRowParser::CouplingRowParser(const CsvTable& table, bool require_j)
    : table_(table), require_j_(require_j), nuclei_(table.require_column("nuclei")) {
  j_ = require_j ? std::optional<std::size_t>(table.require_column("j_hz")) : table.column("j_hz");
  sigma_ = table.column("sigma_hz");
  set_ = table.column("set");
  note_ = table.column("note");
  for (std::size_t c = 0; c < table.header().size(); ++c) {
    if (c == nuclei_ || c == j_ || c == sigma_ || c == set_ || c == note_) continue;
    extra_.push_back(c);
    extra_names_.push_back(table.header()[c]);
  }
}

CouplingRow CouplingRowParser::parse(const CsvRow& row) const {
  CouplingRow out;
  out.line = row.line;
  out.nuclei = split_nuclei(row.fields[nuclei_], table_.where(row, nuclei_));
  const auto number = [&](std::optional<std::size_t> column) -> std::optional<double> {
    if (!column || trim(row.fields[*column]).empty()) return std::nullopt;
    return parse_coupling_hz(trim(row.fields[*column]), table_.where(row, *column));
  };
  out.j_hz = number(j_);
  if (require_j_ && !out.j_hz)
    throw Error("the measured coupling is missing", table_.where(row, *j_), "give j_hz in Hz");
  out.sigma_hz = number(sigma_);
  if (out.sigma_hz && !(*out.sigma_hz > 0))
    throw Error(fmt::format("sigma_hz must be above 0, not {}", *out.sigma_hz), table_.where(row, *sigma_),
                "give the uncertainty of the measured J in Hz, or leave the field empty");
  if (set_) out.set = std::string(trim(row.fields[*set_]));
  if (note_) out.note = row.fields[*note_];
  for (std::size_t i = 0; i < extra_.size(); ++i) out.extra.emplace_back(extra_names_[i], row.fields[extra_[i]]);
  return out;
}

CouplingList parse_coupling_list(const CsvTable& table, bool require_j) {
  CouplingRowParser parser(table, require_j);
  CouplingList list;
  list.source = table.source();
  list.extra_columns = parser.extra_columns();
  for (const auto& row : table.rows()) list.rows.push_back(parser.parse(row));
  if (list.rows.empty()) throw Error("the couplings file has a header but no couplings", Location(table.source()));
  return list;
}

CouplingList read_coupling_list(const std::string& path, bool require_j) {
  return parse_coupling_list(CsvTable::read_file(path), require_j);
}

}  // namespace vicinal::predict
