#pragma once
// Multi-row INSERT for bulk imports, used inside core by the typed import
// writers (core/import_pairs_writer.h); other modules call those writers.
// Rows are buffered and written many at a time with one statement
// ("INSERT ... VALUES (..), (..), ..."), so the per-statement cost (cursors on the table and each index, foreign-key
// lookups set up, the statement's halt) is paid once per batch instead of
// once per row. A million-row import spends most of its time there.
//
// The row template is the VALUES tuple with "@" for each value added per
// row and ?1..?K for the constants bound once (e.g. the audit seq):
//   BatchInsert probes(store, "INSERT INTO probe(id, ref, audit_seq) VALUES ", "(@, @, ?1)", {seq}, 64);
//   probes.Int(id); probes.Text(ref); probes.EndRow();
//   if (probes.full()) probes.Flush();
//   ...
//   probes.Flush();  // the last, partial batch
// Rows land only when Flush() writes them. Callers that read the table, or
// insert children under foreign keys, flush parents before children (a
// child written before its parent would be a violation; deferring the check
// instead makes SQLite scan child tables on every later parent insert).
// Failures throw StoreError (core/store.h).
#include <cstdint>
#include <map>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include "core/store.h"

struct sqlite3_stmt;

namespace twinprobe {

class BatchInsert {
 public:
  using Constant = std::variant<int64_t, std::string>;
  BatchInsert(Store& store, std::string head, std::string row_template, std::vector<Constant> constants,
              int rows_per_batch);
  ~BatchInsert();
  BatchInsert(const BatchInsert&) = delete;
  BatchInsert& operator=(const BatchInsert&) = delete;

  void Int(int64_t value);
  void Text(std::string_view value);
  void Null();
  void EndRow();  // ends a row; throws StoreError past the capacity
  bool full() const { return rows_ == rows_per_batch_; }
  void Flush();   // writes the rows buffered so far (one statement)
  int64_t rows_written() const { return written_; }

 private:
  struct Value {
    int kind = 0;  // 0 null, 1 integer, 2 text
    int64_t i = 0;
    std::string s;
  };
  sqlite3_stmt* StatementFor(int rows);
  void Write(int rows);

  Store& store_;
  std::string head_, template_;
  std::vector<Constant> constants_;
  int per_row_ = 0;
  int rows_per_batch_;
  std::vector<Value> values_;
  size_t used_ = 0;  // values buffered
  int rows_ = 0;     // complete rows buffered
  int64_t written_ = 0;
  std::map<int, sqlite3_stmt*> statements_;  // by row count
};

}  // namespace twinprobe
