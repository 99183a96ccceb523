#include <catch2/catch.hpp>

#include <algorithm>

#include "core/schema.h"
#include "core/store.h"
#include "core/verify.h"

using namespace twinprobe;

TEST_CASE("verify: a freshly migrated store has exactly the reference schema") {
  auto store = Store::Open(":memory:", true);
  REQUIRE(store.ok());
  CHECK(SchemaDifferences(*store.value(), kSchemaVersion).empty());
  // The reference of an older version lacks what later migrations add.
  // Compared as sorted lists: the order of the messages is not what is tested.
  auto differences = SchemaDifferences(*store.value(), 3);
  std::sort(differences.begin(), differences.end());
  CHECK(differences ==
        std::vector<std::string>{
            "the store holds a table 'application_covariate' that twinprobe does not create",
            "the store holds a table 'desk_passphrase' that twinprobe does not create",
            "the store holds a table 'factor_design' that twinprobe does not create",
            "the store holds a table 'handout' that twinprobe does not create",
            "the store holds a table 'handout_vacancy' that twinprobe does not create",
            "the store holds a table 'level_design' that twinprobe does not create",
            "the store holds a table 'mail_excerpt_seal' that twinprobe does not create",
            "the store holds a table 'material_file' that twinprobe does not create",
            "the store holds a table 'merge_choice' that twinprobe does not create",
            "the store holds a table 'merged_row' that twinprobe does not create",
            "the store holds a table 'monitor_look' that twinprobe does not create",
            "the store holds a table 'office_merge' that twinprobe does not create",
            "the store holds a table 'office_origin' that twinprobe does not create",
            "the store holds a table 'sending_detail' that twinprobe does not create",
            "the store holds a table 'withdrawal' that twinprobe does not create",
            "the store holds an index 'application_covariate_seq' on application_covariate that twinprobe does not create",
            "the store holds an index 'desk_passphrase_member' on desk_passphrase that twinprobe does not create",
            "the store holds an index 'desk_passphrase_seq' on desk_passphrase that twinprobe does not create",
            "the store holds an index 'factor_design_seq' on factor_design that twinprobe does not create",
            "the store holds an index 'handout_seq' on handout that twinprobe does not create",
            "the store holds an index 'handout_vacancy_seq' on handout_vacancy that twinprobe does not create",
            "the store holds an index 'level_design_seq' on level_design that twinprobe does not create",
            "the store holds an index 'mail_excerpt_seal_seq' on mail_excerpt_seal that twinprobe does not create",
            "the store holds an index 'material_file_probe' on material_file that twinprobe does not create",
            "the store holds an index 'material_file_seq' on material_file that twinprobe does not create",
            "the store holds an index 'merge_choice_seq' on merge_choice that twinprobe does not create",
            "the store holds an index 'merged_row_main' on merged_row that twinprobe does not create",
            "the store holds an index 'merged_row_office' on merged_row that twinprobe does not create",
            "the store holds an index 'merged_row_seq' on merged_row that twinprobe does not create",
            "the store holds an index 'monitor_look_seq' on monitor_look that twinprobe does not create",
            "the store holds an index 'office_merge_seq' on office_merge that twinprobe does not create",
            "the store holds an index 'office_origin_seq' on office_origin that twinprobe does not create",
            "the store holds an index 'response_supersedes' on response that twinprobe does not create",
            "the store holds an index 'sending_detail_seq' on sending_detail that twinprobe does not create",
            "the store holds an index 'withdrawal_seq' on withdrawal that twinprobe does not create",
            "the store holds an index 'withdrawal_vacancy' on withdrawal that twinprobe does not create"});
}

TEST_CASE("verify: a trigger added to a table is named with its table") {
  auto store = Store::Open(":memory:", true);
  store.value()->Exec("CREATE TRIGGER t AFTER INSERT ON sending BEGIN SELECT 1; END");
  CHECK(SchemaDifferences(*store.value(), kSchemaVersion) ==
        std::vector<std::string>{"the store holds a trigger 't' on sending that twinprobe does not create"});
}

TEST_CASE("verify: a head is 64 hex digits, lowercased") {
  const std::string upper(64, 'A');
  REQUIRE(ParseHead(upper, "--head").ok());
  CHECK(ParseHead(upper, "--head").value() == std::string(64, 'a'));
  auto short_head = ParseHead("abc", "--head");
  REQUIRE_FALSE(short_head.ok());
  CHECK(short_head.error().Message() ==
        "--head: 'abc' is not a chain head (a head is 64 hex digits) \u2014 copy the full head that a writing command "
        "or 'twinprobe verify' printed");
}
