#include "run_summary.h"

#include "output_file.h"
#include "post_error.h"

#include <algorithm>
#include <limits>
#include <memory>

namespace fickcast::post
{
  namespace
  {
    /// Walks a JSON object by dotted path and reports what was missing or of the wrong type.
    class Reader
    {
    public:
      Reader(const Json::Value &root, const std::string &path)
        : root_(root)
        , path_(path)
      {
      }

      const Json::Value &at(const std::string &dotted, const Json::ValueType type) const
      {
        const Json::Value *value = &root_;
        std::size_t begin = 0;
        while (begin <= dotted.size())
          {
            const std::size_t end = std::min(dotted.find('.', begin), dotted.size());
            const std::string key = dotted.substr(begin, end - begin);
            if (!value->isObject() || !value->isMember(key))
              throw PostInputError(path_, "the entry `" + dotted + "` a fickcast run writes", "none");
            value = &(*value)[key];
            begin = end + 1;
          }
        const bool ok =
          type == Json::nullValue || (type == Json::realValue && value->isNumeric()) ||
          (type == Json::stringValue && value->isString()) || (type == Json::arrayValue && value->isArray()) ||
          (type == Json::objectValue && value->isObject()) || (type == Json::booleanValue && value->isBool());
        if (!ok)
          throw PostInputError(path_, "`" + dotted + "` of another type", one_line(value->toStyledString(), 60));
        return *value;
      }

      std::string text(const std::string &dotted) const { return at(dotted, Json::stringValue).asString(); }
      double number(const std::string &dotted) const { return at(dotted, Json::realValue).asDouble(); }
      /// A number that the solver writes as null when it is not finite.
      double number_or_nan(const std::string &dotted) const
      {
        const Json::Value &value = at(dotted, Json::nullValue);
        return value.isNumeric() ? value.asDouble() : std::numeric_limits<double>::quiet_NaN();
      }
      std::string text_or(const std::string &key, const std::string &fallback) const
      {
        return root_.isMember(key) && root_[key].isString() ? root_[key].asString() : fallback;
      }

    private:
      const Json::Value &root_;
      std::string path_;
    };
  } // namespace

  Json::Value read_json_file(const std::string &path, const std::string &what)
  {
    const std::string text = read_file(path, what);
    Json::CharReaderBuilder builder;
    builder["collectComments"] = false;
    std::unique_ptr<Json::CharReader> reader(builder.newCharReader());
    Json::Value root;
    std::string errors;
    if (!reader->parse(text.data(), text.data() + text.size(), &root, &errors))
      throw PostInputError(path, what + " (valid JSON)", "a syntax error: " + one_line(errors, 100));
    if (!root.isObject())
      throw PostInputError(path, what + " (a JSON object)", "another JSON value");
    return root;
  }

  RunSummary read_run_summary(const std::string &path)
  {
    const Json::Value root = read_json_file(path, "the summary.json a fickcast run writes");
    const Reader read(root, path);
    RunSummary s;
    s.path = path;
    s.program = read.text("program");
    if (s.program != "fickcast")
      throw PostInputError(path, "\"program\": \"fickcast\"", "\"" + s.program + "\"");
    s.version = read.text("version");
    s.status = read.text("status");
    s.message = read.text_or("message", "");
    s.case_file = read.text("case.file");
    s.title = read.text("case.title");
    s.dimension = static_cast<unsigned int>(read.number("case.dimension"));
    if (s.dimension < 1 || s.dimension > 3)
      throw PostInputError(path, "case.dimension 1, 2 or 3", std::to_string(s.dimension));
    s.unit_concentration = read.text("case.units.concentration");
    s.unit_concentration_written = read.text("case.units.concentration_as_written");
    s.unit_amount = read.text("case.units.amount");
    s.unit_flux = read.text("case.units.flux");
    for (const auto &item : read.at("case.settings", Json::arrayValue))
      {
        const Reader entry(item, path);
        s.settings.push_back({entry.text("key"), entry.text("written"), entry.text("si"), entry.text("origin")});
      }
    if (const auto *coordinates = s.setting("case.coordinates"))
      s.coordinates = coordinates->si;
    s.cells = static_cast<long>(read.number("mesh.cells"));
    s.unknowns = static_cast<long>(read.number("mesh.unknowns"));
    s.degree = static_cast<unsigned int>(read.number("mesh.degree"));
    // Written only by a run that remeshes.
    if (root["mesh"].isMember("remeshings"))
      {
        s.remeshings = static_cast<long>(read.number("mesh.remeshings"));
        s.cells_largest = static_cast<long>(read.number("mesh.cells_largest"));
        s.unknowns_largest = static_cast<long>(read.number("mesh.unknowns_largest"));
        s.remeshed_amount = read.number("mesh.remeshed_amount");
      }
    for (const auto &name : read.at("mesh.regions", Json::arrayValue))
      s.regions.push_back(name.asString());
    for (const auto &name : read.at("mesh.boundaries", Json::arrayValue))
      s.boundaries.push_back(name.asString());
    s.end_time = read.number("time.end.value");
    s.reached_time = read.number("time.reached.value");
    s.scheme = read.text("time.scheme");
    s.adaptive = read.at("time.adaptive", Json::booleanValue).asBool();
    s.steps_accepted = static_cast<long>(read.number("time.steps_accepted"));
    s.steps_rejected = static_cast<long>(read.number("time.steps_rejected"));
    // Written only by a run with global time error control.
    if (root["time"].isMember("carried_error_final"))
      {
        s.carried_error_final = read.number_or_nan("time.carried_error_final");
        s.carried_error_largest = read.number_or_nan("time.carried_error_largest");
        s.time_tolerance = read.number_or_nan("time.tolerance");
      }
    if (root.isMember("flow"))
      {
        s.cell_peclet = read.number("flow.cell_peclet_largest");
        s.cell_peclet_region = read.text("flow.cell_peclet_region");
        s.courant = read.number("flow.courant_largest");
      }
    if (root["time"].isMember("stages"))
      for (const auto &item : read.at("time.stages", Json::arrayValue))
        {
          const Reader stage(item, path);
          s.stages.push_back({stage.text("name"), stage.number("start"), stage.number("end")});
        }
    s.linear_solver = read.text("solver.linear_solver");
    s.ranks = static_cast<long>(read.number("solver.ranks"));
    s.date = read.text("run.date");
    s.host = read.text("run.host");
    s.wall_time = read.number("run.wall_time.value");
    s.balance_error = read.number_or_nan("mass_balance.error.value");
    s.balance_relative = read.number_or_nan("mass_balance.relative");
    s.results = read.at("results", Json::objectValue);
    // Written since the accuracy check (issue 23); absent in older summaries.
    if (root.isMember("accuracy") && root["accuracy"].isObject())
      s.accuracy = root["accuracy"];
    if (root.isMember("warnings") && root["warnings"].isArray())
      for (const auto &warning : root["warnings"])
        if (warning.isString())
          s.warnings.push_back(warning.asString());
    return s;
  }

  const EchoedSetting *RunSummary::setting(const std::string &key) const
  {
    for (const auto &item : settings)
      if (item.key == key)
        return &item;
    return nullptr;
  }

  std::string RunSummary::region_name(const int id) const
  {
    if (id >= 0 && static_cast<std::size_t>(id) < regions.size())
      return regions[static_cast<std::size_t>(id)];
    return "region " + std::to_string(id);
  }
} // namespace fickcast::post
