#include "report/early_stop_report.h"

#include <cstdio>

#include "report/html_parts.h"
#include "report/p_value.h"

namespace twinprobe {
namespace {

std::string Num(double v) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

std::string Percent(double conf) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.2f%%", 100 * conf);
  return buf;
}

// The lines both text and HTML show, in order.
std::vector<std::string> Lines(const EarlyStop& e, const std::string& reference_label, const std::string& other_label) {
  return {
      "Monitoring stopped the study early at look " + std::to_string(e.look) + " (" + std::to_string(e.sets) + " of " +
          std::to_string(e.planned_sets) + " planned sets, taken " + e.taken_at + "): " + reference_label +
          " alone called back in " + std::to_string(e.b) + ", " + other_label + " alone in " + std::to_string(e.c) +
          " discordant sets.",
      "Naive (as if the look were a fixed-size study): exact McNemar test, two-sided, " + PEquals(e.naive_p) +
          "; conditional odds ratio b/c " + Num(e.naive_odds_ratio) + ", exact " + Percent(e.naive_conf) +
          " interval " + Num(e.naive_lower) + " to " + Num(e.naive_upper) + ".",
      "Adjusted for the looks (" + std::string(e.spending == "pocock" ? "Pocock" : "O'Brien\u2013Fleming") +
          "-type spending, alpha " + Num(e.alpha) + "): stage-wise ordering p-value, two-sided, " +
          PEquals(e.stagewise_p) + " (Jennison & Turnbull 2000, \u00a78.4); repeated confidence interval of b/c " +
          Num(e.repeated_lower) + " to " + Num(e.repeated_upper) + " at the look's nominal level " +
          Percent(e.repeated_conf) + " (Jennison & Turnbull 1989; 2000, ch. 9).",
      EarlyStopCaution(),
  };
}

}  // namespace

std::string RenderEarlyStopText(const EarlyStop& e, const std::string& reference_label,
                                const std::string& other_label) {
  if (!e.present) return "";
  std::string o = "After the early stop:\n";
  for (const std::string& l : Lines(e, reference_label, other_label)) o += "  " + l + "\n";
  return o;
}

nlohmann::json EarlyStopJson(const EarlyStop& e) {
  if (!e.present) return nullptr;
  return {{"look", e.look},
          {"sets", e.sets},
          {"planned_sets", e.planned_sets},
          {"taken_at", e.taken_at},
          {"reference_only", e.b},
          {"other_only", e.c},
          {"alpha", e.alpha},
          {"spending", e.spending},
          {"naive", {{"p", e.naive_p},
                     {"test", "exact McNemar, two-sided"},
                     {"odds_ratio", e.naive_odds_ratio},
                     {"conf", e.naive_conf},
                     {"lower", e.naive_lower},
                     {"upper", e.naive_upper}}},
          {"adjusted", {{"stagewise_p", e.stagewise_p},
                        {"repeated_conf", e.repeated_conf},
                        {"repeated_lower", e.repeated_lower},
                        {"repeated_upper", e.repeated_upper}}},
          {"caution", EarlyStopCaution()}};
}

std::string RenderEarlyStopHtml(const EarlyStop& e, const std::string& reference_label,
                                const std::string& other_label) {
  if (!e.present) return "";
  std::string o = html::Heading("After the early stop");
  for (const std::string& l : Lines(e, reference_label, other_label)) o += html::Para(l);
  return o;
}

}  // namespace twinprobe
