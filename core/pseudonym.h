#pragma once
// Keyed pseudonyms for employers (docs/architecture.md, "Store rules"): the key is an
// HMAC-SHA-256 of the normalised employer name under a per-study secret, so
// the same employer gets the same key within a study, while the key reveals
// nothing once `purge` has removed the secret and the employer table.
#include <string>

namespace twinprobe {

class Store;

// Returns "E-" + 10 hex characters. Creates the study's secret on first use
// (call inside a write transaction).
std::string EmployerKey(Store& store, const std::string& employer_name);

// "hmac:" + HMAC-SHA-256 of `value` under the same per-study secret: what
// is sealed in place of a mail sender's address or subject. A plain SHA-256
// of an address would let anyone who guesses the address confirm it, even
// after purge; once purge has deleted the secret, this digest confirms
// nothing. Creates the secret on first use (call inside a write
// transaction).
std::string KeyedDigest(Store& store, const std::string& value);

// Sets the study's secret to `secret` unless it has one already (then
// nothing changes, so pseudonyms stored before keep their meaning). For a
// study whose pseudonyms must repeat exactly (the demo); call inside a write
// transaction.
void SeedEmployerKeySecret(Store& store, const std::string& secret);

// Lowercased, inner whitespace collapsed, trimmed.
std::string NormaliseName(const std::string& name);

}  // namespace twinprobe
