#pragma once

#include <memory>
#include <string>
#include <string_view>

struct evp_md_ctx_st;

namespace plumbline {

// SHA-256 fed piece by piece (FIPS 180-4, OpenSSL's libcrypto), so a large file is fingerprinted
// block by block without being held whole; the digest equals sha256Hex of the concatenation.
class Sha256Stream {
public:
    Sha256Stream();
    void update(std::string_view bytes);
    // 64 lower-case hex digits; call once, after the last update.
    std::string hexDigest();

private:
    std::unique_ptr<evp_md_ctx_st, void (*)(evp_md_ctx_st*)> m_context;
};

} // namespace plumbline
