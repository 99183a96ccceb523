#include "core/verify.h"

#include <sys/stat.h>

#include <algorithm>
#include <cctype>
#include <fstream>
#include <map>
#include <sstream>

#include "core/schema.h"
#include "core/store.h"
#include "core/verify_summary.h"

namespace twinprobe {
namespace {

constexpr const char* kNotAStoreFix =
    "pass --study with the study folder; a study store is made by 'twinprobe plan' or 'twinprobe import pairs'";

bool IsHexWord(const std::string& w) {
  return w.size() == 64 && std::all_of(w.begin(), w.end(), [](unsigned char c) { return std::isxdigit(c) != 0; });
}

std::string Lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

std::string Quoted(const std::string& name) { return "'" + name + "'"; }

// Runs the read transaction; COMMIT ends it even when a check threw.
class ReadTransaction {
 public:
  explicit ReadTransaction(Store& store) : store_(store) {
    store_.Exec("BEGIN");
    // A deferred transaction takes its snapshot at the first read: take it
    // now, so every later query sees the same committed state.
    store_.QueryInt("SELECT count(*) FROM sqlite_master");
  }
  ~ReadTransaction() {
    try {
      store_.Exec("COMMIT");
    } catch (...) {
    }
  }
  ReadTransaction(const ReadTransaction&) = delete;
  ReadTransaction& operator=(const ReadTransaction&) = delete;

