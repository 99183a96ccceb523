#include "report/svg_flow.h"

#include <algorithm>

#include "report/svg_common.h"

namespace twinprobe::svg {
namespace {

constexpr double kWidth = 640, kBoxW = 260, kBoxH = 40, kStageLeft = 20, kExitLeft = 330, kExitW = 290;
constexpr double kLineH = 18, kGap = 26;

std::string Box(double x, double y, double w, double h, const char* css_class) {
  return "<rect x=\"" + Coord(x) + "\" y=\"" + Coord(y) + "\" width=\"" + Coord(w) + "\" height=\"" + Coord(h) +
         "\" rx=\"4\" class=\"" + css_class + "\" fill=\"#ffffff\" stroke=\"" + OkabeIto()[0].hex + "\"/>";
}

std::string Line(double x1, double y1, double x2, double y2) {
  return "<line x1=\"" + Coord(x1) + "\" y1=\"" + Coord(y1) + "\" x2=\"" + Coord(x2) + "\" y2=\"" + Coord(y2) +
         "\" stroke=\"" + OkabeIto()[0].hex + "\" marker-end=\"url(#flow-arrow)\"/>";
}

}  // namespace

std::string RenderFlowDiagram(const FlowDiagram& d) {
  // Each stage box, then the gap to the next: tall enough for its exit box.
  std::vector<double> gap_after;
  for (size_t i = 0; i < d.stages.size(); ++i) {
    const double exit_h = d.stages[i].exits.empty() ? 0 : 12 + kLineH * static_cast<double>(d.stages[i].exits.size());
    gap_after.push_back(i + 1 < d.stages.size() ? std::max(kGap, exit_h + 16) : 0);
  }
  double height = 20;
  for (size_t i = 0; i < d.stages.size(); ++i) height += kBoxH + gap_after[i];
  std::string o = OpenSvg(d.id, kWidth, height, d.title, d.description);
  o += "<defs><marker id=\"flow-arrow\" viewBox=\"0 0 10 10\" refX=\"9\" refY=\"5\" markerWidth=\"7\" "
       "markerHeight=\"7\" orient=\"auto\"><path d=\"M0,0 L10,5 L0,10 z\" fill=\"" +
       std::string(OkabeIto()[0].hex) + "\"/></marker></defs>";
  const double cx = kStageLeft + kBoxW / 2;
  double y = 10;
  for (size_t i = 0; i < d.stages.size(); ++i) {
    const FlowStage& s = d.stages[i];
    o += "<g class=\"flow-stage\">" + Box(kStageLeft, y, kBoxW, kBoxH, "stage");
    o += LabelText(s.text, cx, y + kBoxH / 2 + 5, "middle", 40) + "</g>";
    const double next = y + kBoxH + gap_after[i];
    if (i + 1 < d.stages.size()) {
      o += Line(cx, y + kBoxH, cx, next);
      if (!s.exits.empty()) {
        const double h = 12 + kLineH * static_cast<double>(s.exits.size());
        const double ey = y + kBoxH + (gap_after[i] - h) / 2;
        o += "<g class=\"flow-exit\">" + Line(cx, ey + h / 2, kExitLeft, ey + h / 2);
        o += Box(kExitLeft, ey, kExitW, h, "exit");
        for (size_t k = 0; k < s.exits.size(); ++k)
          o += LabelText(s.exits[k], kExitLeft + 10, ey + 6 + kLineH * static_cast<double>(k + 1) - 4, "start", 44);
        o += "</g>";
      }
    }
    y = next;
  }
  return o + "</svg>";
}

}  // namespace twinprobe::svg
