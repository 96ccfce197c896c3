// The SQLite layer and the schema: migrations, version refusal, bound text
// stored byte for byte, and write transactions that wait for a busy writer.
#include "library/sqlite.h"

#include <gtest/gtest.h>

#include <unistd.h>

#include <filesystem>
#include <thread>

#include "core/error.h"
#include "library/schema.h"

namespace vicinal::library {
namespace {

std::string scratch(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() / ("vicinal-sqlite-test-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  const auto path = dir / name;
  std::filesystem::remove(path);
  std::filesystem::remove(path.string() + "-wal");
  std::filesystem::remove(path.string() + "-shm");
  return path.string();
}

TEST(Schema, NewLibraryReachesCurrentVersion) {
  Database db(scratch("new.sqlite"), Database::Mode::ReadWriteCreate);
  const auto report = upgrade_schema(db);
  EXPECT_EQ(report.from_version, 0);
  EXPECT_EQ(report.to_version, current_schema_version());
  EXPECT_GE(current_schema_version(), 2);
  EXPECT_TRUE(report.backup_path.empty());
}

TEST(Schema, NewerLibraryIsRefused) {
  const auto path = scratch("newer.sqlite");
  {
    Database db(path, Database::Mode::ReadWriteCreate);
    upgrade_schema(db);
    db.exec("PRAGMA user_version = 999");
  }
  Database db(path, Database::Mode::ReadWrite);
  try {
    upgrade_schema(db);
    FAIL() << "a newer library was accepted";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("newer"), std::string::npos);
  }
}

TEST(Schema, ForeignDatabaseIsRefused) {
  const auto path = scratch("foreign.sqlite");
  Database db(path, Database::Mode::ReadWriteCreate);
  db.exec("CREATE TABLE something (x)");
  EXPECT_THROW(upgrade_schema(db), Error);
}

TEST(Schema, ConstraintsRejectOutOfRangeValues) {
  Database db(scratch("checks.sqlite"), Database::Mode::ReadWriteCreate);
  upgrade_schema(db);
  db.exec("INSERT INTO compounds (id, name, smiles, inchi, inchikey, molfile) VALUES "
          "(1, 'x', 'C', 'InChI=1S/CH4/h1H4', 'VNWKTOKETHGBQD-UHFFFAOYSA-N', '')");
  EXPECT_THROW(db.exec("INSERT INTO measurement_sets (compound_id, temperature_k) VALUES (1, 0)"), Error);
  EXPECT_THROW(db.exec("INSERT INTO measurement_sets (compound_id, temperature_k) VALUES (1, 1000)"), Error);
  EXPECT_THROW(db.exec("INSERT INTO measurement_sets (compound_id, field_mhz) VALUES (1, -400)"), Error);
  EXPECT_THROW(db.exec("INSERT INTO measurement_sets (compound_id, ph) VALUES (1, 14.5)"), Error);
  EXPECT_THROW(db.exec("INSERT INTO measurement_sets (compound_id) VALUES (2)"), Error);  // no such compound
  db.exec("INSERT INTO measurement_sets (id, compound_id, temperature_k, ph) VALUES (1, 1, 298, 7)");
  const char* coupling = "INSERT INTO couplings (set_id, nucleus_a, nucleus_b, atoms_a, atoms_b, path, bond_count, "
                         "isotope_a, isotope_b, j_hz, sigma_hz, assignment, ranks_a, ranks_b, identity) VALUES "
                         "(1, 'a', 'b', '1', '2', '1-2', 1, '1H', '1H', ";
  EXPECT_THROW(db.exec(std::string(coupling) + "1000.5, 0.1, 'assigned', '1', '2', 'k')"), Error);
  EXPECT_THROW(db.exec(std::string(coupling) + "7, -0.1, 'assigned', '1', '2', 'k')"), Error);
  EXPECT_THROW(db.exec(std::string(coupling) + "7, 0.1, 'maybe', '1', '2', 'k')"), Error);
  db.exec(std::string(coupling) + "-1000, 0, 'assigned', '1', '2', 'k')");
}

TEST(Statement, TextIsStoredByteForByte) {
  Database db(scratch("bytes.sqlite"), Database::Mode::ReadWriteCreate);
  db.exec("CREATE TABLE t (v TEXT)");
  const std::vector<std::string> texts = {
      "O'Brien; DROP TABLE t; --", "\"quoted\", with, commas", "Ärger über β-D-Glc — 溶媒 🧪",
      std::string(100000, 'x') + "end", std::string("nul\0inside", 10), "", "  spaces  ", "line\nbreak\r\n"};
  Statement insert(db, "INSERT INTO t (v) VALUES (?)");
  for (const auto& t : texts) {
    insert.bind(1, t);
    insert.run();
  }
  Statement read(db, "SELECT v FROM t ORDER BY rowid");
  for (const auto& t : texts) {
    ASSERT_TRUE(read.step());
    EXPECT_EQ(read.text(0), t);
  }
  Statement tables(db, "SELECT count(*) FROM sqlite_master WHERE name = 't'");
  tables.step();
  EXPECT_EQ(tables.integer(0), 1);
}

TEST(WriteTransaction, WaitsForAnotherWriter) {
  const auto path = scratch("busy.sqlite");
  {
    Database db(path, Database::Mode::ReadWriteCreate);
    db.exec("CREATE TABLE t (v INTEGER)");
  }
  Database first(path, Database::Mode::ReadWrite);
  Database second(path, Database::Mode::ReadWrite);
  auto holder = std::make_unique<WriteTransaction>(first);
  first.exec("INSERT INTO t VALUES (1)");
  // The lock is held longer than SQLite's own busy timeout (2 s): only the
  // retry loop lets the second writer through.
  std::thread release([&] {
    std::this_thread::sleep_for(std::chrono::milliseconds(2500));
    holder->commit();
  });
  {
    WriteTransaction tx(second);
    second.exec("INSERT INTO t VALUES (2)");
    tx.commit();
  }
  release.join();
  Statement count(second, "SELECT count(*) FROM t");
  count.step();
  EXPECT_EQ(count.integer(0), 2);
}

TEST(WriteTransaction, GivesUpAfterItsPatience) {
  const auto path = scratch("patience.sqlite");
  {
    Database db(path, Database::Mode::ReadWriteCreate);
    db.exec("CREATE TABLE t (v INTEGER)");
  }
  Database first(path, Database::Mode::ReadWrite);
  Database second(path, Database::Mode::ReadWrite);
  WriteTransaction holder(first);
  try {
    WriteTransaction tx(second, std::chrono::milliseconds(100));
    FAIL() << "the second writer got the lock";
  } catch (const Error& e) {
    EXPECT_NE(e.hint().find("another vicinal process"), std::string::npos);
  }
}

}  // namespace
}  // namespace vicinal::library
