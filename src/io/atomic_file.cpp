#include "shaftwork/io/atomic_file.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <csignal>
#include <cstdio>
#include <cstring>
#include <utility>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

namespace {

// ---- Temporary files the signal handler removes ------------------------------------------
//
// A handler may only call async-signal-safe functions and read lock-free atomics: each
// slot holds a path in a fixed buffer, published by its state (free, being filled, ready).

constexpr int kSlots = 8;
constexpr std::size_t kSlotPath = 4096;
enum SlotState : int { kFree = 0, kFilling = 1, kReady = 2 };
static_assert(std::atomic<int>::is_always_lock_free);

struct Slot {
  std::atomic<int> state{kFree};
  char path[kSlotPath];
};
Slot g_slots[kSlots];

constexpr int kCleanupSignals[] = {SIGINT, SIGTERM, SIGHUP, SIGPIPE};

extern "C" void remove_temporaries_and_reraise(int signal) {
  for (Slot& slot : g_slots) {
    if (slot.state.load(std::memory_order_acquire) == kReady) ::unlink(slot.path);
  }
  // SA_RESETHAND restored the default action; the signal is blocked until this handler
  // returns, and then ends the program as it would have without us.
  ::raise(signal);
}

// Installs the handler once, for the signals not already ignored (nohup ignores SIGHUP;
// that choice stands).
void install_cleanup_handler() {
  static const bool installed = [] {
    for (const int signal : kCleanupSignals) {
      struct sigaction previous {};
      if (::sigaction(signal, nullptr, &previous) != 0 || previous.sa_handler == SIG_IGN) continue;
      struct sigaction action {};
      action.sa_handler = remove_temporaries_and_reraise;
      action.sa_flags = SA_RESETHAND;
      sigemptyset(&action.sa_mask);
      ::sigaction(signal, &action, nullptr);
    }
    return true;
  }();
  (void)installed;
}

// Registers `path` for removal on a signal; -1 when no slot is free or it is too long
// (the file is then still removed on every other way out).
int register_temporary(const std::string& path) {
  install_cleanup_handler();
  if (path.size() >= kSlotPath) return -1;
  for (int i = 0; i < kSlots; ++i) {
    int expected = kFree;
    if (g_slots[i].state.compare_exchange_strong(expected, kFilling, std::memory_order_acq_rel)) {
      std::memcpy(g_slots[i].path, path.c_str(), path.size() + 1);
      g_slots[i].state.store(kReady, std::memory_order_release);
      return i;
    }
  }
  return -1;
}

void release_temporary(int slot) {
  if (slot >= 0) g_slots[slot].state.store(kFree, std::memory_order_release);
}

// ---- Where the output goes -----------------------------------------------------------------

[[noreturn]] void refuse(const std::string& path, const std::string& problem) {
  throw Error(ErrorKind::bad_input, fmt::format("{}: {}", path, problem));
}

std::string directory_of(const std::string& path) {
  const std::size_t slash = path.rfind('/');
  if (slash == std::string::npos) return ".";
  return slash == 0 ? "/" : path.substr(0, slash);
}

// The name a chain of symbolic links finally leads to (which need not exist yet). The
// caller has stat()ed the path, so a loop was already reported as ELOOP.
std::string follow_links(const std::string& path) {
  std::string at = path;
  for (int hop = 0; hop < 64; ++hop) {
    struct stat info {};
    if (::lstat(at.c_str(), &info) != 0 || !S_ISLNK(info.st_mode)) return at;
    std::vector<char> buffer(static_cast<std::size_t>(info.st_size > 0 ? info.st_size : 255) + 1);
    const ssize_t n = ::readlink(at.c_str(), buffer.data(), buffer.size());
    if (n < 0 || static_cast<std::size_t>(n) >= buffer.size()) return at;  // changed under us: lstat again
    const std::string link(buffer.data(), static_cast<std::size_t>(n));
    at = link.front() == '/' ? link : directory_of(at) + "/" + link;
  }
  refuse(path, "cannot write: too many levels of symbolic links");
}

mode_t current_umask() {
  // Read once; umask() can only be read by setting it, which is harmless before any
  // thread starts writing files.
  static const mode_t mask = [] {
    const mode_t m = ::umask(022);
    ::umask(m);
    return m;
  }();
  return mask;
}

}  // namespace

OutputFile::OutputFile(std::string path) : path_(std::move(path)) {
  struct stat info {};
  if (::stat(path_.c_str(), &info) != 0) {
    if (errno != ENOENT) refuse(path_, fmt::format("cannot write: {}", std::strerror(errno)));
    open_temporary(follow_links(path_), nullptr);  // a new file, perhaps a dangling link's target
    return;
  }
  if (S_ISDIR(info.st_mode)) refuse(path_, "is a directory, not a file");
  if (S_ISCHR(info.st_mode) || S_ISBLK(info.st_mode) || S_ISFIFO(info.st_mode)) {
    fd_ = ::open(path_.c_str(), O_WRONLY | O_CLOEXEC | O_NOCTTY);
    if (fd_ < 0) refuse(path_, fmt::format("cannot write: {}", std::strerror(errno)));
    sink_.emplace(fd_, path_);
    return;
  }
  if (!S_ISREG(info.st_mode)) refuse(path_, "is a socket or another special file; results go to a file or a device");
  if (info.st_nlink > 1) {
    refuse(path_, fmt::format("the file has {} hard links; replacing it would cut it from its other names, and "
                              "writing it in place could leave it half-written: write to a new file",
                              info.st_nlink));
  }
  const std::string final_path = follow_links(path_);
  struct stat named {};
  if (::lstat(final_path.c_str(), &named) != 0 || named.st_dev != info.st_dev || named.st_ino != info.st_ino) {
    refuse(path_, "the file has no name of its own here (a link under /proc, as /dev/stdout is); give its "
                  "own name, or leave out -o to write to standard output");
  }
  open_temporary(final_path, &info);
}

