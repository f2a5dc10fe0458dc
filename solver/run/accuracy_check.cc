#include "run/accuracy_check.h"

#include "case/input_error.h"
#include "numerics/collective.h"
#include "numerics/run_size.h"
#include "results/headline_values.h"
#include "results/json_file.h"
#include "run/checkpoint.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <limits>

namespace fickcast
{
  using namespace dealii;
  namespace fs = std::filesystem;

  namespace
  {
    constexpr long solve_weight = 1000000000L; ///< progress: solves count before steps

    std::string solve_folder(const std::string &folder, const unsigned int k)
    {
      return folder + "/solve-" + std::to_string(k);
    }

  } // namespace

  SolveFacts facts_of(const CaseDescription &c, const RunRecord &r)
  {
    SolveFacts f;
    f.refine = c.geometry.refine;
    f.adaptive_steps = c.time.adaptive;
    f.step_control = c.time.adaptive ? c.time.tolerance : c.time.step;
    f.cells = r.cells;
    f.unknowns = r.unknowns;
    f.steps = r.steps_accepted;
    f.wall_time = r.wall_time;
    return f;
  }

  namespace
  {
    Json::Value solve_json(const std::vector<std::pair<std::string, double>> &values, const SolveFacts &f)
    {
      Json::Value s(Json::objectValue);
      Json::Value v(Json::objectValue);
      for (const auto &[name, value] : values)
        v[name] = value; // NaN is written as null
      s["values"] = v;
      s["refine"] = f.refine;
      s["step_control"] = f.step_control;
      s["adaptive_steps"] = f.adaptive_steps;
      s["cells"] = static_cast<Json::UInt64>(f.cells);
      s["unknowns"] = static_cast<Json::UInt64>(f.unknowns);
      s["steps"] = f.steps;
      s["wall_time_s"] = f.wall_time;
      return s;
    }

    void read_solve_json(const Json::Value &s, std::vector<std::pair<std::string, double>> &values, SolveFacts &f)
    {
      values.clear();
      for (const auto &name : s["values"].getMemberNames())
        {
          const Json::Value &v = s["values"][name];
          values.emplace_back(name, v.isNumeric() ? v.asDouble() : not_a_number);
        }
      f.refine = s["refine"].asUInt();
      f.step_control = s["step_control"].asDouble();
      f.adaptive_steps = s["adaptive_steps"].asBool();
      f.cells = s["cells"].asUInt64();
      f.unknowns = s["unknowns"].asUInt64();
      f.steps = s["steps"].asUInt();
      f.wall_time = s["wall_time_s"].asDouble();
    }

    /// The smallest error worth asking of a result whose value is round-off around zero.
    double absolute_floor(const std::string &name)
    {
      return name == "released_fraction.final" || name == "uptake_fraction.final" ? 1e-9 : 0.0;
    }

    using Values = std::vector<std::pair<std::string, double>>;

    /// The value named @p name in @p values (NaN if absent); @p found says whether it is there.
    double value_of(const Values &values, const std::string &name, bool &found)
    {
      for (const auto &[n, v] : values)
        if (n == name)
          {
            found = true;
            return v;
          }
      found = false;
      return not_a_number;
    }

    /**
     * Estimates the error of each named result of the last of @p solves from its changes between
     * solves; fills @p a (estimates, met). The finer solve's error is its last change over
     * (rho - 1), rho the factor by which the error falls per solve; rho is not trusted above 2
     * (the estimate is at least the last change). With three or more solves, rho is measured from
     * the last two changes (a slow convergence, down to rho = 1.25, gives up to four times the
     * change), and the estimate is at least the change before over 4, the fall the refinement is
     * made for (a change that is small by chance, between two solves that happen to agree, does
     * not make a small estimate). @p steady_floor: the two solves before the last measured their
     * step error alike (else the change between them says nothing about refinement).
     */
    void compare(const std::vector<Values> &solves, const bool steady_floor, AccuracyRecord &a)
    {
      a.estimates.clear();
      a.checked = true;
      a.met = true;
      const Values &fine = solves.back();
      const Values &coarse = solves[solves.size() - 2];
      for (const auto &[name, value] : fine)
        {
          bool found = false;
          const double before = value_of(coarse, name, found);
          if (!found || (std::isnan(value) && std::isnan(before)))
            continue; // not reached (or below the domain) in both: nothing to estimate
          double estimate = std::numeric_limits<double>::infinity();
          if (!std::isnan(value) && !std::isnan(before))
            {
              const double change = std::abs(value - before);
              estimate = change;
              if (solves.size() >= 3 && steady_floor)
                {
                  bool earlier_found = false;
                  const double earlier = value_of(solves[solves.size() - 3], name, earlier_found);
                  const double previous_change = std::abs(before - earlier);
                  if (earlier_found && std::isfinite(previous_change))
                    {
                      const double rho = change > 0 ? std::clamp(previous_change / change, 1.25, 2.0) : 2.0;
                      estimate = std::max(change / (rho - 1), previous_change / 4);
                    }
                }
            }
          a.estimates[name] = estimate;
          if (!(estimate <= a.requested * std::abs(value) || estimate <= absolute_floor(name)))
            a.met = false;
        }
    }

