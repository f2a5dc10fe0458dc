// A results folder that appears complete or not at all.
#pragma once

#include <string>

namespace fickcast
{
  /**
   * Creates `<target>.partial-<pid>` next to the target and, on commit(), renames it to the
   * target (replacing an existing target only when overwriting was allowed). If commit() is
   * never called, the destructor removes the partial folder: results are complete or absent.
   * Only the process that creates it touches the file system (rank 0 in an MPI run).
   */
  class ResultsFolder
  {
  public:
    /// Checks the target and creates the partial folder. Throws InputError if the target exists
    /// and @p overwrite is false (exit code 2), IoError if the folder cannot be created.
    ResultsFolder(const std::string &target, bool overwrite);
    ~ResultsFolder();
    ResultsFolder(const ResultsFolder &) = delete;
    ResultsFolder &operator=(const ResultsFolder &) = delete;

    /// Where to write now.
    const std::string &path() const { return partial_; }
    const std::string &target() const { return target_; }

    /// Moves the partial folder into place. Throws IoError.
    void commit();

  private:
    std::string target_;
    std::string partial_;
    bool overwrite_;
    bool committed_ = false;
  };

  /// Throws InputError if @p target exists and @p overwrite is false (checked before any work).
  void check_results_target(const std::string &target, bool overwrite);
} // namespace fickcast
