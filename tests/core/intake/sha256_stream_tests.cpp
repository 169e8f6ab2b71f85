#include "intake/sha256_stream.hpp"

#include <catch2/catch.hpp>

#include <string>

using plumbline::Sha256Stream;

// Check values: FIPS 180-2 Appendix B (SHA-256 examples, NIST 2002), fed in pieces that cut the
// 64-byte message blocks anywhere.
TEST_CASE("SHA-256 fed in pieces matches the FIPS 180-2 Appendix B examples", "[sha256]")
{
    const std::string message = "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq";
    for (std::size_t piece : {1u, 3u, 7u, 55u, 56u, 64u}) {
        Sha256Stream digest;
        for (std::size_t from = 0; from < message.size(); from += piece)
            digest.update(std::string_view(message).substr(from, piece));
        CHECK(digest.hexDigest() == "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    }
    Sha256Stream million;
    for (int i = 0; i < 1000; ++i)
        million.update(std::string(1000, 'a'));
    CHECK(million.hexDigest() == "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
    Sha256Stream empty;
    CHECK(empty.hexDigest() == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}
