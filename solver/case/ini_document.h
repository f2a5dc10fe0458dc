// The raw content of an INI-style case file, with the line of every key.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

namespace fickcast
{
  /// One `key = value` line of a case file (or one `--set` override).
  struct IniEntry
  {
    std::string section;   ///< `time`, `region.clay`, ...
    std::string key;       ///< key within the section, e.g. `diffusivity` or `point.base`
    std::string value;     ///< the value as written, trimmed, without comment
    std::string file;      ///< file the entry came from, or `--set`
    unsigned int line = 0; ///< 1-based line number; 0 for `--set`

    /// `section.key`, the name used everywhere else.
    std::string full_key() const { return section + "." + key; }
    /// `file:line` or `--set`.
    std::string origin() const;
  };

  /**
   * The entries of an INI-style case file, in file order, each with its line.
   *
   * The values are read with Boost.Program_options (`parse_config_file`); as Boost does not
   * report line numbers, the file is also scanned line by line with the same rules (`#`
   * starts a comment anywhere, `[name]` opens a section, `key = value` otherwise) and the two
   * readings are matched. Structural mistakes (binary or empty file, unterminated section
   * header, duplicate section or key, key outside a section, a line that is neither) throw
   * InputError naming file and line.
   */
  class IniDocument
  {
  public:
    /// Reads and checks @p path. Throws InputError for bad content, IoError if unreadable.
    static IniDocument read(const std::string &path);

    /// Reads from text already in memory; @p name is used in messages.
    static IniDocument parse(const std::string &text, const std::string &name);

    const std::vector<IniEntry> &entries() const { return entries_; }
    /// Section names in order of appearance (including empty sections).
    const std::vector<std::string> &sections() const { return sections_; }
    /// Line of the header of @p section, 0 if absent.
    unsigned int section_line(const std::string &section) const;
    const std::string &file() const { return file_; }

  private:
    std::string file_;
    std::vector<IniEntry> entries_;
    std::vector<std::string> sections_;
    std::vector<unsigned int> section_lines_;
  };

  /// A hash (FNV-1a) of @p entries' keys and values in order, leaving out the keys in @p ignored
  /// (`section.key`): the same case gives the same number, a changed value another.
  std::uint64_t fingerprint(const std::vector<IniEntry> &entries, const std::vector<std::string> &ignored);
} // namespace fickcast