    /// The concentration under which a solve's step error is measured absolutely: half the
    /// smallest level (thresholds, depths) and point value (of the solve before) the case reports;
    /// 0 (the concentration scale) if it reports none.
    double error_floor(const CaseDescription &c, const Values &previous)
    {
      double floor = std::numeric_limits<double>::infinity();
      for (const auto &level : c.output.thresholds)
        floor = std::min(floor, std::abs(level.level));
      for (const auto &level : c.output.depths)
        floor = std::min(floor, std::abs(level.level));
      for (const auto &[name, value] : previous)
        if (name.rfind("point.", 0) == 0 && std::isfinite(value) && value != 0)
          floor = std::min(floor, std::abs(value));
      return std::isfinite(floor) && floor > 0 ? 0.5 * floor : 0.0;
    }

    /// Moves the files of @p sub into @p folder (replacing what is there) and removes every
    /// solve-k folder (rank 0).
    void promote(const std::string &folder, const std::string &sub)
    {
      for (const auto &entry : fs::directory_iterator(sub))
        {
          const fs::path target = fs::path(folder) / entry.path().filename();
          if (fs::exists(target))
            fs::remove_all(target);
          fs::rename(entry.path(), target);
        }
      for (const auto &entry : fs::directory_iterator(folder))
        if (entry.path().filename().string().rfind("solve-", 0) == 0)
          fs::remove_all(entry.path());
    }
  } // namespace

  CaseDescription refined_case(const CaseDescription &description, const unsigned int level)
  {
    CaseDescription c = description;
    const double halving = std::pow(2.0, static_cast<double>(level));
    c.geometry.refine += level;
    c.geometry.open_face_scale /= halving;
    if (c.time.adaptive)
      c.time.tolerance /= std::pow(halving, 3.0);
    else
      c.time.step /= halving;
    // Remeshing: the cells where it refines halve too (an interpolation error of degree p falls
    // as h^(p+1)).
    c.numerics.remesh_error /= std::pow(halving, static_cast<double>(c.numerics.degree + 1));
    if (c.numerics.smallest_cell > 0)
      c.numerics.smallest_cell /= halving;
    if (c.time.initial_step > 0)
      c.time.initial_step /= halving;
    if (c.time.max_step > 0)
      c.time.max_step /= halving;
    return c;
  }

