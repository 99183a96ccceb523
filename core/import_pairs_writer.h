#pragma once
// The rows `import pairs` lands, written in bulk under one audit entry:
// vacancies (with their strata and employers), probes, their sendings and
// their responses. The importer (collector/import_pairs.h) checks the file
// and assigns ids; this writer only stores what it is given.
//
// Rows are buffered and written in multi-row batches, parents before
// children, so the immediate foreign-key checks always find the parent.
// Every index is kept up to date row by row; the .cpp says why rebuilding
// them after the insert was measured and left out.
// Failures throw StoreError (core/store.h). Call inside the AuditedWrite
// whose seq the rows carry; Finish() before committing it.
#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/store.h"

namespace twinprobe {

class BatchInsert;

// What an `import pairs` into an existing imported plan is checked against.
struct ImportPlanRow {
  int64_t id = 0;
  std::string origin;  // "plan" or "import"
  std::string kind;    // paired | sets | unpaired
};

struct ImportArmRow {
  int64_t id = 0;
  std::string label;
  bool is_reference = false;
};

// The current plan, if any.
std::optional<ImportPlanRow> ReadImportPlan(Store& store);
// The plan's arms, in id order.
std::vector<ImportArmRow> ReadImportArms(Store& store, int64_t plan_id);
// The references of the plan's vacancies and probes (to refuse repeats).
std::vector<std::string> ReadVacancyRefs(Store& store, int64_t plan_id);
std::vector<std::string> ReadProbeRefs(Store& store, int64_t plan_id);
// The largest n of the current plan's probe references "P<n>" (0 if none),
// so generated references continue the series.
int64_t MaxProbeSerial(Store& store);

class PairsWriter {
 public:
  // `batch_probes`: how many probes a batch holds; `strata_per_vacancy`
  // and `covariates_per_probe` size the strata and covariate batches. Use
  // inside an AuditedWrite, which holds the write lock.
  PairsWriter(Store& store, int64_t plan_id, int64_t seq, const std::string& actor, const std::string& at,
              int batch_probes, int strata_per_vacancy, int covariates_per_probe = 0);
  ~PairsWriter();
  PairsWriter(const PairsWriter&) = delete;
  PairsWriter& operator=(const PairsWriter&) = delete;

  // Ids to assign: one past the largest stored.
  int64_t next_vacancy_id() const { return next_vacancy_id_; }
  int64_t next_probe_id() const { return next_probe_id_; }

  // An employer's identity under its pseudonym (kept once per key).
  void AddEmployer(const std::string& key, const std::string& name);
  // A vacancy of source 'import'; `employer_key` "" stores none.
  void AddVacancy(int64_t id, std::string_view ref, std::string_view employer_key);
  void AddStratum(int64_t vacancy_id, std::string_view name, std::string_view value);
  void AddProbe(int64_t id, std::string_view ref, int64_t vacancy_id, int64_t arm_id, int64_t send_order);
  void AddSending(int64_t probe_id, std::string_view sent_at);
  // A response of origin 'import'; `received_at` "" stores none; `late`
  // sets the flag 'late'.
  void AddResponse(int64_t probe_id, std::string_view code, std::string_view received_at, bool late);
  // A covariate of an application (application_covariate, migration 14);
  // at most `covariates_per_probe` per probe.
  void AddCovariate(int64_t probe_id, std::string_view name, std::string_view value);
  // Call after each probe: writes the batches once the probes' one is full.
  void EndProbe();
  // Writes what is buffered; the rows are then readable.
  void Finish();

 private:
  void FlushAll();

  Store& store_;
  int64_t next_vacancy_id_, next_probe_id_;
  Stmt employer_;
  std::unique_ptr<BatchInsert> vacancies_, strata_, probes_, sendings_, responses_, covariates_;
  bool finished_ = false;
};

}  // namespace twinprobe
