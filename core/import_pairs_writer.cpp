#include "core/import_pairs_writer.h"

#include "core/import_batch.h"

namespace twinprobe {
namespace {

// A larger page cache for the one big transaction (negative: KiB). Measured
// on a million rows: 32 MiB is as fast as 512 MiB (bench/import).
constexpr const char* kImportCache = "PRAGMA cache_size = -32768";

std::vector<std::string> Texts(Store& store, const char* sql, int64_t plan_id) {
  std::vector<std::string> out;
  Stmt s = store.Prepare(sql);
  s.Bind(1, plan_id);
  while (s.Step()) out.push_back(s.Text(0));
  return out;
}

}  // namespace

std::optional<ImportPlanRow> ReadImportPlan(Store& store) {
  Stmt p = store.Prepare("SELECT id, origin, kind FROM current_plan");
  if (!p.Step()) return std::nullopt;
  return ImportPlanRow{p.Int(0), p.Text(1), p.Text(2)};
}

std::vector<ImportArmRow> ReadImportArms(Store& store, int64_t plan_id) {
  std::vector<ImportArmRow> out;
  Stmt a = store.Prepare("SELECT id, label, is_reference FROM arm WHERE plan_id = ?1 ORDER BY id");
  a.Bind(1, plan_id);
  while (a.Step()) out.push_back({a.Int(0), a.Text(1), a.Int(2) != 0});
  return out;
}

std::vector<std::string> ReadVacancyRefs(Store& store, int64_t plan_id) {
  return Texts(store, "SELECT ref FROM vacancy WHERE plan_id = ?1", plan_id);
}

std::vector<std::string> ReadProbeRefs(Store& store, int64_t plan_id) {
  return Texts(store, "SELECT ref FROM probe WHERE plan_id = ?1", plan_id);
}

int64_t MaxProbeSerial(Store& store) {
  return store.QueryInt("SELECT max(CAST(substr(ref, 2) AS INTEGER)) FROM current_probe WHERE ref GLOB 'P[0-9]*'");
}

PairsWriter::PairsWriter(Store& store, int64_t plan_id, int64_t seq, const std::string& actor, const std::string& at,
                         int batch_probes, int strata_per_vacancy, int covariates_per_probe)
    : store_(store),
      next_vacancy_id_(store.QueryInt("SELECT coalesce(max(id), 0) + 1 FROM vacancy")),
      next_probe_id_(store.QueryInt("SELECT coalesce(max(id), 0) + 1 FROM probe")),
      employer_(store.Prepare("INSERT OR IGNORE INTO employer(key, name) VALUES (?1, ?2)")) {
  store.Exec(kImportCache);
  vacancies_ = std::make_unique<BatchInsert>(
      store, "INSERT INTO vacancy(id, plan_id, ref, employer_key, source, audit_seq) VALUES ",
      "(@, ?1, @, @, 'import', ?2)", std::vector<BatchInsert::Constant>{plan_id, seq}, batch_probes);
  strata_ = std::make_unique<BatchInsert>(store, "INSERT INTO vacancy_stratum(vacancy_id, name, value, audit_seq) VALUES ",
                                          "(@, @, @, ?1)", std::vector<BatchInsert::Constant>{seq},
                                          batch_probes * std::max(1, strata_per_vacancy));
  probes_ = std::make_unique<BatchInsert>(
      store, "INSERT INTO probe(id, plan_id, ref, vacancy_id, arm_id, send_order, audit_seq) VALUES ",
      "(@, ?1, @, @, @, @, ?2)", std::vector<BatchInsert::Constant>{plan_id, seq}, batch_probes);
  sendings_ = std::make_unique<BatchInsert>(
      store, "INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) VALUES ", "(@, @, ?1, ?2, ?3)",
      std::vector<BatchInsert::Constant>{actor, at, seq}, batch_probes);
  responses_ = std::make_unique<BatchInsert>(
      store,
      "INSERT INTO response(probe_id, code, received_at, origin, flags, entered_by, entered_at, audit_seq) VALUES ",
      "(@, @, @, 'import', @, ?1, ?2, ?3)", std::vector<BatchInsert::Constant>{actor, at, seq}, batch_probes);
  if (covariates_per_probe > 0)
    covariates_ = std::make_unique<BatchInsert>(
        store, "INSERT INTO application_covariate(probe_id, name, value, audit_seq) VALUES ", "(@, @, @, ?1)",
        std::vector<BatchInsert::Constant>{seq}, batch_probes * covariates_per_probe);
}

PairsWriter::~PairsWriter() = default;

void PairsWriter::AddEmployer(const std::string& key, const std::string& name) {
  employer_.Bind(1, key).Bind(2, name).Run();
}

void PairsWriter::AddVacancy(int64_t id, std::string_view ref, std::string_view employer_key) {
  if (id >= next_vacancy_id_) next_vacancy_id_ = id + 1;
  vacancies_->Int(id);
  vacancies_->Text(ref);
  if (employer_key.empty()) vacancies_->Null();
  else vacancies_->Text(employer_key);
  vacancies_->EndRow();
}

void PairsWriter::AddStratum(int64_t vacancy_id, std::string_view name, std::string_view value) {
  strata_->Int(vacancy_id);
  strata_->Text(name);
  strata_->Text(value);
  strata_->EndRow();
}

void PairsWriter::AddProbe(int64_t id, std::string_view ref, int64_t vacancy_id, int64_t arm_id, int64_t send_order) {
  if (id >= next_probe_id_) next_probe_id_ = id + 1;
  probes_->Int(id);
  probes_->Text(ref);
  probes_->Int(vacancy_id);
  probes_->Int(arm_id);
  probes_->Int(send_order);
  probes_->EndRow();
}

void PairsWriter::AddSending(int64_t probe_id, std::string_view sent_at) {
  sendings_->Int(probe_id);
  sendings_->Text(sent_at);
  sendings_->EndRow();
}

void PairsWriter::AddResponse(int64_t probe_id, std::string_view code, std::string_view received_at, bool late) {
  responses_->Int(probe_id);
  responses_->Text(code);
  if (received_at.empty()) responses_->Null();
  else responses_->Text(received_at);
  responses_->Text(late ? "late" : "");
  responses_->EndRow();
}

void PairsWriter::AddCovariate(int64_t probe_id, std::string_view name, std::string_view value) {
  covariates_->Int(probe_id);
  covariates_->Text(name);
  covariates_->Text(value);
  covariates_->EndRow();
}

void PairsWriter::EndProbe() {
  if (probes_->full()) FlushAll();
}

void PairsWriter::FlushAll() {
  for (BatchInsert* b : {vacancies_.get(), strata_.get(), probes_.get(), sendings_.get(), responses_.get(), covariates_.get()})
    if (b) b->Flush();
}

// Why the indexes stay: dropping the nine secondary indexes of the filled
// tables (probe_vacancy, the *_probe and *_seq ones, response_supersedes)
// before the insert and building them again inside the same transaction
// was tried on 300,000 rows and saved nothing (2.79 against 2.81 CPU
// seconds; bench/import/RESULTS.md). The import writes every one of those
// indexes in key order (ids and audit_seq only grow), so each row appends
// to the right edge of a B-tree whose path is in the page cache, which
// costs about what CREATE INDEX's scan and sort cost afterwards. The
// indexes that do take random keys are the unique constraints' own
// (vacancy and probe refs), which cannot be dropped.
void PairsWriter::Finish() {
  if (finished_) return;
  FlushAll();
  finished_ = true;
}

}  // namespace twinprobe
