#include "studies/study_runner.h"

#include "case/case_reader.h"
#include "case/input_error.h"
#include "numerics/collective.h"
#include "results/json_file.h"
#include "results/summary.h"
#include "run/results_folder.h"
#include "run/run_case.h"
#include "run/simulation.h"
#include "studies/folder_lock.h"

#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace fickcast
{
  namespace fs = std::filesystem;

  namespace
  {
    std::string read_text(const std::string &path)
    {
      std::ifstream in(path);
      std::ostringstream buffer;
      buffer << in.rdbuf();
      return buffer.str();
    }

    /// Records a case that could not even be set up (a parameter value the case rejects).
    void write_input_error(const std::string &folder, const std::string &message)
    {
      ResultsFolder results(folder, true);
      Json::Value summary(Json::objectValue);
      summary["program"] = "fickcast";
      summary["version"] = fickcast_version();
      summary["status"] = "input error";
      summary["message"] = message;
      write_json(summary, results.path() + "/summary.json");
      results.commit();
    }
  } // namespace

  StudyTotals run_study(const CaseDescription &base, const std::vector<StudyCase> &cases, const StudyOptions &options,
                        MPI_Comm communicator, const std::function<void(const CaseEvent &)> &on_case)
  {
    const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(communicator);
    const std::string plan = plan_fingerprint(cases, options.base_overrides);
    const std::string plan_file = options.folder + "/study_plan.txt";

    // Rank 0 prepares the folder: new, resumed (same plan), or refused; and holds its lock.
    std::vector<char> done(cases.size(), 0);
    FolderLock lock;
    collectively(communicator, [&] {
      if (rank != 0)
        return;
      FolderLock::check_free(options.folder);
      if (fs::exists(options.folder))
        {
          if (options.overwrite)
            {
              check_replaceable(options.folder, "output.folder");
              fs::remove_all(options.folder);
            }
          else if (!fs::exists(plan_file))
            throw InputError(options.folder, "output.folder",
                             "the folder exists and holds no study: expected a new folder, the folder of this same "
                             "study (to resume it), or --overwrite");
          else if (read_text(plan_file) != plan)
            throw InputError(options.folder, "output.folder",
                             "the folder holds a different study (its cases or overrides differ): expected the same "
                             "study to resume it, another --output, or --overwrite");
        }
      fs::create_directories(options.folder + "/cases");
      write_results_marker(options.folder);
      lock.take(options.folder);
      // Leftovers of runs killed hard (partial folders) are not results: remove them.
      for (const auto &entry : fs::directory_iterator(options.folder + "/cases"))
        if (entry.path().filename().string().find(".partial-") != std::string::npos)
          fs::remove_all(entry.path());
      {
        std::ofstream out(plan_file);
        out << plan;
        if (!out)
          throw IoError("cannot write " + plan_file);
      }
      for (std::size_t i = 0; i < cases.size(); ++i)
        done[i] = fs::exists(options.folder + "/cases/" + cases[i].id + "/summary.json") ? 1 : 0;
    });
    MPI_Bcast(done.data(), static_cast<int>(done.size()), MPI_CHAR, 0, communicator);

    // A shared counter on rank 0 hands out the next case.
    long *counter = nullptr;
    MPI_Win window;
    MPI_Win_allocate(rank == 0 ? static_cast<MPI_Aint>(sizeof(long)) : 0, sizeof(long), MPI_INFO_NULL, communicator,
                     &counter, &window);
    if (rank == 0)
      {
        MPI_Win_lock(MPI_LOCK_EXCLUSIVE, 0, 0, window);
        *counter = 0;
        MPI_Win_unlock(0, window);
      }
    MPI_Barrier(communicator);

    StudyTotals totals;
    totals.cases = cases.size();
    const long one = 1;
    while (!stop_requested())
      {
        long index = 0;
        MPI_Win_lock(MPI_LOCK_EXCLUSIVE, 0, 0, window);
        MPI_Fetch_and_op(&one, &index, MPI_LONG, 0, 0, MPI_SUM, window);
        MPI_Win_unlock(0, window);
        if (index >= static_cast<long>(cases.size()))
          break;
        const StudyCase &c = cases[static_cast<std::size_t>(index)];
        const std::string folder = options.folder + "/cases/" + c.id;
        CaseEvent event{c.id, "", "", 0, rank};
        if (done[static_cast<std::size_t>(index)])
          {
            event.status = "already done";
            ++totals.reused;
            if (on_case)
              on_case(event);
            continue;
          }
        const auto start = std::chrono::steady_clock::now();
        std::vector<std::string> overrides = options.base_overrides;
        overrides.insert(overrides.end(), c.overrides.begin(), c.overrides.end());
        try
          {
            const CaseDescription description = read_case(options.case_file, overrides);
            RunOptions run;
            run.folder = folder;
            run.overwrite = true;
            const RunOutcome outcome = run_case(description, run, MPI_COMM_SELF);
            event.status = outcome.record.status;
            event.message = outcome.record.message;
          }
        catch (const InputError &error)
          {
            event.status = "input error";
            event.message = rejection_reason(error);
            write_input_error(folder, event.message);
          }
        catch (const IoError &)
          {
            throw; // the machine's doing (a full disk): the study stops with exit 3, not a failed case
          }
        catch (const std::exception &error)
          {
            event.status = "failed";
            event.message = error.what();
            write_input_error(folder, event.message);
          }
        event.wall_time = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        if (stop_requested())
          {
            // Interrupted while solving: the case is not finished; a rerun computes it.
            std::error_code ignored;
            fs::remove_all(folder, ignored);
            break;
          }
        ++totals.computed;
        totals.failed += event.status == "completed" ? 0 : 1;
        if (on_case)
          on_case(event);
      }
    MPI_Barrier(communicator);
    MPI_Win_free(&window);

    unsigned long sums[4] = {totals.computed, totals.reused, totals.failed, stop_requested() ? 1ul : 0ul};
    MPI_Allreduce(MPI_IN_PLACE, sums, 4, MPI_UNSIGNED_LONG, MPI_SUM, communicator);
    totals.computed = sums[0];
    totals.reused = sums[1];
    totals.failed = sums[2];
    totals.interrupted = sums[3] > 0;
    if (!totals.interrupted)
      collectively(communicator, [&] {
        if (rank == 0)
          totals.table = tabulate_study(base, cases, options.folder);
      });
    return totals;
  }
} // namespace fickcast
