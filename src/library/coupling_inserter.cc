#include "library/coupling_inserter.h"

namespace vicinal::library {

namespace {

constexpr int kColumns = 19;
// Rows per block statement: 608 parameters, far below SQLite's limit of 32766.
constexpr std::size_t kBlockRows = 32;

std::string insert_sql(std::size_t rows) {
  std::string sql =
      "INSERT INTO couplings (set_id, nucleus_a, nucleus_b, atoms_a, atoms_b, path, bond_count, isotope_a, "
      "isotope_b, j_hz, sigma_hz, sign_known, assignment, ranks_a, ranks_b, identity, karplus_set, note, origin) "
      "VALUES ";
  for (std::size_t r = 0; r < rows; ++r) {
    sql += r == 0 ? "(" : ", (";
    for (int c = 0; c < kColumns; ++c) sql += c == 0 ? "?" : ", ?";
    sql += ")";
  }
  return sql;
}

}  // namespace

CouplingInserter::CouplingInserter(Database& db)
    : db_(db), one_(db, insert_sql(1)), block_(db, insert_sql(kBlockRows)) {
  queued_.reserve(kBlockRows);
}

void CouplingInserter::bind_row(Statement& statement, int first, const Row& row) {
  const CouplingRecord& c = *row.record;
  statement.bind(first, row.set_id)
      .bind_in_place(first + 1, row.nucleus_a)
      .bind_in_place(first + 2, row.nucleus_b)
      .bind_in_place(first + 3, row.atoms_a)
      .bind_in_place(first + 4, row.atoms_b)
      .bind_in_place(first + 5, row.path)
      .bind(first + 6, c.bond_count)
      .bind_in_place(first + 7, c.isotope_a)
      .bind_in_place(first + 8, c.isotope_b)
      .bind(first + 9, c.j_hz)
      .bind(first + 10, c.sigma_hz)
      .bind(first + 11, c.sign_known ? 1 : 0)
      .bind_in_place(first + 12, c.stereo_unassigned ? "stereo-unassigned" : "assigned")
      .bind_in_place(first + 13, c.ranks_a)
      .bind_in_place(first + 14, c.ranks_b)
      .bind_in_place(first + 15, c.identity)
      .bind_in_place(first + 16, c.karplus_set)
      .bind_in_place(first + 17, c.note)
      .bind_in_place(first + 18, c.origin);
}

void CouplingInserter::add(Row row) {
  queued_.push_back(std::move(row));
  if (queued_.size() == kBlockRows) flush();
}

void CouplingInserter::flush() {
  if (queued_.size() == kBlockRows) {
    for (std::size_t r = 0; r < kBlockRows; ++r) bind_row(block_, static_cast<int>(r) * kColumns + 1, queued_[r]);
    block_.run();
  } else {
    for (const auto& row : queued_) {
      bind_row(one_, 1, row);
      one_.run();
    }
  }
  queued_.clear();
}

std::int64_t CouplingInserter::insert_now(Row row) {
  flush();
  bind_row(one_, 1, row);
  one_.run();
  return db_.last_insert_id();
}

}  // namespace vicinal::library
