#include "core/import_batch.h"

#include <sqlite3.h>

namespace twinprobe {

BatchInsert::BatchInsert(Store& store, std::string head, std::string row_template, std::vector<Constant> constants,
                         int rows_per_batch)
    : store_(store), head_(std::move(head)), template_(std::move(row_template)), constants_(std::move(constants)),
      rows_per_batch_(rows_per_batch) {
  for (char c : template_) per_row_ += c == '@';
  values_.resize(static_cast<size_t>(per_row_) * static_cast<size_t>(rows_per_batch_));
}

BatchInsert::~BatchInsert() {
  for (auto& [rows, stmt] : statements_) sqlite3_finalize(stmt);
}

sqlite3_stmt* BatchInsert::StatementFor(int rows) {
  auto it = statements_.find(rows);
  if (it != statements_.end()) return it->second;
  std::string sql = head_;
  int next = static_cast<int>(constants_.size()) + 1;
  for (int r = 0; r < rows; ++r) {
    if (r) sql += ", ";
    for (char c : template_) {
      if (c == '@') {
        sql += '?';
        sql += std::to_string(next++);
      }
      else sql += c;
    }
  }
  sqlite3* db = store_.handle();
  sqlite3_stmt* stmt = nullptr;
  if (sqlite3_prepare_v3(db, sql.c_str(), static_cast<int>(sql.size()), SQLITE_PREPARE_PERSISTENT, &stmt, nullptr) !=
      SQLITE_OK)
    throw StoreError("prepare '" + sql.substr(0, 80) + "': " + sqlite3_errmsg(db));
  // Constants stay bound: the statement is reset, never cleared.
  for (size_t k = 0; k < constants_.size(); ++k) {
    int rc = std::holds_alternative<int64_t>(constants_[k])
                 ? sqlite3_bind_int64(stmt, static_cast<int>(k + 1), std::get<int64_t>(constants_[k]))
                 : sqlite3_bind_text(stmt, static_cast<int>(k + 1), std::get<std::string>(constants_[k]).data(),
                                     static_cast<int>(std::get<std::string>(constants_[k]).size()), SQLITE_STATIC);
    if (rc != SQLITE_OK) throw StoreError(std::string("bind: ") + sqlite3_errmsg(db));
  }
  statements_.emplace(rows, stmt);
  return stmt;
}

void BatchInsert::Int(int64_t value) {
  if (used_ == values_.size()) throw StoreError("batch insert: more values than the batch holds");
  Value& v = values_[used_++];
  v.kind = 1;
  v.i = value;
}

void BatchInsert::Text(std::string_view value) {
  if (used_ == values_.size()) throw StoreError("batch insert: more values than the batch holds");
  Value& v = values_[used_++];
  v.kind = 2;
  v.s.assign(value.data(), value.size());
}

void BatchInsert::Null() {
  if (used_ == values_.size()) throw StoreError("batch insert: more values than the batch holds");
  values_[used_++].kind = 0;
}

void BatchInsert::EndRow() {
  if (++rows_ > rows_per_batch_) throw StoreError("batch insert: more rows than the batch holds (" + head_.substr(0, 40) + ")");
}

void BatchInsert::Flush() {
  if (rows_ > 0) Write(rows_);
}

void BatchInsert::Write(int rows) {
  if (used_ != static_cast<size_t>(rows) * static_cast<size_t>(per_row_))
    throw StoreError("batch insert: a row has the wrong number of values (" + head_.substr(0, 40) + ")");
  sqlite3_stmt* stmt = StatementFor(rows);
  sqlite3* db = store_.handle();
  int index = static_cast<int>(constants_.size()) + 1;
  for (size_t i = 0; i < used_; ++i, ++index) {
    const Value& v = values_[i];
    int rc = v.kind == 1   ? sqlite3_bind_int64(stmt, index, v.i)
             : v.kind == 2 ? sqlite3_bind_text(stmt, index, v.s.data(), static_cast<int>(v.s.size()), SQLITE_STATIC)
                           : sqlite3_bind_null(stmt, index);
    if (rc != SQLITE_OK) throw StoreError(std::string("bind: ") + sqlite3_errmsg(db));
  }
  int rc = sqlite3_step(stmt);
  if (rc != SQLITE_DONE) {
    std::string msg = sqlite3_errmsg(db);
    sqlite3_reset(stmt);
    throw StoreError("batch insert (" + head_.substr(0, 40) + "): " + msg);
  }
  sqlite3_reset(stmt);
  written_ += rows;
  used_ = 0;
  rows_ = 0;
}

}  // namespace twinprobe
