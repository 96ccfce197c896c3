// CouplingInserter: rows queued into blocks are stored exactly, in the order
// they were added (ids ascending), including the rows inserted at once for
// derived results and the part block left at the end; a row that breaks a
// CHECK constraint in the middle of a block fails the block.
#include "library/coupling_inserter.h"

#include <gtest/gtest.h>

#include <unistd.h>

#include <filesystem>
#include <map>

#include "core/error.h"
#include "library/schema.h"

namespace vicinal::library {
namespace {

std::string scratch(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() / ("vicinal-inserter-test-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  const auto path = dir / name;
  for (const char* suffix : {"", "-wal", "-shm"}) std::filesystem::remove(path.string() + suffix);
  return path.string();
}

// A library with one compound and one measurement set (id 1).
void add_compound_and_set(Database& db) {
  upgrade_schema(db);
  db.exec("INSERT INTO compounds (id, name, smiles, inchi, inchikey, molfile) VALUES "
          "(1, 'x', 'C', 'InChI=1S/CH4/h1H4', 'VNWKTOKETHGBQD-UHFFFAOYSA-N', '')");
  db.exec("INSERT INTO measurement_sets (id, compound_id) VALUES (1, 1)");
}

CouplingRecord record(int i) {
  CouplingRecord c;
  c.isotope_a = c.isotope_b = "1H";
  c.bond_count = 3;
  c.j_hz = 0.5 * i;
  if (i % 3 == 0) c.sigma_hz = 0.1;
  c.sign_known = i % 2 == 0;
  c.stereo_unassigned = i % 5 == 0;
  c.ranks_a = std::to_string(i);
  c.ranks_b = std::to_string(i + 1);
  c.identity = "key " + std::to_string(i) + std::string(40, '~');  // longer than a small string
  c.note = i % 4 == 0 ? "note; 'quoted' \"text\"" : "";
  c.origin = "file.csv";
  return c;
}

CouplingInserter::Row row(const CouplingRecord& c, int i) {
  CouplingInserter::Row r;
  r.set_id = 1;
  r.record = &c;
  r.nucleus_a = "H" + std::to_string(i);
  r.nucleus_b = "H" + std::to_string(i + 1);
  r.atoms_a = std::to_string(i);
  r.atoms_b = std::to_string(i + 1);
  r.path = std::to_string(i) + "-2-3-" + std::to_string(i + 1);
  return r;
}

TEST(CouplingInserter, StoresEveryRowInOrder) {
  Database db(scratch("order.sqlite"), Database::Mode::ReadWriteCreate);
  add_compound_and_set(db);
  // 75 rows: two full blocks of 32 and a part block, with rows inserted at
  // once (as for couplings with derived results) inside the first block and
  // just after the second.
  constexpr int kRows = 75;
  std::vector<CouplingRecord> records;
  for (int i = 0; i < kRows; ++i) records.push_back(record(i));
  std::map<int, std::int64_t> ids_now;
  {
    WriteTransaction tx(db);
    CouplingInserter inserter(db);
    for (int i = 0; i < kRows; ++i) {
      if (i == 10 || i == 64) ids_now[i] = inserter.insert_now(row(records[i], i));
      else inserter.add(row(records[i], i));
    }
    inserter.flush();
    tx.commit();
  }
  Statement read(db,
                 "SELECT id, nucleus_a, nucleus_b, atoms_a, atoms_b, path, bond_count, isotope_a, isotope_b, j_hz, "
                 "sigma_hz, sign_known, assignment, ranks_a, ranks_b, identity, karplus_set, note, origin "
                 "FROM couplings ORDER BY id");
  int i = 0;
  std::int64_t last_id = 0;
  while (read.step()) {
    ASSERT_LT(i, kRows);
    const CouplingRecord& c = records[i];
    EXPECT_GT(read.integer(0), last_id);
    last_id = read.integer(0);
    if (ids_now.count(i)) EXPECT_EQ(read.integer(0), ids_now[i]) << i;
    EXPECT_EQ(read.text(1), "H" + std::to_string(i));
    EXPECT_EQ(read.text(2), "H" + std::to_string(i + 1));
    EXPECT_EQ(read.text(3), std::to_string(i));
    EXPECT_EQ(read.text(4), std::to_string(i + 1));
    EXPECT_EQ(read.text(5), std::to_string(i) + "-2-3-" + std::to_string(i + 1));
    EXPECT_EQ(read.integer(6), 3);
    EXPECT_EQ(read.text(7), "1H");
    EXPECT_EQ(read.text(8), "1H");
    EXPECT_EQ(read.real(9), c.j_hz);
    EXPECT_EQ(read.optional_real(10), c.sigma_hz);
    EXPECT_EQ(read.integer(11), c.sign_known ? 1 : 0);
    EXPECT_EQ(read.text(12), c.stereo_unassigned ? "stereo-unassigned" : "assigned");
    EXPECT_EQ(read.text(13), c.ranks_a);
    EXPECT_EQ(read.text(14), c.ranks_b);
    EXPECT_EQ(read.text(15), c.identity);
    EXPECT_EQ(read.text(16), "");
    EXPECT_EQ(read.text(17), c.note);
    EXPECT_EQ(read.text(18), "file.csv");
    ++i;
  }
  EXPECT_EQ(i, kRows);
}

TEST(CouplingInserter, ABadRowFailsItsBlock) {
  Database db(scratch("bad.sqlite"), Database::Mode::ReadWriteCreate);
  add_compound_and_set(db);
  std::vector<CouplingRecord> records;
  for (int i = 0; i < 32; ++i) records.push_back(record(i));
  records[17].j_hz = 2000;  // CHECK (abs(j_hz) <= 1000)
  WriteTransaction tx(db);
  CouplingInserter inserter(db);
  for (int i = 0; i < 31; ++i) inserter.add(row(records[i], i));
  EXPECT_THROW(inserter.add(row(records[31], 31)), Error);  // the 32nd row completes the block
  Statement count(db, "SELECT count(*) FROM couplings");
  ASSERT_TRUE(count.step());
  EXPECT_EQ(count.integer(0), 0);
}

}  // namespace
}  // namespace vicinal::library
