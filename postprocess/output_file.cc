#include "output_file.h"

#include "post_error.h"

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <system_error>

#include <unistd.h>

namespace fickcast::post
{
  void make_folder(const std::string &folder)
  {
    std::error_code error;
    std::filesystem::create_directories(folder, error);
    if (error || !std::filesystem::is_directory(folder))
      throw PostIoError("cannot create folder " + folder + (error ? ": " + error.message() : std::string()));
  }

  std::string partial_name(const std::string &path)
  {
    return path + ".partial-" + std::to_string(::getpid());
  }

  void publish_file(const std::string &partial, const std::string &path)
  {
    std::error_code error;
    std::filesystem::rename(partial, path, error);
    if (error)
      {
        std::filesystem::remove(partial, error);
        throw PostIoError("cannot write " + path + ": rename failed");
      }
  }

  void write_file(const std::string &path, const std::string &content)
  {
    const std::string partial = partial_name(path);
    {
      std::ofstream out(partial, std::ios::binary);
      if (!out)
        throw PostIoError("cannot write " + path);
      out << content;
      out.close();
      if (!out)
        {
          std::remove(partial.c_str());
          throw PostIoError("writing " + path + " failed");
        }
    }
    publish_file(partial, path);
  }

  std::string read_file(const std::string &path, const std::string &what)
  {
    if (!std::filesystem::is_regular_file(path))
      throw PostInputError(path, what, "no such file");
    std::ifstream in(path, std::ios::binary);
    if (!in)
      throw PostIoError("cannot read " + path);
    std::stringstream buffer;
    buffer << in.rdbuf();
    if (in.bad())
      throw PostIoError("reading " + path + " failed");
    return buffer.str();
  }
} // namespace fickcast::post
