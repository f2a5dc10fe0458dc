#include "results/csv_writer.h"

#include "case/input_error.h"

#include <cerrno>
#include <charconv>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <stdexcept>

namespace fickcast
{
  std::string csv_field(const std::string &text)
  {
    if (text.find_first_of(",\"\n") == std::string::npos)
      return text;
    std::string out = "\"";
    for (const char c : text)
      out += c == '"' ? std::string("\"\"") : std::string(1, c);
    return out + "\"";
  }

  void CsvWriter::open(const std::string &path, const std::vector<Column> &columns)
  {
    path_ = path;
    stream_.open(path);
    if (!stream_)
      throw IoError("cannot write " + path);
    n_columns_ = columns.size();
    for (std::size_t i = 0; i < columns.size(); ++i)
      {
        stream_ << (i ? "," : "") << columns[i].name;
        if (!columns[i].unit.empty() && columns[i].unit != "1")
          stream_ << " [" << columns[i].unit << "]";
      }
    stream_ << '\n';
  }

  void CsvWriter::write(const std::vector<double> &values)
  {
    if (values.size() != n_columns_)
      throw std::logic_error("fickcast: CSV row of " + std::to_string(values.size()) + " values for " +
                             std::to_string(n_columns_) + " columns in " + path_);
    // The row is formatted into one buffer and written at once; std::to_chars with 12
    // significant digits gives printf's %.12g text (the C++ standard defines it so) in a fifth
    // of the time, which matters when a series row is written every step.
    row_.clear();
    char buffer[32];
    for (std::size_t i = 0; i < values.size(); ++i)
      {
        if (i)
          row_ += ',';
        if (std::isfinite(values[i]))
          {
            const auto end = std::to_chars(buffer, buffer + sizeof(buffer), values[i], std::chars_format::general, 12);
            row_.append(buffer, end.ptr);
          }
      }
    row_ += '\n';
    stream_.write(row_.data(), static_cast<std::streamsize>(row_.size()));
    if (!stream_)
      throw IoError("writing " + path_ + " failed: " + std::strerror(errno) +
                    " (a full disk or a folder that is not writable)");
  }

  std::string CsvWriter::format(const double value)
  {
    if (!std::isfinite(value))
      return "";
    char buffer[32];
    const auto end = std::to_chars(buffer, buffer + sizeof(buffer), value, std::chars_format::general, 12);
    return std::string(buffer, end.ptr);
  }

  void CsvWriter::write_cells(const std::vector<std::string> &cells)
  {
    if (cells.size() != n_columns_)
      throw std::logic_error("fickcast: CSV row of " + std::to_string(cells.size()) + " cells for " +
                             std::to_string(n_columns_) + " columns in " + path_);
    for (std::size_t i = 0; i < cells.size(); ++i)
      stream_ << (i ? "," : "") << cells[i];
    stream_ << '\n';
    if (!stream_)
      throw IoError("writing " + path_ + " failed: " + std::strerror(errno) +
                    " (a full disk or a folder that is not writable)");
  }

  std::uint64_t CsvWriter::flush()
  {
    stream_.flush();
    if (!stream_)
      throw IoError("writing " + path_ + " failed: " + std::strerror(errno) +
                    " (a full disk or a folder that is not writable)");
    std::error_code error;
    const auto size = std::filesystem::file_size(path_, error);
    if (error)
      throw IoError("cannot read the size of " + path_ + ": " + error.message());
    return size;
  }

  void CsvWriter::reopen(const std::string &path, const std::size_t n_columns, const std::uint64_t size)
  {
    path_ = path;
    n_columns_ = n_columns;
    std::error_code error;
    const auto present = std::filesystem::file_size(path, error);
    if (error || present < size)
      throw IoError("cannot resume " + path + ": it holds " +
                    (error ? std::string("nothing") : std::to_string(present)) +
                    " bytes, the checkpoint expects at least " + std::to_string(size));
    std::filesystem::resize_file(path, size, error);
    if (error)
      throw IoError("cannot resume " + path + ": " + error.message());
    stream_.open(path, std::ios::app);
    if (!stream_)
      throw IoError("cannot write " + path);
  }

  void CsvWriter::close()
  {
    if (stream_.is_open())
      {
        stream_.close();
        if (stream_.fail())
          throw IoError("closing " + path_ + " failed: " + std::strerror(errno) +
                        " (a full disk or a folder that is not writable)");
      }
  }
} // namespace fickcast
