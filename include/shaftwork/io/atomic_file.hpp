// shaftwork/io/atomic_file.hpp — the one writer of output files (-o FILE): whole or not
// at all, and nothing but FILE touched.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <sys/stat.h>

#include "shaftwork/io/byte_stream.hpp"

namespace shaftwork::io {

// Writes an output file. What PATH names decides how:
// - nothing yet, or a regular file: the bytes go, as they come, to a temporary file
//   "PATH.XXXXXX" beside it; commit() flushes that to disk and renames it over PATH
//   (atomic on POSIX file systems), so PATH holds the old content or the whole new one,
//   never a part. An existing file keeps its permission bits, and its owner and group
//   where the system lets us set them; a new file gets 0666 less the umask, as the
//   shell's > would give it. So that commit() does not wait long, every 4 MiB written
//   starts those bytes' way to disk and drops as many of the old file's bytes from the
//   page cache (hints to the kernel; neither changes what either file holds).
// - a symbolic link, or a chain of them: the same for the file it finally names, whose
//   temporary file lies beside it; the link stays a link. A dangling link's target is created.
// - a character or block device or a FIFO (/dev/null, a terminal, a named pipe): written
//   through, as the shell's > would; nothing is renamed, and a reader may see a part.
// - refused (bad_input, before anything is written): a directory, a socket, a regular
//   file with more than one hard link (renaming would cut it from its other names;
//   writing in place could leave it half-written), a file reached only through a link
//   under /proc (as /dev/stdout is when standard output is a file).
// Destroyed without commit() (an error, an exception), it removes the temporary file and
// leaves PATH as it was. SIGINT, SIGTERM, SIGHUP and SIGPIPE remove it too, then end the
// program as the signal would have, so the exit status still names the signal.
// Every failure throws bad_input "PATH: ..." with the system's reason.
class OutputFile final : public ByteSink {
 public:
  explicit OutputFile(std::string path);
  OutputFile(const OutputFile&) = delete;
  OutputFile& operator=(const OutputFile&) = delete;
  ~OutputFile() override;

  void write(std::string_view bytes) override;
  // Makes the output final: flush and rename, or close a device. Once only.
  void commit();

 private:
  void open_temporary(const std::string& final_path, const struct ::stat* existing);
  void remove_temporary() noexcept;
  [[noreturn]] void fail(const char* step);
  void start_writeback(bool all);

  std::string path_;     // as the user gave it, for messages
  std::string target_;   // the name renamed over (symbolic links followed); empty: written through
  std::string temp_;     // the temporary file, while there is one
  int fd_ = -1;
  int replaced_fd_ = -1;  // the file the temporary one replaces, read-only, for a cache hint
  int signal_slot_ = -1;  // where the signal handler finds temp_
  std::optional<FdSink> sink_;
  std::uint64_t written_ = 0;       // bytes written to the temporary file
  std::uint64_t written_back_ = 0;  // of them, those whose writing to disk has been started
};

// Throws bad_input "OUTPUT: is also an input of this run (INPUT); the results would
// overwrite it: write them to another file" when `output` names the same regular file as
// one of `inputs` ("-": standard input). Files are compared by identity (device and inode,
// symbolic links followed), so ./a.json, a link to a.json or a hard link of it all count.
// An output that does not exist yet, or is not a regular file, overwrites no input.
void refuse_output_among_inputs(const std::string& output, const std::vector<std::string>& inputs);

}  // namespace shaftwork::io
