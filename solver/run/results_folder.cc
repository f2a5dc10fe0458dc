#include "run/results_folder.h"

#include "case/input_error.h"

#include <cerrno>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <sstream>
#include <system_error>

#include <signal.h>
#include <unistd.h>

namespace fickcast
{
  namespace fs = std::filesystem;

  namespace
  {
    /// The absolute, normalised form of @p path (symbolic links resolved where they exist).
    fs::path canonical_form(const std::string &path)
    {
      std::error_code error;
      fs::path result = fs::weakly_canonical(fs::absolute(path, error), error);
      if (error)
        result = fs::absolute(path).lexically_normal();
      std::string text = result.string();
      while (text.size() > 1 && text.back() == '/')
        text.pop_back();
      return text;
    }

    /// What tells this process from a later one with the same number: the boot and the process's
    /// start time (Linux /proc; empty elsewhere).
    std::string process_identity(const long pid)
    {
      std::ifstream boot("/proc/sys/kernel/random/boot_id");
      std::string boot_id;
      std::getline(boot, boot_id);
      std::ifstream stat("/proc/" + std::to_string(pid) + "/stat");
      std::string text;
      std::getline(stat, text);
      // Field 22 (start time) counts from after the command name, which may hold spaces.
      const auto close = text.rfind(')');
      if (boot_id.empty() || close == std::string::npos)
        return "";
      std::istringstream fields(text.substr(close + 2));
      std::string field;
      for (int k = 3; k <= 22 && fields >> field; ++k)
        if (k == 22)
          return boot_id + " " + field;
      return "";
    }

    /// Whether process @p pid has ended but is not yet reaped (a zombie: state Z or X in Linux
    /// /proc). The ranks of an MPI run that stopped on an error can stay so for a moment after
    /// mpirun returns, and such a process writes nothing more.
    bool process_ended(const long pid)
    {
      std::ifstream stat("/proc/" + std::to_string(pid) + "/stat");
      std::string text;
      std::getline(stat, text);
      const auto close = text.rfind(')');
      if (close == std::string::npos || close + 2 >= text.size())
        return false;
      const char state = text[close + 2];
      return state == 'Z' || state == 'X';
    }

    constexpr const char *owner_file = ".fickcast-owner";

    /// Records which process writes into @p folder (a process number alone is reused).
    void write_owner(const std::string &folder)
    {
      std::ofstream out(folder + "/" + owner_file);
      out << process_identity(::getpid()) << '\n';
    }

    /// Whether the process that made the partial folder @p folder (number @p pid) still runs.
    bool owner_alive(const std::string &folder, const long pid)
    {
      if (pid <= 0 || (::kill(static_cast<pid_t>(pid), 0) != 0 && errno == ESRCH) || process_ended(pid))
        return false;
      std::ifstream in(folder + "/" + owner_file);
      std::string recorded;
      if (!std::getline(in, recorded) || recorded.empty())
        return true; // no record: trust the number
      return recorded == process_identity(pid);
    }

    /// Whether @p ancestor is @p path or one of its parent folders.
    bool contains(const fs::path &ancestor, const fs::path &path)
    {
      auto a = ancestor.begin(), p = path.begin();
      for (; a != ancestor.end(); ++a, ++p)
        if (p == path.end() || *a != *p)
          return false;
      return true;
    }
  } // namespace

  void write_results_marker(const std::string &folder)
  {
    const std::string path = folder + "/" + results_marker;
    std::ofstream out(path);
    out << "Written by fickcast: this folder holds its results and --overwrite may replace it.\n";
    if (!out)
      throw IoError("cannot write " + path);
  }

  void check_replaceable(const std::string &target, const std::string &key)
  {
    const fs::path folder = canonical_form(target);
    std::error_code error;
    const fs::path working = canonical_form(fs::current_path(error).string());
    const char *home = std::getenv("HOME");
    if (folder == folder.root_path() || folder.parent_path() == folder)
      throw InputError(target, key, "--overwrite refused: this is a filesystem root");
    if (contains(folder, working))
      throw InputError(target, key,
                       "--overwrite refused: this is the working folder or one of its parents (" + working.string() +
                         "); choose a results folder inside it");
    if (home != nullptr && *home != '\0' && folder == canonical_form(home))
      throw InputError(target, key, "--overwrite refused: this is the home folder");
    if (!fs::is_directory(target, error))
      throw InputError(target, key, "expected a folder, found a file of that name");
    if (!fs::exists(fs::path(target) / results_marker, error))
      throw InputError(target, key,
                       std::string("--overwrite refused: the folder holds no ") + results_marker +
                         " marker, so fickcast did not write it (or a version before 0.8 did); remove it yourself "
                         "or choose another folder");
  }

