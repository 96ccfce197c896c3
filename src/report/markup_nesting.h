// For tests of markup writers (HTML, SVG): checks that every element opened is
// closed in order, so a document is at least well-nested.
#pragma once

#include <regex>
#include <string>
#include <vector>

namespace vicinal::report {

// The first nesting problem ("unexpected </p>", "unclosed <div>"), or "" when
// every element is closed in order. Void HTML elements and self-closing tags
// ("<rect .../>") need no end tag; declarations and comments are ignored.
inline std::string markup_nesting_problem(const std::string& markup) {
  static const std::regex tag("<(/?)([a-zA-Z][a-zA-Z0-9:]*)[^>]*?(/?)>");
  std::vector<std::string> open;
  for (auto it = std::sregex_iterator(markup.begin(), markup.end(), tag); it != std::sregex_iterator(); ++it) {
    const std::string name = (*it)[2];
    if (name == "meta" || name == "br" || name == "link" || (*it)[3] == "/") continue;
    if ((*it)[1] == "/") {
      if (open.empty() || open.back() != name) return "unexpected </" + name + ">";
      open.pop_back();
    } else {
      open.push_back(name);
    }
  }
  return open.empty() ? "" : "unclosed <" + open.back() + ">";
}

}  // namespace vicinal::report
