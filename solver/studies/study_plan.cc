#include "studies/study_plan.h"

#include "case/case_reader.h"
#include "case/input_error.h"
#include "case/units.h"
#include "studies/distributions.h"

#include <algorithm>
#include <cstdio>
#include <map>
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

  namespace
  {
    /// NAME for a key layer.NAME.thickness, empty for any other key.
    std::string thickness_layer(const std::string &key)
    {
      const std::string prefix = "layer.", suffix = ".thickness";
      if (key.rfind(prefix, 0) == 0 && key.size() > prefix.size() + suffix.size() &&
          key.compare(key.size() - suffix.size(), suffix.size(), suffix) == 0)
        return key.substr(prefix.size(), key.size() - prefix.size() - suffix.size());
      return {};
    }
  } // namespace

  std::vector<std::string> case_overrides(const CaseDescription &base, const std::vector<ParameterValue> &values)
  {
    std::vector<std::string> overrides;
    std::map<std::string, std::string> thickness; // layer name -> value as written
    const ParameterValue *layers_key = nullptr, *first_edit = nullptr;
    for (const auto &v : values)
      {
        const std::string name = thickness_layer(v.key);
        if (name.empty())
          {
            if (v.key == "geometry.layers")
              layers_key = &v;
            overrides.push_back(v.key + "=" + v.value);
            continue;
          }
        const bool known = std::any_of(base.geometry.layers.begin(), base.geometry.layers.end(),
                                       [&](const auto &layer) { return layer.name == name; });
        if (!known)
          {
            std::string list;
            for (const auto &layer : base.geometry.layers)
              list += (list.empty() ? "" : ", ") + layer.name;
            throw InputError(v.origin, v.key,
                             "expected a layer of geometry.layers (" + list + "), found '" + name + "'");
          }
        thickness[name] = v.value;
        first_edit = first_edit ? first_edit : &v;
      }
    if (thickness.empty())
      return overrides;
    if (layers_key)
      throw InputError(first_edit->origin, "sweep." + first_edit->key,
                       "expected either geometry.layers or layer.NAME.thickness in one study (the layer list would "
                       "undo the thickness), found both");
    std::string layers;
    for (const auto &layer : base.geometry.layers)
      {
        const auto edit = thickness.find(layer.name);
        layers += (layers.empty() ? "" : ", ") + layer.name + " " +
                  (edit != thickness.end() ? edit->second : format_number(layer.thickness, "m"));
      }
    overrides.push_back("geometry.layers=" + layers);
    return overrides;
  }

  std::vector<std::string> parameter_overrides(const CaseDescription &base, const std::string &key,
                                               const std::string &value, const std::string &origin)
  {
    return case_overrides(base, {{key, value, origin}});
  }

  std::vector<StudyCase> plan_study(const CaseDescription &base)
  {
    const SweepSpec &sweep = base.sweep;
    std::vector<StudyCase> cases;
    if (!sweep.vary.empty())
      {
        std::size_t count = sweep.zip ? sweep.vary.front().values.size() : 1;
        if (!sweep.zip)
          for (const auto &p : sweep.vary)
            count *= p.values.size();
        for (std::size_t index = 0; index < count; ++index)
          {
            StudyCase c;
            c.id = case_id(index);
            // Grid: the first key varies slowest; zip: element `index` of every list.
            std::size_t rest = index;
            std::vector<std::size_t> pick(sweep.vary.size());
            for (std::size_t j = sweep.vary.size(); j-- > 0;)
              {
                const std::size_t n = sweep.vary[j].values.size();
                pick[j] = sweep.zip ? index : rest % n;
                rest /= sweep.zip ? 1 : n;
              }
            std::vector<ParameterValue> chosen;
            for (std::size_t j = 0; j < sweep.vary.size(); ++j)
              {
                const auto &p = sweep.vary[j];
                c.parameters.emplace_back(p.key, p.values[pick[j]]);
                chosen.push_back({p.key, p.values[pick[j]], p.origin});
              }
            c.overrides = case_overrides(base, chosen);
            cases.push_back(c);
          }
        return cases;
      }
    std::vector<Distribution> inputs;
    for (const auto &p : sweep.sample)
      {
        try
          {
            inputs.push_back(Distribution::parse(p.distribution));
          }
        catch (const UnitError &error)
          {
            throw InputError(p.origin, "sweep.sample." + p.key, error.what());
          }
      }
    const auto values = latin_hypercube(inputs, sweep.samples, sweep.seed);
    for (std::size_t i = 0; i < values.size(); ++i)
      {
        StudyCase c;
        c.id = case_id(i);
        std::vector<ParameterValue> chosen;
        for (std::size_t j = 0; j < inputs.size(); ++j)
          {
            const std::string value = format_number(values[i][j], inputs[j].unit);
            c.parameters.emplace_back(sweep.sample[j].key, value);
            chosen.push_back({sweep.sample[j].key, value, sweep.sample[j].origin});
          }
        c.overrides = case_overrides(base, chosen);
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
          throw InputError(p.origin, study_key,
                           "the case rejects " + p.key + " = '" + value + "': " + rejection_reason(error));
        }
    };
    for (const auto &p : base.sweep.vary)
      for (const auto &value : p.values)
        check(p, "sweep.vary." + p.key, value);
    for (const auto &p : base.sweep.sample)
      {
        Distribution d;
        try
          {
            d = Distribution::parse(p.distribution);
          }
        catch (const UnitError &error)
          {
            throw InputError(p.origin, "sweep.sample." + p.key, error.what());
          }
        check(p, "sweep.sample." + p.key, format_number(d.median(), d.unit));
      }
  }

  std::string rejection_reason(const InputError &error)
  {
    if (error.where() != "--set")
      return error.what();
    return error.key().empty() ? error.message() : error.key() + ": " + error.message();
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
