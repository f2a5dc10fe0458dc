// A study folder in use: two sweeps writing into the same folder at once would mix their cases.
#pragma once

#include <string>

namespace fickcast
{
  /**
   * Holds FOLDER/.fickcast-lock (process id and host) while a study writes into FOLDER; removed
   * by the destructor, also when the study stops on an error or a signal.
   */
  class FolderLock
  {
  public:
    FolderLock() = default;
    ~FolderLock();
    FolderLock(const FolderLock &) = delete;
    FolderLock &operator=(const FolderLock &) = delete;

    /**
     * Throws InputError (naming output.folder) if @p folder holds the lock of a study that still
     * runs (a live process on this host, or any process on another host). A lock left by a
     * process that no longer runs is stale and ignored. Call before touching the folder.
     */
    static void check_free(const std::string &folder);

    /// Creates the lock in @p folder (which must exist). Throws InputError if another process
    /// took it in the meantime, IoError if it cannot be written.
    void take(const std::string &folder);

  private:
    std::string path_;
  };
} // namespace fickcast
