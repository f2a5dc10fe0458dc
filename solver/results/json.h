// A small ordered JSON value for summary.json and reports (writing only).
#pragma once

#include <map>
#include <memory>
#include <ostream>
#include <string>
#include <utility>
#include <vector>

namespace fickcast
{
  /**
   * A JSON value: null, boolean, number, string, array or object. Objects keep their keys in
   * insertion order, so files read top-down like the reports they feed. Non-finite numbers are
   * written as null (JSON has no NaN).
   */
  class Json
  {
  public:
    enum class Type
    {
      null,
      boolean,
      number,
      string,
      array,
      object
    };

    Json() = default;
    Json(double number);
    Json(int number);
    Json(unsigned int number);
    Json(long number);
    Json(unsigned long number);
    Json(bool value);
    Json(const char *text);
    Json(const std::string &text);
    static Json array();
    static Json object();

    /// Object member access; creates the key (turning a null into an object).
    Json &operator[](const std::string &key);
    /// Appends to an array (turning a null into an array).
    void push_back(const Json &value);

    Type type() const { return type_; }
    bool contains(const std::string &key) const;
    const Json *find(const std::string &key) const;
    double number() const { return number_; }
    const std::string &string() const { return string_; }
    const std::vector<std::pair<std::string, Json>> &members() const { return members_; }
    const std::vector<Json> &items() const { return items_; }

    void write(std::ostream &out, int indent = 0) const;
    std::string dump() const;

  private:
    Type type_ = Type::null;
    double number_ = 0;
    bool boolean_ = false;
    std::string string_;
    std::vector<Json> items_;
    std::vector<std::pair<std::string, Json>> members_;
  };

  /// Escapes @p text for a JSON string literal (with the quotes).
  std::string json_quote(const std::string &text);
} // namespace fickcast
