#include "study_table.h"

#include "post_error.h"

#include "case/units.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <limits>

namespace fickcast::post
{
  bool is_case_key(const std::string &name)
  {
    // Case sections, and `layer` for the study parameter layer.NAME.thickness.
    static const std::vector<std::string> sections{"case",   "geometry", "region",      "boundary", "initial",
                                                   "time",   "numerics", "temperature", "stage",    "output",
                                                   "solver", "sweep",    "layer"};
    const std::string first = name.substr(0, name.find('.'));
    return name.find('.') != std::string::npos && std::find(sections.begin(), sections.end(), first) != sections.end();
  }

  StudyTable read_study(const std::string &folder)
  {
    StudyTable study{CsvTable::read(folder + "/sweep.csv"), {}, {}, {}, 0};
    const CsvTable &t = study.table;
    if (t.names().empty() || t.names()[0] != "case")
      throw PostInputError(t.path() + ":1", "`case` as the first column", "'" + t.names()[0] + "'");
    const std::size_t status = t.find("status");
    for (std::size_t c = 1; c < t.names().size(); ++c)
      {
        const std::string &name = t.names()[c];
        if (name == "status" || name == "wall_time" || name == "message")
          continue;
        if (is_case_key(name) && study.results.empty())
          study.parameters.push_back(c);
        else
          {
            study.results.push_back(c);
            t.numbers(c); // results must be numbers
          }
      }
    if (t.n_rows() == 0)
      throw PostInputError(t.path(), "one row per case", "no rows");
    for (std::size_t r = 0; r < t.n_rows(); ++r)
      {
        const bool ok = status == CsvTable::npos || t.rows()[r][status] == "completed";
        study.usable.push_back(ok);
        study.n_failed += ok ? 0 : 1;
      }
    return study;
  }

  namespace
  {
    /// A cell split into its leading number and the unit text after it (trimmed).
    struct NumberAndUnit
    {
      double number = std::numeric_limits<double>::quiet_NaN();
      std::string unit;
    };

    NumberAndUnit split_cell(const std::string &cell)
    {
      NumberAndUnit out;
      const char *begin = cell.c_str();
      char *end = nullptr;
      const double v = std::strtod(begin, &end);
      if (end == begin)
        return out;
      out.number = v;
      out.unit = cell.substr(static_cast<std::size_t>(end - begin));
      const auto first = out.unit.find_first_not_of(" \t");
      const auto last = out.unit.find_last_not_of(" \t");
      out.unit = first == std::string::npos ? "" : out.unit.substr(first, last - first + 1);
      return out;
    }
  } // namespace

  std::string StudyTable::parameter_unit(const std::size_t index) const
  {
    for (const auto &row : table.rows())
      {
        const NumberAndUnit cell = split_cell(row[index]);
        if (std::isfinite(cell.number) && !cell.unit.empty())
          return cell.unit;
      }
    return {};
  }

  std::vector<double> StudyTable::parameter_values(const std::size_t index) const
  {
    const std::string common = parameter_unit(index);
    std::vector<double> values;
    for (std::size_t r = 0; r < table.rows().size(); ++r)
      {
        const NumberAndUnit cell = split_cell(table.rows()[r][index]);
        double v = cell.number;
        if (std::isfinite(v) && cell.unit != common)
          {
            // A value written in another unit (72 cm among metres): converted; a value that
            // is not a quantity of the same kind is not a number on this axis.
            try
              {
                v = UnitSystem::instance().to_si(cell.number, cell.unit, common.empty() ? "1" : common);
              }
            catch (const std::exception &)
              {
                v = std::numeric_limits<double>::quiet_NaN();
              }
          }
        values.push_back(v);
      }
    return values;
  }

  bool is_event_result(const std::string &name)
  {
    return name.rfind("threshold.", 0) == 0 || name.rfind("release.", 0) == 0 || name.rfind("uptake.", 0) == 0 ||
           name.rfind("flux_limit.", 0) == 0 || name.rfind("crossed_limit.", 0) == 0;
  }

  std::vector<double> StudyTable::result_values(const std::size_t index) const
  {
    std::vector<double> values = table.numbers(index);
    const bool event = is_event_result(table.names()[index]);
    for (std::size_t r = 0; r < values.size(); ++r)
      if (!usable[r])
        values[r] = std::numeric_limits<double>::quiet_NaN();
      else if (event && std::isnan(values[r]))
        values[r] = std::numeric_limits<double>::infinity();
    return values;
  }

  double sample_quantile(std::vector<double> values, const double p)
  {
    values.erase(std::remove_if(values.begin(), values.end(), [](double v) { return std::isnan(v); }), values.end());
    if (values.empty())
      return std::numeric_limits<double>::quiet_NaN();
    std::sort(values.begin(), values.end());
    const double h = (values.size() - 1) * std::clamp(p, 0.0, 1.0);
    const auto low = static_cast<std::size_t>(std::floor(h));
    const std::size_t high = std::min(low + 1, values.size() - 1);
    const double g = h - static_cast<double>(low);
    if (g == 0 || values[low] == values[high])
      return values[low];
    if (std::isinf(values[high]))
      return values[high];
    return values[low] + g * (values[high] - values[low]);
  }

  void exceedance_curve(std::vector<double> values, std::vector<double> &levels, std::vector<double> &probability)
  {
    values.erase(std::remove_if(values.begin(), values.end(), [](double v) { return std::isnan(v); }), values.end());
    std::sort(values.begin(), values.end());
    const std::size_t n = values.size();
    levels.clear();
    probability.clear();
    for (std::size_t i = 0; i < n && std::isfinite(values[i]); ++i)
      {
        levels.push_back(values[i]);
        probability.push_back(1.0 - static_cast<double>(i + 1) / static_cast<double>(n + 1));
      }
  }

  double finite_mean(const std::vector<double> &values)
  {
    double sum = 0;
    std::size_t n = 0;
    for (const double v : values)
      if (std::isinf(v))
        return std::numeric_limits<double>::quiet_NaN();
      else if (!std::isnan(v))
        {
          sum += v;
          ++n;
        }
    return n ? sum / static_cast<double>(n) : std::numeric_limits<double>::quiet_NaN();
  }
} // namespace fickcast::post
