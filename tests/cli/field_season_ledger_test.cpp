// Issue 16, "done when": a scripted field season. A 200-vacancy paired study
// and a 3-arm sets study are driven through time with the study clock pinned
// (TWINPROBE_NOW): plan, render, freeze, re-plan before sending, partial
// sending, late answers, corrections, withdrawn vacancies, analyses mid-way
// and at the end, monitor looks. The script keeps its own ledger of what it
// did and derives every count from it (the window rule as docs/methods.md
// states it); analyze and report must agree with the ledger in text and
// JSON, and the HTML report (parsed with Gumbo) with both.
#include <catch2/catch.hpp>

#include <cstdlib>
#include <filesystem>
#include <map>
#include <regex>
#include <set>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"
#include "collector/responses.h"
#include "core/clock.h"
#include "core/meta.h"
#include "report/html_inspect.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

constexpr int64_t kDay = 86400;
constexpr int kWindowDays = 28;

std::string Iso(int64_t t) { return FormatIsoTime(t); }
int64_t At(const std::string& iso) { return ParseIsoTime(iso).value(); }

struct Answer {
  std::string code;
  int64_t at = 0;
};

struct LedgerProbe {
  std::string ref, arm;
  std::optional<int64_t> sent_at;
  std::vector<Answer> answers;  // in the order they are recorded (a later one corrects the earlier)
};

struct LedgerSet {
  std::string vacancy;
  std::vector<LedgerProbe> probes;
  std::optional<int64_t> withdrawn_at;
};

// What the ledger says at the study clock `now`: only what happened by then.
struct Expected {
  int64_t vacancies = 0, sets_analysed = 0, sets_open = 0, sets_incomplete = 0, sets_unsent = 0, sets_withdrawn = 0;
  int64_t probes_sent = 0, responses = 0, responses_late = 0, probes_open = 0;
  std::map<std::string, std::pair<int64_t, int64_t>> arms;  // label -> (probes analysed, positive)
  int64_t a = 0, b = 0, c = 0, d = 0;                       // paired table (reference first)
};

bool IsPositive(const std::string& code) { return code == "info_request" || code == "invitation" || code == "offer"; }

Expected Tally(const std::vector<LedgerSet>& sets, int64_t now, const std::string& reference) {
  Expected e;
  e.vacancies = static_cast<int64_t>(sets.size());
  for (const LedgerSet& s : sets) {
    const bool withdrawn = s.withdrawn_at && *s.withdrawn_at <= now;
    bool all_sent = true, any_sent = false, all_closed = true;
    std::vector<std::pair<std::string, bool>> outcome;  // arm, positive
    for (const LedgerProbe& p : s.probes) {
      const bool sent = p.sent_at && *p.sent_at <= now;
      const Answer* current = nullptr;
      for (const Answer& a : p.answers)
        if (a.at <= now) current = &a;
      all_sent = all_sent && sent;
      any_sent = any_sent || sent;
      if (!sent) continue;
      ++e.probes_sent;
      const int64_t window_end = *p.sent_at + kWindowDays * kDay;
      const bool answered = current && current->code != "none";
      const bool late = answered && current->at > window_end;
      const bool closed = (answered && !late) || now >= window_end;
      if (current && !late) ++e.responses;
      if (!withdrawn && late) ++e.responses_late;
      if (!withdrawn && !closed) ++e.probes_open;
      all_closed = all_closed && closed;
      outcome.emplace_back(p.arm, answered && !late && IsPositive(current->code));
    }
    if (withdrawn) {
      ++e.sets_withdrawn;
    } else if (!all_sent) {
      ++e.sets_incomplete;
      if (!any_sent) ++e.sets_unsent;
    } else if (!all_closed) {
      ++e.sets_open;
    } else {
      ++e.sets_analysed;
      bool ref_pos = false, other_pos = false;
      for (const auto& [arm, positive] : outcome) {
        auto& [n, k] = e.arms[arm];
        ++n;
        k += positive;
        (arm == reference ? ref_pos : other_pos) = (arm == reference ? ref_pos : other_pos) || positive;
      }
      ++(ref_pos ? (other_pos ? e.a : e.b) : (other_pos ? e.c : e.d));
    }
  }
  return e;
}

std::string Sets(int64_t n) { return std::to_string(n) + (n == 1 ? " set" : " sets"); }

