#include "results/summary.h"

#include "case/input_error.h"

#include <chrono>
#include <cmath>
#include <ctime>
#include <fstream>

#include <unistd.h>

#ifndef FICKCAST_VERSION
#define FICKCAST_VERSION "unknown"
#endif

namespace fickcast
{
  std::string fickcast_version()
  {
    return FICKCAST_VERSION;
  }

  namespace
  {
    std::string now_iso8601()
    {
      const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
      char buffer[32];
      std::strftime(buffer, sizeof(buffer), "%Y-%m-%dT%H:%M:%SZ", std::gmtime(&now));
      return buffer;
    }

    std::string host_name()
    {
      char buffer[256] = {0};
      if (::gethostname(buffer, sizeof(buffer) - 1) != 0)
        return "unknown";
      return buffer;
    }

    Json quantity(const double value, const std::string &unit)
    {
      Json q = Json::object();
      q["value"] = value;
      q["unit"] = unit;
      return q;
    }

    const char *scheme_name(const TimeScheme scheme)
    {
      switch (scheme)
        {
          case TimeScheme::implicit_euler:
            return "implicit_euler";
          case TimeScheme::crank_nicolson:
            return "crank_nicolson";
          case TimeScheme::bdf2:
            break;
        }
      return "bdf2";
    }
  } // namespace

