// Fuzzes mail reading: the bytes as one raw RFC 5322 message
// (collector/mail_message.h), then through the fresh-text, search-text and
// suggestion steps `mail` runs on it, and the same bytes as an mbox file
// (collector/mail_source.h). Never a crash or hang; the decoded subject,
// From, To and text are valid UTF-8 as the header promises; addresses are
// lowercased, hold an '@' and are not repeated; search-text offsets stay
// inside the text; evidence contexts are valid UTF-8; an mbox either splits
// into messages that together hold no more bytes than the file (each found
// at "PATH:LINE") or is refused with a positioned message. Each input's
// peak memory stays under 256 MB above its start (tests/fuzz/fuzz_memory.h).
#include <unistd.h>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "collector/mail_codec.h"
#include "collector/mail_message.h"
#include "collector/mail_source.h"
#include "collector/mail_suggest.h"
#include "collector/mail_text.h"
#include "planner/mail_section.h"
#include "tests/fuzz/fuzz_check.h"
#include "tests/fuzz/fuzz_memory.h"

using namespace twinprobe;

namespace {

void CheckAddresses(const std::vector<std::string>& list) {
  for (size_t i = 0; i < list.size(); ++i) {
    const std::string& a = list[i];
    FUZZ_CHECK(a.find('@') != std::string::npos);
    for (char c : a) FUZZ_CHECK(!(c >= 'A' && c <= 'Z'));
    FUZZ_CHECK(std::find(list.begin(), list.begin() + static_cast<std::ptrdiff_t>(i), a) == list.begin() + static_cast<std::ptrdiff_t>(i));
  }
}

void CheckSearchText(const SearchText& st) {
  FUZZ_CHECK(st.origin.size() == st.folded.size() + 1);
  uint32_t previous = 0;
  for (uint32_t o : st.origin) {
    FUZZ_CHECK(o >= previous && o <= st.plain.size());
    previous = o;
  }
  FUZZ_CHECK(st.origin.back() == st.plain.size());
}

void CheckMessage(std::string_view raw) {
  static const Suggester suggester(DefaultMailRules(OutcomeScheme{}));  // the built-in rules, folded once
  MailMessage m = ParseMailMessage(raw);
  FUZZ_CHECK(IsUtf8(m.subject));
  FUZZ_CHECK(IsUtf8(m.from));
  FUZZ_CHECK(IsUtf8(m.to));
  FUZZ_CHECK(IsUtf8(m.text));
  FUZZ_CHECK(m.attachments >= 0);
  FUZZ_CHECK(m.is_forward || !m.forwarded_date);
  CheckAddresses(m.sender_addresses);
  CheckAddresses(m.recipient_addresses);
  CheckAddresses(m.forwarded_sender_addresses);

  std::string fresh = FreshText(m.text, m.subject);
  FUZZ_CHECK(IsUtf8(fresh));
  SearchText st = MakeSearchText(fresh);
  CheckSearchText(st);
  CheckSearchText(MakeSearchText(m.subject));
  FUZZ_CHECK(IsUtf8(Clip(st.plain, 40)));
  Suggestion s = suggester.Suggest(m.subject, fresh, 30);
  for (const PhraseEvidence& e : s.evidence) FUZZ_CHECK(IsUtf8(e.context));
  FUZZ_CHECK(s.code.empty() || std::any_of(s.evidence.begin(), s.evidence.end(), [&](const PhraseEvidence& e) {
               return e.code == s.code && !e.negated;
             }));
}

void CheckMbox(std::string_view bytes) {
  static const std::string path =
      (std::filesystem::temp_directory_path() / ("twinprobe-mail-fuzz-" + std::to_string(getpid()) + ".mbox")).string();
  {
    FILE* f = std::fopen(path.c_str(), "wb");
    FUZZ_CHECK(f != nullptr);
    FUZZ_CHECK(std::fwrite(bytes.data(), 1, bytes.size(), f) == bytes.size());
    std::fclose(f);
  }
  auto mails = ReadMbox(path);
  std::remove(path.c_str());
  std::string_view text = bytes;
  if (text.rfind("\xEF\xBB\xBF", 0) == 0) text.remove_prefix(3);  // skipped by ReadMbox
  if (!mails.ok()) {
    FUZZ_CHECK(text.rfind("From ", 0) != 0);
    FUZZ_CHECK(mails.error().where == path + ":1:1");
    FUZZ_CHECK(!mails.error().what.empty() && !mails.error().fix.empty());
    return;
  }
  FUZZ_CHECK(text.empty() || text.rfind("From ", 0) == 0);
  size_t total = 0;
  for (const RawMail& r : mails.value()) {
    FUZZ_CHECK(r.where.rfind(path + ":", 0) == 0);
    total += r.raw.size();
    std::string canonical = CanonicalRaw(r.raw);
    FUZZ_CHECK(!canonical.empty() && canonical.back() == '\n');
    FUZZ_CHECK(canonical.size() == 1 || canonical[canonical.size() - 2] != '\n');
  }
  FUZZ_CHECK(total <= bytes.size());
  for (const RawMail& r : mails.value()) CheckMessage(r.raw);
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  // The stated bound: a message (and the same bytes as an mbox) costs less
  // than 256 MB above where it started, ASan included; HTML parts are capped
  // by collector/html_bounds.h.
  fuzz::InputMemoryBound bound(256);
  std::string_view raw(reinterpret_cast<const char*>(data), size);
  CheckMessage(raw);
  CheckMbox(raw);
  return 0;
}
