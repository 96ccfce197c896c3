// Importing in batches, on one thread or two, stores exactly what importing
// the file whole stores; a bad row or a failed write anywhere leaves nothing.
#include "library/import.h"

#include <gtest/gtest.h>

#include <unistd.h>

#include <algorithm>
#include <filesystem>
#include <fstream>

#include "core/error.h"
#include "library/coupling_row.h"

namespace vicinal::library {
namespace {

std::filesystem::path scratch_dir() {
  const auto dir = std::filesystem::temp_directory_path() / ("vicinal-import-test-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  return dir;
}

std::unique_ptr<Library> fresh_library(const std::string& name) {
  const auto path = scratch_dir() / name;
  for (const char* suffix : {"", "-wal", "-shm"}) std::filesystem::remove(path.string() + suffix);
  return Library::create(path.string());
}

// Three compounds whose rows are interleaved, so that every compound and most
// sets continue over several small batches; each set has assigned rows, a
// stereo-unassigned group (the two protons of a CH2 against one proton), a
// repeated row (a duplicate) and, in one set, a second value for a pair (a
// conflict). Atoms by index in Open Babel's numbering of the SMILES with
// hydrogens added: heavy atoms first, then each heavy atom's hydrogens.
std::string write_interleaved_csv(const std::string& name, const std::string& last_row = "") {
  const auto path = scratch_dir() / name;
  std::ofstream out(path);
  out << "compound,smiles,solvent,temperature_k,nuclei,j_hz\n";
  struct Compound {
    const char* name;
    const char* smiles;
    const char* pair;        // two protons on neighbouring carbons
    const char* unassigned;  // CH2 protons (either order) against a neighbour's proton
  };
  // CCCO: C1 C2 C3 O4, H5-H7 on C1, H8-H9 on C2, H10-H11 on C3, H12 on O4.
  // CCCCl and CCCBr are numbered alike.
  const Compound compounds[] = {{"propanol", "CCCO", "5,8", "8|9,10"},
                                {"chloropropane", "CCCCl", "5,8", "8|9,10"},
                                {"bromopropane", "CCCBr", "5,8", "8|9,10"}};
  bool first[3] = {true, true, true};
  for (int t = 0; t < 6; ++t)
    for (int c = 0; c < 3; ++c) {
      const Compound& k = compounds[c];
      auto row = [&](const std::string& nuclei, double j) {
        out << k.name << ',' << (first[c] ? k.smiles : "") << ",CDCl3," << 280 + 5 * t << ",\"" << nuclei << "\","
            << j << '\n';
        first[c] = false;
      };
      row(k.pair, 7.0 + 0.1 * t);
      row(std::string(k.unassigned), 9.5 - 0.1 * c);
      row("5,10", 5.0 + 0.1 * c);
      row(k.pair, 7.0 + 0.1 * t);  // the same value again: a duplicate
      const std::string other = k.unassigned;
      row(other.substr(2, 1) + "|" + other.substr(0, 1) + other.substr(3), 4.5);
      if (t == 2 && c == 1) row(k.pair, 7.9);  // a second value: a conflict
    }
  out << last_row;
  return path.string();
}

// Every stored coupling as one line (compound, set, identity, nuclei, value),
// sorted: the content of a library, whatever order rows were stored in.
std::vector<std::string> content(Library& library) {
  std::vector<std::string> lines;
  for (const auto& e : library.read_entries())
    for (const auto& s : e.sets)
      for (const auto& c : s.couplings)
        lines.push_back(e.compound.inchikey + " " + conditions_key(s.conditions) + " " + c.identity + " " +
                        c.nucleus_a + "," + c.nucleus_b + " " + join_atoms(c.path, '-') + " " + std::to_string(c.j_hz));
  std::sort(lines.begin(), lines.end());
  return lines;
}

ImportOutcome import_with(Library& library, const std::string& csv, std::size_t batch, int threads,
                          ImportOptions options = {}) {
  options.batch_couplings = batch;
  NoProgress progress;
  return import_file(library, csv, options, progress, threads);
}

TEST(Import, BatchesAndThreadsStoreWhatTheWholeFileStores) {
  const auto csv = write_interleaved_csv("interleaved.csv");
  auto whole = fresh_library("whole.sqlite");
  const auto reference = import_with(*whole, csv, 1000000, 1);
  ASSERT_EQ(reference.read.couplings, 91u);
  EXPECT_EQ(reference.stored.compounds_added, 3);
  EXPECT_EQ(reference.stored.sets_added, 18);
  EXPECT_EQ(reference.stored.couplings_duplicate, 18);
  ASSERT_EQ(reference.stored.conflicts.size(), 1u);
  const auto expected = content(*whole);
  ASSERT_EQ(expected.size(), 91u - 18u);

  for (const int threads : {1, 2})
    for (const std::size_t batch : {1u, 7u, 40u}) {
      SCOPED_TRACE("threads " + std::to_string(threads) + ", batch " + std::to_string(batch));
      auto lib = fresh_library("batched.sqlite");
      const auto got = import_with(*lib, csv, batch, threads);
      EXPECT_EQ(got.read.couplings, reference.read.couplings);
      EXPECT_EQ(got.stored.compounds_added, 3);
      EXPECT_EQ(got.stored.compounds_known, 0);
      EXPECT_EQ(got.stored.sets_added, 18);
      EXPECT_EQ(got.stored.sets_known, 0);
      EXPECT_EQ(got.stored.couplings_added, reference.stored.couplings_added);
      EXPECT_EQ(got.stored.couplings_duplicate, reference.stored.couplings_duplicate);
      EXPECT_EQ(got.stored.conflicts.size(), 1u);
      EXPECT_EQ(content(*lib), expected);
      // The same file again adds nothing, in batches as whole.
      const auto again = import_with(*lib, csv, batch, threads);
      EXPECT_EQ(again.stored.couplings_added, 0);
      EXPECT_EQ(again.stored.compounds_known, 3);
      EXPECT_EQ(again.stored.sets_known, 18);
    }
}

// Batches cut by compounds, and compounds parked between their rows (one
// kept whole: every row of the interleaved file brings its compound back
// from the molfile), store the same.
TEST(Import, BatchesOfFewCompoundsAndParkedCompoundsStoreTheSame) {
  const auto csv = write_interleaved_csv("interleaved.csv");
  auto whole = fresh_library("whole.sqlite");
  import_with(*whole, csv, 1000000, 1);
  const auto expected = content(*whole);
  for (const int threads : {1, 2})
    for (const std::size_t compounds : {1u, 2u})
      for (const std::size_t kept_whole : {1u, 1024u}) {
        SCOPED_TRACE("threads " + std::to_string(threads) + ", compounds per batch " + std::to_string(compounds) +
                     ", kept whole " + std::to_string(kept_whole));
        ImportOptions options;
        options.batch_compounds = compounds;
        options.compounds_whole = kept_whole;
        auto lib = fresh_library("batched.sqlite");
        const auto got = import_with(*lib, csv, 1000000, threads, options);
        EXPECT_EQ(got.stored.compounds_added, 3);
        EXPECT_EQ(got.stored.compounds_known, 0);  // continued over batches, not met as stored before
        EXPECT_EQ(got.stored.sets_added, 18);
        EXPECT_EQ(got.stored.sets_known, 0);
        EXPECT_EQ(got.stored.couplings_duplicate, 18);
        EXPECT_EQ(got.stored.conflicts.size(), 1u);
        EXPECT_EQ(content(*lib), expected);
      }
}

std::size_t stored_couplings(Library& library) {
  Statement count(library.db(), "SELECT count(*) FROM couplings");
  count.step();
  return static_cast<std::size_t>(count.integer(0));
}

TEST(Import, BadLastRowLeavesNothingOnEitherThreadCount) {
  const auto csv = write_interleaved_csv("bad-last.csv", "propanol,,CDCl3,300,\"5,8\",not-a-number\n");
  for (const int threads : {1, 2}) {
    auto lib = fresh_library("bad.sqlite");
    try {
      import_with(*lib, csv, 7, threads);
      ADD_FAILURE() << "the bad row was accepted";
    } catch (const Error& e) {
      EXPECT_EQ(e.where().line, 93) << e.one_line();
    }
    EXPECT_EQ(stored_couplings(*lib), 0u);
  }
}

TEST(Import, FailedWriteStopsTheReaderAndLeavesNothing) {
  const auto csv = write_interleaved_csv("write-fails.csv");
  auto lib = fresh_library("write-fails.sqlite");
  // A write that fails part-way through the file, after several batches.
  lib->db().exec("CREATE TRIGGER stop_here AFTER INSERT ON couplings WHEN NEW.id = 30 "
                 "BEGIN SELECT RAISE(ABORT, 'refused by the test'); END");
  EXPECT_THROW(import_with(*lib, csv, 7, 2), Error);
  EXPECT_EQ(stored_couplings(*lib), 0u);
}

}  // namespace
}  // namespace vicinal::library
