#include "core/response_records.h"

#include "core/sha256.h"

namespace twinprobe {
namespace {

constexpr const char* kFindProbe = "SELECT id FROM current_probe WHERE ref = ?1";
constexpr const char* kCurrentResponse =
    "SELECT id, code FROM current_response WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1";

}  // namespace

int64_t FindCurrentProbe(Store& store, const std::string& ref) {
  Stmt s = store.Prepare(kFindProbe);
  s.Bind(1, ref);
  return s.Step() ? s.Int(0) : 0;
}

ResponseRecords::ResponseRecords(Store& store)
    : store_(store),
      find_probe_(store.Prepare(kFindProbe)),
      last_sending_(store.Prepare("SELECT sent_at FROM sending WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1")),
      current_(store.Prepare(kCurrentResponse)),
      insert_(store.Prepare(
          "INSERT INTO response(probe_id, code, received_at, channel, note, note_sha256, origin, flags, entered_by, "
          "entered_at, supersedes, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12)")) {}

int64_t ResponseRecords::FindProbe(const std::string& ref) {
  find_probe_.Bind(1, ref);
  int64_t id = find_probe_.Step() ? find_probe_.Int(0) : 0;
  find_probe_.Reset();
  return id;
}

std::string ResponseRecords::LastSentAt(int64_t probe_id) {
  last_sending_.Bind(1, probe_id);
  std::string at = last_sending_.Step() ? last_sending_.Text(0) : std::string();
  last_sending_.Reset();
  return at;
}

int64_t ResponseRecords::CurrentResponseId(int64_t probe_id) {
  current_.Bind(1, probe_id);
  int64_t id = current_.Step() ? current_.Int(0) : 0;
  current_.Reset();
  return id;
}

int64_t ResponseRecords::Insert(const ResponseRow& r) {
  insert_.Bind(1, r.probe_id).Bind(2, r.code).Bind(3, r.received_at).Bind(4, r.channel);
  if (r.note) insert_.Bind(5, *r.note).Bind(6, Sha256Hex(*r.note));
  else insert_.BindNull(5).BindNull(6);
  insert_.Bind(7, r.origin).Bind(8, r.flags).Bind(9, r.entered_by).Bind(10, r.entered_at);
  if (r.supersedes) insert_.Bind(11, r.supersedes);
  else insert_.BindNull(11);
  insert_.Bind(12, r.audit_seq).Run();
  return store_.LastInsertId();
}

std::optional<std::string> CurrentResponseCode(Store& store, int64_t probe_id) {
  Stmt s = store.Prepare(kCurrentResponse);
  s.Bind(1, probe_id);
  if (!s.Step()) return std::nullopt;
  return s.Text(1);
}

}  // namespace twinprobe
