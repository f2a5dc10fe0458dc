#include "results/json_file.h"

#include "case/input_error.h"

#include <json/reader.h>
#include <json/writer.h>

#include <cerrno>
#include <cmath>
#include <cstring>
#include <fstream>
#include <memory>
#include <sstream>

namespace fickcast
{
  namespace
  {
    /// Replaces every non-finite number in @p value by null (JsonCpp would write 1e+9999 for
    /// infinity, which no JSON reader takes for a number).
    void null_non_finite(Json::Value &value)
    {
      if (value.type() == Json::realValue && !std::isfinite(value.asDouble()))
        value = Json::Value();
      else if (value.isArray() || value.isObject())
        for (auto &item : value)
          null_non_finite(item);
    }
  } // namespace

  std::string json_text(const Json::Value &value)
  {
    Json::Value finite = value;
    null_non_finite(finite);
    Json::StreamWriterBuilder builder;
    builder["indentation"] = "  ";
    builder["commentStyle"] = "None";
    builder["enableYAMLCompatibility"] = true; // `"key": value`, not `"key" : value`
    builder["emitUTF8"] = true;                // UTF-8 text as is, not \u escapes
    builder["precision"] = 17;                 // enough for every double to read back exactly
    builder["precisionType"] = "significant";
    builder["useSpecialFloats"] = false;
    return Json::writeString(builder, finite) + "\n";
  }

  void write_json(const Json::Value &value, const std::string &path)
  {
    const std::string text = json_text(value);
    std::ofstream out(path);
    if (!out)
      throw IoError("cannot write " + path);
    out << text;
    out.close(); // the bytes reach the disk here: a full disk shows now, not in a destructor
    if (!out)
      throw IoError("writing " + path + " failed: " + std::strerror(errno) +
                    " (a full disk or a folder that is not writable)");
  }

  Json::Value read_json(const std::string &path)
  {
    std::ifstream in(path);
    if (!in)
      throw IoError("cannot read " + path);
    std::ostringstream buffer;
    buffer << in.rdbuf();
    const std::string text = buffer.str();
    Json::CharReaderBuilder builder;
    builder["collectComments"] = false;
    const std::unique_ptr<Json::CharReader> reader(builder.newCharReader());
    Json::Value root;
    std::string errors;
    if (!reader->parse(text.data(), text.data() + text.size(), &root, &errors))
      {
        for (char &c : errors)
          c = c == '\n' ? ' ' : c;
        throw IoError("cannot read " + path + ": " + errors.substr(0, errors.find_last_not_of(' ') + 1));
      }
    return root;
  }
} // namespace fickcast
