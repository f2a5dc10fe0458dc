// Writing outputs whole or not at all: a temporary file next to the target, renamed when complete.
#pragma once

#include <string>

namespace fickcast::post
{
  /// Creates @p folder and its parents if missing; PostIoError if that fails.
  void make_folder(const std::string &folder);

  /// A temporary name next to @p path (same folder, so the final rename is atomic).
  std::string partial_name(const std::string &path);

  /// Renames the finished @p partial to @p path; PostIoError if that fails.
  void publish_file(const std::string &partial, const std::string &path);

  /// Writes @p content to @p path through a partial file; PostIoError on any failure.
  void write_file(const std::string &path, const std::string &content);

  /// The whole content of @p path; PostInputError naming the file if it cannot be read.
  std::string read_file(const std::string &path, const std::string &what);
} // namespace fickcast::post
