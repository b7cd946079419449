// shaftwork/error.hpp — the one exception type the library throws.
//
// Library code reports every failure by throwing shaftwork::Error; only the
// CLI's main() turns errors into exit codes. The kind says what went wrong,
// not what to do about it.
#pragma once

#include <stdexcept>
#include <string>

namespace shaftwork {

enum class ErrorKind {
  bad_input,       // malformed or inconsistent input (a unit, a key, a set of knowns)
  out_of_range,    // a state outside a model's validity range
  no_convergence,  // an iterative solve did not meet its tolerance within its budget
  not_available,   // a request the chosen model cannot answer
};

class Error : public std::runtime_error {
 public:
  Error(ErrorKind kind, const std::string& message)
      : std::runtime_error(message), kind_(kind) {}

  ErrorKind kind() const noexcept { return kind_; }

  // A copy of this error with "context: " put before the message, e.g. the
  // JSON path of the key that held the bad value.
  Error with_context(const std::string& context) const {
    return Error(kind_, context + ": " + what());
  }

 private:
  ErrorKind kind_;
};

}  // namespace shaftwork
