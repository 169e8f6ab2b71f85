#include "intake/sha256_stream.hpp"

#include <openssl/evp.h>

#include <array>
#include <stdexcept>

namespace plumbline {

Sha256Stream::Sha256Stream()
    : m_context(EVP_MD_CTX_new(), &EVP_MD_CTX_free)
{
    if (!m_context || EVP_DigestInit_ex(m_context.get(), EVP_sha256(), nullptr) != 1)
        throw std::runtime_error("libcrypto could not start a SHA-256 digest");
}

void Sha256Stream::update(std::string_view bytes)
{
    if (EVP_DigestUpdate(m_context.get(), bytes.data(), bytes.size()) != 1)
        throw std::runtime_error("libcrypto could not compute a SHA-256 digest");
}

std::string Sha256Stream::hexDigest()
{
    std::array<unsigned char, EVP_MAX_MD_SIZE> digest{};
    unsigned int length = 0;
    if (EVP_DigestFinal_ex(m_context.get(), digest.data(), &length) != 1)
        throw std::runtime_error("libcrypto could not compute a SHA-256 digest");
    static const char* hex = "0123456789abcdef";
    std::string out;
    out.reserve(2 * length);
    for (unsigned int i = 0; i < length; ++i) {
        out += hex[digest[i] >> 4];
        out += hex[digest[i] & 0xF];
    }
    return out;
}

} // namespace plumbline
