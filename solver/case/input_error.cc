#include "case/input_error.h"

namespace fickcast
{
  namespace
  {
    /// Length in bytes of the valid UTF-8 sequence starting at @p i, or 0 if it is not one.
    std::size_t utf8_length(const std::string &text, const std::size_t i)
    {
      const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(text[k]); };
      const unsigned char lead = byte(i);
      std::size_t n = 0;
      if (lead >= 0xC2 && lead <= 0xDF)
        n = 2;
      else if (lead >= 0xE0 && lead <= 0xEF)
        n = 3;
      else if (lead >= 0xF0 && lead <= 0xF4)
        n = 4;
      if (n == 0 || i + n > text.size())
        return 0;
      for (std::size_t k = i + 1; k < i + n; ++k)
        if ((byte(k) & 0xC0) != 0x80)
          return 0;
      return n;
    }
  } // namespace

  std::string printable(const std::string &text, const std::size_t limit)
  {
    std::string out;
    std::size_t i = 0, shown = 0;
    for (; i < text.size() && shown < limit; ++shown)
      {
        const unsigned char c = static_cast<unsigned char>(text[i]);
        if (c >= 0x20 && c < 0x7F)
          {
            out += text[i++];
            continue;
          }
        if (c >= 0x80)
          if (const std::size_t n = utf8_length(text, i); n > 0)
            {
              out += text.substr(i, n);
              i += n;
              continue;
            }
        // Control characters (newlines, terminal escapes) and bytes that are not UTF-8.
        static const char digits[] = "0123456789abcdef";
        out += c == '\t' ? std::string("\\t") : std::string("\\x") + digits[c >> 4] + digits[c & 15];
        ++i;
      }
    if (i < text.size())
      out += "... (" + std::to_string(text.size() - i) + " more bytes)";
    return out;
  }

  namespace
  {
    std::string compose(const std::string &where, const std::string &key, const std::string &message)
    {
      std::string text;
      if (!where.empty())
        text += printable(where, 240) + ": ";
      if (!key.empty())
        text += printable(key, 120) + ": ";
      return text + printable(message, 480);
    }
  } // namespace

  InputError::InputError(const std::string &where, const std::string &key, const std::string &message)
    : std::runtime_error(compose(where, key, message))
    , where_(printable(where, 240))
    , key_(printable(key, 120))
    , message_(printable(message, 480))
  {
  }
} // namespace fickcast
