#include "studies/result_names.h"

#include "case/input_error.h"
#include "case/quantity_text.h"
#include "case/units.h"

#include <algorithm>

namespace fickcast
{
  namespace
  {
    /// Faces that are a bath in some stage: their bath concentration is a named result.
    std::vector<std::string> bath_faces(const CaseDescription &c)
    {
      std::vector<std::string> faces;
      for (const auto &stage : c.stages)
        for (const auto &b : stage.boundaries)
          if (b.kind == BoundaryKind::bath && std::find(faces.begin(), faces.end(), b.name) == faces.end())
            faces.push_back(b.name);
      return faces;
    }
  } // namespace

  std::vector<ResultName> expected_results(const CaseDescription &c)
  {
    std::vector<ResultName> names;
    names.push_back({"amount.final_total", c.units.amount});
    for (const auto &named_point : c.output.points)
      names.push_back({"point." + named_point.name + ".final", c.units.concentration});
    for (const auto &threshold : c.output.thresholds)
      names.push_back({"threshold." + threshold.name, "s"});
    names.push_back({c.output.fraction_name() + ".final", "1"});
    for (const auto &release : c.output.releases)
      names.push_back({c.output.fraction_event_prefix() + "." + release.name, "s"});
    for (const auto &[name, boundary] : c.output.time_lags)
      names.push_back({"time_lag." + name, "s"});
    for (const auto &face : bath_faces(c))
      names.push_back({"bath." + face + ".final", c.units.concentration});
    for (const auto &face : c.output.face_results)
      {
        const bool is_time =
          face.kind == FaceResultSpec::Kind::flux_limit || face.kind == FaceResultSpec::Kind::crossed_limit;
        const bool is_amount = face.kind == FaceResultSpec::Kind::crossed;
        names.push_back({face.full_name(), is_time ? "s" : is_amount ? c.units.amount : c.units.amount + "/s"});
        if (face.kind == FaceResultSpec::Kind::peak_flux)
          names.push_back({face.full_name() + ".time", "s"});
      }
    for (const auto &depth : c.output.depths)
      names.push_back({"depth." + depth.name, "m"});
    return names;
  }

  std::vector<std::string> result_order(const CaseDescription &c)
  {
    std::vector<std::string> names{"amount.final_total"};
    for (const auto &named_point : c.output.points)
      {
        names.push_back("point." + named_point.name + ".final");
        if (std::any_of(c.output.thresholds.begin(), c.output.thresholds.end(),
                        [&](const LevelSpec &threshold) { return threshold.name == named_point.name; }))
          names.push_back("threshold." + named_point.name);
      }
    names.push_back(c.output.fraction_name() + ".final");
    for (const auto &release : c.output.releases)
      names.push_back(c.output.fraction_event_prefix() + "." + release.name);
    for (const auto &[name, boundary] : c.output.time_lags)
      names.push_back("time_lag." + name);
    for (const auto &face : bath_faces(c))
      names.push_back("bath." + face + ".final");
    for (const auto &face : c.output.face_results)
      {
        names.push_back(face.full_name());
        if (face.kind == FaceResultSpec::Kind::peak_flux)
          names.push_back(face.full_name() + ".time");
      }
    for (const auto &depth : c.output.depths)
      names.push_back("depth." + depth.name);
    return names;
  }

  double result_level(const CaseDescription &c, const std::string &name, const std::string &level_text,
                      const std::string &origin, const std::string &key)
  {
    const auto names = expected_results(c);
    const ResultName *found = nullptr;
    std::vector<std::string> list;
    for (const auto &n : names)
      {
        list.push_back(n.name);
        if (n.name == name)
          found = &n;
      }
    if (found == nullptr)
      {
        std::string text;
        for (const auto &n : list)
          text += (text.empty() ? "" : ", ") + n;
        const std::string suggestion = nearest(name, list);
        throw InputError(origin, key,
                         "expected a named result of the case (" + text + "), found '" + name + "'" +
                           (suggestion.empty() ? "" : " (did you mean '" + suggestion + "'?)"));
      }
    try
      {
        const QuantityText q = split_quantity(level_text, false);
        if (q.unit.empty())
          return q.number;
        return UnitSystem::instance().to_si(q.number, q.unit, found->unit);
      }
    catch (const UnitError &error)
      {
        throw InputError(origin, key,
                         "expected a value in the unit of " + name + " (" + found->unit + "), found '" + level_text +
                           "': " + error.what());
      }
  }
  bool is_event_result(const std::string &name)
  {
    return name.rfind("threshold.", 0) == 0 || name.rfind("release.", 0) == 0 || name.rfind("uptake.", 0) == 0 ||
           name.rfind("flux_limit.", 0) == 0 || name.rfind("crossed_limit.", 0) == 0;
  }
} // namespace fickcast
