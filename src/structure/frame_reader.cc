#include "structure/frame_reader.h"

#include <fast_float/fast_float.h>
#include <fmt/format.h>
#include <openbabel/elements.h>

#include <algorithm>
#include <charconv>
#include <cctype>
#include <cstdio>
#include <filesystem>
#include <memory>
#include <string_view>

#include "core/error.h"

namespace vicinal::structure {

namespace {

// Lines of a file read through a large buffer; a line is valid until the next call.
class LineReader {
 public:
  explicit LineReader(const std::string& path) : path_(path), file_(std::fopen(path.c_str(), "rb"), &std::fclose) {
    if (!file_) throw Error("cannot open file for reading", Location(path));
    buffer_.resize(1 << 20);
  }

  bool next(std::string_view& line) {
    for (;;) {
      const auto newline = std::find(buffer_.begin() + begin_, buffer_.begin() + end_, '\n');
      if (newline != buffer_.begin() + end_) {
        const std::size_t stop = newline - buffer_.begin();
        line = std::string_view(buffer_.data() + begin_, stop - begin_);
        begin_ = stop + 1;
        ++number_;
        if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
        require_no_bare_cr(line);
        return true;
      }
      if (eof_) {
        if (begin_ == end_) return false;
        line = std::string_view(buffer_.data() + begin_, end_ - begin_);
        begin_ = end_;
        ++number_;
        if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
        require_no_bare_cr(line);
        return true;
      }
      // Move the partial line to the front, grow if one line fills the buffer, refill.
      std::copy(buffer_.begin() + begin_, buffer_.begin() + end_, buffer_.begin());
      end_ -= begin_;
      begin_ = 0;
      if (end_ == buffer_.size()) buffer_.resize(buffer_.size() * 2);
      const std::size_t got = std::fread(buffer_.data() + end_, 1, buffer_.size() - end_, file_.get());
      if (got == 0) eof_ = true;
      end_ += got;
    }
  }

  // Lines end in LF or CRLF; a CR alone inside a line means old Mac line ends,
  // which would otherwise be misread as one long line.
  void require_no_bare_cr(std::string_view line) const {
    if (line.find('\r') != std::string_view::npos)
      throw Error("a line ends in a bare carriage return (CR)", here(), "save the file with LF or CRLF line ends");
  }

  long line_number() const { return number_; }
  Location here(long column = 0) const { return Location(path_, number_, column); }