// The flow lines analyze prints, in its words, from the ledger.
std::string FlowText(const Expected& e) {
  std::string o = "Flow of the study:\n  " + std::to_string(e.vacancies) + " vacancies planned\n";
  if (e.sets_unsent) o += "    " + Sets(e.sets_unsent) + " left out: no application sent yet\n";
  if (e.sets_incomplete - e.sets_unsent)
    o += "    " + Sets(e.sets_incomplete - e.sets_unsent) + " left out: some applications not sent\n";
  if (e.sets_withdrawn) o += "    " + Sets(e.sets_withdrawn) + " left out: vacancy withdrawn\n";
  o += "  " + Sets(e.sets_analysed + e.sets_open) + " with every application sent\n";
  if (e.sets_open) o += "    " + Sets(e.sets_open) + " left out: still within the 28-day window\n";
  o += "  " + Sets(e.sets_analysed) + " closed (answered or window over)\n";
  o += "  " + Sets(e.sets_analysed) + " analysed\n";
  if (e.responses_late)
    o += "    " + std::to_string(e.responses_late) + (e.responses_late == 1 ? " answer" : " answers") +
         " after the window kept as late, counted as no answer\n";
  return o;
}

class Season {
 public:
  explicit Season(const std::string& study) : study_(study) {}

  testing::CliRun Cli(std::vector<std::string> args, int64_t now, int expect_exit = 0) {
    args.insert(args.begin(), {"--study", study_});
    auto r = RunCli(args, {"TWINPROBE_NOW=" + Iso(now)});
    INFO(args[2] << ": " << r.err);
    REQUIRE(r.exit_code == expect_exit);
    return r;
  }

  // The plan's sets in vacancy order, each probe with its arm.
  std::vector<LedgerSet> ReadPlan() {
    auto store = Store::Open(study_ + "/study.db", false);
    REQUIRE(store.ok());
    Stmt q = store.value()->Prepare(
        "SELECT v.ref, p.ref, a.label FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id "
        "JOIN arm a ON a.id = p.arm_id ORDER BY v.id, a.is_reference DESC, a.id");
    std::vector<LedgerSet> sets;
    while (q.Step()) {
      if (sets.empty() || sets.back().vacancy != q.Text(0)) sets.push_back({q.Text(0), {}, std::nullopt});
      sets.back().probes.push_back({q.Text(1), q.Text(2), std::nullopt, {}});
    }
    return sets;
  }

  // Applies the ledger's sendings and answers that fall in (from, to], in
  // time order, each with the study clock at its own time (the commands'
  // library functions, as the desk calls them: hundreds of `sent` runs of
  // the binary would take minutes in a Debug build).
  void Apply(const std::vector<LedgerSet>& sets, int64_t from, int64_t to) {
    struct Event {
      int64_t at;
      const LedgerProbe* probe;
      const Answer* answer;  // nullptr: the sending
    };
    std::vector<Event> events;
    for (const LedgerSet& s : sets)
      for (const LedgerProbe& p : s.probes) {
        if (p.sent_at && *p.sent_at > from && *p.sent_at <= to) events.push_back({*p.sent_at, &p, nullptr});
        for (const Answer& a : p.answers)
          if (a.at > from && a.at <= to) events.push_back({a.at, &p, &a});
      }
    std::stable_sort(events.begin(), events.end(), [](const Event& x, const Event& y) { return x.at < y.at; });
    auto store = Store::Open(study_ + "/study.db", false);
    REQUIRE(store.ok());
    const OutcomeScheme scheme = StoredOutcomeScheme(*store.value());
    for (const Event& e : events) {
      setenv("TWINPROBE_NOW", Iso(e.at + 60).c_str(), 1);
      if (!e.answer) {
        auto r = RecordSending(*store.value(), e.probe->ref, Iso(e.at));
        INFO(e.probe->ref << ": " << (r.ok() ? "" : r.error().Message()));
        REQUIRE(r.ok());
      } else {
        auto r = RecordResponse(*store.value(), scheme, {e.probe->ref, e.answer->code, Iso(e.at), "mail", "", "record"});
        INFO(e.probe->ref << ": " << (r.ok() ? "" : r.error().Message()));
        REQUIRE(r.ok());
      }
    }
    unsetenv("TWINPROBE_NOW");
  }

