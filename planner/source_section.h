#pragma once
// Reading the [[source]] tables of study.toml: the permitted web sources of a
// listing audit (docs/fetch.md, "The [[source]] section"). Called once from
// planner/design_file.cpp after the other sections.
//
// A design whose [study].kind is "listing" is a listing audit: it sends no
// probes, so [[factor]], [profiles] and [templates] are optional there
// (design_file.cpp skips them when absent) and at least one [[source]] is
// required (checked here).
#include <string>

#include <toml++/toml.h>

#include "core/design.h"
#include "core/status.h"

namespace twinprobe {

// Appends every [[source]] of `root` to design.sources. `label` is the file
// name used in messages ("study.toml:LINE:COL: what — fix"). Checks keys,
// types and ranges, that every host of the URL pattern is allowlisted, that
// the placeholders match the lists of queries and locations, and that the
// User-Agent names a product token (RFC 9309 section 2.2.1) and a contact.
// Selectors are checked later by collector/extract.h (the planner cannot see
// the collector). Returns the first problem found.
Status ReadSources(const toml::table& root, const std::string& label, Design& design);

}  // namespace twinprobe
