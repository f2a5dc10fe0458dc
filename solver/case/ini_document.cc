#include "case/ini_document.h"

#include "case/input_error.h"

#include <boost/program_options/options_description.hpp>
#include <boost/program_options/parsers.hpp>

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

namespace fickcast
{
  namespace
  {
    std::string trim(const std::string &text)
    {
      const auto first = text.find_first_not_of(" \t\r\n");
      if (first == std::string::npos)
        return "";
      const auto last = text.find_last_not_of(" \t\r\n");
      return text.substr(first, last - first + 1);
    }

    /// Byte offset of the first byte that is not valid UTF-8 text, or npos.
    std::size_t first_non_text_byte(const std::string &text)
    {
      std::size_t i = 0;
      while (i < text.size())
        {
          const auto byte = static_cast<unsigned char>(text[i]);
          if (byte == 0 || (byte < 0x20 && byte != '\n' && byte != '\r' && byte != '\t'))
            return i;
          std::size_t continuation = 0;
          if (byte < 0x80)
            continuation = 0;
          else if ((byte & 0xE0) == 0xC0)
            continuation = 1;
          else if ((byte & 0xF0) == 0xE0)
            continuation = 2;
          else if ((byte & 0xF8) == 0xF0)
            continuation = 3;
          else
            return i;
          for (std::size_t k = 1; k <= continuation; ++k)
            if (i + k >= text.size() || (static_cast<unsigned char>(text[i + k]) & 0xC0) != 0x80)
              return i;
          i += continuation + 1;
        }
      return std::string::npos;
    }

    bool valid_name(const std::string &name)
    {
      if (name.empty())
        return false;
      for (const char c : name)
        if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '.' || c == '-'))
          return false;
      return name.front() != '.' && name.back() != '.';
    }
  } // namespace

  std::string IniEntry::origin() const
  {
    if (line == 0)
      return file;
    return file + ":" + std::to_string(line);
  }

  unsigned int IniDocument::section_line(const std::string &section) const
  {
    for (std::size_t i = 0; i < sections_.size(); ++i)
      if (sections_[i] == section)
        return section_lines_[i];
    return 0;
  }

  IniDocument IniDocument::read(const std::string &path)
  {
    std::error_code ignored;
    if (std::filesystem::is_directory(path, ignored))
      throw InputError(path, "", "expected an INI-style case file, found a folder");
    std::ifstream in(path, std::ios::binary);
    if (!in)
      throw InputError(path, "", "cannot open the case file (expected a readable INI-style text file)");
    std::ostringstream buffer;
    buffer << in.rdbuf();
    if (in.bad())
      throw IoError(path + ": reading the case file failed");
    return parse(buffer.str(), path);
  }

  IniDocument IniDocument::parse(const std::string &text, const std::string &name)
  {
    constexpr std::size_t max_size = 4 * 1024 * 1024;
    if (text.size() > max_size)
      throw InputError(name, "",
                       "expected a case file of at most 4 MiB, found " + std::to_string(text.size()) + " bytes");
    const std::size_t bad_byte = first_non_text_byte(text);
    if (bad_byte != std::string::npos)
      {
        const auto line = 1 + std::count(text.begin(), text.begin() + bad_byte, '\n');
        throw InputError(name + ":" + std::to_string(line), "",
                         "expected a UTF-8 text case file, found binary content at byte " + std::to_string(bad_byte));
      }

    IniDocument document;
    document.file_ = name;

    // First reading: our own line scan, same rules as Boost's config-file parser.
    std::istringstream lines(text);
    std::string raw;
    unsigned int line_number = 0;
    std::string section;
    std::map<std::string, unsigned int> key_lines;
    while (std::getline(lines, raw))
      {
        ++line_number;
        const std::string where = name + ":" + std::to_string(line_number);
        std::string line = raw;
        if (const auto hash = line.find('#'); hash != std::string::npos)
          line.erase(hash);
        line = trim(line);
        if (line.empty())
          continue;
        if (line.front() == '[')
          {
            if (line.back() != ']')
              throw InputError(where, "", "unterminated section header: expected '[name]', found '" + line + "'");
            section = trim(line.substr(1, line.size() - 2));
            if (!valid_name(section))
              throw InputError(where, "",
                               "expected a section name of letters, digits, '_', '-' "
                               "and '.', found '[" +
                                 section + "]'");
            if (const unsigned int first = document.section_line(section); first != 0)
              throw InputError(where, "",
                               "duplicate section [" + section + "], first given at line " + std::to_string(first));
            document.sections_.push_back(section);
            document.section_lines_.push_back(line_number);
            continue;
          }
        const auto equals = line.find('=');
        if (equals == std::string::npos)
          throw InputError(where, "", "expected 'key = value' or '[section]', found '" + line + "'");
        const std::string key = trim(line.substr(0, equals));
        const std::string value = trim(line.substr(equals + 1));
        if (section.empty())
          throw InputError(where, key, "key given before any [section] header");
        if (!valid_name(key))
          throw InputError(where, key, "expected a key of letters, digits, '_', '-' and '.', found '" + key + "'");
        const std::string full = section + "." + key;
        if (const auto previous = key_lines.find(full); previous != key_lines.end())
          throw InputError(where, full, "key given twice, first at line " + std::to_string(previous->second));
        key_lines[full] = line_number;
        document.entries_.push_back(IniEntry{section, key, value, name, line_number});
      }
    if (document.entries_.empty())
      throw InputError(name, "",
                       document.sections_.empty() ? "the case file is empty: expected sections such as [geometry] "
                                                    "and [time] with 'key = value' lines"
                                                  : "the case file has section headers but no 'key = value' lines");

    // Second reading: Boost.Program_options, the parser of record for names and values.
    namespace po = boost::program_options;
    std::istringstream stream(text);
    po::options_description none;
    po::parsed_options parsed(&none);
    try
      {
        parsed = po::parse_config_file(stream, none, /*allow_unregistered=*/true);
      }
    catch (const po::error &error)
      {
        throw InputError(name, "", std::string("not a valid INI-style case file: ") + error.what());
      }
    if (parsed.options.size() != document.entries_.size())
      throw InputError(name, "",
                       "the file reads differently line by line (" + std::to_string(document.entries_.size()) +
                         " keys) than as a whole (" + std::to_string(parsed.options.size()) + " keys)");
    for (std::size_t i = 0; i < parsed.options.size(); ++i)
      {
        auto &entry = document.entries_[i];
        const auto &option = parsed.options[i];
        const std::string boost_value = option.value.empty() ? std::string() : option.value.front();
        if (option.string_key != entry.full_key() || boost_value != entry.value)
          throw InputError(entry.origin(), entry.full_key(),
                           "the line reads differently line by line than as a whole: found '" + option.string_key +
                             " = " + boost_value + "'");
      }
    return document;
  }

  std::uint64_t fingerprint(const std::vector<IniEntry> &entries, const std::vector<std::string> &ignored)
  {
    std::uint64_t hash = 1469598103934665603ull;
    const auto add = [&hash](const std::string &text) {
      for (const unsigned char ch : text)
        {
          hash ^= ch;
          hash *= 1099511628211ull;
        }
      hash ^= 0xff; // a separator no text holds
      hash *= 1099511628211ull;
    };
    for (const auto &entry : entries)
      {
        const std::string key = entry.full_key();
        if (std::find(ignored.begin(), ignored.end(), key) != ignored.end())
          continue;
        add(key);
        add(entry.value);
      }
    return hash;
  }
} // namespace fickcast