  // analyze (text and JSON) and report (text, JSON, HTML) at `now` agree
  // with the ledger and with each other.
  void CheckAnalysis(const std::vector<LedgerSet>& sets, int64_t now, const std::string& reference, bool paired) {
    const Expected e = Tally(sets, now, reference);
    INFO("study clock " << Iso(now));
    const auto j = nlohmann::json::parse(Cli({"--json", "analyze"}, now).out);
    const std::string text = Cli({"analyze"}, now).out;
    CHECK(text.find(FlowText(e)) != std::string::npos);
    CHECK(j["counts"]["vacancies"] == e.vacancies);
    CHECK(j["counts"]["probes_sent"] == e.probes_sent);
    CHECK(j["counts"]["responses"] == e.responses);
    CHECK(j["counts"]["responses_late"] == e.responses_late);
    CHECK(j["counts"]["sets_analysed"] == e.sets_analysed);
    CHECK(j["counts"]["sets_open"] == e.sets_open);
    CHECK(j["counts"]["sets_incomplete"] == e.sets_incomplete);
    const auto& flow = j["flow"];
    CHECK(flow["vacancies_planned"] == e.vacancies);
    CHECK(flow["sets_sent"] == e.sets_analysed + e.sets_open);
    CHECK(flow["sets_closed"] == e.sets_analysed);
    CHECK(flow["sets_analysed"] == e.sets_analysed);
    CHECK(flow["probes_open"] == e.probes_open);
    CHECK(flow["responses_late"] == e.responses_late);
    std::map<std::string, int64_t> excluded;
    for (const auto& x : flow["excluded"]) excluded[x["reason"]] = x["sets"];
    CHECK(excluded == std::map<std::string, int64_t>{{"not_sent", e.sets_unsent},
                                                      {"incomplete", e.sets_incomplete - e.sets_unsent},
                                                      {"still_open", e.sets_open},
                                                      {"withdrawn", e.sets_withdrawn}});
    std::map<std::string, std::pair<int64_t, int64_t>> arms;
    for (const auto& a : j["arms"])
      if (a["probes"] > 0) arms[a["label"]] = {a["probes"], a["positive"]};
    CHECK(arms == e.arms);
    if (paired) {
      CHECK(j["paired"]["table"]["a"] == e.a);
      CHECK(j["paired"]["table"]["b"] == e.b);
      CHECK(j["paired"]["table"]["c"] == e.c);
      CHECK(j["paired"]["table"]["d"] == e.d);
    }
    const std::string open_sentence =
        e.sets_open == 0 ? ""
                         : Sets(e.sets_open) + (e.sets_open == 1 ? " is still within its" : " are still within their") +
                               " 28-day window and " + (e.sets_open == 1 ? "is" : "are") + " not analysed yet.";
    if (open_sentence.empty()) CHECK(j["open_sets"].is_null());
    else CHECK(j["open_sets"] == open_sentence);
    CHECK(text.find(open_sentence) != std::string::npos);

    // The three report formats say the same.
    const std::string dir = study_ + "/reports";
    Cli({"report", "--out", dir + "/r.txt"}, now);
    Cli({"report", "--out", dir + "/r.json"}, now);
    Cli({"report", "--out", dir + "/r.html"}, now);
    const std::string report_text = testing::ReadFile(dir + "/r.txt");
    const auto rj = nlohmann::json::parse(testing::ReadFile(dir + "/r.json"));
    CHECK(report_text.find(FlowText(e)) != std::string::npos);
    CHECK(rj["flow"] == j["flow"]);
    CHECK(rj["counts"] == j["counts"]);
    CHECK(rj["arms"] == j["arms"]);
    const testing::ParsedHtml page(testing::ReadFile(dir + "/r.html"));
    const GumboNode* figure = page.ElementById("figure-flow");
    REQUIRE(figure != nullptr);
    std::map<std::string, int64_t> rows;  // the flow table beside the diagram
    std::function<void(const GumboNode*)> walk = [&](const GumboNode* n) {
      if (n->type != GUMBO_NODE_ELEMENT) return;
      if (testing::ParsedHtml::TagName(n) == "tr") {
        std::vector<std::string> cells;
        const GumboVector& kids = n->v.element.children;
        for (unsigned i = 0; i < kids.length; ++i) {
          const auto* k = static_cast<const GumboNode*>(kids.data[i]);
          const std::string tag = testing::ParsedHtml::TagName(k);
          if (tag == "th" || tag == "td") cells.push_back(testing::ParsedHtml::TextOf(k));
        }
        if (cells.size() == 2 && !cells[1].empty() && std::isdigit(static_cast<unsigned char>(cells[1][0])))
          rows[cells[0]] = std::stoll(std::regex_replace(cells[1], std::regex("[^0-9]"), ""));
        return;
      }
      const GumboVector& kids = n->v.element.children;
      for (unsigned i = 0; i < kids.length; ++i) walk(static_cast<const GumboNode*>(kids.data[i]));
    };
    walk(figure);
    std::map<std::string, int64_t> expected_rows = {
        {"Vacancies planned", flow["vacancies_planned"]},
        {"Sets with every application sent", flow["sets_sent"]},
        {"Sets closed", flow["sets_closed"]},
        {"Sets analysed", flow["sets_analysed"]}};
    for (const auto& x : flow["excluded"]) expected_rows["Left out: " + x["label"].get<std::string>()] = x["sets"];
    CHECK(rows == expected_rows);
    std::vector<std::string> paragraphs;
    for (const auto* p : page.ElementsByTag("p")) paragraphs.push_back(testing::ParsedHtml::TextOf(p));
    if (!open_sentence.empty())
      CHECK(std::find(paragraphs.begin(), paragraphs.end(), open_sentence) != paragraphs.end());
  }

