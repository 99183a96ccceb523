#pragma once
// Reading the store's meta table (newest value of a key wins).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/design.h"

namespace twinprobe {

class Store;

std::optional<std::string> MetaValue(Store& store, const std::string& key);
// Splits a comma-joined meta value ("" gives an empty list).
std::vector<std::string> MetaList(Store& store, const std::string& key);
// Adds a meta row (the key's new value) under audit entry `seq`; call
// inside an AuditedWrite.
void StoreMetaValue(Store& store, int64_t seq, const std::string& key, const std::string& value);
// The outcome scheme the current plan was made with (defaults if absent).
OutcomeScheme StoredOutcomeScheme(Store& store);

}  // namespace twinprobe
