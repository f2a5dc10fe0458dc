#include "results/summary.h"

#include <chrono>
#include <cmath>
#include <ctime>

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

    Json::Value quantity(const double value, const std::string &unit)
    {
      Json::Value q(Json::objectValue);
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

  Json::Value make_summary(const CaseDescription &c, const RunRecord &r)
  {
    Json::Value s(Json::objectValue);
    s["program"] = "fickcast";
    s["version"] = fickcast_version();
    s["status"] = r.status;
    if (!r.message.empty())
      s["message"] = r.message;

    Json::Value &case_json = s["case"];
    case_json["file"] = c.file;
    case_json["title"] = c.title;
    case_json["dimension"] = c.dimension;
    Json::Value &units = case_json["units"];
    units["concentration"] = c.units.concentration;
    units["concentration_as_written"] = c.units.as_written;
    units["amount"] = c.units.amount;
    units["flux"] = c.units.amount + "/s";
    Json::Value settings(Json::arrayValue);
    for (const auto &record : c.settings)
      {
        Json::Value item(Json::objectValue);
        item["key"] = record.key;
        item["written"] = record.written;
        item["si"] = record.si;
        item["origin"] = record.origin;
        settings.append(item);
      }
    case_json["settings"] = settings;

    Json::Value &mesh = s["mesh"];
    mesh["cells"] = r.cells;
    mesh["unknowns"] = r.unknowns;
    mesh["degree"] = r.degree;
    if (r.remeshings > 0 || r.cells_largest > 0)
      {
        mesh["remeshings"] = r.remeshings;
        mesh["cells_largest"] = static_cast<Json::UInt64>(r.cells_largest);
        mesh["unknowns_largest"] = static_cast<Json::UInt64>(r.unknowns_largest);
        mesh["remeshed_amount"] = r.remeshed_amount;
      }
    Json::Value regions(Json::arrayValue), boundaries(Json::arrayValue);
    for (const auto &name : r.regions)
      regions.append(name);
    for (const auto &name : r.boundaries)
      boundaries.append(name);
    mesh["regions"] = regions;
    mesh["boundaries"] = boundaries;

    Json::Value &time = s["time"];
    time["end"] = quantity(c.time.end, "s");
    time["reached"] = quantity(r.end_time, "s");
    time["scheme"] = scheme_name(c.time.scheme);
    time["adaptive"] = c.time.adaptive;
    time["steps_accepted"] = r.steps_accepted;
    time["steps_rejected"] = r.steps_rejected;
    if (c.time.adaptive)
      {
        time["tolerance"] = c.time.tolerance;
        time["error_control"] = r.carried_time_error >= 0 ? "global" : "local";
        if (r.carried_time_error >= 0)
          {
            time["carried_error_final"] = r.carried_time_error;
            time["carried_error_largest"] = r.carried_time_error_largest;
            time["carried_error_largest_at"] = quantity(r.carried_time_error_largest_at, "s");
            time["steps_at_floor"] = r.steps_at_floor;
          }
      }
    Json::Value stages(Json::arrayValue);
    for (const auto &stage : r.stages)
      {
        Json::Value item(Json::objectValue);
        item["name"] = stage.name;
        item["start"] = stage.start;
        item["end"] = stage.end;
        stages.append(item);
      }
    time["stages"] = stages;

    Json::Value &solver = s["solver"];
    solver["linear_solver"] = r.linear_solver;
    solver["linear_iterations"] = r.linear_iterations;
    solver["nonlinear_iterations"] = r.nonlinear_iterations;
    solver["matrix_setups"] = r.matrix_setups;
    solver["ranks"] = r.ranks;
    if (r.cell_peclet > 0)
      {
        Json::Value &flow = s["flow"];
        flow["cell_peclet_largest"] = r.cell_peclet;
        flow["cell_peclet_region"] = r.cell_peclet_region;
        flow["courant_largest"] = r.courant;
        flow["stabilisation"] = "streamline upwind Petrov-Galerkin (Brooks and Hughes 1982)";
      }

    Json::Value &run = s["run"];
    run["date"] = now_iso8601();
    run["host"] = host_name();
    run["wall_time"] = quantity(r.wall_time, "s");
    Json::Value timing(Json::objectValue);
    for (const auto &[phase, seconds] : r.timing)
      timing[phase] = seconds;
    run["wall_time_by_phase_s"] = timing;

    Json::Value &amounts = s["amounts"];
    double initial = r.initial_undissolved, final = r.final_undissolved;
    Json::Value initial_regions(Json::objectValue), final_regions(Json::objectValue), entered(Json::objectValue);
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
    Json::Value baths(Json::objectValue);
    for (std::size_t b = 0; b < r.boundaries.size() && b < r.bath_final.size(); ++b)
      if (std::isfinite(r.bath_final[b]))
        baths[r.boundaries[b]] = r.bath_final[b];
    amounts["bath_final_concentration"] = baths;
    amounts["source_total"] = r.source_total;
    amounts["decayed_total"] = r.decayed_total;

    Json::Value &balance = s["mass_balance"];
    balance["error"] = quantity(r.balance_error, c.units.amount);
    balance["relative"] = r.balance_error_relative;

    Json::Value &results = s["results"];
    results["amount.final_total"] = quantity(final, c.units.amount);
    for (const auto &named_point : r.points)
      {
        results["point." + named_point.name + ".final"] = quantity(named_point.final_value, c.units.concentration);
        if (std::isfinite(named_point.threshold))
          {
            Json::Value t = quantity(named_point.threshold_time, "s");
            t["level"] = named_point.threshold;
            t["reached"] = std::isfinite(named_point.threshold_time);
            results["threshold." + named_point.name] = t;
          }
      }
    if (std::isfinite(r.released_final))
      {
        Json::Value released = quantity(r.released_final, "1");
        released["reference_amount"] = r.released_reference;
        released["reference_unit"] = c.units.amount;
        results[c.output.fraction_name() + ".final"] = released;
      }
    for (const auto &release : r.releases)
      {
        Json::Value event = quantity(release.time, "s");
        event["level"] = release.level;
        event["reached"] = std::isfinite(release.time);
        results[c.output.fraction_event_prefix() + "." + release.name] = event;
      }
    for (const auto &lag : r.time_lags)
      {
        Json::Value event = quantity(lag.time_lag, "s");
        event["boundary"] = lag.boundary;
        event["final_flux_in"] = lag.final_flux;
        event["flux_unit"] = c.units.amount + "/s";
        event["steady"] = lag.steady;
        results["time_lag." + lag.name] = event;
      }
    for (std::size_t b = 0; b < r.boundaries.size() && b < r.bath_final.size(); ++b)
      if (std::isfinite(r.bath_final[b]))
        {
          Json::Value bath = quantity(r.bath_final[b], c.units.concentration);
          bath["boundary"] = r.boundaries[b];
          bath["phase"] = "bath liquid";
          results["bath." + r.boundaries[b] + ".final"] = bath;
        }
    const std::string rate_unit = c.units.amount + "/s";
    for (const auto &face : r.face_results)
      {
        const bool limit = face.prefix == "flux_limit" || face.prefix == "crossed_limit";
        Json::Value item = quantity(face.value, limit                      ? std::string("s")
                                                : face.prefix == "crossed" ? c.units.amount
                                                                           : rate_unit);
        item["boundary"] = face.boundary;
        item["direction"] = face.outward ? "out" : "in";
        if (std::isfinite(face.asked_time))
          item[face.prefix == "crossed" ? "by" : "at"] = quantity(face.asked_time, "s");
        if (limit)
          {
            item["limit"] = quantity(face.limit, face.prefix == "flux_limit" ? rate_unit : c.units.amount);
            item["reached"] = std::isfinite(face.value);
          }
        if (face.prefix == "steady_flux")
          item["steady"] = face.steady;
        if (!face.note.empty())
          item["note"] = face.note;
        results[face.full_name()] = item;
        if (face.prefix == "peak_flux")
          {
            Json::Value when = quantity(face.when, "s");
            when["boundary"] = face.boundary;
            when["direction"] = face.outward ? "out" : "in";
            results[face.full_name() + ".time"] = when;
          }
      }
    if (!r.moments.empty())
      {
        Json::Value moments(Json::objectValue);
        Json::Value times(Json::arrayValue), moment_amounts(Json::arrayValue), means(Json::arrayValue),
          variances(Json::arrayValue);
        for (const auto &m : r.moments)
          {
            times.append(m.time);
            moment_amounts.append(m.amount);
            Json::Value mean(Json::arrayValue);
            for (unsigned int d = 0; d < c.dimension; ++d)
              mean.append(m.mean[d]);
            means.append(mean);
            variances.append(m.variance);
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
        Json::Value d(Json::objectValue);
        d["level"] = depth.level;
        d["unit"] = "m";
        Json::Value times(Json::arrayValue), depths(Json::arrayValue);
        for (std::size_t i = 0; i < depth.times.size(); ++i)
          {
            times.append(depth.times[i]);
            depths.append(depth.depths[i]);
          }
        d["times"] = times;
        d["depths"] = depths;
        d["final"] = depth.depths.empty() ? not_a_number : depth.depths.back();
        d["value"] = d["final"]; // like every named result: its value (at the end) and unit
        results["depth." + depth.name] = d;
      }

    Json::Value warnings(Json::arrayValue);
    for (const auto &warning : r.warnings)
      warnings.append(warning);
    s["warnings"] = warnings;

    // The accuracy check: an estimate beside each result it compared, and how it went.
    Json::Value &accuracy = s["accuracy"];
    const AccuracyRecord &a = r.accuracy;
    if (a.requested > 0)
      accuracy["requested"] = a.requested;
    else
      accuracy["requested"] = "off";
    accuracy["relative_to"] = "each result itself";
    accuracy["checked"] = a.checked;
    accuracy["met"] = a.met;
    accuracy["note"] = a.note;
    Json::Value solves(Json::arrayValue);
    for (const auto &solve : a.solves)
      {
        Json::Value item(Json::objectValue);
        item["refine"] = solve.refine;
        item[solve.adaptive_steps ? "time_tolerance" : "time_step_s"] = solve.step_control;
        item["cells"] = static_cast<Json::UInt64>(solve.cells);
        item["unknowns"] = static_cast<Json::UInt64>(solve.unknowns);
        item["steps"] = solve.steps;
        item["wall_time_s"] = solve.wall_time;
        solves.append(item);
      }
    accuracy["solves"] = solves;
    for (const auto &[name, estimate] : a.estimates)
      {
        if (!results.isMember(name))
          continue;
        if (std::isfinite(estimate))
          results[name]["error_estimate"] = estimate;
        else
          {
            results[name]["error_estimate"] = Json::Value(Json::nullValue);
            results[name]["error_note"] = "reached in one solve of the check but not in the other";
          }
      }
    return s;
  }
} // namespace fickcast
