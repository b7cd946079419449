#include "shaftwork/io/shared_library.hpp"

#include <dlfcn.h>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {
namespace {

std::string last_dl_error() {
  const char* text = ::dlerror();
  return text ? text : "no reason given";
}

}  // namespace

SharedLibrary::SharedLibrary(const char* soname, const char* package, const char* use)
    : handle_(::dlopen(soname, RTLD_NOW | RTLD_LOCAL)), soname_(soname), package_(package), use_(use) {
  if (handle_ == nullptr) {
    throw Error(ErrorKind::not_available,
                fmt::format("{} need {}, from the Debian package {}, which could not be loaded: {}", use_, soname_,
                            package_, last_dl_error()));
  }
}

void* SharedLibrary::symbol(const char* name) const {
  ::dlerror();  // clears an older error, so that the reason given is this lookup's
  void* address = ::dlsym(handle_, name);
  if (address == nullptr) {
    throw Error(ErrorKind::not_available,
                fmt::format("{} need the function {} of {} (Debian package {}), which this copy of it lacks: {}",
                            use_, name, soname_, package_, last_dl_error()));
  }
  return address;
}

}  // namespace shaftwork::io
