#include "case/input_error.h"

namespace fickcast
{
  namespace
  {
    std::string compose(const std::string &where, const std::string &key, const std::string &message)
    {
      std::string text;
      if (!where.empty())
        text += where + ": ";
      if (!key.empty())
        text += key + ": ";
      return text + message;
    }
  } // namespace

  InputError::InputError(const std::string &where, const std::string &key, const std::string &message)
    : std::runtime_error(compose(where, key, message))
    , where_(where)
    , key_(key)
    , message_(message)
  {
  }
} // namespace fickcast
