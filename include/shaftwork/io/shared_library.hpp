// shaftwork/io/shared_library.hpp — a shared library opened when it is first needed.
//
// Cairo (pictures) and libxlsxwriter (workbooks) are not linked into the program: with the
// 20 libraries they pull in (X11, fontconfig, freetype, libcrypto, ...) their loading
// tripled the CPU time of a short run (docs/performance.md), though most runs draw nothing
// and write no workbook. Each is opened by its soname at its first use and its functions
// taken by name into a table of pointers (src/charts/cairo_api.hpp, src/io/xlsx_api.hpp;
// DEVELOPERS.md).
#pragma once

#include <string>

namespace shaftwork::io {

class SharedLibrary {
 public:
  // Opens `soname` (dlopen, RTLD_NOW | RTLD_LOCAL); it stays open for the life of the
  // process. `use` says what needs it ("pictures"), `package` the Debian package that
  // installs it. Throws not_available: "USE need SONAME, from the Debian package PACKAGE,
  // which could not be loaded: REASON".
  SharedLibrary(const char* soname, const char* package, const char* use);

  // Points `slot` at the library's function `name`. Throws not_available: "USE need the
  // function NAME of SONAME (Debian package PACKAGE), which this copy of it lacks: REASON".
  template <class Function>
  void take(Function*& slot, const char* name) const {
    slot = reinterpret_cast<Function*>(symbol(name));
  }

 private:
  void* symbol(const char* name) const;

  void* handle_;
  std::string soname_, package_, use_;
};

}  // namespace shaftwork::io
