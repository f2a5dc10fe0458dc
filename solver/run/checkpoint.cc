#include "run/checkpoint.h"

#include "case/input_error.h"
#include "numerics/diffusion_problem.h"
#include "results/observers.h"

#include <algorithm>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace fickcast
{
  namespace fs = std::filesystem;

  namespace
  {
    constexpr char magic[] = "fickcast checkpoint 1\n";
    enum Tag : unsigned char
    {
      tag_number = 1,
      tag_count = 2,
      tag_text = 3,
      tag_values = 4
    };

    std::string step_folder(const std::string &folder, const unsigned long step)
    {
      char name[32];
      std::snprintf(name, sizeof(name), "step-%09lu", step);
      return folder + "/" + name;
    }

    std::string rank_file(const std::string &step_folder, const unsigned int rank)
    {
      char name[32];
      std::snprintf(name, sizeof(name), "rank-%04u.bin", rank);
      return step_folder + "/" + name;
    }

    /// FNV-1a of @p bytes: a damaged file is told from a whole one.
    std::uint64_t checksum(const std::string &bytes)
    {
      std::uint64_t hash = 1469598103934665603ull;
      for (const unsigned char ch : bytes)
        {
          hash ^= ch;
          hash *= 1099511628211ull;
        }
      return hash;
    }

    /// Complete checkpoints in @p folder (FOLDER/checkpoint), by step, newest last.
    std::vector<unsigned long> complete_steps(const std::string &folder)
    {
      std::vector<unsigned long> steps;
      std::error_code error;
      for (fs::directory_iterator entry(folder, error), end; !error && entry != end; entry.increment(error))
        {
          const std::string name = entry->path().filename().string();
          if (name.rfind("step-", 0) != 0 || name.size() != 14 ||
              name.find_first_not_of("0123456789", 5) != std::string::npos)
            continue;
          std::error_code missing;
          if (fs::exists(entry->path() / "complete", missing))
            steps.push_back(std::stoul(name.substr(5)));
        }
      std::sort(steps.begin(), steps.end());
      return steps;
    }

    /// True on every rank if it is true on any (collective).
    bool any(const bool flag, MPI_Comm communicator)
    {
      int value = flag ? 1 : 0;
      MPI_Allreduce(MPI_IN_PLACE, &value, 1, MPI_INT, MPI_MAX, communicator);
      return value != 0;
    }
  } // namespace

  // --- StateArchive

  // An empty vector's data() may be a null pointer, which memcpy must not get even for 0 bytes
  // (found by the sanitize preset in cli.restart).
  void StateArchive::raw(const void *data, const std::size_t size)
  {
    if (size > 0)
      bytes_.append(static_cast<const char *>(data), size);
  }

  void StateArchive::read_raw(void *data, const std::size_t size)
  {
    if (bytes_.size() - position_ < size)
      throw IoError("the checkpoint ends early (a damaged file)");
    if (size > 0)
      std::memcpy(data, bytes_.data() + position_, size);
    position_ += size;
  }

  void StateArchive::put(const double value)
  {
    put_tag(tag_number);
    raw(&value, sizeof(value));
  }

  void StateArchive::put_count(const std::uint64_t value)
  {
    put_tag(tag_count);
    raw(&value, sizeof(value));
  }

  void StateArchive::put(const std::string &text)
  {
    put_tag(tag_text);
    const std::uint64_t size = text.size();
    raw(&size, sizeof(size));
    raw(text.data(), text.size());
  }

  void StateArchive::put(const std::vector<double> &values)
  {
    put_tag(tag_values);
    const std::uint64_t size = values.size();
    raw(&size, sizeof(size));
    raw(values.data(), values.size() * sizeof(double));
  }

  namespace
  {
    void check_tag(const unsigned char found, const unsigned char expected)
    {
      if (found != expected)
        throw IoError("the checkpoint does not hold what this version of fickcast expects (a damaged file, or "
                      "one written by another version)");
    }
  } // namespace

  void StateArchive::put_tag(const unsigned char tag)
  {
    raw(&tag, 1);
  }

  void StateArchive::expect_tag(const unsigned char expected)
  {
    unsigned char tag = 0;
    read_raw(&tag, 1);
    check_tag(tag, expected);
  }

  double StateArchive::get()
  {
    expect_tag(tag_number);
    double value = 0;
    read_raw(&value, sizeof(value));
    return value;
  }

  std::uint64_t StateArchive::get_count()
  {
    expect_tag(tag_count);
    std::uint64_t value = 0;
    read_raw(&value, sizeof(value));
    return value;
  }

  std::string StateArchive::get_text()
  {
    expect_tag(tag_text);
    std::uint64_t size = 0;
    read_raw(&size, sizeof(size));
    if (size > bytes_.size() - position_)
      throw IoError("the checkpoint ends early (a damaged file)");
    std::string text(static_cast<std::size_t>(size), '\0');
    read_raw(text.data(), text.size());
    return text;
  }

  std::vector<double> StateArchive::get_values()
  {
    expect_tag(tag_values);
    std::uint64_t size = 0;
    read_raw(&size, sizeof(size));
    if (size > (bytes_.size() - position_) / sizeof(double))
      throw IoError("the checkpoint ends early (a damaged file)");
    std::vector<double> values(static_cast<std::size_t>(size));
    read_raw(values.data(), values.size() * sizeof(double));
    return values;
  }

  // --- CheckpointStore

  CheckpointStore::CheckpointStore(const std::string &folder, MPI_Comm communicator)
    : folder_(folder + "/checkpoint")
    , communicator_(communicator)
  {
    int rank = 0;
    MPI_Comm_rank(communicator, &rank);
    rank_ = static_cast<unsigned int>(rank);
  }

  void CheckpointStore::write(const unsigned long step, const CheckpointIdentity &identity, const StateArchive &archive)
  {
    const std::string here = step_folder(folder_, step);
    std::string failure;
    {
      StateArchive head;
      head.put_count(identity.fingerprint);
      head.put_count(identity.dimension);
      head.put_count(identity.ranks);
      head.put_count(rank_);
      head.put_count(identity.unknowns);
      head.put_count(identity.local_unknowns);
      const std::string body = head.bytes() + archive.bytes();
      const std::uint64_t sum = checksum(body);
      std::error_code error;
      fs::create_directories(here, error);
      const std::string file = rank_file(here, rank_);
      std::ofstream out(file + ".tmp", std::ios::binary | std::ios::trunc);
      out.write(magic, sizeof(magic) - 1);
      out.write(reinterpret_cast<const char *>(&sum), sizeof(sum));
      out.write(body.data(), static_cast<std::streamsize>(body.size()));
      out.close();
      if (!out)
        failure =
          "cannot write " + file + ": " + std::strerror(errno) + " (a full disk or a folder that is not writable)";
      else
        {
          fs::rename(file + ".tmp", file, error);
          if (error)
            failure = "cannot write " + file + ": " + error.message();
        }
    }
    if (any(!failure.empty(), communicator_))
      throw IoError(failure.empty() ? "another rank could not write its checkpoint file in " + here : failure);
    if (rank_ == 0)
      {
        std::ofstream mark(here + "/complete");
        mark << "step " << step << ", " << identity.ranks << " rank(s)\n";
        mark.close();
        if (!mark)
          failure = "cannot write " + here + "/complete (a full disk or a folder that is not writable)";
        else
          for (const unsigned long older : complete_steps(folder_))
            if (older != step)
              {
                std::error_code ignored;
                fs::remove_all(step_folder(folder_, older), ignored);
              }
      }
    if (any(!failure.empty(), communicator_))
      throw IoError(failure.empty() ? "rank 0 could not complete the checkpoint in " + here : failure);
  }

  std::optional<StateArchive> CheckpointStore::read_latest(const CheckpointIdentity &identity) const
  {
    long step = -1;
    if (rank_ == 0)
      {
        const auto steps = complete_steps(folder_);
        step = steps.empty() ? -1 : static_cast<long>(steps.back());
      }
    MPI_Bcast(&step, 1, MPI_LONG, 0, communicator_);
    if (step < 0)
      return std::nullopt;
    const std::string here = step_folder(folder_, static_cast<unsigned long>(step));

    // Each rank reads its own file; the first problem found (in rank order) is everybody's.
    std::string problem;
    bool input_problem = false;
    StateArchive archive;
    const std::string file = rank_file(here, rank_);
    std::ifstream in(file, std::ios::binary);
    std::ostringstream buffer;
    buffer << in.rdbuf();
    const std::string bytes = buffer.str();
    const std::size_t head = sizeof(magic) - 1 + sizeof(std::uint64_t);
    std::uint64_t sum = 0;
    if (!in.is_open())
      {
        int written_by = 0;
        std::error_code error;
        for (fs::directory_iterator entry(here, error), end; !error && entry != end; entry.increment(error))
          written_by += entry->path().extension() == ".bin" ? 1 : 0;
        problem = "expected a checkpoint written by " + std::to_string(identity.ranks) +
                  " rank(s) (this run), found one by " + std::to_string(written_by) + " (resume with as many ranks)";
        input_problem = true;
      }
    else if (bytes.size() < head || bytes.compare(0, sizeof(magic) - 1, magic) != 0)
      problem = "cannot resume from " + file + ": not a fickcast checkpoint of this version";
    else
      {
        std::memcpy(&sum, bytes.data() + sizeof(magic) - 1, sizeof(sum));
        if (checksum(bytes.substr(head)) != sum)
          problem = "cannot resume from " + file + ": the file is damaged (its checksum does not match)";
      }
    if (problem.empty())
      try
        {
          archive = StateArchive(bytes.substr(head));
          const std::uint64_t fingerprint = archive.get_count();
          const std::uint64_t dimension = archive.get_count();
          const std::uint64_t ranks = archive.get_count();
          const std::uint64_t rank = archive.get_count();
          const std::uint64_t unknowns = archive.get_count();
          const std::uint64_t local = archive.get_count();
          input_problem = true;
          if (fingerprint != identity.fingerprint)
            problem = "expected the case this checkpoint was written for, found it changed (the case file or "
                      "its --set values); --overwrite starts the run again";
          else if (ranks != identity.ranks)
            problem = "expected a checkpoint written by " + std::to_string(identity.ranks) +
                      " rank(s) (this run), found one by " + std::to_string(ranks) + " (resume with as many ranks)";
          else if (dimension != identity.dimension || rank != rank_ || unknowns != identity.unknowns ||
                   local != identity.local_unknowns)
            problem = "expected a checkpoint of this run's mesh (" + std::to_string(identity.unknowns) +
                      " unknowns), found one of " + std::to_string(unknowns) +
                      " (a mesh file may have changed); --overwrite starts the run again";
          else
            input_problem = false;
        }
      catch (const IoError &error)
        {
          problem = "cannot resume from " + file + ": " + error.what();
        }

    // Agree on the first problem: its rank, then its text.
    int mine = problem.empty() ? 1 << 30 : static_cast<int>(rank_);
    int first = mine;
    MPI_Allreduce(&mine, &first, 1, MPI_INT, MPI_MIN, communicator_);
    if (first != 1 << 30)
      {
        unsigned long length = problem.size();
        int kind = input_problem ? 1 : 0;
        MPI_Bcast(&length, 1, MPI_UNSIGNED_LONG, first, communicator_);
        MPI_Bcast(&kind, 1, MPI_INT, first, communicator_);
        problem.resize(length);
        MPI_Bcast(problem.data(), static_cast<int>(length), MPI_CHAR, first, communicator_);
        if (kind == 1)
          throw InputError(here, "--resume", problem);
        throw IoError(problem);
      }
    return archive;
  }

  void CheckpointStore::remove_all() const
  {
    if (rank_ != 0)
      return;
    std::error_code ignored;
    fs::remove_all(folder_, ignored);
  }

  void put(StateArchive &archive, const ProblemState &state)
  {
    archive.put_count(state.stage);
    archive.put(state.bath_value);
    archive.put(state.bath_value_prev);
    archive.put(state.bath_trial);
    archive.put(state.reserve);
    archive.put(state.preconditioner_key);
    archive.put_count(state.matrix_setups);
    archive.put(state.system_key);
    archive.put(state.solver_statistics);
  }

  void get(StateArchive &archive, ProblemState &state)
  {
    state.stage = static_cast<unsigned int>(archive.get_count());
    state.bath_value = archive.get_values();
    state.bath_value_prev = archive.get_values();
    state.bath_trial = archive.get_values();
    state.reserve = archive.get_values();
    state.preconditioner_key = archive.get_values();
    state.matrix_setups = static_cast<unsigned int>(archive.get_count());
    state.system_key = archive.get_values();
    state.solver_statistics = archive.get_values();
  }

  void put(StateArchive &archive, const ObserverState &state)
  {
    archive.put(state.point_values);
    archive.put(state.threshold_times);
    archive.put_count(state.depth_times.size());
    for (std::size_t k = 0; k < state.depth_times.size(); ++k)
      {
        archive.put(state.depth_times[k]);
        archive.put(state.depth_values[k]);
      }
    archive.put(state.last_released);
    archive.put(state.release_times);
    archive.put_count(state.moments.size());
    for (const auto &m : state.moments)
      archive.put(std::vector<double>{m.time, m.amount, m.mean[0], m.mean[1], m.mean[2], m.variance});
    archive.put_count(state.profiles_size);
  }

  void get(StateArchive &archive, ObserverState &state)
  {
    state.point_values = archive.get_values();
    state.threshold_times = archive.get_values();
    const std::uint64_t depths = archive.get_count();
    if (depths > 1000000)
      throw IoError("the checkpoint holds an impossible number of depths (a damaged file)");
    state.depth_times.resize(depths);
    state.depth_values.resize(depths);
    for (std::size_t k = 0; k < depths; ++k)
      {
        state.depth_times[k] = archive.get_values();
        state.depth_values[k] = archive.get_values();
      }
    state.last_released = archive.get();
    state.release_times = archive.get_values();
    const std::uint64_t moments = archive.get_count();
    if (moments > 100000000)
      throw IoError("the checkpoint holds an impossible number of moments (a damaged file)");
    state.moments.clear();
    for (std::size_t k = 0; k < moments; ++k)
      {
        const std::vector<double> v = archive.get_values();
        if (v.size() != 6)
          throw IoError("the checkpoint's moments are damaged");
        MomentsRecord m;
        m.time = v[0];
        m.amount = v[1];
        m.mean = {{v[2], v[3], v[4]}};
        m.variance = v[5];
        state.moments.push_back(m);
      }
    state.profiles_size = archive.get_count();
  }

  long latest_checkpoint_step(const std::string &folder)
  {
    const auto steps = complete_steps(folder + "/checkpoint");
    return steps.empty() ? -1 : static_cast<long>(steps.back());
  }
} // namespace fickcast
