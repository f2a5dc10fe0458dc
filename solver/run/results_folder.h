// A results folder that appears complete or not at all.
#pragma once

#include <functional>
#include <string>
#include <vector>

namespace fickcast
{
  /**
   * Creates `<target>.partial-<pid>` next to the target and, on commit(), renames it to the
   * target (replacing an existing target only when overwriting was allowed). If commit() is
   * never called, the destructor removes the partial folder (results are complete or absent),
   * unless it is kept for a resume (keep(), or a resumed run that stopped on an error).
   * The partial folder holds the results marker from the start. Partial folders of the same
   * target left by dead processes are named on stderr, and removed when overwriting.
   * Only the process that creates it touches the file system (rank 0 in an MPI run).
   */
  class ResultsFolder
  {
  public:
    /// Tells how far the run in a partial folder got: its newest checkpoint's step, or -1.
    using Progress = std::function<long(const std::string &)>;

    /// Checks the target and creates the partial folder. Throws InputError if the target exists
    /// and @p overwrite is false (exit code 2), IoError if the folder cannot be created.
    /// With @p resume, the partial folder of a dead process that got furthest (by @p resume) is
    /// taken over instead of a new one (resumed() says so) and the other stale ones are removed;
    /// a target that exists already is refused (the run finished).
    ResultsFolder(const std::string &target, bool overwrite, const Progress &resume = {});
    ~ResultsFolder();
    ResultsFolder(const ResultsFolder &) = delete;
    ResultsFolder &operator=(const ResultsFolder &) = delete;

    /// Where to write now.
    const std::string &path() const { return partial_; }
    const std::string &target() const { return target_; }

    /// Moves the partial folder into place. Throws IoError.
    void commit();
    /// Leaves the partial folder where it is for a later --resume (an interrupted run).
    void keep() { kept_ = true; }
    /// Whether the partial folder was taken over from an interrupted run.
    bool resumed() const { return resumed_; }

  private:
    std::string target_;
    std::string partial_;
    bool overwrite_;
    bool committed_ = false;
    bool kept_ = false;
    bool resumed_ = false;
  };

  /// The file fickcast writes into every results, study, sizing and verification folder it
  /// makes: --overwrite replaces a folder only if it holds this marker.
  inline constexpr const char *results_marker = ".fickcast-results";

  /// Writes the marker into @p folder. Throws IoError.
  void write_results_marker(const std::string &folder);

  /// Throws InputError (naming @p key, e.g. output.folder) unless the existing folder @p target
  /// may be replaced: a folder (not a file) holding the marker, and not the working folder, an
  /// ancestor of it, the home folder or a filesystem root.
  void check_replaceable(const std::string &target, const std::string &key);

  /// Throws InputError if @p target exists and @p overwrite is false, or if @p overwrite is true
  /// and the folder may not be replaced (check_replaceable); checked before any work.
  void check_results_target(const std::string &target, bool overwrite);

  /// Partial folders `<target>.partial-<pid>` left by processes that no longer run (killed hard).
  std::vector<std::string> stale_partials(const std::string &target);
} // namespace fickcast
