#include "eval/files.h"

#include <filesystem>
#include <fstream>

#include <fmt/format.h>
#include <nettle/sha2.h>

namespace heatdeck {

namespace fs = std::filesystem;

bool ReadWholeFile(const std::string& path, size_t max_bytes, std::string* out, std::string* why) {
  std::error_code ec;
  if (!fs::is_regular_file(path, ec)) {
    *why = fs::exists(path, ec) ? "not a regular file" : "no such file";
    return false;
  }
  const auto size = fs::file_size(path, ec);
  if (ec) {
    *why = ec.message();
    return false;
  }
  if (size > max_bytes) {
    *why = fmt::format(
        "the file is {} bytes, over the limit of {} bytes (raise it with "
        "--max-file-size)",
        size, max_bytes);
    return false;
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) {
    *why = "cannot be opened for reading";
    return false;
  }
  // Read straight into the string at its known size (a stringstream copied
  // the text twice more); a file that grows while being read (or reports
  // size 0, as /proc files do) is read on to its end, up to max_bytes.
  out->resize(static_cast<size_t>(size));
  in.read(out->data(), static_cast<std::streamsize>(size));
  out->resize(static_cast<size_t>(in.gcount()));
  if (in.gcount() == static_cast<std::streamsize>(size)) {
    char more[4096];
    while (out->size() <= max_bytes && in.read(more, sizeof more).gcount() > 0)
      out->append(more, static_cast<size_t>(in.gcount()));
  }
  if (out->size() > max_bytes) {
    *why = fmt::format("the file grew past the limit of {} bytes while being read", max_bytes);
    return false;
  }
  return true;
}

// Nettle's SHA-256 rather than OpenSSL's: OpenSSL 3 sets up its library
// context and default provider on first use, which with loading libcrypto
// cost about 4 ms of process time per run, more than the whole start-up
// budget of `heatdeck check` (tools/bench.sh, P2); Nettle's hash needs no set-up.
std::string Sha256Hex(const std::string& data) {
  sha256_ctx ctx;
  sha256_init(&ctx);
  sha256_update(&ctx, data.size(), reinterpret_cast<const uint8_t*>(data.data()));
  uint8_t digest[SHA256_DIGEST_SIZE];
  sha256_digest(&ctx, sizeof digest, digest);
  static constexpr char kHex[] = "0123456789abcdef";
  std::string hex(2 * sizeof digest, '0');
  for (size_t i = 0; i < sizeof digest; ++i) {
    hex[2 * i] = kHex[digest[i] >> 4];
    hex[2 * i + 1] = kHex[digest[i] & 0x0F];
  }
  return hex;
}

std::string CanonicalDir(const std::string& dir) {
  std::error_code ec;
  fs::path p = fs::canonical(dir.empty() ? fs::path(".") : fs::path(dir), ec);
  if (ec || !fs::is_directory(p, ec)) return "";
  return p.string();
}

namespace {

bool Inside(const fs::path& file, const std::string& dir) {
  const fs::path d(dir);
  auto fi = file.begin();
  for (auto di = d.begin(); di != d.end(); ++di, ++fi) {
    if (fi == file.end() || *fi != *di) return false;
  }
  return true;
}

}  // namespace

bool ResolveContained(const std::string& base_dir, const std::string& path,
                      const std::vector<std::string>& allowed, std::string* resolved,
                      std::string* why) {
  fs::path p(path);
  if (p.is_relative()) p = fs::path(base_dir.empty() ? "." : base_dir) / p;
  std::error_code ec;
  const fs::path canon = fs::canonical(p, ec);
  if (ec) {
    *why = "no such file";
    return false;
  }
  for (const auto& dir : allowed) {
    if (!dir.empty() && Inside(canon, dir)) {
      *resolved = canon.string();
      return true;
    }
  }
  *why = fmt::format(
      "'{}' lies outside the deck's folder and the template library; "
      "allow its folder with --allow-path",
      canon.string());
  return false;
}

}  // namespace heatdeck
