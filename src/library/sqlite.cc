#include "library/sqlite.h"

#include <fmt/format.h>

#include <thread>
#include <utility>

#include "core/error.h"

namespace vicinal::library {

namespace {

constexpr int kBusyTimeoutMs = 2000;

bool is_busy(int code) { return (code & 0xff) == SQLITE_BUSY || (code & 0xff) == SQLITE_LOCKED; }

// Runs `sql` until it is not refused for a lock, or until `patience` is used up.
int exec_retrying(Database& db, const char* sql, std::chrono::milliseconds patience) {
  const auto deadline = std::chrono::steady_clock::now() + patience;
  auto pause = std::chrono::milliseconds(5);
  for (;;) {
    const int rc = sqlite3_exec(db.handle(), sql, nullptr, nullptr, nullptr);
    if (!is_busy(rc) || std::chrono::steady_clock::now() >= deadline) return rc;
    std::this_thread::sleep_for(pause);
    pause = std::min(pause * 2, std::chrono::milliseconds(200));
  }
}

}  // namespace

// ---- Statement ----

Statement::Statement(Database& db, std::string_view sql) : db_(&db) {
  const int rc = sqlite3_prepare_v2(db.handle(), sql.data(), static_cast<int>(sql.size()), &stmt_, nullptr);
  if (rc != SQLITE_OK) db.fail(rc, fmt::format("preparing '{}'", sql.substr(0, 60)));
}

Statement::~Statement() { sqlite3_finalize(stmt_); }

Statement::Statement(Statement&& other) noexcept : db_(other.db_), stmt_(std::exchange(other.stmt_, nullptr)) {}

Statement& Statement::bind(int index, std::int64_t value) {
  if (int rc = sqlite3_bind_int64(stmt_, index, value); rc != SQLITE_OK) db_->fail(rc, "binding");
  return *this;
}
Statement& Statement::bind(int index, double value) {
  if (int rc = sqlite3_bind_double(stmt_, index, value); rc != SQLITE_OK) db_->fail(rc, "binding");
  return *this;
}
Statement& Statement::bind_text(int index, std::string_view text, sqlite3_destructor_type lifetime) {
  const int rc = sqlite3_bind_text64(stmt_, index, text.data(), text.size(), lifetime, SQLITE_UTF8);
  if (rc != SQLITE_OK) db_->fail(rc, "binding");
  return *this;
}
Statement& Statement::bind(int index, std::string_view text) { return bind_text(index, text, SQLITE_TRANSIENT); }
Statement& Statement::bind_in_place(int index, std::string_view text) { return bind_text(index, text, SQLITE_STATIC); }
Statement& Statement::bind_blob(int index, const std::vector<unsigned char>& bytes) {
  const int rc = sqlite3_bind_blob64(stmt_, index, bytes.data(), bytes.size(), SQLITE_TRANSIENT);
  if (rc != SQLITE_OK) db_->fail(rc, "binding");
  return *this;
}
Statement& Statement::bind_null(int index) {
  if (int rc = sqlite3_bind_null(stmt_, index); rc != SQLITE_OK) db_->fail(rc, "binding");
  return *this;
}

bool Statement::step() {
  const int rc = sqlite3_step(stmt_);
  if (rc == SQLITE_ROW) return true;
  if (rc == SQLITE_DONE) return false;
  const std::string sql = sqlite3_sql(stmt_) ? sqlite3_sql(stmt_) : "";
  sqlite3_reset(stmt_);
  db_->fail(rc, fmt::format("running '{}'", sql.substr(0, 60)));
}

void Statement::run() {
  while (step()) {
  }
  reset();
}

void Statement::reset() {
  sqlite3_reset(stmt_);
  sqlite3_clear_bindings(stmt_);
}

bool Statement::is_null(int column) const { return sqlite3_column_type(stmt_, column) == SQLITE_NULL; }
std::int64_t Statement::integer(int column) const { return sqlite3_column_int64(stmt_, column); }
double Statement::real(int column) const { return sqlite3_column_double(stmt_, column); }
std::string Statement::text(int column) const {
  const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(stmt_, column));
  return p ? std::string(p, static_cast<std::size_t>(sqlite3_column_bytes(stmt_, column))) : std::string();
}
std::optional<double> Statement::optional_real(int column) const {
  if (is_null(column)) return std::nullopt;
  return real(column);
}
std::optional<std::int64_t> Statement::optional_integer(int column) const {
  if (is_null(column)) return std::nullopt;
  return integer(column);
}
std::vector<unsigned char> Statement::blob(int column) const {
  const auto* p = static_cast<const unsigned char*>(sqlite3_column_blob(stmt_, column));
  return p ? std::vector<unsigned char>(p, p + sqlite3_column_bytes(stmt_, column)) : std::vector<unsigned char>();
}

// ---- Database ----

