#include "core/import_files.h"

#include "core/store.h"

namespace twinprobe {

bool AlreadyImported(Store& store, const std::string& kind, const std::string& sha256) {
  Stmt s = store.Prepare("SELECT count(*) FROM import_file WHERE kind = ?1 AND sha256 = ?2");
  s.Bind(1, kind).Bind(2, sha256);
  return s.Step() && s.Int(0) > 0;
}

void RecordImportFile(Store& store, int64_t seq, const std::string& kind, const std::string& sha256,
                      const std::string& path, int64_t rows_landed, int64_t rows_rejected) {
  Stmt ins = store.Prepare(
      "INSERT INTO import_file(kind, sha256, path, rows_landed, rows_rejected, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6)");
  ins.Bind(1, kind).Bind(2, sha256).Bind(3, path).Bind(4, rows_landed).Bind(5, rows_rejected).Bind(6, seq).Run();
}

std::vector<ImportedFile> ReadImportedFiles(Store& store) {
  std::vector<ImportedFile> files;
  Stmt s = store.Prepare("SELECT kind, sha256, path, rows_landed, rows_rejected FROM import_file ORDER BY id");
  while (s.Step()) files.push_back({s.Text(0), s.Text(1), s.Text(2), s.Int(3), s.Int(4)});
  return files;
}

}  // namespace twinprobe
