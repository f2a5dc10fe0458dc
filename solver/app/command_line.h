// The fickcast command line: a verb, a case file, common flags.
#pragma once

#include <string>
#include <vector>

namespace fickcast
{
  /// What the user asked for.
  struct Invocation
  {
    std::string verb; ///< run, check, ... or empty for --help / --version
    std::string case_file;
    std::vector<std::string> overrides; ///< --set section.key=value, in order
    std::vector<std::string> vary;      ///< sweep --vary key=values, as sweep.vary.key=values overrides
    std::string output;                 ///< --output DIR
    bool overwrite = false;
    bool resume = false;      ///< --resume: continue an interrupted run from its checkpoint
    bool allow_large = false; ///< --allow-large: no size limits (numerics/run_size.h)
    bool quiet = false;
    bool help = false;
    bool version = false;
    bool list_keys = false; ///< check --keys
    bool report = false;    ///< run/sweep --report: plots and HTML report at the end
  };

  /// The verbs this build offers, with a one-line description each.
  const std::vector<std::pair<std::string, std::string>> &verbs();

  /// Parses argv (without argv[0]). Throws InputError("command line", ...) on a bad flag.
  Invocation parse_command_line(const std::vector<std::string> &arguments);

  /// Help text for the program (empty verb) or for a verb.
  std::string help_text(const std::string &verb);
} // namespace fickcast
