#pragma once

#include <stdexcept>
#include <string>

namespace settlewell {

/// An error in what the user gave the program (a file, a key, a boundary name).
/// The message is one line that names where the problem is; the command line
/// prints it and exits with status 2.
class InputError : public std::runtime_error {
public:
  explicit InputError(const std::string& message)
      : std::runtime_error(message) {}
};

/// A failure inside a numerical step that the input did not cause directly
/// (a singular matrix, a solver that did not converge).
class SolverError : public std::runtime_error {
public:
  explicit SolverError(const std::string& message)
      : std::runtime_error(message) {}
};

/// The system refused an operation the run needs (a full disk, a folder that
/// vanished, no permission): the message names the file and the system's reason;
/// the command line prints it on one line and exits with status 4.
class SystemError : public std::runtime_error {
public:
  explicit SystemError(const std::string& message)
      : std::runtime_error(message) {}
};

/// A broken promise inside the program (a programming error, not the user's):
/// the command line reports it as an internal error with exit status 3.
class InternalError : public std::logic_error {
public:
  explicit InternalError(const std::string& message)
      : std::logic_error(message) {}
};

} // namespace settlewell
