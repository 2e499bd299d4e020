// Sha256Hex against the SHA-256 examples of FIPS 180-2 (Appendix B) and the
// empty message's digest (NIST's SHA-256 example values).
#include <string>

#include <gtest/gtest.h>

#include "eval/files.h"

namespace heatdeck {
namespace {

TEST(Sha256Hex, EmptyMessage) {
  EXPECT_EQ(Sha256Hex(""), "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST(Sha256Hex, OneBlockMessage) {
  EXPECT_EQ(Sha256Hex("abc"), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

TEST(Sha256Hex, MultiBlockMessage) {
  EXPECT_EQ(Sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
            "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

TEST(Sha256Hex, LongMessage) {
  EXPECT_EQ(Sha256Hex(std::string(1000000, 'a')),
            "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST(Sha256Hex, BytesAbove0x7FAreHashedAsUnsigned) {
  // The digest of `printf '\xff\x80' | sha256sum` (GNU coreutils).
  EXPECT_EQ(Sha256Hex(std::string("\xff\x80", 2)),
            "85c61621ebd04403f66d96fe300cf10b3844de7358184f1276cb08790fd135f1");
}

}  // namespace
}  // namespace heatdeck