  RunRecord check_accuracy(const CaseDescription &description, const std::string &folder,
                           const CheckpointPolicy &checkpoints, const SolveOnce &solve, MPI_Comm communicator)
  {
    const bool root = Utilities::MPI::this_mpi_process(communicator) == 0;
    AccuracyRecord accuracy;
    accuracy.requested = description.numerics.accuracy;
    const unsigned int most = std::max(2u, description.numerics.accuracy_solves);

    std::vector<Values> history;
    std::vector<double> floors; // time.error_floor of each solve
    Values values;
    RunRecord last;
    bool last_from_file = false;
    unsigned int last_k = 0;
    for (unsigned int k = 0;; ++k)
      {
        CaseDescription c = refined_case(description, k);
        if (c.time.adaptive)
          c.time.error_floor = error_floor(c, history.empty() ? Values() : history.back());
        floors.push_back(c.time.error_floor);
        if (k > 0)
          try
            {
              // The estimate counts global refinements only; the last solve's cells, 2^dim times,
              // also count the refinement next to open faces.
              RunSize size = estimate_run_size(c);
              const double grown = static_cast<double>(accuracy.solves.back().cells) * std::pow(2.0, c.dimension);
              if (size.cells > 0 && grown > size.cells)
                {
                  const double factor = grown / size.cells;
                  size.cells *= factor;
                  size.unknowns *= factor;
                  size.memory *= factor;
                }
              check_run_size(c, size, installed_memory());
            }
          catch (const InputError &error)
            {
              accuracy.note = "the check stopped after " + std::to_string(k) +
                              " solve(s): the next finer one would not fit this machine (" + error.message() + ")";
              break;
            }
        const std::string sub = solve_folder(folder, k);
        bool finished = false, has_checkpoint = false;
        Json::Value saved;
        collectively(communicator, [&] {
          if (!root)
            return;
          if (checkpoints.resume && fs::exists(sub + "/solve.json"))
            {
              saved = read_json(sub + "/solve.json");
              finished = true;
            }
          has_checkpoint = checkpoints.resume && latest_checkpoint_step(sub) >= 0;
          if (!finished)
            fs::create_directories(sub + "/fields");
        });
        finished = Utilities::MPI::broadcast(communicator, finished, 0);
        has_checkpoint = Utilities::MPI::broadcast(communicator, has_checkpoint, 0);

        SolveFacts facts;
        RunRecord record;
        if (finished)
          read_solve_json(saved, values, facts);
        else
          {
            CheckpointPolicy policy = checkpoints;
            policy.resume = has_checkpoint;
            record = solve(c, sub, policy);
            facts = facts_of(c, record);
            if (record.status != "completed")
              {
                accuracy.solves.push_back(facts);
                accuracy.note = "solve " + std::to_string(k + 1) + " of the accuracy check " +
                                (record.status == "failed" ? "failed" : "was interrupted");
                if (record.status == "failed")
                  collectively(communicator, [&] {
                    if (root)
                      promote(folder, sub);
                  });
                record.accuracy = accuracy;
                return record;
              }
            values = headline_values(record);
            collectively(communicator, [&] {
              if (root)
                write_json(solve_json(values, facts), sub + "/solve.json");
            });
          }
        accuracy.solves.push_back(facts);
        history.push_back(values);
        if (k > 0)
          {
            const double a = k >= 2 ? floors[k - 2] : 0, b = k >= 2 ? floors[k - 1] : 0;
            compare(history, a == b || (a > 0 && b > 0 && std::max(a, b) <= 2 * std::min(a, b)), accuracy);
          }
        last = record;
        last_from_file = finished;
        last_k = k;
        const bool met = Utilities::MPI::broadcast(communicator, accuracy.met, 0);
        if (met)
          break;
        if (k + 1 >= most)
          {
            accuracy.note = "not met after " + std::to_string(k + 1) +
                            " solves (numerics.accuracy_solves); the estimates say by how much";
            break;
          }
      }

    if (last_from_file)
      {
        // The run was interrupted after this solve finished: its numbers are known, its fields
        // and tables are not all kept. Solve it once more (the same arithmetic).
        CheckpointPolicy policy = checkpoints;
        policy.resume = false;
        const std::string sub = solve_folder(folder, last_k);
        collectively(communicator, [&] {
          if (root)
            {
              fs::remove_all(sub);
              fs::create_directories(sub + "/fields");
            }
        });
        CaseDescription c = refined_case(description, last_k);
        if (c.time.adaptive)
          c.time.error_floor = floors[last_k];
        last = solve(c, sub, policy);
        if (last.status != "completed")
          accuracy.note = "the last solve of the accuracy check, repeated after a resume, did not complete";
      }
    collectively(communicator, [&] {
      if (root)
        promote(folder, solve_folder(folder, last_k));
    });
    last.accuracy = accuracy;
    return last;
  }

  long accuracy_progress(const std::string &folder)
  {
    long progress = latest_checkpoint_step(folder);
    for (unsigned int k = 0; k < 16; ++k)
      {
        const std::string sub = solve_folder(folder, k);
        if (!fs::exists(sub))
          break;
        if (fs::exists(sub + "/solve.json"))
          progress = std::max(progress, (k + 1) * solve_weight - 1);
        else if (const long step = latest_checkpoint_step(sub); step >= 0)
          progress = std::max(progress, k * solve_weight + step);
      }
    return progress;
  }
} // namespace fickcast
