#pragma once
// Scanners for the repository's own rules (tests/repository_test.cpp). Each
// takes a path relative to the source root and the file's text, and returns
// one "PATH:LINE: what is wrong" finding per offending line.
#include <string>
#include <vector>

namespace twinprobe::testing {

struct RepositoryFile {
  std::string path;  // relative to the source root, '/'-separated
  std::string text;
};

// The tracked files (git ls-files; a walk of the source tree skipping build*
// and hidden folders when git is not there), text files only.
std::vector<RepositoryFile> RepositoryFiles();

// References to notes kept outside the repository (the project's planning
// notes by name, or a path leaving the tree towards them).
std::vector<std::string> FindOutsideReferences(const std::string& path, const std::string& text);

// `#include "MODULE/..."` of a module above the file's own, or beside it in
// the same layer. Layers: core, stats < planner, collector < analysis <
// report, desk < cli. Files outside a module folder are not checked.
std::vector<std::string> FindLayerViolations(const std::string& path, const std::string& text);

// <sqlite3.h> or sqlite3_* in a file under cli/.
std::vector<std::string> FindCliSqliteCalls(const std::string& path, const std::string& text);

// SQL in a module other than core/: SELECT / INSERT / UPDATE / DELETE /
// CREATE TABLE statements and calls of Prepare(, Exec(, QueryInt(, outside
// comment lines. Only module folders are scanned (not tests/ or bench/).
std::vector<std::string> FindSqlOutsideCore(const std::string& path, const std::string& text);

}  // namespace twinprobe::testing
