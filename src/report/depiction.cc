#include "report/depiction.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/mol.h>
#include <openbabel/obconversion.h>
#include <openbabel/obiter.h>

#include <cmath>
#include <regex>
#include <stdexcept>

#include "core/error.h"
#include "report/html.h"

namespace vicinal::report {

namespace {

using OpenBabel::OBAtom;
using OpenBabel::OBMol;

struct Point {
  double x = 0, y = 0;
};

// Open Babel hydrogens that can be folded into their neighbour's implicit
// count without losing anything: unlabelled, ordinary isotope, one bond to a
// heavy atom.
bool foldable(OBAtom& atom, const std::map<unsigned long, std::string>& label_by_id) {
  if (atom.GetAtomicNum() != 1 || atom.GetIsotope() > 1 || label_by_id.count(atom.GetId())) return false;
  if (atom.GetExplicitDegree() != 1) return false;
  FOR_NBORS_OF_ATOM(neighbour, &atom) if (neighbour->GetAtomicNum() == 1) return false;
  return true;
}

void fold_hydrogens(OBMol& mol, const std::map<unsigned long, std::string>& label_by_id) {
  std::vector<OBAtom*> hydrogens;
  FOR_ATOMS_OF_MOL(atom, mol) if (foldable(*atom, label_by_id)) hydrogens.push_back(&*atom);
  for (OBAtom* h : hydrogens) {
    // DeleteHydrogen leaves the neighbour's hydrogen count short: the drawing
    // would show a radical instead of CH or OH.
    FOR_NBORS_OF_ATOM(neighbour, h) neighbour->SetImplicitHCount(neighbour->GetImplicitHCount() + 1);
    mol.DeleteHydrogen(h);
  }
}

// Where a label goes: away from the atom's bonds, just far enough that the
// label's box clears the atom's element symbol (or the bond vertex of a carbon
// drawn without one). Sizes are in Open Babel's units: bonds 40 long, symbols
// in 16-unit type, our labels in 11-unit type.
Point label_position(OBAtom& atom, const std::string& label, const std::map<int, Point>& drawn) {
  const Point at = drawn.at(static_cast<int>(atom.GetIdx()));
  double dx = 0, dy = 0;
  FOR_NBORS_OF_ATOM(neighbour, &atom) {
    const Point n = drawn.at(static_cast<int>(neighbour->GetIdx()));
    const double length = std::hypot(n.x - at.x, n.y - at.y);
    if (length > 1e-9) dx -= (n.x - at.x) / length, dy -= (n.y - at.y) / length;
  }
  double length = std::hypot(dx, dy);
  if (length < 0.2) {  // bonds balance out (none, or opposite ones): up and to the right
    dx = 0.6, dy = -0.8, length = 1;
  }
  dx /= length, dy /= length;
  const bool symbol_drawn = atom.GetAtomicNum() != 6 || atom.GetExplicitDegree() <= 1;
  const double atom_half = symbol_drawn ? 8.0 : 3.0;
  const double label_half_width = 3.6 * static_cast<double>(label.size()), label_half_height = 5.5;
  const double along_x = std::abs(dx) > 1e-6 ? (atom_half + label_half_width) / std::abs(dx) : 1e9;
  const double along_y = std::abs(dy) > 1e-6 ? (atom_half + label_half_height) / std::abs(dy) : 1e9;
  const double distance = std::min(along_x, along_y) + 2;
  return {at.x + distance * dx, at.y + distance * dy};
}

}  // namespace

std::string depiction_svg(const OpenBabel::OBMol& molecule, const std::map<int, std::string>& labels,
                          const DepictionOptions& options) {
  const int atom_count = static_cast<int>(molecule.NumAtoms());
  if (atom_count == 0) throw Error("the structure has no atoms to draw");
  OBMol mol(molecule);
  std::map<unsigned long, std::string> label_by_id;  // atom ids survive the deletion of hydrogens
  for (const auto& [index, label] : labels) {
    if (index < 1 || index > atom_count) {
      Location where;
      where.atom = std::to_string(index);
      throw Error(fmt::format("atom {} is labelled '{}', but the structure has {} atoms", index, label, atom_count),
                  where, "atom numbers count from 1 in the order of the structure file");
    }
    label_by_id[mol.GetAtom(index)->GetId()] = label;
  }
  fold_hydrogens(mol, label_by_id);

  OpenBabel::OBConversion conversion;
  if (!conversion.SetOutFormat("svg")) throw std::runtime_error("Open Babel has no SVG writer");
  const auto out = OpenBabel::OBConversion::OUTOPTIONS;
  conversion.AddOption("i", out);  // atom numbers: they mark where each atom is drawn
  conversion.AddOption("d", out);  // no molecule name inside the drawing
  conversion.AddOption("j", out);  // never any javascript
  conversion.AddOption("x", out);  // no XML declaration: the SVG is embedded
  conversion.AddOption("P", out, std::to_string(options.size_px).c_str());
  if (!options.colour_atoms) conversion.AddOption("u", out);
  std::string svg = conversion.WriteString(&mol);

  // Open Babel writes atom numbers as small red text at the atom positions.
  // They tell where each atom was drawn; they are replaced by the chemist's
  // labels or removed.
  static const std::regex number(R"re(<text x="([-0-9.e]+)" y="([-0-9.e]+)" fill="rgb\(255,0,0\)"[^>]*font-size="12" >(\d+)</text>\n?)re");
  std::map<int, Point> drawn;
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), number); it != std::sregex_iterator(); ++it)
    drawn[std::stoi((*it)[3])] = {std::stod((*it)[1]), std::stod((*it)[2])};
  if (static_cast<int>(drawn.size()) != static_cast<int>(mol.NumAtoms()))
    throw std::runtime_error("Open Babel's SVG writer did not mark the atom positions as expected");

  std::string labelled;
  std::size_t from = 0;
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), number); it != std::sregex_iterator(); ++it) {
    labelled.append(svg, from, static_cast<std::size_t>(it->position()) - from);
    from = static_cast<std::size_t>(it->position() + it->length());
    OBAtom* atom = mol.GetAtom(std::stoi((*it)[3]));
    const auto label = label_by_id.find(atom->GetId());
    if (label == label_by_id.end()) continue;
    const Point p = label_position(*atom, label->second, drawn);
    labelled += fmt::format(
        "<text x=\"{:.1f}\" y=\"{:.1f}\" class=\"atom-label\" text-anchor=\"middle\" dominant-baseline=\"central\" "
        "font-family=\"DejaVu Sans, sans-serif\" font-size=\"11\" font-weight=\"bold\" fill=\"#0072B2\" "
        "stroke=\"#ffffff\" stroke-width=\"3\" stroke-linejoin=\"round\" paint-order=\"stroke\">{}</text>\n",
        p.x, p.y, html_escape(label->second));
  }
  labelled.append(svg, from);

  // One drawing per molecule, several per page: no fixed id, our own title.
  const std::string fixed_id = " id=\"topsvg\"";
  if (const auto at = labelled.find(fixed_id); at != std::string::npos) labelled.erase(at, fixed_id.size());
  const auto title_start = labelled.find("<title>");
  const auto title_end = labelled.find("</title>", title_start);
  if (title_start != std::string::npos && title_end != std::string::npos)
    labelled.replace(title_start, title_end + 8 - title_start,
                     options.title.empty() ? "" : "<title>" + html_escape(options.title) + "</title>");
  return labelled;
}

}  // namespace vicinal::report
