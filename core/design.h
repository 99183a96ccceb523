#pragma once
// The study design as plain data: what `study.toml` says, after parsing and
// validation (planner/design_file.h reads it; every other module takes it as
// a value). Field names follow the words of docs/architecture.md.
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace twinprobe {

// Where a value came from in study.toml, for error messages.
struct SourcePos {
  int line = 0;
  int column = 0;
};

struct Factor {
  std::string name;
  std::vector<std::string> levels;
  std::string reference;  // one of levels
  SourcePos pos;
  // Template fields this factor sets, one value per level in `levels` order,
  // e.g. birth_year = ["2003", "1979"] for levels ["younger", "older"]. The
  // factor controls these fields: they may differ between the probes of a set.
  std::map<std::string, std::vector<std::string>> fields;
  // "within": every vacancy receives every level (its set holds one probe
  // per level); "between": each vacancy receives one level, drawn by blocked
  // randomisation within the strata (planner/assign.h).
  std::string vary = "within";
  std::string label;                          // display name; "" = name
  std::map<std::string, std::string> labels;  // level -> display label
  // Ordered levels: one number per level in `levels` order (e.g. ages 28,
  // 45, 58), for the trend test; empty when the levels are not ordered.
  std::vector<double> scores;

  bool is_between() const { return vary == "between"; }
  // The level's display label, else the level itself.
  std::string LevelLabel(const std::string& level) const;
  // The factor's display label, else its name.
  std::string DisplayName() const { return label.empty() ? name : label; }
};

// One combination of levels, e.g. {origin: "coastal"}. label is
// "origin=coastal" (several factors: "gender=f,origin=coastal").
struct Arm {
  std::string label;
  std::map<std::string, std::string> levels;  // factor -> level
  bool is_reference = false;
};

// A name pool: the names that signal one level of the name factor (or one
// combination of levels when names signal several factors, e.g. gender and
// origin). Every pool is keyed by the same factors, Design::name_factors.
struct NamePool {
  std::string factor;  // the single name factor ("" when keyed by several)
  std::string level;   // its level ("" when keyed by several)
  std::string file;  // relative to the study folder; CSV with a header (at least given_name,family_name)
  std::map<std::string, std::string> levels;  // name factor -> level, always filled
  SourcePos pos;
};

struct OutcomeScheme {
  std::vector<std::string> codes = {"none", "rejection", "info_request", "invitation", "offer"};
  std::vector<std::string> positive = {"info_request", "invitation", "offer"};
  int window_days = 28;
  bool is_positive(const std::string& code) const;
  bool has_code(const std::string& code) const;
};

struct Schedule {
  int gap_min_hours = 24;
  int gap_max_hours = 72;
  std::vector<int> weekdays = {0, 1, 2, 3, 4};  // 0 = Monday
  std::string start;                            // YYYY-MM-DD, first sending day
  int hour_open = 9;     // sending hours [hour_open, hour_close), UTC
  int hour_close = 17;
  int sets_per_day = 20;  // sets started per sending day, in vacancy-file order
  int early_days = 1;     // a sending may be this many days before the first planned one
  SourcePos gap_pos;      // where gap_hours was written (for messages)
};

struct AnalysisPlan {
  std::string primary = "positive_callback";
  std::string correction = "holm";  // bonferroni | holm | hochberg | hommel | bh | by | none
  double alpha = 0.05;
  std::vector<int> looks;  // planned interim looks, in completed sets
  // Lan–DeMets spending function of the monitoring plan: "obf" (O'Brien–
  // Fleming type) or "pocock" (stats/sequential.h). Part of the frozen plan
  // whenever looks are planned; `monitor --spending` with another value is a
  // deviation.
  std::string spending = "obf";
  // Paired designs: the margin m of an equivalence test (two one-sided
  // tests that the paired difference of callback rates lies in (-m, m));
  // 0 = no equivalence test.
  double equivalence_margin = 0;
};

struct EthicsBlock {
  std::string approval;        // reference of the ethics board's approval
  int retention_days = 0;
  int decline_within_hours = 0;
  int cap_per_employer = 0;
  bool present = false;
};

// One extraction rule of a [[source]]: a field of each list item, written
// "SELECTOR" (the text of the first match) or "SELECTOR @ATTR" (an
// attribute); an empty selector means the item itself. The selector syntax
// is in docs/fetch.md; collector/extract.h compiles and checks it.
struct FieldRule {
  std::string name;
  std::string rule;
  bool optional = false;  // a missing optional field is left out, not a failure
  SourcePos pos;
};

// A permitted web source for a listing audit (docs/design-file.md: [[source]]; read by
// planner/source_section.h, fetched by collector/fetch_run.h).
struct Source {
  std::string name;
  std::vector<std::string> allow_hosts;  // "host" or "host:port", lower case
  std::string url;  // pattern with {query} {location} {page}
  std::vector<std::string> queries;
  std::vector<std::string> locations;
  int pages = 1;                       // pages 1..pages of every query x location
  int page_limit = 100;                // list pages fetched per run, at most
  double min_interval_seconds = 5.0;   // between two requests to one host
  std::string user_agent;              // product/version, e.g. "VeldmarkListingAudit/1.0"
  std::string contact;                 // e-mail or https URL, sent in the User-Agent
  double connect_timeout_seconds = 10;
  double timeout_seconds = 30;         // whole exchange
  int64_t max_body_bytes = 5 << 20;
  int retries = 3;                     // extra attempts after a 429 or 503
  double backoff_seconds = 2;          // first wait; doubles per attempt
  double retry_after_cap_seconds = 120;  // a longer Retry-After gives up instead of waiting
  int max_redirects = 5;
  // Extraction rules ([source.extract]).
  std::string list_selector;  // optional: the list element; items are searched inside it
  std::string item_selector;
  std::string item_key;       // name of the field that identifies an item
  std::vector<FieldRule> fields;
  SourcePos pos, url_pos, list_pos, item_pos;

  // "user_agent (+contact)", the header sent with every request.
  std::string UserAgentHeader() const { return user_agent + " (+" + contact + ")"; }
  // The robots.txt product token: user_agent up to the first '/' or space.
  std::string ProductToken() const { return user_agent.substr(0, user_agent.find_first_of("/ ")); }
};

// The [mail] section (planner/mail_section.h reads it; docs/mail.md): where
// responses arrive and the transparent rules that suggest a response code.
// A suggestion is never a response: a person confirms it with `review`.
struct MailPhraseRule {
  std::string code;                  // one of the outcome scheme's codes
  std::vector<std::string> phrases;  // matched case-insensitively, as whole words, across line breaks
  SourcePos pos;
};

struct MailRules {
  std::vector<std::string> mbox;     // mbox files (relative to the study folder, or absolute)
  std::vector<std::string> maildir;  // Maildir folders (holding cur/ and new/)
  std::vector<std::string> imap;     // imap:// or imaps:// URLs of one folder, without credentials
  // Shared mail hosts: a sender there says nothing about which employer wrote.
  std::vector<std::string> generic_domains;
  // In precedence order: when phrases of several codes match, the first rule's code is suggested.
  std::vector<MailPhraseRule> suggest;
  // A phrase is set aside (shown, not counted) when one of these words stands
  // among the four words before it in the same sentence ("we cannot invite you").
  std::vector<std::string> negations;
  int excerpt_chars = 400;  // how much of a message the review queue keeps (purge clears it)
  bool present = false;     // false: the design has no [mail] section and the built-in rules apply
};

struct Design {
  std::string study_id;
  std::string title;
  uint64_t seed = 1;
  std::string kind = "paired";  // paired | sets | unpaired | listing (a listing audit: no probes)
  std::vector<Factor> factors;
  std::vector<Arm> arms;  // arms[reference_arm] is the reference
  int reference_arm = 0;
  std::string arms_include = "all";  // all | neighbours | list
  std::vector<std::string> name_factors;  // factors the name pools are keyed by
  std::vector<NamePool> name_pools;
  std::string mailbox_pattern = "{given}.{family}@mail.example";  // placeholders
  std::string phone_pattern;
  std::vector<std::string> templates;  // files relative to the study folder
  std::vector<std::string> factor_fields;  // template fields a factor controls (given_name, …)
  Schedule schedule;
  OutcomeScheme outcomes;
  std::vector<std::string> strata;  // vacancy columns
  std::string vacancies_file = "vacancies.csv";
  AnalysisPlan analysis;
  EthicsBlock ethics;
  std::vector<Source> sources;
  MailRules mail;
  // [team] members: the field team, by the names they sign in to the desk
  // with (desk/). Not part of the canonical text: who does the fieldwork is
  // not part of the design that `freeze` fixes.
  std::vector<std::string> team;
  std::string canonical;  // canonical text of the design (hashed by freeze)
  // The input files of the analysis as read with the design (FormatInputs of
  // planner/freeze_inputs.h); "" when the design was parsed from text alone.
  std::string inputs;
};

// The analysis plan in canonical form: one "key=value" line per item, keys in
// a fixed order (kind, arms, reference, outcome codes, positive codes, window,
// strata, primary, correction, alpha, looks). `freeze` hashes and stores it;
// analysis compares it item by item to list deviations.
std::string CanonicalAnalysisPlan(const Design& design);

}  // namespace twinprobe
