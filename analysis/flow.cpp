#include "analysis/flow.h"

namespace twinprobe {

StudyFlow ComputeFlow(const Fieldwork& f, int window_days) {
  StudyFlow flow;
  flow.vacancies_planned = f.vacancies;
  flow.window_days = window_days;
  flow.sets_sent = f.sets_complete + f.sets_open;
  flow.sets_closed = f.sets_complete;
  flow.sets_analysed = f.sets_complete;
  flow.probes_open = f.probes_open;
  flow.responses_late = f.responses_late;
  // A vacancy of the plan without a probe never had a set: it was not sent.
  const int64_t sets = f.sets_complete + f.sets_open + f.sets_incomplete + f.sets_withdrawn;
  const int64_t without_probes = f.vacancies > sets ? f.vacancies - sets : 0;
  flow.exclusions = {
      {"not_sent", "no application sent yet", f.sets_unsent + without_probes},
      {"incomplete", "some applications not sent", f.sets_incomplete - f.sets_unsent},
      {"still_open", "still within the " + std::to_string(window_days) + "-day window", f.sets_open},
      // Last, so the earlier reasons keep their places in the JSON array.
      {"withdrawn", "vacancy withdrawn", f.sets_withdrawn},
  };
  return flow;
}

}  // namespace twinprobe
