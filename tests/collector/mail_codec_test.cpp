// Transfer encodings and charsets. Expected values were computed with
// Python's standard library (base64, quopri, codecs), an implementation
// independent of ours; where RFC 2045 and Python differ, the RFC is named.
#include "collector/mail_codec.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("mail codec: base64 decodes, skipping line breaks and junk") {
  // base64.b64encode(b"Hello, Veldmark!") == b"SGVsbG8sIFZlbGRtYXJrIQ=="
  CHECK(DecodeBase64("SGVsbG8sIFZlbGRtYXJrIQ==") == "Hello, Veldmark!");
  CHECK(DecodeBase64("SGVsbG8s\r\nIFZlbGRt\n YXJrIQ==\n") == "Hello, Veldmark!");
  CHECK(DecodeBase64("") == "");
  CHECK(DecodeBase64("w5Z5dg==") == "\xc3\x96yv");  // "Öyv" in UTF-8
}

TEST_CASE("mail codec: quoted-printable joins soft breaks and drops transport blanks") {
  // quopri.decodestring gives b"Caf\xe9 noir  \nline=2"; RFC 2045 section 6.7
  // rule 3 says trailing blanks were added in transport and are deleted.
  CHECK(DecodeQuotedPrintable("Caf=E9 =\nnoir  \nline=3D2") == "Caf\xe9 noir\nline=2");
  CHECK(DecodeQuotedPrintable("a=\r\nb\r\nc") == "ab\nc");
  CHECK(DecodeQuotedPrintable("50=ZZ off, lower=e9") == "50=ZZ off, lower\xe9");
  CHECK(DecodeQuotedPrintable("ends with =") == "ends with ");
}

TEST_CASE("mail codec: Q encoding turns underscores into spaces") {
  CHECK(DecodeQEncoding("Ren=E9e_Halvard") ==
        "Ren\xe9"
        "e Halvard");
  CHECK(DecodeQEncoding("a=5Fb") == "a_b");
}

TEST_CASE("mail codec: UTF-8 validity") {
  CHECK(IsUtf8("plain"));
  CHECK(IsUtf8("\xc3\x96yvind \xe2\x9c\x93 \xf0\x9f\x93\xac"));
  CHECK_FALSE(IsUtf8("\xc0\xaf"));      // overlong '/'
  CHECK_FALSE(IsUtf8("\xed\xa0\x80"));  // a surrogate
  CHECK_FALSE(IsUtf8("caf\xe9"));       // Latin-1
  CHECK_FALSE(IsUtf8("\xe2\x82"));      // cut short
}

TEST_CASE("mail codec: charsets convert to UTF-8") {
  CHECK(ToUtf8("Ren\xe9"
               "e",
               "ISO-8859-1") ==
        "Ren\xc3\xa9"
        "e");
  // Labelled Latin-1 but holding a Windows dash (0x96): read as windows-1252.
  CHECK(ToUtf8("A \x96 B", "iso-8859-1") == "A \xe2\x80\x93 B");
  // "€5".encode("iso-8859-15") == b"\xa45" (in Latin-1 0xA4 would be "¤").
  CHECK(ToUtf8("\xa4"
               "5",
               "iso-8859-15") ==
        "\xe2\x82\xac"
        "5");
  // "Привет".encode("koi8_r") == b"\xf0\xd2\xc9\xd7\xc5\xd4", through iconv.
  CHECK(ToUtf8("\xf0\xd2\xc9\xd7\xc5\xd4", "KOI8-R") == "\xd0\x9f\xd1\x80\xd0\xb8\xd0\xb2\xd0\xb5\xd1\x82");
  CHECK(ToUtf8("Gr\xc3\xbc\xc3\x9f"
               "e",
               "utf-8") ==
        "Gr\xc3\xbc\xc3\x9f"
        "e");
  // RFC 2231 language suffix.
  CHECK(ToUtf8("caf\xe9", "iso-8859-1*fr") == "caf\xc3\xa9");
}

TEST_CASE("mail codec: an unknown or wrong charset never loses the text") {
  CHECK(ToUtf8("Gr\xc3\xbc\xc3\x9f"
               "e",
               "x-invented-charset") ==
        "Gr\xc3\xbc\xc3\x9f"
        "e");
  CHECK(ToUtf8("caf\xe9", "x-invented-charset") == "caf\xc3\xa9");
  CHECK(ToUtf8("caf\xe9", "utf-8") == "caf\xc3\xa9");  // declared UTF-8, is Latin-1
  CHECK(ToUtf8("Gr\xc3\xbc\xc3\x9f"
               "e",
               "") ==
        "Gr\xc3\xbc\xc3\x9f"
        "e");  // undeclared UTF-8
  CHECK(IsUtf8(ToUtf8("\xff\xfe\x80\x81", "us-ascii")));
}
