#include "intake/sha256.hpp"

#include <catch2/catch.hpp>

#include <string>

using plumbline::sha256Hex;

// Check values: FIPS 180-2 Appendix B (SHA-256 examples, NIST 2002) and the well-known digest of
// the empty string (NIST CSRC "Examples with intermediate values", SHA-256).
TEST_CASE("SHA-256 matches the FIPS 180-2 Appendix B examples", "[sha256]")
{
    CHECK(sha256Hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    CHECK(sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq")
          == "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    CHECK(sha256Hex(std::string(1000000, 'a')) == "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
    CHECK(sha256Hex("") == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}
