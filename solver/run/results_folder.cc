#include "run/results_folder.h"

#include "case/input_error.h"

#include <filesystem>
#include <system_error>

#include <unistd.h>

namespace fickcast
{
  namespace fs = std::filesystem;

  void check_results_target(const std::string &target, const bool overwrite)
  {
    std::error_code error;
    if (fs::exists(target, error) && !overwrite)
      throw InputError(target, "output.folder",
                       "the results folder exists already: expected a new folder, or --overwrite to replace it");
    if (fs::exists(target, error) && !fs::is_directory(target, error))
      throw InputError(target, "output.folder", "expected a folder, found a file of that name");
  }

  ResultsFolder::ResultsFolder(const std::string &target, const bool overwrite)
    : target_(fs::path(target).lexically_normal().string())
    , overwrite_(overwrite)
  {
    if (!target_.empty() && (target_.back() == '/'))
      target_.pop_back();
    check_results_target(target_, overwrite);
    partial_ = target_ + ".partial-" + std::to_string(::getpid());
    std::error_code error;
    fs::remove_all(partial_, error);
    fs::create_directories(partial_, error);
    if (error)
      throw IoError("cannot create the results folder " + partial_ + ": " + error.message());
  }

  ResultsFolder::~ResultsFolder()
  {
    if (!committed_)
      {
        std::error_code error;
        fs::remove_all(partial_, error);
      }
  }

  void ResultsFolder::commit()
  {
    std::error_code error;
    std::string old;
    if (fs::exists(target_, error))
      {
        if (!overwrite_)
          throw IoError("the results folder " + target_ + " appeared while the run was going on");
        old = target_ + ".old-" + std::to_string(::getpid());
        fs::rename(target_, old, error);
        if (error)
          throw IoError("cannot move the old results folder " + target_ + " aside: " + error.message());
      }
    fs::rename(partial_, target_, error);
    if (error)
      throw IoError("cannot rename " + partial_ + " to " + target_ + ": " + error.message());
    committed_ = true;
    if (!old.empty())
      fs::remove_all(old, error);
  }
} // namespace fickcast
