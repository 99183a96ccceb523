#pragma once
// `handout`: one field office's part of a study. Writes a new study folder
// holding the design (study.toml and the files it names: name pools,
// templates, the ethics folder), only the office's vacancies (the vacancies
// file cut to them), and a store with the current plan's header and those
// vacancies' probes, profiles and sealed material files, with the same row
// ids as the main store; the materials themselves are copied beside it. The
// office works in that folder with every fieldwork command and comes back
// with `merge` (collector/merge.h).
//
// Both chains seal the handout: the office store's first entry seals where
// it came from (the main plan's hash and chain head), and the main store's
// entry seals the office, its vacancies and the office chain's first head.
// A vacancy is handed out once.
#include <cstdint>
#include <optional>
#include <string>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct HandoutRequest {
  std::string study_dir;                       // the main study folder
  std::string to;                              // the office folder to create (must not exist)
  std::optional<std::string> vacancies_file;   // vacancy references, one a line
  std::optional<std::string> stratum;          // "name=value", e.g. "region=North Fen"
};

struct HandoutResult {
  std::string office;  // the office's name: the folder's last part
  std::string folder;
  int64_t vacancies = 0, probes = 0, material_files = 0;
  std::string plan_hash, office_head;
};

// Office names are what `merge --prefer` and `status` show: letters, digits,
// '-', '_' and '.', not starting with '.', and not "main" (the main store's name).
Status CheckOfficeName(const std::string& name, const std::string& where);

// Hands out the selected vacancies of the current plan of `main` (the store
// of `design`, read from request.study_dir). Errors (bad input; nothing is
// written anywhere): exactly one of vacancies_file and stratum must be given;
// a line of the file naming no vacancy of the plan (FILE:LINE:COL); a
// stratum or value the plan lacks; an empty selection; a vacancy already
// handed out (naming its office); an office name already used; `to` exists.
Result<HandoutResult> HandOut(Store& main, const Design& design, const HandoutRequest& request);

}  // namespace twinprobe
