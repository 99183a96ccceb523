#include <catch2/catch.hpp>

#include <filesystem>

#include "planner/template_text.h"
#include "testing/testing.h"

using namespace twinprobe;

TEST_CASE("template: fields and includes are read with their places") {
  testing::TempDir dir;
  testing::WriteFile(dir / "templates/cv.md", "# {{full_name}}\n\n{{include parts/contact.md}}\nBye {{ given_name }}.\n");
  testing::WriteFile(dir / "parts/contact.md", "Mail: {{mailbox}}\n");
  auto doc = LoadTemplate(dir.path(), "templates/cv.md");
  REQUIRE(doc.ok());
  auto uses = doc.value().FieldUses();
  REQUIRE(uses.size() == 3);
  CHECK(uses.at("full_name")->line == 1);
  CHECK(uses.at("full_name")->column == 3);
  CHECK(uses.at("mailbox")->file == dir / "parts/contact.md");
  CHECK(uses.at("given_name")->line == 4);
  auto filled = FillTemplate(doc.value(), {{"full_name", "Ada Moss"}, {"mailbox", "a@x.example"}, {"given_name", "Ada"}});
  REQUIRE(filled.ok());
  CHECK(filled.value() == "# Ada Moss\n\nMail: a@x.example\n\nBye Ada.\n");
}

TEST_CASE("template: an unknown field is named at its place with a suggestion") {
  testing::TempDir dir;
  testing::WriteFile(dir / "t.md", "Hello\n  {{ful_name}}\n");
  auto doc = LoadTemplate(dir.path(), "t.md");
  REQUIRE(doc.ok());
  auto filled = FillTemplate(doc.value(), {{"full_name", "Ada Moss"}});
  REQUIRE_FALSE(filled.ok());
  CHECK(filled.error().Message() == dir / "t.md" + ":2:3: unknown field 'ful_name' (did you mean 'full_name'?) \u2014 "
                                                   "use a field of the profile or the vacancy (see docs/render.md)");
}

TEST_CASE("template: includes cannot leave the study folder") {
  testing::TempDir dir;
  testing::WriteFile(dir / "outside.md", "secret");
  testing::WriteFile(dir / "study/t1.md", "{{include ../outside.md}}");
  testing::WriteFile(dir / "study/t2.md", "x\n{{include /etc/passwd}}");
  testing::WriteFile(dir / "study/t3.md", "{{include link.md}}");
  std::filesystem::create_symlink(dir / "outside.md", dir / "study/link.md");
  const std::string study = dir / "study";
  auto t1 = LoadTemplate(study, "t1.md");
  REQUIRE_FALSE(t1.ok());
  CHECK(t1.error().Message() == study + "/t1.md:1:1: the template file '../outside.md' is outside the study folder "
                                         "\u2014 keep templates and the files they include inside the study folder");
  auto t2 = LoadTemplate(study, "t2.md");
  REQUIRE_FALSE(t2.ok());
  CHECK(t2.error().where == study + "/t2.md:2:1");
  auto t3 = LoadTemplate(study, "t3.md");
  REQUIRE_FALSE(t3.ok());
  CHECK(t3.error().what == "the template file 'link.md' resolves outside the study folder (a symbolic link?)");
  // The top-level template itself is held to the same rule.
  auto top = LoadTemplate(study, "../outside.md");
  REQUIRE_FALSE(top.ok());
  CHECK(top.error().what == "the template file '../outside.md' is outside the study folder");
}

TEST_CASE("template: include cycles, unclosed braces and control characters are refused") {
  testing::TempDir dir;
  testing::WriteFile(dir / "a.md", "{{include b.md}}");
  testing::WriteFile(dir / "b.md", "text\n{{include a.md}}");
  testing::WriteFile(dir / "c.md", "ok\nHello {{full_name\n");
  testing::WriteFile(dir / "d.md", std::string("ok\nbad \x07 bell"));
  testing::WriteFile(dir / "e.md", "{{two words}}");
  auto a = LoadTemplate(dir.path(), "a.md");
  REQUIRE_FALSE(a.ok());
  CHECK(a.error().what == "'a.md' includes itself (an include cycle)");
  CHECK(a.error().where == dir / "b.md:2:1");
  auto c = LoadTemplate(dir.path(), "c.md");
  REQUIRE_FALSE(c.ok());
  CHECK(c.error().where == dir / "c.md:2:7");
  CHECK(c.error().what == "'{{' is not closed by '}}' on the same line");
  auto d = LoadTemplate(dir.path(), "d.md");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().Message() == dir / "d.md:2:5: the template holds a control character (byte 7) \u2014 remove it");
  auto e = LoadTemplate(dir.path(), "e.md");
  REQUIRE_FALSE(e.ok());
  CHECK(e.error().what == "'{{two words}}' is not a field name");
}
