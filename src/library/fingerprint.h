// Substructure pre-screen: Open Babel's FP2 path fingerprint (1024 bits) is
// stored per compound; a SMARTS query is tested only on compounds whose
// fingerprint holds every bit of the query's. The screen is used only for
// queries that read as plain SMILES (organic-subset atoms, bonds, rings,
// branches) and match their own molecule, so that it can never drop a hit.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace vicinal::library {

inline constexpr const char* kFingerprintKind = "FP2-1024";

using Fingerprint = std::vector<unsigned char>;

// Fingerprint of a compound from its SMILES; empty when Open Babel fails.
Fingerprint compound_fingerprint(const std::string& smiles);
// Fingerprint of a query, or nothing when the query is not safe to screen with.
std::optional<Fingerprint> query_fingerprint(const std::string& smarts);
// Every bit of `query` is set in `compound`.
bool may_contain(const Fingerprint& compound, const Fingerprint& query);

}  // namespace vicinal::library