void OutputFile::open_temporary(const std::string& final_path, const struct ::stat* existing) {
  std::vector<char> name(final_path.begin(), final_path.end());
  const char suffix[] = ".XXXXXX";
  name.insert(name.end(), suffix, suffix + sizeof suffix);  // with its terminating NUL
  fd_ = ::mkostemp(name.data(), O_CLOEXEC);
  if (fd_ < 0) refuse(path_, fmt::format("cannot write: {}", std::strerror(errno)));
  temp_.assign(name.data());
  target_ = final_path;
  signal_slot_ = register_temporary(temp_);
  sink_.emplace(fd_, path_);
  // The file it replaces keeps its owner and group where the system lets us (root, or the
  // owner choosing one of its groups) and its permission bits; set-id bits only with the owner.
  mode_t mode = static_cast<mode_t>(0666) & ~current_umask();
  if (existing) {
    const bool owner_kept = ::fchown(fd_, existing->st_uid, existing->st_gid) == 0;
    mode = existing->st_mode & (owner_kept ? 07777 : 01777);
  }
  if (::fchmod(fd_, mode) != 0) fail("permissions");
  if (existing) replaced_fd_ = ::open(final_path.c_str(), O_RDONLY | O_CLOEXEC | O_NOCTTY);  // -1: no matter
}

OutputFile::~OutputFile() {
  if (fd_ >= 0) ::close(fd_);
  if (replaced_fd_ >= 0) ::close(replaced_fd_);
  remove_temporary();
}

void OutputFile::remove_temporary() noexcept {
  if (temp_.empty()) return;
  ::unlink(temp_.c_str());
  release_temporary(signal_slot_);
  signal_slot_ = -1;
  temp_.clear();
}

void OutputFile::fail(const char* step) {
  const std::string reason = std::strerror(errno);
  if (fd_ >= 0) ::close(fd_);
  fd_ = -1;
  sink_.reset();
  remove_temporary();
  refuse(path_, fmt::format("cannot write ({}): {}", step, reason));
}

void OutputFile::write(std::string_view bytes) {
  if (!sink_) refuse(path_, "cannot write: the file is already closed");
  sink_->write(bytes);  // on failure the destructor removes the temporary file
  written_ += bytes.size();
  start_writeback(false);
}

// Once there are kWritebackBytes of new bytes (or all of them when `all`), two things that
// would otherwise wait until commit(), done while the rows are still being rated:
// - the new bytes' writing to disk is started, without waiting (Linux's sync_file_range), so
//   that commit()'s fsync has only the last bytes left to wait for;
// - as many bytes of the file to be replaced leave the page cache (posix_fadvise
//   DONTNEED; its content is untouched), so that the rename which frees it at the end
//   has fewer pages to free.
// Hints only: whether they work or not, fsync makes the file durable and the rename
// replaces the old one whole.
void OutputFile::start_writeback(bool all) {
#ifdef __linux__
  constexpr std::uint64_t kWritebackBytes = 4 << 20;
  if (temp_.empty() || written_ == written_back_ || (!all && written_ - written_back_ < kWritebackBytes)) return;
  const auto from = static_cast<off_t>(written_back_), length = static_cast<off_t>(written_ - written_back_);
  ::sync_file_range(fd_, from, length, SYNC_FILE_RANGE_WRITE);
  if (replaced_fd_ >= 0) ::posix_fadvise(replaced_fd_, from, all ? 0 : length, POSIX_FADV_DONTNEED);
  written_back_ = written_;
#else
  (void)all;
#endif
}

void OutputFile::commit() {
  if (!sink_) refuse(path_, "cannot write: the file is already closed");
  start_writeback(true);
  if (!temp_.empty() && ::fsync(fd_) != 0) fail("sync");
  if (replaced_fd_ >= 0) ::close(std::exchange(replaced_fd_, -1));  // before the rename that frees it
  sink_.reset();
  const int fd = std::exchange(fd_, -1);
  if (::close(fd) != 0) fail("close");
  if (temp_.empty()) return;  // written through to a device or FIFO
  if (std::rename(temp_.c_str(), target_.c_str()) != 0) fail("rename");
  // Released only after the rename: a signal in between finds no file to remove.
  release_temporary(signal_slot_);
  signal_slot_ = -1;
  temp_.clear();
}

void refuse_output_among_inputs(const std::string& output, const std::vector<std::string>& inputs) {
  struct stat out {};
  if (::stat(output.c_str(), &out) != 0 || !S_ISREG(out.st_mode)) return;
  for (const std::string& input : inputs) {
    struct stat in {};
    const int status = input == "-" ? ::fstat(STDIN_FILENO, &in) : ::stat(input.c_str(), &in);
    if (status == 0 && in.st_dev == out.st_dev && in.st_ino == out.st_ino) {
      refuse(output, fmt::format("is also an input of this run ({}); the results would overwrite it: write them "
                                 "to another file",
                                 input == "-" ? "standard input" : input));
    }
  }
}

}  // namespace shaftwork::io
