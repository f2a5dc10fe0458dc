#include "studies/study_plan.h"

#include "case/case_reader.h"
#include "case/input_error.h"
#include "case/units.h"
#include "studies/distributions.h"

#include <cstdio>
#include <sstream>

namespace fickcast
{
  namespace
  {
    std::string format_number(const double value, const std::string &unit)
    {
      char buffer[64];
      std::snprintf(buffer, sizeof(buffer), "%.12g", value);
      return unit.empty() ? std::string(buffer) : std::string(buffer) + " " + unit;
    }

    std::string case_id(const std::size_t index)
    {
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), "case_%04zu", index + 1);
      return buffer;
    }
  } // namespace

  std::vector<std::string> parameter_overrides(const CaseDescription &base, const std::string &key,
                                               const std::string &value, const std::string &origin)
  {
    const std::string prefix = "layer.", suffix = ".thickness";
    if (key.rfind(prefix, 0) == 0 && key.size() > prefix.size() + suffix.size() &&
        key.compare(key.size() - suffix.size(), suffix.size(), suffix) == 0)
      {
        const std::string name = key.substr(prefix.size(), key.size() - prefix.size() - suffix.size());
        std::string layers;
        bool found = false;
        for (const auto &layer : base.geometry.layers)
          {
            const bool this_one = layer.name == name;
            found = found || this_one;
            layers += (layers.empty() ? "" : ", ") + layer.name + " " +
                      (this_one ? value : format_number(layer.thickness, "m"));
          }
        if (!found)
          {
            std::string list;
            for (const auto &layer : base.geometry.layers)
              list += (list.empty() ? "" : ", ") + layer.name;
            throw InputError(origin, key, "expected a layer of geometry.layers (" + list + "), found '" + name + "'");
          }
        return {"geometry.layers=" + layers};
      }
    return {key + "=" + value};
  }

  std::vector<StudyCase> plan_study(const CaseDescription &base)
  {
    const StudySpec &study = base.study;
    std::vector<StudyCase> cases;
    if (!study.vary.empty())
      {
        std::size_t count = study.zip ? study.vary.front().values.size() : 1;
        if (!study.zip)
          for (const auto &p : study.vary)
            count *= p.values.size();
        for (std::size_t index = 0; index < count; ++index)
          {
            StudyCase c;
            c.id = case_id(index);
            // Grid: the first key varies slowest; zip: element `index` of every list.
            std::size_t rest = index;
            std::vector<std::size_t> pick(study.vary.size());
            for (std::size_t j = study.vary.size(); j-- > 0;)
              {
                const std::size_t n = study.vary[j].values.size();
                pick[j] = study.zip ? index : rest % n;
                rest /= study.zip ? 1 : n;
              }
            for (std::size_t j = 0; j < study.vary.size(); ++j)
              {
                const auto &p = study.vary[j];
                c.parameters.emplace_back(p.key, p.values[pick[j]]);
                for (const auto &o : parameter_overrides(base, p.key, p.values[pick[j]], p.origin))
                  c.overrides.push_back(o);
              }
            cases.push_back(c);
          }
        return cases;
      }
    std::vector<Distribution> inputs;
    for (const auto &p : study.sample)
      {
        try
          {
            inputs.push_back(Distribution::parse(p.distribution));
          }
        catch (const UnitError &error)
          {
            throw InputError(p.origin, "study.sample." + p.key, error.what());
          }
      }
    const auto values = latin_hypercube(inputs, study.samples, study.seed);
    for (std::size_t i = 0; i < values.size(); ++i)
      {
        StudyCase c;
        c.id = case_id(i);
        for (std::size_t j = 0; j < inputs.size(); ++j)
          {
            const std::string value = format_number(values[i][j], inputs[j].unit);
            c.parameters.emplace_back(study.sample[j].key, value);
            for (const auto &o : parameter_overrides(base, study.sample[j].key, value, study.sample[j].origin))
              c.overrides.push_back(o);
          }
        cases.push_back(c);
      }
    return cases;
  }

  void check_study_values(const CaseDescription &base, const std::string &case_file,
                          const std::vector<std::string> &base_overrides)
  {
    const auto check = [&](const StudyParameter &p, const std::string &study_key, const std::string &value) {
      std::vector<std::string> overrides = base_overrides;
      for (const auto &o : parameter_overrides(base, p.key, value, p.origin))
        overrides.push_back(o);
      try
        {
          read_case(case_file, overrides);
        }
      catch (const InputError &error)
        {
          // The offending value came from the study, not from --set: name the key alone.
          const std::string reason =
            error.where() == "--set" ? error.key() + ": " + error.message() : std::string(error.what());
          throw InputError(p.origin, study_key, "the case rejects " + p.key + " = '" + value + "': " + reason);
        }
    };
    for (const auto &p : base.study.vary)
      for (const auto &value : p.values)
        check(p, "study.vary." + p.key, value);
    for (const auto &p : base.study.sample)
      {
        Distribution d;
        try
          {
            d = Distribution::parse(p.distribution);
          }
        catch (const UnitError &error)
          {
            throw InputError(p.origin, "study.sample." + p.key, error.what());
          }
        check(p, "study.sample." + p.key, format_number(d.median(), d.unit));
      }
  }

  std::string plan_fingerprint(const std::vector<StudyCase> &cases, const std::vector<std::string> &base_overrides)
  {
    std::ostringstream out;
    for (const auto &o : base_overrides)
      out << "set " << o << '\n';
    for (const auto &c : cases)
      {
        out << c.id;
        for (const auto &o : c.overrides)
          out << " | " << o;
        out << '\n';
      }
    return out.str();
  }
} // namespace fickcast
