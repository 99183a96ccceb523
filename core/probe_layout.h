#pragma once
// Where each probe of the current plan sat in its set: the template it used
// and its send position. The fieldwork (core/fieldwork.h) tallies these for
// the balance tables only; the adjusted conditional logistic regression
// (analysis/adjusted_model.h) needs them probe by probe, joined to the
// outcomes of Fieldwork::completed by vacancy and probe order.
#include <cstdint>
#include <map>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct ProbeLayout {
  std::string template_path;  // "" when the probe has none (imported pairs)
  int send_order = 1;         // 1 = sent first to its vacancy
};

// Vacancy id -> its probes in probe order (the order of SetProbe in
// Fieldwork::completed). Empty when the store holds no plan.
using ProbeLayouts = std::map<int64_t, std::vector<ProbeLayout>>;

// Reads the current plan's probes. Memory grows with probes (about 40 bytes
// each). Throws StoreError only for SQLite failures the user cannot cause.
ProbeLayouts ReadProbeLayout(Store& store);

}  // namespace twinprobe
