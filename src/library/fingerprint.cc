#include "library/fingerprint.h"

#include <openbabel/fingerprint.h>
#include <openbabel/mol.h>
#include <openbabel/obconversion.h>
#include <openbabel/parsmart.h>

#include <cctype>

#include "structure/openbabel_log.h"

namespace vicinal::library {

namespace {

std::optional<OpenBabel::OBMol> parse_smiles(const std::string& smiles) {
  OpenBabel::OBConversion conv;
  conv.SetInFormat("smi");
  OpenBabel::OBMol mol;
  if (!conv.ReadString(&mol, smiles) || mol.NumAtoms() == 0) return std::nullopt;
  return mol;
}

Fingerprint fingerprint_of(OpenBabel::OBMol& mol) {
  OpenBabel::OBFingerprint* fp = OpenBabel::OBFingerprint::FindFingerprint("FP2");
  std::vector<unsigned int> words;
  if (!fp || !fp->GetFingerprint(&mol, words, 1024)) return {};
  Fingerprint bytes;
  for (unsigned int w : words)
    for (int k = 0; k < 4; ++k) bytes.push_back(static_cast<unsigned char>((w >> (8 * k)) & 0xff));
  return bytes;
}

}  // namespace

Fingerprint compound_fingerprint(const std::string& smiles) {
  structure::LogCapture quiet;
  auto mol = parse_smiles(smiles);
  return mol ? fingerprint_of(*mol) : Fingerprint{};
}

std::optional<Fingerprint> query_fingerprint(const std::string& smarts) {
  // Only the plain-SMILES subset of SMARTS: no brackets, wildcards, logic or
  // explicit H, whose meaning as a query differs from their meaning as SMILES.
  for (char c : smarts)
    if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '(' || c == ')' || c == '=' || c == '#' ||
          c == '-'))
      return std::nullopt;
  for (char c : smarts)
    if (std::isalpha(static_cast<unsigned char>(c)) && std::string("BCNOPSFIlrcnops").find(c) == std::string::npos)
      return std::nullopt;
  structure::LogCapture quiet;
  auto mol = parse_smiles(smarts);
  if (!mol) return std::nullopt;
  OpenBabel::OBSmartsPattern pattern;
  if (!pattern.Init(smarts) || !pattern.Match(*mol, true)) return std::nullopt;
  // The SMILES reading must be the same graph as the query: equal atom counts
  // (implicit hydrogens are not atoms in either).
  if (pattern.NumAtoms() != mol->NumAtoms()) return std::nullopt;
  Fingerprint fp = fingerprint_of(*mol);
  if (fp.empty()) return std::nullopt;
  return fp;
}

bool may_contain(const Fingerprint& compound, const Fingerprint& query) {
  if (compound.size() != query.size()) return true;  // unknown kind: no screening
  for (std::size_t i = 0; i < query.size(); ++i)
    if ((compound[i] & query[i]) != query[i]) return false;
  return true;
}

}  // namespace vicinal::library
