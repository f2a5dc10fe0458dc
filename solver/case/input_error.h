// One mistake in what a user gave us: a case file, a mesh, a flag. Exit code 2.
#pragma once

#include <stdexcept>
#include <string>

namespace fickcast
{
  /**
   * A mistake in user input (case file, mesh file, command-line flag, table file).
   *
   * The message is one line: `where: key: what was expected, what was found`.
   * `where` is `file:line`, `--set`, `command line` or a file name; `key` may be empty.
   * The command line turns it into exit code 2 and writes no results.
   */
  class InputError : public std::runtime_error
  {
  public:
    InputError(const std::string &where, const std::string &key, const std::string &message);

    /// file:line, `--set`, or another description of where the mistake is.
    const std::string &where() const { return where_; }
    /// The case key concerned (for example `region.clay.diffusivity`), or empty.
    const std::string &key() const { return key_; }
    /// The explanation alone, without where and key.
    const std::string &message() const { return message_; }

  private:
    std::string where_;
    std::string key_;
    std::string message_;
  };

  /**
   * @p text as a message may show it: at most @p limit characters (the rest counted, not shown),
   * control characters (newlines, terminal escape codes) and bytes that are not UTF-8 written as
   * \xNN. InputError passes its parts through it, so echoed input stays one readable line.
   */
  std::string printable(const std::string &text, std::size_t limit);

  /// A numerical failure during a run (no convergence, step size underflow). Exit code 1.
  class RunFailure : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };

  /// A signal stopped the work (SIGINT, SIGTERM) before it was done. Exit code 4.
  class Interrupted : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };

  /// Reading or writing a file failed for a reason outside the input itself. Exit code 3.
  class IoError : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };
} // namespace fickcast
