// A thin RAII layer over the SQLite C API: one Database per connection,
// Statements that only ever take bound parameters, and write transactions
// that retry while another process holds the write lock, so that "database is
// locked" reaches the user only after the wait has really run out.
#pragma once

#include <sqlite3.h>

#include <chrono>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace vicinal::library {

class Database;

class Statement {
 public:
  Statement(Database& db, std::string_view sql);
  ~Statement();
  Statement(const Statement&) = delete;
  Statement& operator=(const Statement&) = delete;
  Statement(Statement&& other) noexcept;

  // Parameters are 1-based, as in SQLite. An empty optional binds NULL.
  Statement& bind(int index, std::int64_t value);
  Statement& bind(int index, int value) { return bind(index, static_cast<std::int64_t>(value)); }
  Statement& bind(int index, double value);
  Statement& bind(int index, std::string_view text);
  Statement& bind(int index, const char* text) { return bind(index, std::string_view(text)); }
  Statement& bind(int index, const std::string& text) { return bind(index, std::string_view(text)); }
  // Binds text without copying it: the text must stay unchanged until the
  // statement has run (or been reset).
  Statement& bind_in_place(int index, std::string_view text);
  Statement& bind_blob(int index, const std::vector<unsigned char>& bytes);
  Statement& bind_null(int index);
  template <typename T>
  Statement& bind(int index, const std::optional<T>& value) {
    return value ? bind(index, *value) : bind_null(index);
  }

  // Advances; true while a row is available.
  bool step();
  // Runs a statement that returns no rows (or ignores them) and resets it.
  void run();
  void reset();  // also clears the bindings

  bool is_null(int column) const;
  std::int64_t integer(int column) const;
  double real(int column) const;
  std::string text(int column) const;
  std::optional<double> optional_real(int column) const;
  std::optional<std::int64_t> optional_integer(int column) const;
  std::vector<unsigned char> blob(int column) const;

 private:
  Statement& bind_text(int index, std::string_view text, sqlite3_destructor_type lifetime);
  Database* db_;
  sqlite3_stmt* stmt_ = nullptr;
};

class Database {
 public:
  enum class Mode { ReadWrite, ReadWriteCreate, ReadOnly };
  // Opens with foreign keys on, WAL journal, full sync and a busy timeout.
  Database(const std::string& path, Mode mode);
  ~Database();
  Database(const Database&) = delete;
  Database& operator=(const Database&) = delete;

  sqlite3* handle() { return db_; }
  const std::string& path() const { return path_; }

  // Runs SQL text without parameters (schema scripts, pragmas).
  void exec(std::string_view sql);
  std::int64_t last_insert_id() const;
  int user_version();

  // Throws vicinal::Error naming the file with SQLite's message.
  [[noreturn]] void fail(int code, std::string_view doing) const;

  // Copies the whole database to `target` with the online backup API; the copy
  // is a consistent snapshot even while other connections read or write.
  void backup_to(const std::string& target);

 private:
  sqlite3* db_ = nullptr;
  std::string path_;
};

// BEGIN IMMEDIATE ... COMMIT, retried on SQLITE_BUSY until `patience` has
// passed; rolled back by the destructor unless commit() ran.
class WriteTransaction {
 public:
  explicit WriteTransaction(Database& db,
                            std::chrono::milliseconds patience = std::chrono::milliseconds(60000));
  ~WriteTransaction();
  WriteTransaction(const WriteTransaction&) = delete;
  WriteTransaction& operator=(const WriteTransaction&) = delete;
  void commit();

 private:
  Database& db_;
  std::chrono::milliseconds patience_;
  bool open_ = false;
};

// A consistent read snapshot (BEGIN DEFERRED ... COMMIT).
class ReadTransaction {
 public:
  explicit ReadTransaction(Database& db);
  ~ReadTransaction();
  ReadTransaction(const ReadTransaction&) = delete;
  ReadTransaction& operator=(const ReadTransaction&) = delete;

 private:
  Database& db_;
};

}  // namespace vicinal::library