 private:
  std::string study_;
};

// The demo study folder with its vacancy list cut to the first `n` rows.
void CutVacancies(const std::string& study, size_t n) {
  std::string all = testing::ReadFile(study + "/vacancies.csv"), kept;
  size_t lines = 0, pos = 0;
  while (lines <= n && pos < all.size()) {
    const size_t end = all.find('\n', pos);
    kept += all.substr(pos, end - pos + 1);
    pos = end + 1;
    ++lines;
  }
  testing::WriteFile(study + "/vacancies.csv", kept);
}

}  // namespace

TEST_CASE("field season: a 200-vacancy paired study through time agrees with the script's ledger") {
  testing::TempDir dir;
  const std::string study = dir / "veldmark";
  Season season(study);
  const int64_t t0 = At("2027-02-20T10:00:00Z");
  season.Cli({"init"}, t0);
  season.Cli({"plan"}, t0);
  season.Cli({"render"}, t0);
  season.Cli({"freeze"}, t0 + 600);

  // Before sending, the list is cut to 200 vacancies and the design's
  // sending hours changed, then re-planned: the first plan's materials move
  // aside and the change is listed against the freeze.
  CutVacancies(study, 200);
  std::string design = testing::ReadFile(study + "/study.toml");
  design.replace(design.find("hours = [9, 17]"), 15, "hours = [9, 16]");
  testing::WriteFile(study + "/study.toml", design);
  const std::string replan = season.Cli({"plan"}, t0 + kDay).out;
  CHECK(replan.find("to " + study + "/materials/superseded-plan-1: they do not belong to plan 2; run 'twinprobe "
                                    "render' before sending.") != std::string::npos);
  CHECK(std::filesystem::is_directory(study + "/materials/superseded-plan-1"));
  season.Cli({"render"}, t0 + kDay);
  const std::string deviations = season.Cli({"analyze"}, t0 + kDay).out;
  CHECK(deviations.find("The analysis follows the frozen plan: no deviation.") == std::string::npos);
  std::set<std::string> kinds;
  const auto replanned = nlohmann::json::parse(season.Cli({"--json", "analyze"}, t0 + kDay).out);
  for (const auto& d : replanned["preregistration"]["deviations"]) kinds.insert(d["kind"].get<std::string>());
  CHECK(kinds.count("design_edited") == 1);
  CHECK(kinds.count("plan_from_other_design") == 1);
  // The cut vacancy list is a deviation of its own, named by its file (the
  // freeze records every input of the analysis).
  bool vacancy_file_listed = false;
  for (const auto& d : replanned["preregistration"]["deviations"])
    if (d.contains("file") && d["file"].is_string() && d["file"].get<std::string>() == "vacancies.csv")
      vacancy_file_listed = true;
  CHECK(vacancy_file_listed);

  // The ledger: sets 0-149 sent in full (the reference on day i/10 of
  // March, the other a day later), 150-159 only the reference, 160-199
  // nothing. Answers by set number modulo 10: 0, 1 the reference invited;
  // 2 the other; 3 both; 4 both rejected; 5 the reference invited after the
  // window (late); 6 the reference invited, then corrected to a rejection;
  // 7-9 no answer. Sets 7 (sent, unanswered) and 155 (half sent) withdrawn.
  std::vector<LedgerSet> sets = season.ReadPlan();
  REQUIRE(sets.size() == 200);
  const std::string reference = "origin=inland";
  const int64_t march = At("2027-03-01T09:00:00Z");
  for (size_t i = 0; i < sets.size(); ++i) {
    REQUIRE(sets[i].probes.size() == 2);
    LedgerProbe& ref = sets[i].probes[0];
    LedgerProbe& other = sets[i].probes[1];
    REQUIRE(ref.arm == reference);
    if (i >= 160) continue;
    ref.sent_at = march + static_cast<int64_t>(i / 10) * kDay;
    if (i < 150) other.sent_at = *ref.sent_at + kDay;
    const int64_t in_window = 3 * kDay + 3600;
    switch (i % 10) {
      case 0: case 1: ref.answers = {{"invitation", *ref.sent_at + in_window}}; break;
      case 2: if (other.sent_at) other.answers = {{"info_request", *other.sent_at + in_window}}; break;
      case 3:
        ref.answers = {{"invitation", *ref.sent_at + in_window}};
        if (other.sent_at) other.answers = {{"offer", *other.sent_at + in_window}};
        break;
      case 4:
        ref.answers = {{"rejection", *ref.sent_at + in_window}};
        if (other.sent_at) other.answers = {{"rejection", *other.sent_at + in_window}};
        break;
      case 5: ref.answers = {{"invitation", *ref.sent_at + 35 * kDay}}; break;
      case 6: ref.answers = {{"invitation", *ref.sent_at + in_window}, {"rejection", *ref.sent_at + in_window + kDay}}; break;
      default: break;
    }
  }
  sets[7].withdrawn_at = At("2027-03-20T00:00:00Z");
  sets[155].withdrawn_at = At("2027-03-20T00:00:00Z");

  // Mid-fieldwork: everything up to 25 March has happened.
  const int64_t mid = At("2027-03-25T12:00:00Z");
  season.Apply(sets, t0, mid);
  for (size_t i : {size_t{7}, size_t{155}})
    season.Cli({"withdraw", sets[i].vacancy, "--reason", "the posting closed", "--at", Iso(*sets[i].withdrawn_at)},
               mid);
  season.CheckAnalysis(sets, mid, reference, true);
  const Expected at_mid = Tally(sets, mid, reference);
  CHECK(at_mid.sets_open > 0);  // the point of a mid-fieldwork look
  // An unplanned look mid-season is stored and sealed with the alpha it spent.
  auto monitor = nlohmann::json::parse(season.Cli({"--json", "monitor", "--look-now"}, mid).out);
  CHECK(monitor["completed_sets"] == at_mid.sets_analysed);
  CHECK(monitor["planned_sets"] == at_mid.sets_analysed + at_mid.sets_open + at_mid.sets_incomplete);
  CHECK(monitor["new_looks"] == 1);
  REQUIRE(monitor["looks"].size() == 1);
  CHECK(monitor["looks"][0]["kind"] == "unplanned");
  const double alpha_mid = monitor["looks"][0]["alpha_spent"].get<double>();

  // The end: the late answers have come, every window is over.
  const int64_t end = At("2027-06-01T12:00:00Z");
  season.Apply(sets, mid, end);
  season.CheckAnalysis(sets, end, reference, true);
  const Expected at_end = Tally(sets, end, reference);
  CHECK(at_end.sets_open == 0);
  CHECK(at_end.responses_late == 15);  // sets 5, 15, …, 155 less the withdrawn 155
  // The look at the end keeps the stored one as it was and spends only
  // what it left (the alpha carried, not spent afresh).
  monitor = nlohmann::json::parse(season.Cli({"--json", "monitor", "--look-now"}, end).out);
  CHECK(monitor["completed_sets"] == at_end.sets_analysed);
  REQUIRE(monitor["looks"].size() == 2);
  CHECK(monitor["looks"][0]["taken_before"] == true);
  CHECK(monitor["looks"][0]["alpha_spent"].get<double>() == alpha_mid);
  CHECK(monitor["looks"][1]["alpha_spent"].get<double>() >= alpha_mid);
  CHECK(season.Cli({"verify"}, end).out.rfind("The audit chain is intact", 0) == 0);
}

