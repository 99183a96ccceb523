// desk/passphrase.h: PBKDF2-HMAC-SHA-256 and the passphrase rules.
#include "desk/passphrase.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("desk passphrase: PBKDF2-HMAC-SHA-256 gives the RFC 7914 section 11 vectors") {
  // Percival and Josefsson (2016), RFC 7914 "The scrypt Password-Based Key
  // Derivation Function", section 11, both PBKDF2-HMAC-SHA256 vectors; the
  // same values come from Python's hashlib.pbkdf2_hmac("sha256", …).
  CHECK(Pbkdf2Sha256Hex("passwd", "salt", 1, 64) ==
        "55ac046e56e3089fec1691c22544b605f94185216dde0465e68b9d57c20dacbc"
        "49ca9cccf179b645991664b39d77ef317c71b845b1e30bd509112041d3a19783");
  CHECK(Pbkdf2Sha256Hex("Password", "NaCl", 80000, 64) ==
        "4ddcd8f60b98be21830cee5ef22701f9641a4418d04c0414aeff08876b34ab56"
        "a1d425a1225833549adb841b51c9b3176a272bdebba1d078478f62b397f33c8d");
}

TEST_CASE("desk passphrase: a stored hash accepts its passphrase and nothing else") {
  StoredPassphrase p = HashPassphrase("Ada Moss", "meadow lantern river");
  CHECK(p.scheme == "pbkdf2-sha256");
  CHECK(p.iterations == 600000);
  CHECK(p.salt_hex.size() == 32);
  CHECK(p.hash_hex.size() == 64);
  CHECK(p.hash_hex.find("meadow") == std::string::npos);
  CHECK(PassphraseMatches(p, "meadow lantern river"));
  CHECK_FALSE(PassphraseMatches(p, "meadow lantern rivers"));
  CHECK_FALSE(PassphraseMatches(p, ""));
  // The same passphrase twice gets two salts, so two different hashes.
  StoredPassphrase q = HashPassphrase("Ada Moss", "meadow lantern river");
  CHECK(q.salt_hex != p.salt_hex);
  CHECK(q.hash_hex != p.hash_hex);
  // A damaged row never matches.
  StoredPassphrase damaged = p;
  damaged.salt_hex = "zz";
  CHECK_FALSE(PassphraseMatches(damaged, "meadow lantern river"));
  damaged = p;
  damaged.scheme = "plain";
  CHECK_FALSE(PassphraseMatches(damaged, "meadow lantern river"));
}

TEST_CASE("desk passphrase: too short, too long and mistyped passphrases are refused with a way out") {
  CHECK(CheckNewPassphrase("short", "short", "").error().Message() ==
        "the passphrase has 5 characters, fewer than 10 \u2014 choose a longer one, for example four unrelated words");
  const std::string long_one(201, 'a');
  CHECK(CheckNewPassphrase(long_one, long_one, "").error().Message() ==
        "the passphrase is longer than 200 characters \u2014 choose a shorter one");
  CHECK(CheckNewPassphrase("meadow lantern", "meadow lanterns", "").error().Message() ==
        "the two passphrases differ \u2014 type the same passphrase in both fields");
  CHECK(CheckNewPassphrase("meadow lantern", "meadow lantern", "").ok());
}
