// Case keys, sections and verbs whose 0.7.0 spelling was replaced: one error naming the new one.
#pragma once

#include <string>

namespace fickcast
{
  /**
   * The current spelling of a section and key that fickcast 0.7.0 accepted and this version does
   * not (no silent aliases: the reader turns it into one InputError naming the new spelling).
   *
   * @p key may be empty for a section header alone. Returns a phrase such as
   * "`parameter` in a [size] section", or an empty string when the spelling is current.
   */
  std::string renamed_spelling(const std::string &section, const std::string &key);

  /// The message for an old spelling: "[study] seek.key is a spelling of fickcast 0.7; write ... instead".
  std::string renamed_message(const std::string &section, const std::string &key, const std::string &replacement);

  /// The current name of a command-line verb that was renamed, or empty (for example `seek` -> `size`).
  std::string renamed_verb(const std::string &verb);
} // namespace fickcast