TEST_CASE("field season: a 3-arm sets study through time agrees with the script's ledger") {
  testing::TempDir dir;
  const std::string study = dir / "three";
  Season season(study);
  const int64_t t0 = At("2027-02-20T10:00:00Z");
  season.Cli({"init"}, t0);
  // A third origin level with its own name pool and a third template (no
  // two probes of a set share one), a higher cap per employer, no looks.
  std::string design = testing::ReadFile(study + "/study.toml");
  auto swap = [&](const std::string& from, const std::string& to) {
    const size_t at = design.find(from);
    REQUIRE(at != std::string::npos);
    design.replace(at, from.size(), to);
  };
  swap("kind = \"paired\"", "kind = \"sets\"");
  swap("levels = [\"inland\", \"coastal\"]", "levels = [\"inland\", \"coastal\", \"upland\"]");
  swap("[templates]", "[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"upland\"\nfile = \"names/upland.csv\"\n\n[templates]");
  swap("\"templates/cv_meadow.md\"]", "\"templates/cv_meadow.md\", \"templates/cv_harbour.md\"]");
  swap("looks = [200]\n", "");
  swap("cap_per_employer = 2", "cap_per_employer = 3");
  testing::WriteFile(study + "/study.toml", design);
  testing::WriteFile(study + "/templates/cv_harbour.md", testing::ReadFile(study + "/templates/cv_meadow.md"));
  testing::WriteFile(study + "/names/upland.csv",
                     "given_name,family_name\nAnnika,Fellrode\nBrisa,Hollmark\nCato,Ibenstrand\nDarja,Joskel\n"
                     "Eskil,Kvarnby\nFenna,Lodmoor\nGaro,Mirnholt\nHedda,Nubbevik\nIvo,Ostrumark\nJuno,Pellgard\n"
                     "Kasi,Quillby\nLeif,Rostmere\n");
  CutVacancies(study, 60);
  season.Cli({"plan"}, t0);
  season.Cli({"render"}, t0);
  season.Cli({"freeze"}, t0 + 600);

  // Sets 0-44 sent in full (arms a day apart), 45-49 two of three, 50-59
  // nothing. Answers by set number modulo 6: 0 inland invited; 1 coastal;
  // 2 upland; 3 all three; 4 inland invited late; 5 none. Set 8 withdrawn.
  std::vector<LedgerSet> sets = season.ReadPlan();
  REQUIRE(sets.size() == 60);
  const std::string reference = "origin=inland";
  const int64_t march = At("2027-03-01T09:00:00Z");
  for (size_t i = 0; i < 50; ++i) {
    REQUIRE(sets[i].probes.size() == 3);
    REQUIRE(sets[i].probes[0].arm == reference);
    for (size_t k = 0; k < 3; ++k)
      if (i < 45 || k < 2) sets[i].probes[k].sent_at = march + static_cast<int64_t>(i / 5 + k) * kDay;
    auto invite = [&](size_t k, int64_t after) {
      if (sets[i].probes[k].sent_at) sets[i].probes[k].answers = {{"invitation", *sets[i].probes[k].sent_at + after}};
    };
    switch (i % 6) {
      case 0: invite(0, 2 * kDay); break;
      case 1: invite(1, 2 * kDay); break;
      case 2: invite(2, 2 * kDay); break;
      case 3: for (size_t k = 0; k < 3; ++k) invite(k, 2 * kDay); break;
      case 4: invite(0, 30 * kDay); break;
      default: break;
    }
  }
  sets[8].withdrawn_at = At("2027-03-12T00:00:00Z");

  const int64_t mid = At("2027-03-20T12:00:00Z");
  season.Apply(sets, t0, mid);
  season.Cli({"withdraw", sets[8].vacancy, "--reason", "the employer saw through the test", "--at",
              Iso(*sets[8].withdrawn_at)},
             mid);
  season.CheckAnalysis(sets, mid, reference, false);
  CHECK(Tally(sets, mid, reference).sets_open > 0);

  const int64_t end = At("2027-06-01T12:00:00Z");
  season.Apply(sets, mid, end);
  season.CheckAnalysis(sets, end, reference, false);
  CHECK(Tally(sets, end, reference).responses_late == 8);  // sets 4, 10, …, 46
}
