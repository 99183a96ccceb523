#include "planner/profiles.h"

#include <cctype>
#include <cstdio>

namespace twinprobe {
namespace {

std::string Slug(const std::string& s) {
  std::string out;
  for (unsigned char c : s)
    if (std::isalnum(c)) out += static_cast<char>(std::tolower(c));
    else if (c >= 0x80) out += static_cast<char>(c);  // keep UTF-8 letters as written
  return out;
}

std::string FillPattern(std::string pattern, const std::string& given, const std::string& family, int serial) {
  auto replace = [&](const std::string& key, const std::string& value) {
    for (size_t pos = 0; (pos = pattern.find(key, pos)) != std::string::npos; pos += value.size())
      pattern.replace(pos, key.size(), value);
  };
  char n[16];
  std::snprintf(n, sizeof n, "%03d", serial);
  replace("{given}", Slug(given));
  replace("{family}", Slug(family));
  replace("{n}", n);
  return pattern;
}

}  // namespace

const std::vector<std::string>& ContactPlaceholders() {
  static const std::vector<std::string> p = {"{given}", "{family}", "{n}"};
  return p;
}

int PoolOfArm(const Design& d, const Arm& arm) {
  for (size_t i = 0; i < d.name_pools.size(); ++i) {
    bool match = !d.name_pools[i].levels.empty();
    for (const auto& [factor, level] : d.name_pools[i].levels) {
      auto it = arm.levels.find(factor);
      match = match && it != arm.levels.end() && it->second == level;
    }
    if (match) return static_cast<int>(i);
  }
  return -1;
}

Result<std::vector<PlannedProfile>> BuildProfiles(const Design& d, const std::vector<NameList>& pools) {
  std::vector<PlannedProfile> out;
  // mailbox / phone -> the name that owns it, to refuse two names sharing one.
  std::map<std::string, std::string> mailbox_owner, phone_owner;
  int serial = 0;
  for (size_t a = 0; a < d.arms.size(); ++a) {
    const Arm& arm = d.arms[a];
    int pool = PoolOfArm(d, arm);
    if (pool < 0 || pool >= static_cast<int>(pools.size()))
      return BadInput("", "arm " + arm.label + " has no name pool", "add one under [profiles]");
    const NameList& list = pools[pool];
    for (size_t i = 0; i < list.names.size(); ++i) {
      PlannedProfile p;
      p.arm = static_cast<int>(a);
      p.pool = pool;
      p.given_name = list.names[i].first;
      p.family_name = list.names[i].second;
      ++serial;
      p.mailbox = FillPattern(d.mailbox_pattern, p.given_name, p.family_name, serial);
      p.phone = d.phone_pattern.empty() ? "" : FillPattern(d.phone_pattern, p.given_name, p.family_name, serial);
      const std::string full = p.full_name();
      std::string where = list.path + ":" + std::to_string(list.lines.empty() ? 0 : list.lines[i]);
      for (auto [owner, value, what] : {std::tuple{&mailbox_owner, p.mailbox, "mailbox"},
                                         std::tuple{&phone_owner, p.phone, "phone number"}}) {
        if (value.empty()) continue;
        auto [it, fresh] = owner->emplace(value, full);
        if (!fresh && it->second != full)
          return BadInput(where, std::string("the ") + what + " '" + value + "' would be shared by '" + it->second +
                                     "' and '" + full + "'",
                          "add {n} (or {given} and {family}) to the pattern under [profiles]");
      }
      p.fields["given_name"] = p.given_name;
      p.fields["family_name"] = p.family_name;
      p.fields["full_name"] = full;
      p.fields["mailbox"] = p.mailbox;
      p.fields["phone"] = p.phone;
      for (size_t c = 0; c < list.extra_columns.size(); ++c) p.fields[list.extra_columns[c]] = list.extra[i][c];
      for (const auto& f : d.factors) {
        size_t level = 0;
        while (level < f.levels.size() && f.levels[level] != arm.levels.at(f.name)) ++level;
        for (const auto& [field, values] : f.fields) p.fields[field] = values.at(level);
      }
      out.push_back(std::move(p));
    }
  }
  return out;
}

}  // namespace twinprobe
