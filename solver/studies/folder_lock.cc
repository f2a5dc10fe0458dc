#include "studies/folder_lock.h"

#include "case/input_error.h"

#include <fcntl.h>
#include <signal.h>
#include <unistd.h>

#include <cerrno>
#include <climits>
#include <cstdio>
#include <filesystem>
#include <fstream>

namespace fickcast
{
  namespace
  {
    constexpr const char *lock_name = "/.fickcast-lock";

    std::string this_host()
    {
      char name[HOST_NAME_MAX + 1] = {};
      return gethostname(name, sizeof(name)) == 0 ? std::string(name) : std::string("unknown host");
    }

    /// The holder written in a lock file ("pid host"), and whether it still runs.
    struct Holder
    {
      long pid = 0;
      std::string host;
      bool alive = false;
    };

    Holder read_holder(const std::string &path)
    {
      Holder h;
      std::ifstream in(path);
      in >> h.pid >> h.host;
      if (h.pid <= 0)
        return h; // empty or unreadable: a lock being written, or debris; treated as stale
      if (h.host != this_host())
        h.alive = true; // cannot tell from here
      else
        h.alive = kill(static_cast<pid_t>(h.pid), 0) == 0 || errno == EPERM;
      return h;
    }

    [[noreturn]] void refuse(const std::string &folder, const Holder &h)
    {
      throw InputError(folder, "output.folder",
                       "expected a folder no other study is writing to, found one in use by process " +
                         std::to_string(h.pid) + " on " + h.host + ": wait for it, use another --output, or remove " +
                         folder + lock_name + " if that process no longer runs");
    }
  } // namespace

  void FolderLock::check_free(const std::string &folder)
  {
    const std::string path = folder + lock_name;
    if (!std::filesystem::exists(path))
      return;
    const Holder h = read_holder(path);
    if (h.alive && !(h.pid == static_cast<long>(getpid()) && h.host == this_host()))
      refuse(folder, h);
  }

  void FolderLock::take(const std::string &folder)
  {
    const std::string path = folder + lock_name;
    for (int attempt = 0; attempt < 2; ++attempt)
      {
        const int fd = open(path.c_str(), O_WRONLY | O_CREAT | O_EXCL, 0644);
        if (fd >= 0)
          {
            const std::string text = std::to_string(static_cast<long>(getpid())) + " " + this_host() + "\n";
            const bool written = write(fd, text.data(), text.size()) == static_cast<ssize_t>(text.size());
            close(fd);
            if (!written)
              {
                std::remove(path.c_str());
                throw IoError("cannot write " + path);
              }
            path_ = path;
            return;
          }
        if (errno != EEXIST)
          throw IoError("cannot create " + path);
        const Holder h = read_holder(path);
        if (h.alive)
          refuse(folder, h);
        std::remove(path.c_str()); // stale: its process is gone
      }
    throw IoError("cannot take " + path + ": it keeps reappearing");
  }

  FolderLock::~FolderLock()
  {
    if (!path_.empty())
      std::remove(path_.c_str());
  }
} // namespace fickcast
