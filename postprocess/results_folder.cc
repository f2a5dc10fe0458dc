#include "results_folder.h"

#include "post_error.h"

#include "case/units.h"

#include <cmath>
#include <filesystem>

namespace fickcast::post
{
  void require_folder(const std::string &folder, const std::string &what)
  {
    if (!std::filesystem::is_directory(folder))
      throw PostInputError(folder, what,
                           std::filesystem::exists(folder) ? std::string("a file, not a folder") : "no such folder");
  }

  ResultsFolder open_results(const std::string &folder)
  {
    require_folder(folder, "a results folder written by `fickcast run`");
    ResultsFolder results{folder, read_run_summary(folder + "/summary.json"), CsvTable::read(folder + "/series.csv"),
                          std::nullopt, std::nullopt};
    results.series.require("time");
    results.series.require_numbers();
    if (results.series.n_rows() == 0)
      throw PostInputError(results.series.path(), "one row per accepted step", "no rows");
    if (std::filesystem::exists(folder + "/profiles.csv"))
      {
        results.profiles = CsvTable::read(folder + "/profiles.csv");
        for (const char *name : {"time", "line", "distance", "concentration"})
          results.profiles->require(name);
        results.profiles->require_numbers({"line"});
      }
    if (std::filesystem::exists(folder + "/fields"))
      results.fields.emplace(folder);
    return results;
  }

  DisplayUnit concentration_display(const RunSummary &summary)
  {
    const std::string &written = summary.unit_concentration_written;
    if (!written.empty() && written != summary.unit_concentration)
      try
        {
          const double factor = UnitSystem::instance().to_si(1.0, written, summary.unit_concentration);
          if (std::isfinite(factor) && factor > 0)
            return {written, factor};
        }
      catch (const std::exception &)
        {
          // Not convertible: stay in SI.
        }
    return {summary.unit_concentration, 1.0};
  }

  DisplayUnits case_units(const RunSummary &summary)
  {
    CaseDescription description;
    for (const auto &setting : summary.settings)
      description.settings.push_back({setting.key, setting.written, setting.si, setting.origin});
    description.units.concentration = summary.unit_concentration;
    description.units.as_written =
      summary.unit_concentration_written.empty() ? summary.unit_concentration : summary.unit_concentration_written;
    description.units.amount = summary.unit_amount;
    description.units.flux = summary.unit_flux;
    return DisplayUnits(description, 10);
  }

  DisplayUnit length_display(const double span_metres)
  {
    const double span = std::abs(span_metres);
    if (span >= 0.5)
      return {"m", 1};
    if (span >= 5e-4)
      return {"mm", 1e-3};
    if (span >= 5e-7)
      return {"µm", 1e-6};
    return {"nm", 1e-9};
  }
} // namespace fickcast::post
