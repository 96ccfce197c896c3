// 2D structure drawings for reports, made by Open Babel's SVG writer, with the
// atoms marked by the labels the chemist gave them ("H-3a", "C-2").
//
//   std::map<int, std::string> labels = {{3, "C-2"}, {10, "H-2"}};  // 1-based atom -> label
//   doc.figure(depiction_svg(molecule, labels, {.title = "compound 7"}), "Compound 7 as labelled");
#pragma once

#include <map>
#include <string>

namespace OpenBabel {
class OBMol;
}

namespace vicinal::report {

struct DepictionOptions {
  std::string title;       // the SVG <title> (read by screen readers and shown on hover)
  int size_px = 320;       // width and height of the drawing
  bool colour_atoms = true;  // element colours for hetero atoms; false = black and white
};

// The molecule drawn in 2D (coordinates generated; 3D coordinates are not
// used) as an SVG document without XML declaration and without script.
// Hydrogens that carry a label are drawn as atoms so their label has a place;
// every other hydrogen is folded into its heavy atom (OH, NH2 as usual).
// A label for an atom index outside the molecule is a vicinal::Error.
std::string depiction_svg(const OpenBabel::OBMol& molecule, const std::map<int, std::string>& labels,
                          const DepictionOptions& options = {});

}  // namespace vicinal::report
