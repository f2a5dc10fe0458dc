// The subcommands of fickcast-post: sample, integrate, compare, plots, report.
#pragma once

#include <string>
#include <vector>

namespace fickcast::post
{
  /// Runs fickcast-post with @p arguments (without the program name); returns the exit code.
  /// Throws PostInputError (exit 2) or PostIoError (exit 3); main turns them into one line.
  int run_command(const std::vector<std::string> &arguments);

  /// The usage text of fickcast-post (or of one command).
  std::string usage_text(const std::string &command = "");
} // namespace fickcast::post
