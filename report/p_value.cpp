#include "report/p_value.h"

#include <cmath>
#include <cstdio>

namespace twinprobe {
namespace {

constexpr double kSmallestShown = 1e-16;
constexpr char kBelowSmallest[] = "< 1e-16";

}  // namespace

std::string FormatP(double p) {
  if (std::isnan(p)) return "not defined";
  if (p < kSmallestShown) return kBelowSmallest;
  char buf[32];
  std::snprintf(buf, sizeof buf, p < 0.001 ? "%.2e" : "%.3g", p);
  return buf;
}

std::string FormatP(const stats::PValue& p) {
  if (std::isnan(p.p) || p.p >= kSmallestShown || !std::isfinite(p.log10_p)) return FormatP(p.p);
  char buf[64];
  std::snprintf(buf, sizeof buf, "%s (log10 p = %.1f)", kBelowSmallest, p.log10_p);
  return buf;
}

namespace {

std::string WithRelation(const std::string& value) {
  if (value == "not defined") return "p not defined";
  if (value.rfind("< ", 0) == 0) return "p " + value;
  return "p = " + value;
}

}  // namespace

std::string PEquals(double p) { return WithRelation(FormatP(p)); }
std::string PEquals(const stats::PValue& p) { return WithRelation(FormatP(p)); }

}  // namespace twinprobe
