#include "report/chain_warning.h"

#include <nlohmann/json.hpp>

namespace twinprobe {

const char* const kBrokenChainLead = "The study's audit chain is broken.";

std::string BrokenChainDetail(const ReportContext& ctx) {
  if (ctx.audit_intact) return "";
  std::string detail = ctx.audit_problem.empty() ? "" : "First broken link: " + ctx.audit_problem;
  if (!detail.empty() && detail.back() != '.') detail += '.';
  return (detail.empty() ? "" : detail + " ") +
         "Stored data changed outside twinprobe; run 'twinprobe verify' before relying on these numbers.";
}

std::string WithChainWarningText(const std::string& text, const ReportContext& ctx) {
  if (ctx.audit_intact) return text;
  return std::string("WARNING: ") + kBrokenChainLead + " " + BrokenChainDetail(ctx) + "\n\n" + text;
}

std::string WithChainWarningJson(const std::string& json, const ReportContext& ctx) {
  if (ctx.audit_intact) return json;
  nlohmann::json j = nlohmann::json::parse(json);
  j["audit_warning"] = std::string(kBrokenChainLead) + " " + BrokenChainDetail(ctx);
  return j.dump(2) + "\n";
}

}  // namespace twinprobe
