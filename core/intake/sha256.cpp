#include "intake/sha256.hpp"

#include "intake/sha256_stream.hpp"

namespace plumbline {

std::string sha256Hex(std::string_view bytes)
{
    Sha256Stream digest;
    digest.update(bytes);
    return digest.hexDigest();
}

} // namespace plumbline
