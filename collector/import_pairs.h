#pragma once
// `import pairs FILE.csv`: a whole dataset collected elsewhere (a newsroom's
// or an HR department's spreadsheet), one row per probe. See docs/import.md.
//
// Columns: vacancy, arm, outcome (required); sent_at, responded_at, probe,
// employer (optional); the stratum columns (named by --strata, else by the
// design's [strata], else by an earlier import). Columns named reject_* are
// skipped; any other column is reported as ignored.
//   - outcome: a code of the study's scheme. Without a design the scheme is
//     the default one plus "0" and "1" (1 = positive callback).
//   - arm: with a design, an arm label ("origin=coastal") or, for a single
//     factor, its level ("coastal"); without one, any text, and the arms are
//     the distinct values (--reference names the reference arm).
//   - every vacancy has exactly one row per arm (in an unpaired design, from
//     study.toml, exactly one row); its strata and employer are the same on
//     all its rows.
//
// Where it lands: with no plan in the store, a new plan of origin "import"
// (creating the store, and taking arms, reference and strata from the design
// or, without one, from the file and the options). With an earlier imported
// plan, the new vacancies join it (same arms and strata). A store planned by
// `twinprobe plan` is refused: its responses come through `import outcomes`.
//
// The file is read twice, streaming: first every row is checked, then the
// good rows land in one audited transaction. All or nothing by default (the
// first bad row fails the import and nothing is written, not even a new
// store). With skip_bad, a vacancy with any bad row is left out whole (a set
// missing a probe cannot be compared) and every row left out goes to the
// reject file with its reason. A file whose bytes were imported before adds
// nothing.
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "core/design.h"
#include "core/near_duplicates.h"
#include "core/status.h"

namespace twinprobe {

struct PairsImportOptions {
  std::vector<std::string> strata;  // stratum columns (--strata)
  bool strata_given = false;        // --strata was given (possibly empty: no strata)
  std::string reference;            // --reference ARM
  bool skip_bad = false;
  std::string reject_path;          // default FILE.rejects.csv
  bool raw_cells = false;           // reject file cells as they are, formula-like ones included
  std::string study_id;             // id of a new study without a design (default: the folder's name)
  bool progress = true;             // a progress bar on stderr when it is a terminal
  // Set by `import applications` (collector/import_applications.h), which
  // shares this importer; `import pairs` leaves them empty.
  bool records = false;  // the rows are applicant records, not probes sent
  std::string kind;      // paired | sets | unpaired; "" decides by the number of arms
  std::vector<std::pair<std::string, std::string>> column_names;  // (role, the file's column)
  std::string factor;    // the factor's name in a new study ("" names it "arm")
  // Outcome values that count as positive. When given (without a design),
  // any value is an outcome and the scheme's codes are the values seen.
  std::vector<std::string> positive;
  // Hiring stages in order: the outcome is the furthest stage reached, so
  // the codes are exactly these (positive: --positive, else every stage
  // after the first). Stored for the stage analysis. When every stage names
  // a column of the file, those columns are yes/no flags (1/0, yes/no, y/n,
  // true/false, any case) and the outcome is the last stage flagged yes; a
  // row flagged yes at a stage after a no is refused.
  std::vector<std::string> stages;
  // Covariate columns kept with each application (the file's names, after
  // --columns), for the adjusted logistic model. Every cell must be filled;
  // a covariate is numeric when every cell is a number
  // (core/covariate_records.h), else categorical.
  std::vector<std::string> covariates;
  // Scores of ordered groups (--scores a28=28,a45=45,a58=58), stored with
  // the levels (level_design) for the trend test; every group needs one.
  std::vector<std::pair<std::string, double>> scores;
};

// How a covariate column was read.
struct CovariateSummary {
  std::string name;
  bool numeric = false;
  int64_t categories = 0;  // distinct values of a categorical covariate (0 when numeric)
};

struct PairsImportSummary {
  bool already_imported = false;
  bool new_plan = false;           // a plan (and maybe the store) was created
  int64_t plan_id = 0;
  std::string kind;                // paired | sets
  std::vector<std::string> arms;   // labels, reference first
  std::vector<std::string> strata;
  std::string factor;              // the factor's name (a new study)
  std::vector<std::string> positive;  // outcome values counted positive
  int64_t rows_landed = 0;
  int64_t rows_rejected = 0;
  int64_t vacancies_landed = 0;
  int64_t sendings = 0;            // rows with sent_at
  int64_t late = 0;                // responses flagged 'late'
  std::string reject_path;         // "" when no row was rejected
  std::vector<std::string> ignored_columns;
  std::vector<CovariateSummary> covariates;  // in the order given
  // Values of a stratum, employer or arm column that differ only in case or
  // spaces (each spelling lands as a value of its own); the command warns.
  std::vector<NearDuplicate> near_duplicates;
  std::string audit_hash;
};

// Imports `path` into the store at `store_path` (created when missing, only
// once the file has been checked). `design` is the study's design when the
// folder has a study.toml, else nullptr.
Result<PairsImportSummary> ImportPairs(const std::string& store_path, const Design* design, const std::string& path,
                                       const PairsImportOptions& options);

}  // namespace twinprobe
