#include "results/json.h"

#include <cmath>
#include <cstdio>
#include <sstream>

namespace fickcast
{
  Json::Json(const double number)
    : type_(Type::number)
    , number_(number)
  {
  }
  Json::Json(const int number)
    : Json(static_cast<double>(number))
  {
  }
  Json::Json(const unsigned int number)
    : Json(static_cast<double>(number))
  {
  }
  Json::Json(const long number)
    : Json(static_cast<double>(number))
  {
  }
  Json::Json(const unsigned long number)
    : Json(static_cast<double>(number))
  {
  }
  Json::Json(const bool value)
    : type_(Type::boolean)
    , boolean_(value)
  {
  }
  Json::Json(const char *text)
    : type_(Type::string)
    , string_(text)
  {
  }
  Json::Json(const std::string &text)
    : type_(Type::string)
    , string_(text)
  {
  }

  Json Json::array()
  {
    Json value;
    value.type_ = Type::array;
    return value;
  }

  Json Json::object()
  {
    Json value;
    value.type_ = Type::object;
    return value;
  }

  Json &Json::operator[](const std::string &key)
  {
    if (type_ == Type::null)
      type_ = Type::object;
    for (auto &[name, value] : members_)
      if (name == key)
        return value;
    members_.emplace_back(key, Json());
    return members_.back().second;
  }

  void Json::push_back(const Json &value)
  {
    if (type_ == Type::null)
      type_ = Type::array;
    items_.push_back(value);
  }

  bool Json::contains(const std::string &key) const
  {
    return find(key) != nullptr;
  }

  const Json *Json::find(const std::string &key) const
  {
    for (const auto &[name, value] : members_)
      if (name == key)
        return &value;
    return nullptr;
  }

  std::string json_quote(const std::string &text)
  {
    std::string out = "\"";
    for (const char c : text)
      {
        switch (c)
          {
            case '"':
              out += "\\\"";
              break;
            case '\\':
              out += "\\\\";
              break;
            case '\n':
              out += "\\n";
              break;
            case '\t':
              out += "\\t";
              break;
            case '\r':
              out += "\\r";
              break;
            default:
              if (static_cast<unsigned char>(c) < 0x20)
                {
                  char buffer[8];
                  std::snprintf(buffer, sizeof(buffer), "\\u%04x", c);
                  out += buffer;
                }
              else
                out += c;
          }
      }
    return out + "\"";
  }

  void Json::write(std::ostream &out, const int indent) const
  {
    const std::string pad(static_cast<std::size_t>(indent + 2), ' ');
    const std::string close_pad(static_cast<std::size_t>(indent), ' ');
    switch (type_)
      {
        case Type::null:
          out << "null";
          break;
        case Type::boolean:
          out << (boolean_ ? "true" : "false");
          break;
        case Type::number:
          if (!std::isfinite(number_))
            out << "null";
          else
            {
              char buffer[32];
              std::snprintf(buffer, sizeof(buffer), "%.15g", number_);
              out << buffer;
            }
          break;
        case Type::string:
          out << json_quote(string_);
          break;
        case Type::array:
          if (items_.empty())
            {
              out << "[]";
              break;
            }
          out << "[\n";
          for (std::size_t i = 0; i < items_.size(); ++i)
            {
              out << pad;
              items_[i].write(out, indent + 2);
              out << (i + 1 < items_.size() ? ",\n" : "\n");
            }
          out << close_pad << "]";
          break;
        case Type::object:
          if (members_.empty())
            {
              out << "{}";
              break;
            }
          out << "{\n";
          for (std::size_t i = 0; i < members_.size(); ++i)
            {
              out << pad << json_quote(members_[i].first) << ": ";
              members_[i].second.write(out, indent + 2);
              out << (i + 1 < members_.size() ? ",\n" : "\n");
            }
          out << close_pad << "}";
          break;
      }
  }

  std::string Json::dump() const
  {
    std::ostringstream out;
    write(out);
    return out.str();
  }
} // namespace fickcast
