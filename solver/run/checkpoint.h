// Checkpoints: the whole state of a run at a step, from which an interrupted run continues.
#pragma once

#include "case/input_error.h"

#include <mpi.h>

#include <algorithm>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace fickcast
{
  struct ProblemState;
  struct ObserverState;

  /**
   * A byte string written and read field by field, in the byte order of the machine (a checkpoint
   * is read back where it was written). Reading past the end or a field of another kind throws
   * IoError: a damaged checkpoint is refused, never half-read.
   */
  class StateArchive
  {
  public:
    StateArchive() = default;
    explicit StateArchive(std::string bytes)
      : bytes_(std::move(bytes))
    {
    }

    void put(double value);
    void put_count(std::uint64_t value);
    void put(const std::string &text);
    void put(const std::vector<double> &values);

    double get();
    std::uint64_t get_count();
    std::string get_text();
    std::vector<double> get_values();

    const std::string &bytes() const { return bytes_; }
    bool at_end() const { return position_ == bytes_.size(); }

  private:
    void raw(const void *data, std::size_t size);
    void read_raw(void *data, std::size_t size);
    /// Each field starts with a byte telling its kind; reading another kind is damage.
    void put_tag(unsigned char tag);
    void expect_tag(unsigned char expected);
    std::string bytes_;
    std::size_t position_ = 0;
  };

  /// What every rank's file of a checkpoint says about where it came from.
  struct CheckpointIdentity
  {
    std::uint64_t fingerprint = 0; ///< of the case (CaseDescription::fingerprint)
    unsigned int dimension = 1;
    unsigned int ranks = 1;
    std::uint64_t unknowns = 0;
    std::uint64_t local_unknowns = 0; ///< this rank's owned unknowns
  };

  /**
   * The checkpoints of one run in `FOLDER/checkpoint/step-NNNNNNNNN/`: one file per rank
   * (`rank-RRRR.bin`) and a `complete` mark written by rank 0 after every rank has written its
   * file. A checkpoint is complete or ignored; the older one is removed only after the newer is
   * complete, so a run killed at any instant (kill -9 included) leaves one to continue from.
   * Collective over @p communicator (the ranks that solve); the folder is shared by them.
   */
  class CheckpointStore
  {
  public:
    CheckpointStore(const std::string &folder, MPI_Comm communicator);

    /// Writes this rank's @p archive as the checkpoint after step @p step (collective).
    /// Throws IoError on every rank if any rank failed to write.
    void write(unsigned long step, const CheckpointIdentity &identity, const StateArchive &archive);

    /// This rank's archive of the newest complete checkpoint, after checking that it was written
    /// for @p identity (same case, ranks and mesh); nothing if there is none (collective).
    /// Throws InputError (naming the folder, what it holds and what this run is) if it does not
    /// fit, IoError if it is damaged.
    std::optional<StateArchive> read_latest(const CheckpointIdentity &identity) const;

    /// Removes every checkpoint (rank 0): a finished run keeps none.
    void remove_all() const;

  private:
    std::string folder_; ///< FOLDER/checkpoint
    MPI_Comm communicator_;
    unsigned int rank_ = 0;
  };

  /// The problem's and the observers' parts of a checkpoint, written and read in one order.
  void put(StateArchive &archive, const ProblemState &state);
  void get(StateArchive &archive, ProblemState &state);
  void put(StateArchive &archive, const ObserverState &state);
  void get(StateArchive &archive, ObserverState &state);

  /// The step of the newest complete checkpoint in the results folder @p folder, or -1.
  long latest_checkpoint_step(const std::string &folder);

  /// The entries of @p v this rank owns, for a checkpoint.
  template <typename Vector>
  std::vector<double> owned_values(const Vector &v)
  {
    return std::vector<double>(v.begin(), v.end());
  }

  /// Sets the entries of @p v this rank owns from a checkpoint (IoError if they do not fit).
  template <typename Vector>
  void set_owned_values(Vector &v, const std::vector<double> &values)
  {
    if (values.size() != static_cast<std::size_t>(v.end() - v.begin()))
      throw IoError("the checkpoint's state does not fit this rank's part of the mesh (a damaged file)");
    std::copy(values.begin(), values.end(), v.begin());
  }
} // namespace fickcast
