#pragma once
// The study store: one SQLite file per study (docs/architecture.md, "Store rules").
// WAL mode, foreign keys on, a busy timeout, migrations by PRAGMA user_version.
//
// SQLite failures that are not the user's fault (disk full, a corrupt file,
// a programming error in SQL) throw StoreError; the CLI edge turns them into
// exit code 3. Everything the user can cause is reported as a Status instead.
#include <cstdint>
#include <memory>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>

#include "core/status.h"

struct sqlite3;
struct sqlite3_stmt;

namespace twinprobe {

class StoreError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

// A prepared statement. Bind indexes start at 1, column indexes at 0.
class Stmt {
 public:
  Stmt(sqlite3* db, std::string_view sql);
  ~Stmt();
  Stmt(const Stmt&) = delete;
  Stmt& operator=(const Stmt&) = delete;
  Stmt(Stmt&& other) noexcept;

  Stmt& Bind(int index, int64_t value);
  Stmt& Bind(int index, int value) { return Bind(index, static_cast<int64_t>(value)); }
  Stmt& Bind(int index, double value);
  Stmt& Bind(int index, std::string_view value);
  Stmt& Bind(int index, const char* value) { return Bind(index, std::string_view(value)); }
  Stmt& Bind(int index, const std::string& value) { return Bind(index, std::string_view(value)); }
  Stmt& Bind(int index, const std::optional<std::string>& value);
  Stmt& BindNull(int index);

  // Advances; true while a row is available. Throws StoreError on failure.
  bool Step();
  // Runs a statement that returns no rows, then resets it for reuse.
  void Run();
  void Reset();

  bool IsNull(int col) const;
  int64_t Int(int col) const;
  double Double(int col) const;
  std::string Text(int col) const;
  std::optional<std::string> OptText(int col) const;
  int ColumnCount() const;
  std::string ColumnName(int col) const;
  int ColumnType(int col) const;  // SQLITE_INTEGER, SQLITE_FLOAT, SQLITE_TEXT, SQLITE_BLOB, SQLITE_NULL

 private:
  sqlite3* db_;
  sqlite3_stmt* stmt_ = nullptr;
};

class Store {
 public:
  // Opens (and with `create`, creates) the store at `path` (":memory:" for
  // tests) and brings its schema to the current version. Fails with a
  // bad-input error if the file is missing and `create` is false, or if it
  // was written by a newer twinprobe.
  static Result<std::unique_ptr<Store>> Open(const std::string& path, bool create);
  // Opens an existing store for reading only: no migration, no pragma that
  // writes, and SQLite refuses any write through this handle (verify must
  // never change what it checks). Fails with a bad-input error if the file is
  // missing or SQLite cannot read it; it does not check that it is a study store.
  static Result<std::unique_ptr<Store>> OpenReadOnly(const std::string& path);
  ~Store();
  Store(const Store&) = delete;
  Store& operator=(const Store&) = delete;

  Stmt Prepare(std::string_view sql) { return Stmt(db_, sql); }
  void Exec(std::string_view sql);
  int64_t LastInsertId() const;
  // The single integer a query returns (0 when it returns no row or NULL).
  int64_t QueryInt(std::string_view sql);
  int schema_version();
  const std::string& path() const { return path_; }
  sqlite3* handle() { return db_; }

 private:
  Store(sqlite3* db, std::string path) : db_(db), path_(std::move(path)) {}
  sqlite3* db_;
  std::string path_;
};

// BEGIN IMMEDIATE ... COMMIT; rolls back in the destructor unless committed.
// IMMEDIATE takes the write lock up front, so two writers queue on the busy
// timeout instead of failing half-way with SQLITE_BUSY.
class Transaction {
 public:
  explicit Transaction(Store& store);
  ~Transaction();
  Transaction(const Transaction&) = delete;
  Transaction& operator=(const Transaction&) = delete;
  void Commit();
  bool committed() const { return committed_; }

 private:
  Store& store_;
  bool committed_ = false;
};

}  // namespace twinprobe