Database::Database(const std::string& path, Mode mode) : path_(path) {
  int flags = mode == Mode::ReadOnly ? SQLITE_OPEN_READONLY
              : mode == Mode::ReadWrite ? SQLITE_OPEN_READWRITE
                                        : SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE;
  const int rc = sqlite3_open_v2(path.c_str(), &db_, flags | SQLITE_OPEN_NOMUTEX, nullptr);
  if (rc != SQLITE_OK) {
    std::string message = db_ ? sqlite3_errmsg(db_) : sqlite3_errstr(rc);
    sqlite3_close(db_);
    db_ = nullptr;
    throw Error(fmt::format("cannot open the library: {}", message), {path},
                mode == Mode::ReadWrite || mode == Mode::ReadOnly
                    ? "create it with 'vicinal library init' or check --library"
                    : "check that the folder exists and is writable");
  }
  sqlite3_extended_result_codes(db_, 1);
  sqlite3_busy_timeout(db_, kBusyTimeoutMs);
  // A throwing constructor never reaches the destructor: close the connection
  // here, or a damaged file leaks it (found by the sanitizer run).
  try {
    // Reading the header fails here if the file is not a database at all.
    exec("PRAGMA foreign_keys = ON");
    // Another program's database (tables, but no vicinal schema version) is
    // refused by upgrade_schema; its journal mode must not be changed first.
    const bool foreign = [&] {
      Statement tables(*this, "SELECT count(*) FROM sqlite_master");
      tables.step();
      return user_version() == 0 && tables.integer(0) > 0;
    }();
    if (mode != Mode::ReadOnly && !foreign) {
      // journal_mode=WAL needs the write lock the first time; retry like writes do.
      const int wal = exec_retrying(*this, "PRAGMA journal_mode = WAL", std::chrono::milliseconds(60000));
      if (wal != SQLITE_OK) fail(wal, "switching to WAL journal");
    }
    exec("PRAGMA synchronous = FULL");
  } catch (...) {
    sqlite3_close_v2(db_);
    db_ = nullptr;
    throw;
  }
}

Database::~Database() { sqlite3_close_v2(db_); }

void Database::exec(std::string_view sql) {
  const std::string owned(sql);
  char* message = nullptr;
  const int rc = sqlite3_exec(db_, owned.c_str(), nullptr, nullptr, &message);
  if (rc != SQLITE_OK) {
    std::string text = message ? message : sqlite3_errstr(rc);
    sqlite3_free(message);
    throw Error(fmt::format("library error: {}", text), {path_},
                is_busy(rc) ? "another vicinal process holds the library; try again" : "");
  }
}

std::int64_t Database::last_insert_id() const { return sqlite3_last_insert_rowid(db_); }

int Database::user_version() {
  Statement s(*this, "PRAGMA user_version");
  s.step();
  return static_cast<int>(s.integer(0));
}

void Database::fail(int code, std::string_view doing) const {
  std::string message = sqlite3_errmsg(db_);
  std::string hint;
  if (is_busy(code)) hint = "another vicinal process kept the library locked; try again";
  else if ((code & 0xff) == SQLITE_CONSTRAINT) hint = "a value is out of its allowed range or refers to nothing";
  else if ((code & 0xff) == SQLITE_NOTADB || (code & 0xff) == SQLITE_CORRUPT)
    hint = "the file is not an intact vicinal library; restore it from a backup";
  else if ((code & 0xff) == SQLITE_READONLY) hint = "the library file or its folder is read-only";
  throw Error(fmt::format("library error while {}: {}", doing, message), {path_}, hint);
}

void Database::backup_to(const std::string& target) {
  sqlite3* out = nullptr;
  int rc = sqlite3_open_v2(target.c_str(), &out, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE, nullptr);
  if (rc != SQLITE_OK) {
    sqlite3_close(out);
    throw Error("cannot create the backup file", {target}, "check that the folder exists and is writable");
  }
  sqlite3_backup* b = sqlite3_backup_init(out, "main", db_, "main");
  if (!b) {
    std::string message = sqlite3_errmsg(out);
    sqlite3_close(out);
    throw Error(fmt::format("cannot start the backup: {}", message), {target});
  }
  // All pages in one step: the copy is one read transaction, hence a snapshot.
  // Retried while a writer holds a lock that blocks reading the header.
  auto pause = std::chrono::milliseconds(5);
  const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(60);
  do {
    rc = sqlite3_backup_step(b, -1);
    if (!is_busy(rc) || std::chrono::steady_clock::now() >= deadline) break;
    std::this_thread::sleep_for(pause);
    pause = std::min(pause * 2, std::chrono::milliseconds(200));
  } while (true);
  sqlite3_backup_finish(b);
  std::string message = sqlite3_errmsg(out);
  sqlite3_close(out);
  if (rc != SQLITE_DONE) throw Error(fmt::format("the backup failed: {}", message), {target});
}

// ---- transactions ----

WriteTransaction::WriteTransaction(Database& db, std::chrono::milliseconds patience)
    : db_(db), patience_(patience) {
  const int rc = exec_retrying(db_, "BEGIN IMMEDIATE", patience_);
  if (rc != SQLITE_OK) db_.fail(rc, "starting a write");
  open_ = true;
}

WriteTransaction::~WriteTransaction() {
  if (open_) sqlite3_exec(db_.handle(), "ROLLBACK", nullptr, nullptr, nullptr);
}

void WriteTransaction::commit() {
  const int rc = exec_retrying(db_, "COMMIT", patience_);
  if (rc != SQLITE_OK) db_.fail(rc, "committing");
  open_ = false;
}

ReadTransaction::ReadTransaction(Database& db) : db_(db) {
  const int rc = exec_retrying(db_, "BEGIN", std::chrono::milliseconds(60000));
  if (rc != SQLITE_OK) db_.fail(rc, "starting a read");
}

ReadTransaction::~ReadTransaction() { sqlite3_exec(db_.handle(), "COMMIT", nullptr, nullptr, nullptr); }

}  // namespace vicinal::library