 private:
  Store& store_;
};

}  // namespace

Result<std::string> ParseHead(const std::string& text, const std::string& where) {
  if (!IsHexWord(text))
    return Error{ErrorKind::kUsage, where,
                 "'" + text.substr(0, 80) + "' is not a chain head (a head is 64 hex digits)",
                 "copy the full head that a writing command or 'twinprobe verify' printed"};
  return Lower(text);
}

Result<std::vector<WitnessedHead>> ReadWitnessFile(const std::string& path) {
  struct stat st{};
  if (::stat(path.c_str(), &st) != 0 || !S_ISREG(st.st_mode))
    return BadInput(path, "cannot read the witness file (it is missing or not a regular file)",
                    "give the file the study's witness keeps, with one chain head per line");
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the witness file", "check the path and its permissions");
  std::vector<WitnessedHead> heads;
  std::string line;
  // A witness file is a few lines a person appends to; a long one is not one.
  constexpr int kMaxLines = 100000;
  for (int n = 1; n <= kMaxLines && std::getline(in, line); ++n) {
    std::istringstream words(line);
    std::string w;
    while (words >> w)
      if (IsHexWord(w)) heads.push_back({Lower(w), path + ":" + std::to_string(n), 0});
  }
  if (heads.empty())
    return BadInput(path + ":1", "the witness file holds no chain head (64 hex digits)",
                    "write the head a writing command printed into it, one per line");
  return heads;
}

std::vector<std::string> SchemaDifferences(Store& store, int version) {
  std::map<std::pair<std::string, std::string>, SchemaObject> expected, actual;
  for (auto& o : ReferenceSchema(version)) expected[{o.type, o.name}] = o;
  for (auto& o : StoredSchema(store)) actual[{o.type, o.name}] = o;
  std::vector<std::string> out;
  for (const auto& [key, o] : actual) {
    auto it = expected.find(key);
    if (it == expected.end()) {
      out.push_back(std::string("the store holds ") + (o.type == "index" ? "an " : "a ") + o.type + " " + Quoted(o.name) +
                    (o.type == "table" ? std::string() : " on " + o.table) + " that twinprobe does not create");
    } else if (it->second.sql != o.sql) {
      out.push_back("the " + o.type + " " + Quoted(o.name) +
                    " differs from the one twinprobe creates (its SQL was changed, e.g. a column renamed or the " +
                    o.type + " redefined)");
    }
  }
  for (const auto& [key, o] : expected)
    if (!actual.count(key)) out.push_back("the " + o.type + " " + Quoted(o.name) + " that twinprobe creates is missing");
  return out;
}

std::string ProblemPlace(const AuditProblem& p) {
  return p.seq == 0 ? std::string("the store") : "entry " + std::to_string(p.seq);
}

std::string FirstBrokenLink(const StoreVerification& v) {
  if (v.audit.problems.empty()) return "";
  const AuditProblem& first = v.audit.problems.front();
  return ProblemPlace(first) + ": " + first.what;
}

Result<StoreVerification> VerifyStore(const std::string& path, std::vector<WitnessedHead> witnessed) {
  struct stat st{};
  if (::stat(path.c_str(), &st) != 0)
    return BadInput(path, "no study store here",
                    "run 'twinprobe plan' (or 'twinprobe import pairs') first, or pass --study DIR");
  if (!S_ISREG(st.st_mode)) return BadInput(path, "is not a study store (not a regular file)", kNotAStoreFix);
  // SQLite reads a zero-byte file as an empty database; an empty study.db
  // proves nothing, so it must not pass as "intact: 0 entries".
  if (st.st_size == 0) return BadInput(path, "is not a study store (the file is empty)", kNotAStoreFix);

  // Every SQLite database begins with this header (sqlite.org, "Database
  // File Format", section 1.3.1); checked before SQLite reads anything.
  {
    std::ifstream in(path, std::ios::binary);
    char magic[16] = {};
    in.read(magic, sizeof magic);
    if (!in || std::string(magic, sizeof magic) != std::string("SQLite format 3\0", 16))
      return BadInput(path, "is not a study store (it is not an SQLite database)", kNotAStoreFix);
  }
  auto opened = Store::OpenReadOnly(path);
  if (!opened.ok()) return opened.error();
  Store& store = *opened.value();
  StoreVerification v;
  try {
    ReadTransaction tx(store);
    v.schema_version = store.schema_version();
    if (v.schema_version > kSchemaVersion)
      return BadInput(path,
                      "the store has schema version " + std::to_string(v.schema_version) +
                          " but this twinprobe knows only up to " + std::to_string(kSchemaVersion),
                      "use a newer twinprobe");
    if (v.schema_version < 1 || store.QueryInt("SELECT count(*) FROM sqlite_master WHERE name = 'audit'") == 0)
      return BadInput(path, "is not a study store (it has no twinprobe schema)", kNotAStoreFix);

    std::vector<std::string> schema = SchemaDifferences(store, v.schema_version);
    try {
      v.audit = VerifyAudit(store);
      for (AuditProblem& p : CheckSummaries(store)) v.audit.problems.push_back(std::move(p));
    } catch (const StoreError& e) {
      // A changed schema can make the chain unreadable (a renamed column);
      // that is a finding, reported with the schema's differences.
      if (schema.empty()) throw;
      v.audit.problems.push_back({0, std::string("the audit chain cannot be read (") + e.what() + ")"});
    }
    for (auto it = schema.rbegin(); it != schema.rend(); ++it)
      v.audit.problems.insert(v.audit.problems.begin(), AuditProblem(0, *it));

    // A witnessed head must be the hash of an entry of the (checked) chain:
    // then no entry up to it was removed and none before it rewritten.
    for (WitnessedHead& w : witnessed) {
      Stmt q = store.Prepare("SELECT seq FROM audit WHERE hash = ?1");
      q.Bind(1, w.hash);
      w.seq = q.Step() ? q.Int(0) : 0;
      if (w.seq == 0)
        v.audit.problems.push_back(
            {0, "the witnessed head " + w.hash + " (" + w.source +
                    ") is not in the chain: entries up to it were removed, or the chain was rewritten"});
    }
    v.witnessed = std::move(witnessed);
  } catch (const StoreError& e) {
    return BadInput(path, std::string("is not a readable study store (") + e.what() + ")", kNotAStoreFix);
  }
  std::stable_sort(v.audit.problems.begin(), v.audit.problems.end(),
                   [](const AuditProblem& a, const AuditProblem& b) { return a.seq < b.seq; });
  return v;
}

}  // namespace twinprobe
