// io::SharedLibrary, the loader behind the Cairo and libxlsxwriter tables: a library that is
// not there, or lacks a function, is a not_available error whose message names the library,
// its Debian package and what needed it; a function taken by name is the library's own.
#include <cmath>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/shared_library.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using shaftwork::io::SharedLibrary;

namespace {

// The error the action throws (the test fails when it throws none).
template <class Act>
Error error_of(Act act) {
  try {
    act();
  } catch (const Error& e) {
    return e;
  }
  FAIL("no error thrown");
  return Error(ErrorKind::bad_input, "");
}

}  // namespace

TEST_CASE("a library that cannot be opened: not_available, naming it, its package and its use") {
  const Error e = error_of([] { SharedLibrary("libshaftwork-absent.so.7", "libshaftwork-absent7", "pictures"); });
  CHECK(e.kind() == ErrorKind::not_available);
  // The reason after the last colon is glibc's dlerror() text for a file that is not there.
  CHECK(std::string(e.what()) ==
        "pictures need libshaftwork-absent.so.7, from the Debian package libshaftwork-absent7, which could not be "
        "loaded: libshaftwork-absent.so.7: cannot open shared object file: No such file or directory");
}

TEST_CASE("a function the library lacks: not_available, naming the function, the library and its package") {
  const SharedLibrary libm("libm.so.6", "libc6", "these tests");
  double (*missing)(double) = nullptr;
  const Error e = error_of([&] { libm.take(missing, "shaftwork_no_such_function"); });
  CHECK(e.kind() == ErrorKind::not_available);
  using Catch::Matchers::EndsWith;
  using Catch::Matchers::StartsWith;
  // dlerror() names the library by its path, which differs between systems.
  CHECK_THAT(e.what(), StartsWith("these tests need the function shaftwork_no_such_function of libm.so.6 (Debian package "
                                  "libc6), which this copy of it lacks: ") &&
                           EndsWith("libm.so.6: undefined symbol: shaftwork_no_such_function"));
  CHECK(missing == nullptr);
}

TEST_CASE("a function taken by name is the library's: cos from libm") {
  const SharedLibrary libm("libm.so.6", "libc6", "these tests");
  double (*cosine)(double) = nullptr;
  libm.take(cosine, "cos");
  REQUIRE(cosine != nullptr);
  // cos(0) = 1 exactly and cos(pi/3) = 1/2 (to rounding), whatever the implementation.
  CHECK(cosine(0.0) == 1.0);
  CHECK(cosine(M_PI / 3) == Approx(0.5).epsilon(1e-15));
  CHECK(cosine(1.0) == std::cos(1.0));  // the program's own libm gives the same bits
}
