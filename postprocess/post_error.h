// The mistakes fickcast-post reports: bad input (exit 2) and failed file I/O (exit 3).
#pragma once

#include <stdexcept>
#include <string>

namespace fickcast::post
{
  /**
   * Something the user gave us is not what a fickcast results folder holds: a missing folder
   * or file, a malformed table, an output time or field that does not exist, a bad flag.
   *
   * The message is one line, `where: what was expected, what was found`, where `where` names
   * the file (with `:line` for tables) or `command line`. fickcast-post exits with code 2.
   */
  class PostInputError : public std::runtime_error
  {
  public:
    /// @p where is the file (or `command line`); @p expected and @p found complete the sentence.
    PostInputError(const std::string &where, const std::string &expected, const std::string &found);
  };

  /// Reading or writing a file failed for a reason outside the input itself. Exit code 3.
  class PostIoError : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };

  /// @p text with line breaks replaced by spaces and cut to @p limit characters (for messages).
  std::string one_line(const std::string &text, std::size_t limit = 160);
} // namespace fickcast::post
