#include "core/store.h"

#include <sqlite3.h>

#include <chrono>
#include <filesystem>
#include <thread>

#include "core/schema.h"

namespace twinprobe {
namespace {

[[noreturn]] void Fail(sqlite3* db, std::string_view context) {
  throw StoreError(std::string(context) + ": " + sqlite3_errmsg(db));
}

// How long a writer waits for another writer before giving up. Fieldwork has
// several people recording at once; waiting a while is better than an error.
constexpr int kBusyTimeoutMs = 30000;

// The busy handler covers most waits, but SQLite reports BUSY at once where
// waiting could deadlock: BEGIN IMMEDIATE in WAL edge cases (a checkpoint),
// and switching a new file to WAL while another process creates the same
// store. Those statements are retried for about 10 s before failing.
void ExecRetryingBusy(Store& store, std::string_view sql) {
  for (int attempt = 0;; ++attempt) {
    try {
      store.Exec(sql);
      return;
    } catch (const StoreError&) {
      if (attempt >= 200) throw;
      std::this_thread::sleep_for(std::chrono::milliseconds(50));
    }
  }
}

}  // namespace

Stmt::Stmt(sqlite3* db, std::string_view sql) : db_(db) {
  if (sqlite3_prepare_v2(db, sql.data(), static_cast<int>(sql.size()), &stmt_, nullptr) != SQLITE_OK)
    Fail(db, "prepare '" + std::string(sql.substr(0, 80)) + "'");
}

Stmt::~Stmt() {
  if (stmt_) sqlite3_finalize(stmt_);
}

Stmt::Stmt(Stmt&& other) noexcept : db_(other.db_), stmt_(other.stmt_) { other.stmt_ = nullptr; }

Stmt& Stmt::Bind(int index, int64_t value) {
  if (sqlite3_bind_int64(stmt_, index, value) != SQLITE_OK) Fail(db_, "bind");
  return *this;
}
Stmt& Stmt::Bind(int index, double value) {
  if (sqlite3_bind_double(stmt_, index, value) != SQLITE_OK) Fail(db_, "bind");
  return *this;
}
Stmt& Stmt::Bind(int index, std::string_view value) {
  if (sqlite3_bind_text(stmt_, index, value.data(), static_cast<int>(value.size()), SQLITE_TRANSIENT) !=
      SQLITE_OK)
    Fail(db_, "bind");
  return *this;
}
Stmt& Stmt::Bind(int index, const std::optional<std::string>& value) {
  return value ? Bind(index, std::string_view(*value)) : BindNull(index);
}
Stmt& Stmt::BindNull(int index) {
  if (sqlite3_bind_null(stmt_, index) != SQLITE_OK) Fail(db_, "bind");
  return *this;
}

bool Stmt::Step() {
  int rc = sqlite3_step(stmt_);
  if (rc == SQLITE_ROW) return true;
  if (rc == SQLITE_DONE) return false;
  Fail(db_, "step");
}

void Stmt::Run() {
  Step();
  Reset();
}

void Stmt::Reset() {
  sqlite3_reset(stmt_);
  sqlite3_clear_bindings(stmt_);
}

bool Stmt::IsNull(int col) const { return sqlite3_column_type(stmt_, col) == SQLITE_NULL; }
int64_t Stmt::Int(int col) const { return sqlite3_column_int64(stmt_, col); }
double Stmt::Double(int col) const { return sqlite3_column_double(stmt_, col); }
std::string Stmt::Text(int col) const {
  const unsigned char* p = sqlite3_column_text(stmt_, col);
  if (!p) return {};
  return std::string(reinterpret_cast<const char*>(p), static_cast<size_t>(sqlite3_column_bytes(stmt_, col)));
}
std::optional<std::string> Stmt::OptText(int col) const {
  if (IsNull(col)) return std::nullopt;
  return Text(col);
}
int Stmt::ColumnCount() const { return sqlite3_column_count(stmt_); }
std::string Stmt::ColumnName(int col) const { return sqlite3_column_name(stmt_, col); }
int Stmt::ColumnType(int col) const { return sqlite3_column_type(stmt_, col); }

Result<std::unique_ptr<Store>> Store::Open(const std::string& path, bool create) {
  bool in_memory = path == ":memory:";
  if (!in_memory && !create && !std::filesystem::exists(path))
    return BadInput(path, "no study store here",
                    "run 'twinprobe plan' (or 'twinprobe import pairs') first, or pass --study DIR");
  sqlite3* db = nullptr;
  int flags = SQLITE_OPEN_READWRITE | (create ? SQLITE_OPEN_CREATE : 0);
  if (sqlite3_open_v2(path.c_str(), &db, flags, nullptr) != SQLITE_OK) {
    std::string msg = db ? sqlite3_errmsg(db) : "out of memory";
    sqlite3_close(db);
    return BadInput(path, "cannot open the study store: " + msg);
  }
  std::unique_ptr<Store> store(new Store(db, path));
  sqlite3_busy_timeout(db, kBusyTimeoutMs);
  try {
    store->Exec("PRAGMA foreign_keys = ON");
    if (!in_memory) ExecRetryingBusy(*store, "PRAGMA journal_mode = WAL");
    store->Exec("PRAGMA synchronous = NORMAL");
    int version = store->schema_version();
    if (version > kSchemaVersion)
      return BadInput(path, "the store has schema version " + std::to_string(version) +
                                 " but this twinprobe knows only up to " + std::to_string(kSchemaVersion),
                      "use a newer twinprobe");
    if (version < kSchemaVersion) Migrate(*store);
  } catch (const StoreError& e) {
    return BadInput(path, std::string("not a usable study store (") + e.what() + ")");
  }
  return store;
}

Result<std::unique_ptr<Store>> Store::OpenReadOnly(const std::string& path) {
  if (!std::filesystem::exists(path))
    return BadInput(path, "no study store here",
                    "run 'twinprobe plan' (or 'twinprobe import pairs') first, or pass --study DIR");
  sqlite3* db = nullptr;
  if (sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr) != SQLITE_OK) {
    std::string msg = db ? sqlite3_errmsg(db) : "out of memory";
    sqlite3_close(db);
    return BadInput(path, "cannot open the study store: " + msg);
  }
  std::unique_ptr<Store> store(new Store(db, path));
  // A reader waits for a writer that is checkpointing, like a writer does.
  sqlite3_busy_timeout(db, kBusyTimeoutMs);
  return store;
}

Store::~Store() { sqlite3_close_v2(db_); }

void Store::Exec(std::string_view sql) {
  char* err = nullptr;
  std::string text(sql);
  if (sqlite3_exec(db_, text.c_str(), nullptr, nullptr, &err) != SQLITE_OK) {
    std::string msg = err ? err : "unknown error";
    sqlite3_free(err);
    throw StoreError("exec '" + text.substr(0, 80) + "': " + msg);
  }
}

int64_t Store::LastInsertId() const { return sqlite3_last_insert_rowid(db_); }

int64_t Store::QueryInt(std::string_view sql) {
  Stmt s = Prepare(sql);
  if (!s.Step() || s.IsNull(0)) return 0;
  return s.Int(0);
}

int Store::schema_version() { return static_cast<int>(QueryInt("PRAGMA user_version")); }

Transaction::Transaction(Store& store) : store_(store) { ExecRetryingBusy(store_, "BEGIN IMMEDIATE"); }

Transaction::~Transaction() {
  if (!committed_) {
    try {
      store_.Exec("ROLLBACK");
    } catch (...) {
    }
  }
}

void Transaction::Commit() {
  store_.Exec("COMMIT");
  committed_ = true;
}

}  // namespace twinprobe
