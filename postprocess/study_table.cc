#include "study_table.h"

#include "post_error.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <limits>

namespace fickcast::post
{
  bool is_case_key(const std::string &name)
  {
    static const std::vector<std::string> sections{"case",     "geometry",    "region", "boundary", "initial", "time",
                                                   "numerics", "temperature", "stage",  "output",   "solver",  "study"};
    const std::string first = name.substr(0, name.find('.'));
    return name.find('.') != std::string::npos && std::find(sections.begin(), sections.end(), first) != sections.end();
  }

  StudyTable read_study(const std::string &folder)
  {
    StudyTable study{CsvTable::read(folder + "/study.csv"), {}, {}, {}, 0};
    const CsvTable &t = study.table;
    if (t.names().empty() || t.names()[0] != "case")
      throw PostInputError(t.path() + ":1", "`case` as the first column", "'" + t.names()[0] + "'");
    const std::size_t status = t.find("status");
    for (std::size_t c = 1; c < t.names().size(); ++c)
      {
        const std::string &name = t.names()[c];
        if (name == "status" || name == "wall_time")
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

  std::vector<double> StudyTable::parameter_values(const std::size_t index) const
  {
    std::vector<double> values;
    for (const auto &row : table.rows())
      {
        const char *begin = row[index].c_str();
        char *end = nullptr;
        const double v = std::strtod(begin, &end);
        values.push_back(end == begin ? std::numeric_limits<double>::quiet_NaN() : v);
      }
    return values;
  }

  std::vector<double> StudyTable::result_values(const std::size_t index) const
  {
    std::vector<double> values = table.numbers(index);
    for (std::size_t r = 0; r < values.size(); ++r)
      if (!usable[r])
        values[r] = std::numeric_limits<double>::quiet_NaN();
    return values;
  }

  double sample_quantile(std::vector<double> values, const double p)
  {
    values.erase(std::remove_if(values.begin(), values.end(), [](double v) { return !std::isfinite(v); }),
                 values.end());
    if (values.empty())
      return std::numeric_limits<double>::quiet_NaN();
    std::sort(values.begin(), values.end());
    const double h = (values.size() - 1) * std::clamp(p, 0.0, 1.0);
    const auto low = static_cast<std::size_t>(std::floor(h));
    const std::size_t high = std::min(low + 1, values.size() - 1);
    return values[low] + (h - static_cast<double>(low)) * (values[high] - values[low]);
  }

  void exceedance_curve(std::vector<double> values, std::vector<double> &levels, std::vector<double> &probability)
  {
    values.erase(std::remove_if(values.begin(), values.end(), [](double v) { return !std::isfinite(v); }),
                 values.end());
    std::sort(values.begin(), values.end());
    levels = values;
    probability.resize(values.size());
    for (std::size_t i = 0; i < values.size(); ++i)
      probability[i] = 1.0 - static_cast<double>(i + 1) / static_cast<double>(values.size() + 1);
  }

  double finite_mean(const std::vector<double> &values)
  {
    double sum = 0;
    std::size_t n = 0;
    for (const double v : values)
      if (std::isfinite(v))
        {
          sum += v;
          ++n;
        }
    return n ? sum / static_cast<double>(n) : std::numeric_limits<double>::quiet_NaN();
  }
} // namespace fickcast::post
