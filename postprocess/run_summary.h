// summary.json of a results folder, read into plain values (names, units, facts, results).
#pragma once

#include <json/json.h>

#include <limits>
#include <string>
#include <vector>

namespace fickcast::post
{
  /// One case setting as the run echoed it: key, value as written, SI value, where it came from.
  struct EchoedSetting
  {
    std::string key;
    std::string written;
    std::string si;
    std::string origin;
  };

  /// A stage of a staged run (times in seconds).
  struct StageSpan
  {
    std::string name;
    double start = 0;
    double end = 0;
  };

  /**
   * What a run wrote about itself in summary.json. Fields a run always writes are required
   * (PostInputError naming summary.json otherwise); the named results are kept as JSON.
   */
  struct RunSummary
  {
    std::string path; ///< the summary.json read
    std::string program;
    std::string version;
    std::string status;
    std::string message;
    std::string case_file;
    std::string title;
    unsigned int dimension = 1;
    std::string coordinates = "cartesian"; ///< cartesian, cylinder, sphere or axisymmetric
    std::string unit_concentration;        ///< SI unit of concentrations (kg/m3, mol/m3, 1/m3, 1)
    std::string unit_concentration_written;
    std::string unit_amount; ///< kg/m2 in 1-D Cartesian, kg/m in 2-D, kg in 3-D (or mol, 1)
    std::string unit_flux;
    std::vector<EchoedSetting> settings;
    long cells = 0;
    long unknowns = 0;
    unsigned int degree = 1;
    /// numerics.remesh: how often the mesh changed, its largest size and the amount the
    /// remeshings added (a term of the mass balance); remeshings = -1 for a run that did not remesh.
    long remeshings = -1;
    long cells_largest = 0;
    long unknowns_largest = 0;
    double remeshed_amount = 0;
    std::vector<std::string> regions; ///< names by material id
    std::vector<std::string> boundaries;
    double end_time = 0;
    double reached_time = 0;
    std::string scheme;
    bool adaptive = false;
    long steps_accepted = 0;
    long steps_rejected = 0;
    /// time.error_control = global: the time error carried by the state at the end and at most
    /// (relative to the concentration scale), the tolerance; NaN otherwise.
    double carried_error_final = std::numeric_limits<double>::quiet_NaN();
    double carried_error_largest = std::numeric_limits<double>::quiet_NaN();
    double time_tolerance = std::numeric_limits<double>::quiet_NaN();
    std::vector<StageSpan> stages;
    /// Water flow (summary.json `flow`, written only with a Darcy flux): the largest cell Peclet
    /// number, its region, the largest Courant number of a step; cell_peclet 0 without flow.
    double cell_peclet = 0;
    std::string cell_peclet_region;
    double courant = 0;
    std::string linear_solver;
    long ranks = 1;
    std::string date;
    std::string host;
    double wall_time = 0;
    double balance_error = 0;
    double balance_relative = 0;
    Json::Value results;               ///< the `results` object as written
    Json::Value accuracy;              ///< the `accuracy` object (null if the summary has none)
    std::vector<std::string> warnings; ///< signs that numbers may be poor, with remedies

    /// The echoed setting @p key, or nullptr.
    const EchoedSetting *setting(const std::string &key) const;
    /// The region name of material id @p id (or `region ID` if out of range).
    std::string region_name(int id) const;
  };

  /// Reads @p path (a results folder's summary.json).
  RunSummary read_run_summary(const std::string &path);

  /// Parses @p path as JSON; PostInputError naming the file if missing or malformed.
  Json::Value read_json_file(const std::string &path, const std::string &what);
} // namespace fickcast::post