 private:
  std::string path_;
  std::unique_ptr<std::FILE, int (*)(std::FILE*)> file_;
  std::vector<char> buffer_;
  std::size_t begin_ = 0, end_ = 0;
  bool eof_ = false;
  long number_ = 0;
};

std::string_view trim_view(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

double number_at(std::string_view text, const Location& where) {
  text = trim_view(text);
  double value = 0;
  const auto result = fast_float::from_chars(text.data(), text.data() + text.size(), value);
  if (text.empty() || result.ec != std::errc() || result.ptr != text.data() + text.size() || !std::isfinite(value))
    throw Error(fmt::format("'{}' is not a coordinate", text), where);
  return value;
}

bool same_element(std::string_view symbol, int atomic_number) {
  std::string want = OpenBabel::OBElements::GetSymbol(atomic_number);
  if (symbol.size() != want.size()) return false;
  for (std::size_t i = 0; i < want.size(); ++i)
    if (std::tolower(static_cast<unsigned char>(symbol[i])) != std::tolower(static_cast<unsigned char>(want[i])))
      return false;
  return true;
}

Error wrong_count(const std::string& path, std::size_t frame, std::size_t got, std::size_t want, long line) {
  return Error(fmt::format("frame {} has {} atoms, but the first frame has {}", frame + 1, got, want),
               Location(path, line), "every frame of an ensemble must have the same atoms in the same order");
}

std::size_t stream_pdb(const std::string& path, const std::vector<int>& elements, const FrameCallback& on_frame) {
  LineReader in(path);
  const std::size_t n = elements.size();
  std::vector<double> xyz(3 * n);
  std::size_t frame = 0, atom = 0;
  bool in_model = false;
  long frame_start_line = 1;
  const auto finish = [&](long line) {
    if (atom == 0) return;
    if (atom != n) throw wrong_count(path, frame, atom, n, line);
    on_frame(frame, xyz);
    ++frame;
    atom = 0;
  };
  std::string_view line;
  while (in.next(line)) {
    const std::string_view record = line.substr(0, 6);
    if (record.starts_with("MODEL")) {
      finish(in.line_number());
      in_model = true;
      frame_start_line = in.line_number();
    } else if (record.starts_with("ENDMDL") || (record.starts_with("END") && !in_model)) {
      finish(frame_start_line);
      in_model = false;
    } else if (record == "ATOM  " || record == "HETATM") {
      if (line.size() > 16 && line[16] != ' ' && line[16] != 'A' && line[16] != '1') continue;  // alternate locations
      if (line.size() < 54)
        throw Error(fmt::format("frame {}: ATOM record too short for coordinates (truncated file?)", frame + 1),
                    in.here());
      if (atom == 0) frame_start_line = in.line_number();
      if (atom >= n) throw wrong_count(path, frame, atom + 1, n, in.line_number());
      if (line.size() >= 78) {
        const std::string_view symbol = trim_view(line.substr(76, 2));
        if (!symbol.empty() && !same_element(symbol, elements[atom]))
          throw Error(fmt::format("frame {}: atom {} is {}, but {} in the first frame", frame + 1, atom + 1, symbol,
                                  OpenBabel::OBElements::GetSymbol(elements[atom])),
                      in.here(77));
      }
      xyz[3 * atom] = number_at(line.substr(30, 8), in.here(31));
      xyz[3 * atom + 1] = number_at(line.substr(38, 8), in.here(39));
      xyz[3 * atom + 2] = number_at(line.substr(46, 8), in.here(47));
      ++atom;
    }
  }
  if (in_model && atom > 0)
    throw Error(fmt::format("frame {} ends without ENDMDL (truncated file?)", frame + 1), in.here());
  finish(in.line_number());
  if (frame == 0) throw Error("no ATOM or HETATM records", Location(path));
  return frame;
}

std::size_t stream_xyz(const std::string& path, const std::vector<int>& elements, const FrameCallback& on_frame) {
  LineReader in(path);
  const std::size_t n = elements.size();
  std::vector<double> xyz(3 * n);
  std::size_t frame = 0;
  std::string_view line;
  while (in.next(line)) {
    const std::string_view count_text = trim_view(line);
    if (count_text.empty()) continue;  // blank lines between or after frames
    const long count_line = in.line_number();
    std::size_t count = 0;
    const auto r = std::from_chars(count_text.data(), count_text.data() + count_text.size(), count);
    if (r.ec != std::errc() || r.ptr != count_text.data() + count_text.size())
      throw Error(fmt::format("frame {}: expected the atom count, found '{}'", frame + 1, count_text), in.here(1));
    if (count != n) throw wrong_count(path, frame, count, n, count_line);
    if (!in.next(line))
      throw Error(fmt::format("frame {} is truncated: the comment line is missing", frame + 1), in.here());
    for (std::size_t atom = 0; atom < n; ++atom) {
      if (!in.next(line))
        throw Error(fmt::format("frame {} is truncated: {} of {} atoms present", frame + 1, atom, n), in.here());
      // element x y z [anything else]
      std::string_view rest = trim_view(line);
      std::string_view fields[4];
      for (int f = 0; f < 4; ++f) {
        const auto stop = rest.find_first_of(" \t");
        fields[f] = rest.substr(0, stop);
        if (fields[f].empty())
          throw Error(fmt::format("frame {}: atom line needs an element and three coordinates (truncated file?)",
                                  frame + 1),
                      in.here());
        rest = stop == std::string_view::npos ? std::string_view() : trim_view(rest.substr(stop));
      }
      const bool numeric = std::isdigit(static_cast<unsigned char>(fields[0][0]));
      const bool ok = numeric ? std::to_string(elements[atom]) == fields[0] : same_element(fields[0], elements[atom]);
      if (!ok)
        throw Error(fmt::format("frame {}: atom {} is {}, but {} in the first frame", frame + 1, atom + 1, fields[0],
                                OpenBabel::OBElements::GetSymbol(elements[atom])),
                    in.here(1));
      for (int k = 0; k < 3; ++k) xyz[3 * atom + k] = number_at(fields[k + 1], in.here());
    }
    on_frame(frame, xyz);
    ++frame;
  }
  if (frame == 0) throw Error("no frames found", Location(path));
  return frame;
}

}  // namespace

FrameFormat frame_format_of(const std::string& path) {
  std::string ext = std::filesystem::path(path).extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return std::tolower(c); });
  if (ext == ".pdb" || ext == ".ent") return FrameFormat::Pdb;
  if (ext == ".xyz") return FrameFormat::Xyz;
  throw Error("the fast frame reader reads multi-model PDB and multi-frame XYZ only", Location(path),
              "give a .pdb or .xyz trajectory");
}

std::size_t stream_frames(const std::string& path, const std::vector<int>& atomic_numbers,
                          const FrameCallback& on_frame) {
  return frame_format_of(path) == FrameFormat::Pdb ? stream_pdb(path, atomic_numbers, on_frame)
                                                   : stream_xyz(path, atomic_numbers, on_frame);
}

}  // namespace vicinal::structure