  void check_results_target(const std::string &target, const bool overwrite)
  {
    std::error_code error;
    if (!fs::exists(target, error))
      return;
    if (!overwrite)
      {
        if (!fs::is_directory(target, error))
          throw InputError(target, "output.folder", "expected a folder, found a file of that name");
        throw InputError(target, "output.folder",
                         "the results folder exists already: expected a new folder, or --overwrite to replace it");
      }
    check_replaceable(target, "output.folder");
  }

  std::vector<std::string> stale_partials(const std::string &target)
  {
    std::vector<std::string> stale;
    const fs::path path = fs::path(target).lexically_normal();
    const fs::path parent = path.parent_path().empty() ? fs::path(".") : path.parent_path();
    const std::string prefix = path.filename().string() + ".partial-";
    std::error_code error;
    for (fs::directory_iterator entry(parent, error), end; !error && entry != end; entry.increment(error))
      {
        const std::string name = entry->path().filename().string();
        if (name.rfind(prefix, 0) != 0)
          continue;
        const std::string digits = name.substr(prefix.size());
        if (digits.empty() || digits.find_first_not_of("0123456789") != std::string::npos)
          continue;
        const long pid = std::strtol(digits.c_str(), nullptr, 10);
        if (!owner_alive((parent / name).string(), pid))
          stale.push_back((parent / name).string());
      }
    return stale;
  }

  ResultsFolder::ResultsFolder(const std::string &target, const bool overwrite, const Progress &resume)
    : target_(fs::path(target).lexically_normal().string())
    , overwrite_(overwrite)
  {
    while (target_.size() > 1 && target_.back() == '/')
      target_.pop_back();
    if (target_.empty() || target_ == ".")
      check_replaceable(fs::current_path().string(), "output.folder");
    std::error_code error;
    if (resume && fs::exists(target_, error))
      throw InputError(target_, "--resume",
                       "expected an interrupted run to continue, found a finished results folder (--overwrite "
                       "runs it again)");
    check_results_target(target_, overwrite);
    partial_ = target_ + ".partial-" + std::to_string(::getpid());

    // With --resume: the stale partial folder that got furthest is taken over.
    std::string taken;
    if (resume)
      {
        long best = -1;
        for (const std::string &stale : stale_partials(target_))
          if (fs::exists(fs::path(stale) / results_marker, error))
            if (const long step = resume(stale); step > best)
              {
                best = step;
                taken = stale;
              }
      }
    for (const std::string &stale : stale_partials(target_))
      {
        if (stale == taken)
          continue;
        if ((overwrite || resume) && fs::exists(fs::path(stale) / results_marker, error))
          {
            fs::remove_all(stale, error);
            std::cerr << "fickcast: removed " << stale << ", left by an interrupted run\n";
          }
        else
          std::cerr << "fickcast: note: " << stale
                    << " is left by an interrupted run (its process no longer runs); --overwrite removes it, "
                       "--resume continues it\n";
      }
    if (!taken.empty())
      {
        fs::remove_all(partial_, error);
        fs::rename(taken, partial_, error);
        if (error)
          throw IoError("cannot take over " + taken + " to resume it: " + error.message());
        write_owner(partial_);
        resumed_ = true;
        return;
      }
    if (resume)
      std::cerr << "fickcast: note: no interrupted run of " << target_ << " to resume; starting at t = 0\n";
    fs::remove_all(partial_, error);
    fs::create_directories(partial_, error);
    if (error)
      throw IoError("cannot create the results folder " + partial_ + ": " + error.message());
    write_results_marker(partial_);
    write_owner(partial_);
  }

  ResultsFolder::~ResultsFolder()
  {
    // A resumed run that stops on an error keeps its state for the next --resume.
    if (!committed_ && !kept_ && !resumed_)
      {
        std::error_code error;
        fs::remove_all(partial_, error);
      }
  }

  void ResultsFolder::commit()
  {
    std::error_code error;
    fs::remove(fs::path(partial_) / owner_file, error);
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
