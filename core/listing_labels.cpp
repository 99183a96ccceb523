#include "core/listing_labels.h"

namespace twinprobe {

ItemLabelWriter::ItemLabelWriter(Store& store)
    : insert_(store.Prepare("INSERT INTO item_label(item_key, factor, level, audit_seq) VALUES (?1, ?2, ?3, ?4)")) {}

void ItemLabelWriter::Insert(int64_t seq, const std::string& item_key, const std::string& factor,
                             const std::string& level) {
  insert_.Bind(1, item_key).Bind(2, factor).Bind(3, level).Bind(4, seq).Run();
}

ItemLabelReader::ItemLabelReader(Store& store)
    : select_(store.Prepare(
          "SELECT level, audit_seq FROM item_label WHERE item_key = ?1 AND factor = ?2 ORDER BY id DESC LIMIT 1")) {}

std::optional<StoredItemLabel> ItemLabelReader::Current(const std::string& item_key, const std::string& factor) {
  select_.Bind(1, item_key).Bind(2, factor);
  std::optional<StoredItemLabel> out;
  if (select_.Step()) out = StoredItemLabel{select_.Text(0), select_.Int(1)};
  select_.Reset();
  return out;
}

std::vector<ProfileLabelRow> ReadProfileLabels(Store& store) {
  Stmt q = store.Prepare(
      "SELECT p.display_name, f.name, l.name FROM profile p "
      "JOIN arm_level al ON al.arm_id = p.arm_id JOIN level l ON l.id = al.level_id JOIN factor f ON f.id = "
      "l.factor_id "
      "WHERE p.plan_id = (SELECT max(id) FROM plan) ORDER BY p.id, f.name");
  std::vector<ProfileLabelRow> out;
  while (q.Step()) out.push_back({q.Text(0), q.Text(1), q.Text(2)});
  return out;
}

bool ListingFileImported(Store& store, ImportKind kind, const std::string& sha256) {
  Stmt seen = store.Prepare("SELECT count(*) FROM import_file WHERE kind = ?1 AND sha256 = ?2");
  seen.Bind(1, ImportKindName(kind)).Bind(2, sha256);
  return seen.Step() && seen.Int(0) > 0;
}

void RecordListingFile(Store& store, int64_t seq, ImportKind kind, const std::string& sha256, const std::string& path,
                       int64_t rows_landed) {
  Stmt ins = store.Prepare(
      "INSERT INTO import_file(kind, sha256, path, rows_landed, rows_rejected, audit_seq) VALUES (?1, ?2, ?3, ?4, 0, "
      "?5)");
  ins.Bind(1, ImportKindName(kind)).Bind(2, sha256).Bind(3, path).Bind(4, rows_landed).Bind(5, seq).Run();
}

}  // namespace twinprobe
