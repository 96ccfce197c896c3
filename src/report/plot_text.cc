#include "report/plot_text.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdint>
#include <numbers>

namespace vicinal::report {

namespace {

constexpr const char* kFontFamily = "DejaVu Sans";

// Length of the UTF-8 sequence starting at s[i], or 0 when it is malformed.
std::size_t sequence_length(const std::string& s, std::size_t i) {
  const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(s[k]); };
  const unsigned char lead = byte(i);
  std::size_t n = lead < 0x80 ? 1 : (lead >> 5) == 0x6 ? 2 : (lead >> 4) == 0xE ? 3 : (lead >> 3) == 0x1E ? 4 : 0;
  if (n == 0 || i + n > s.size()) return 0;
  for (std::size_t k = 1; k < n; ++k)
    if ((byte(i + k) & 0xC0) != 0x80) return 0;
  if (n == 2 && lead < 0xC2) return 0;  // overlong
  return n;
}

std::string xml_escape(const std::string& s) {
  std::string out;
  for (char c : s) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

void replace_all(std::string& s, const std::string& from, const std::string& to) {
  for (std::size_t at = s.find(from); at != std::string::npos; at = s.find(from, at + to.size()))
    s.replace(at, from.size(), to);
}

// cairo numbers its SVG surfaces with a counter shared by the whole process;
// renumbering them in order of appearance makes equal figures equal documents.
std::string renumber_surfaces(const std::string& svg) {
  std::string out;
  std::vector<std::string> seen;
  const std::string word = "surface";
  std::size_t from = 0;
  for (std::size_t at = svg.find(word); at != std::string::npos; at = svg.find(word, from)) {
    std::size_t end = at + word.size();
    while (end < svg.size() && std::isdigit(static_cast<unsigned char>(svg[end]))) ++end;
    out.append(svg, from, at - from);
    const std::string name = svg.substr(at, end - at);
    if (end == at + word.size()) {
      out += name;
    } else {
      auto it = std::find(seen.begin(), seen.end(), name);
      if (it == seen.end()) it = seen.insert(seen.end(), name);
      out += word + std::to_string(it - seen.begin() + 1);
    }
    from = end;
  }
  return out + svg.substr(from);
}

}  // namespace

std::string valid_utf8(const std::string& text) {
  std::string out;
  for (std::size_t i = 0; i < text.size();) {
    const std::size_t n = sequence_length(text, i);
    if (n == 0) {
      out += '?';
      ++i;
    } else if (n == 1 && static_cast<unsigned char>(text[i]) < 0x20) {
      out += ' ';
      ++i;
    } else {
      out.append(text, i, n);
      i += n;
    }
  }
  return out;
}

void PlotText::font(double size_pt, bool bold) {
  size_ = size_pt;
  bold_ = bold;
  cairo_select_font_face(cr_, kFontFamily, CAIRO_FONT_SLANT_NORMAL,
                         bold ? CAIRO_FONT_WEIGHT_BOLD : CAIRO_FONT_WEIGHT_NORMAL);
  cairo_set_font_size(cr_, size_pt);
}

double PlotText::width(const std::string& text) {
  cairo_text_extents_t extents;
  cairo_text_extents(cr_, valid_utf8(text).c_str(), &extents);
  return extents.x_advance;
}

void PlotText::draw(const std::string& raw, double x, double y, double h_anchor, VAlign v, double angle_deg) {
  const std::string text = valid_utf8(raw);
  if (text.empty()) return;
  const double w = width(text);
  // Offsets from the anchor to the baseline start, in the text's own direction.
  // DejaVu Sans capitals are about 0.73 em tall.
  const double dx = -h_anchor * w;
  const double dy = v == VAlign::Top ? 0.76 * size_ : v == VAlign::Middle ? 0.36 * size_ : 0.0;
  const double angle = angle_deg * std::numbers::pi / 180;
  cairo_save(cr_);
  cairo_translate(cr_, x, y);
  cairo_rotate(cr_, angle);
  cairo_move_to(cr_, dx, dy);
  cairo_show_text(cr_, text.c_str());
  cairo_new_path(cr_);
  cairo_restore(cr_);
  if (layer_) {
    layer_->push_back({text, x + dx * std::cos(angle) - dy * std::sin(angle),
                       y + dx * std::sin(angle) + dy * std::cos(angle), size_, w, angle_deg, bold_});
  }
}

std::vector<std::string> PlotText::wrap(const std::string& raw, double max_width) {
  std::vector<std::string> lines;
  const std::string text = [&] {
    std::string kept;  // newlines survive the clean-up as line breaks
    std::size_t start = 0;
    for (std::size_t nl; (nl = raw.find('\n', start)) != std::string::npos; start = nl + 1)
      kept += valid_utf8(raw.substr(start, nl - start)) + '\n';
    return kept + valid_utf8(raw.substr(start));
  }();
  std::size_t start = 0;
  while (start <= text.size()) {
    std::size_t end = text.find('\n', start);
    if (end == std::string::npos) end = text.size();
    const std::string paragraph = text.substr(start, end - start);
    start = end + 1;
    std::string line;
    std::size_t i = 0;
    while (i < paragraph.size()) {
      if (paragraph[i] == ' ') {
        ++i;
        continue;
      }
      std::size_t word_end = paragraph.find(' ', i);
      if (word_end == std::string::npos) word_end = paragraph.size();
      std::string word = paragraph.substr(i, word_end - i);
      i = word_end;
      const std::string joined = line.empty() ? word : line + " " + word;
      if (width(joined) <= max_width) {
        line = joined;
        continue;
      }
      if (!line.empty()) lines.push_back(line), line.clear();
      // The word alone is too long: cut it between UTF-8 characters.
      while (width(word) > max_width) {
        std::size_t cut = 0;
        for (std::size_t k = 0; k < word.size();) {
          const std::size_t n = std::max<std::size_t>(1, sequence_length(word, k));
          if (cut > 0 && width(word.substr(0, k + n)) > max_width) break;
          k += n;
          cut = k;
        }
        if (cut >= word.size()) break;
        lines.push_back(word.substr(0, cut));
        word = word.substr(cut);
      }
      line = word;
    }
    if (!line.empty()) lines.push_back(line);
    if (end == text.size()) break;
  }
  return lines;
}

std::string finish_svg(const std::string& cairo_svg, const std::string& title, const std::vector<TextItem>& layer) {
  std::string svg = renumber_surfaces(cairo_svg);
  // FNV-1a of the content: the same figure always gets the same prefix.
  std::uint32_t hash = 2166136261u;
  for (unsigned char c : svg) hash = (hash ^ c) * 16777619u;
  const std::string prefix = fmt::format("v{:08x}-", hash);
  replace_all(svg, "id=\"", "id=\"" + prefix);
  replace_all(svg, "href=\"#", "href=\"#" + prefix);
  replace_all(svg, "url(#", "url(#" + prefix);

  const std::size_t open = svg.find("<svg");
  const std::size_t open_end = open == std::string::npos ? open : svg.find('>', open);
  if (open_end != std::string::npos && !title.empty())
    svg.insert(open_end + 1, "\n<title>" + xml_escape(valid_utf8(title)) + "</title>");

  std::string text_layer = fmt::format("<g fill-opacity=\"0\" font-family=\"{}, sans-serif\">\n", kFontFamily);
  for (const auto& t : layer) {
    text_layer += fmt::format("<text x=\"{:.2f}\" y=\"{:.2f}\" font-size=\"{:.2f}\"", t.x, t.y, t.size);
    if (t.bold) text_layer += " font-weight=\"bold\"";
    if (t.angle_deg != 0)
      text_layer += fmt::format(" transform=\"rotate({:.2f} {:.2f} {:.2f})\"", t.angle_deg, t.x, t.y);
    text_layer += fmt::format(" textLength=\"{:.2f}\" lengthAdjust=\"spacingAndGlyphs\">{}</text>\n", t.width,
                              xml_escape(t.text));
  }
  text_layer += "</g>\n";
  const std::size_t close = svg.rfind("</svg>");
  if (close != std::string::npos) svg.insert(close, text_layer);
  return svg;
}

}  // namespace vicinal::report
