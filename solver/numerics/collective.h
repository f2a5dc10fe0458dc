// Errors that happen on some MPI ranks, raised on all of them.
#pragma once

#include "case/input_error.h"

#include <deal.II/base/mpi.h>

#include <stdexcept>
#include <string>
#include <utility>

namespace fickcast
{
  namespace detail
  {
    enum class ErrorKind : int
    {
      none = 0,
      input = 1,
      io = 2,
      other = 3
    };

    /// Runs @p work on every rank; if any rank throws, every rank throws the first error seen.
    template <typename Work>
    void collectively_impl(MPI_Comm communicator, Work &&work)
    {
      ErrorKind kind = ErrorKind::none;
      std::string where, key, message, text;
      try
        {
          work();
        }
      catch (const InputError &error)
        {
          kind = ErrorKind::input;
          where = error.where();
          key = error.key();
          message = error.message();
        }
      catch (const IoError &error)
        {
          kind = ErrorKind::io;
          text = error.what();
        }
      catch (const std::exception &error)
        {
          kind = ErrorKind::other;
          text = error.what();
        }
      const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(communicator);
      const unsigned int n_ranks = dealii::Utilities::MPI::n_mpi_processes(communicator);
      const unsigned int reporter = dealii::Utilities::MPI::min(kind == ErrorKind::none ? n_ranks : rank, communicator);
      if (reporter == n_ranks)
        return;
      const int code = dealii::Utilities::MPI::broadcast(communicator, static_cast<int>(kind), reporter);
      where = dealii::Utilities::MPI::broadcast(communicator, where, reporter);
      key = dealii::Utilities::MPI::broadcast(communicator, key, reporter);
      message = dealii::Utilities::MPI::broadcast(communicator, message, reporter);
      text = dealii::Utilities::MPI::broadcast(communicator, text, reporter);
      switch (static_cast<ErrorKind>(code))
        {
          case ErrorKind::input:
            throw InputError(where, key, message);
          case ErrorKind::io:
            throw IoError(text);
          default:
            throw std::runtime_error(text);
        }
    }
  } // namespace detail

  /**
   * Runs @p work on every rank of @p communicator; if any rank throws (InputError, IoError or
   * another std::exception), every rank throws the first such error (lowest rank), so no rank is
   * left waiting in a collective call.
   */
  template <typename Work>
  void collectively(MPI_Comm communicator, Work &&work)
  {
    detail::collectively_impl(communicator, std::forward<Work>(work));
  }
} // namespace fickcast
