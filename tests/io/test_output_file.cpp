// io::OutputFile over an existing file larger than the writeback step (4 MiB): the old
// file's pages are dropped from the cache and the new bytes' writing to disk started while
// writing, yet the old content stays whole until commit(), and after it the new content is
// all there.
#include <cstdio>
#include <fstream>
#include <iterator>
#include <string>

#include <unistd.h>

#include <catch2/catch.hpp>

#include "shaftwork/io/atomic_file.hpp"

namespace {

std::string read_all(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

// `bytes` bytes of a pattern that differs with `seed`, so that a stale page would show.
std::string pattern(std::size_t bytes, char seed) {
  std::string text(bytes, '\0');
  for (std::size_t i = 0; i < bytes; ++i) text[i] = static_cast<char>('a' + (i * 7 + seed) % 26);
  return text;
}

void write_in_pieces(shaftwork::io::OutputFile& file, const std::string& text) {
  constexpr std::size_t kPiece = 300 * 1024;  // as a batch writes its chunks
  for (std::size_t at = 0; at < text.size(); at += kPiece) file.write(std::string_view(text).substr(at, kPiece));
}

}  // namespace

TEST_CASE("replacing a large file: the old content whole until commit, the new one whole after") {
  const std::string path = "output_file_test_" + std::to_string(::getpid()) + ".txt";
  const std::string old_text = pattern(11 << 20, 3);
  const std::string new_text = pattern(9 << 20, 11);
  {
    std::ofstream(path, std::ios::binary) << old_text;
  }
  {
    shaftwork::io::OutputFile file(path);
    write_in_pieces(file, new_text);
    CHECK(read_all(path) == old_text);  // written but not committed: abandoned below
  }
  CHECK(read_all(path) == old_text);
  {
    shaftwork::io::OutputFile file(path);
    write_in_pieces(file, new_text);
    file.commit();
  }
  CHECK(read_all(path) == new_text);
  std::remove(path.c_str());
}