  Json make_summary(const CaseDescription &c, const RunRecord &r)
  {
    Json s = Json::object();
    s["program"] = "fickcast";
    s["version"] = fickcast_version();
    s["status"] = r.status;
    if (!r.message.empty())
      s["message"] = r.message;

    Json &case_json = s["case"];
    case_json["file"] = c.file;
    case_json["title"] = c.title;
    case_json["dimension"] = c.dimension;
    Json &units = case_json["units"];
    units["concentration"] = c.units.concentration;
    units["concentration_as_written"] = c.units.as_written;
    units["amount"] = c.units.amount;
    units["flux"] = c.units.amount + "/s";
    Json settings = Json::array();
    for (const auto &record : c.settings)
      {
        Json item = Json::object();
        item["key"] = record.key;
        item["written"] = record.written;
        item["si"] = record.si;
        item["origin"] = record.origin;
        settings.push_back(item);
      }
    case_json["settings"] = settings;

    Json &mesh = s["mesh"];
    mesh["cells"] = r.cells;
    mesh["unknowns"] = r.unknowns;
    mesh["degree"] = r.degree;
    Json regions = Json::array(), boundaries = Json::array();
    for (const auto &name : r.regions)
      regions.push_back(name);
    for (const auto &name : r.boundaries)
      boundaries.push_back(name);
    mesh["regions"] = regions;
    mesh["boundaries"] = boundaries;

    Json &time = s["time"];
    time["end"] = quantity(c.time.end, "s");
    time["reached"] = quantity(r.end_time, "s");
    time["scheme"] = scheme_name(c.time.scheme);
    time["adaptive"] = c.time.adaptive;
    time["steps_accepted"] = r.steps_accepted;
    time["steps_rejected"] = r.steps_rejected;
    Json stages = Json::array();
    for (const auto &stage : r.stages)
      {
        Json item = Json::object();
        item["name"] = stage.name;
        item["start"] = stage.start;
        item["end"] = stage.end;
        stages.push_back(item);
      }
    time["stages"] = stages;

    Json &solver = s["solver"];
    solver["linear_solver"] = r.linear_solver;
    solver["linear_iterations"] = r.linear_iterations;
    solver["nonlinear_iterations"] = r.nonlinear_iterations;
    solver["matrix_setups"] = r.matrix_setups;
    solver["ranks"] = r.ranks;

    Json &run = s["run"];
    run["date"] = now_iso8601();
    run["host"] = host_name();
    run["wall_time"] = quantity(r.wall_time, "s");
    Json timing = Json::object();
    for (const auto &[phase, seconds] : r.timing)
      timing[phase] = seconds;
    run["wall_time_by_phase_s"] = timing;

    Json &amounts = s["amounts"];
    double initial = r.initial_undissolved, final = r.final_undissolved;
    Json initial_regions = Json::object(), final_regions = Json::object(), entered = Json::object();
    for (std::size_t i = 0; i < r.regions.size(); ++i)
      {
        initial += r.initial_region_amounts[i];
        final += r.final_region_amounts[i];
        initial_regions[r.regions[i]] = r.initial_region_amounts[i];
        final_regions[r.regions[i]] = r.final_region_amounts[i];
      }
    for (std::size_t b = 0; b < r.boundaries.size(); ++b)
      entered[r.boundaries[b]] = r.boundary_entered[b];
    amounts["unit"] = c.units.amount;
    amounts["initial_total"] = initial;
    amounts["initial_by_region"] = initial_regions;
    amounts["final_total"] = final;
    amounts["final_by_region"] = final_regions;
    amounts["entered_by_boundary"] = entered;
    amounts["undissolved_initial"] = r.initial_undissolved;
    amounts["undissolved_final"] = r.final_undissolved;
    Json baths = Json::object();
    for (std::size_t b = 0; b < r.boundaries.size() && b < r.bath_final.size(); ++b)
      if (std::isfinite(r.bath_final[b]))
        baths[r.boundaries[b]] = r.bath_final[b];
    amounts["bath_final_concentration"] = baths;
    amounts["source_total"] = r.source_total;
    amounts["decayed_total"] = r.decayed_total;

    Json &balance = s["mass_balance"];
    balance["error"] = quantity(r.balance_error, c.units.amount);
    balance["relative"] = r.balance_error_relative;

    Json &results = s["results"];
    results["amount.final_total"] = quantity(final, c.units.amount);
    for (const auto &named_point : r.points)
      {
        results["point." + named_point.name + ".final"] = quantity(named_point.final_value, c.units.concentration);
        if (std::isfinite(named_point.threshold))
          {
            Json t = quantity(named_point.threshold_time, "s");
            t["level"] = named_point.threshold;
            t["reached"] = std::isfinite(named_point.threshold_time);
            results["threshold." + named_point.name] = t;
          }
      }
    if (std::isfinite(r.released_final))
      {
        Json released = quantity(r.released_final, "1");
        released["reference_amount"] = r.released_reference;
        released["reference_unit"] = c.units.amount;
        results["released_fraction.final"] = released;
      }
    for (const auto &release : r.releases)
      {
        Json event = quantity(release.time, "s");
        event["level"] = release.level;
        event["reached"] = std::isfinite(release.time);
        results["release." + release.name] = event;
      }
    for (const auto &lag : r.time_lags)
      {
        Json event = quantity(lag.time_lag, "s");
        event["boundary"] = lag.boundary;
        event["final_flux_in"] = lag.final_flux;
        event["flux_unit"] = c.units.amount + "/s";
        event["steady"] = lag.steady;
        results["time_lag." + lag.name] = event;
      }
    if (!r.moments.empty())
      {
        Json moments = Json::object();
        Json times = Json::array(), moment_amounts = Json::array(), means = Json::array(), variances = Json::array();
        for (const auto &m : r.moments)
          {
            times.push_back(m.time);
            moment_amounts.push_back(m.amount);
            Json mean = Json::array();
            for (unsigned int d = 0; d < c.dimension; ++d)
              mean.push_back(m.mean[d]);
            means.push_back(mean);
            variances.push_back(m.variance);
          }
        moments["times"] = times;
        moments["amount"] = moment_amounts;
        moments["mean_position"] = means;
        moments["variance"] = variances;
        moments["units"] = "s; " + c.units.amount + "; m; m2";
        results["moments"] = moments;
      }
    for (const auto &depth : r.depths)
      {
        Json d = Json::object();
        d["level"] = depth.level;
        d["unit"] = "m";
        Json times = Json::array(), depths = Json::array();
        for (std::size_t i = 0; i < depth.times.size(); ++i)
          {
            times.push_back(depth.times[i]);
            depths.push_back(depth.depths[i]);
          }
        d["times"] = times;
        d["depths"] = depths;
        d["final"] = depth.depths.empty() ? not_a_number : depth.depths.back();
        results["depth." + depth.name] = d;
      }
    return s;
  }

  void write_json(const Json &summary, const std::string &path)
  {
    std::ofstream out(path);
    if (!out)
      throw IoError("cannot write " + path);
    summary.write(out);
    out << '\n';
    if (!out)
      throw IoError("writing " + path + " failed");
  }
} // namespace fickcast
