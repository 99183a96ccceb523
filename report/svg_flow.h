#pragma once
// The flow diagram of a study (a participant flow, drawn as trial reporting
// guidelines draw one): a column of stage boxes joined by arrows, and beside
// each arrow a box for the sets that left the flow there, with the reason.
#include <cstdint>
#include <string>
#include <vector>

namespace twinprobe::svg {

struct FlowStage {
  std::string text;  // "400 vacancies planned"
  // Sets that leave the flow between this stage and the next, one line each
  // ("188 sets: no application sent yet"); empty: none.
  std::vector<std::string> exits;
};

struct FlowDiagram {
  std::string id;
  std::string title;
  std::string description;
  std::vector<FlowStage> stages;  // top to bottom
};

std::string RenderFlowDiagram(const FlowDiagram& diagram);

}  // namespace twinprobe::svg
