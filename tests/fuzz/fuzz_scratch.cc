#include "fuzz_scratch.h"

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <system_error>

namespace fickcast::fuzz
{
  namespace
  {
    namespace fs = std::filesystem;

    /// Copies the regular files of SOURCE_DIR/@p from (those ending in @p extension) into @p to.
    void copy_files(const std::string &from, const fs::path &to, const std::string &extension)
    {
      fs::create_directories(to);
      const fs::path source = fs::path(FICKCAST_SOURCE_DIR) / from;
      for (const auto &entry : fs::directory_iterator(source))
        if (entry.is_regular_file() && entry.path().extension() == extension)
          fs::copy_file(entry.path(), to / entry.path().filename(), fs::copy_options::overwrite_existing);
    }

    fs::path make_scratch()
    {
      const char *tmp = std::getenv("TMPDIR");
      std::string pattern = std::string(tmp != nullptr && *tmp != '\0' ? tmp : "/tmp") + "/fickcast-fuzz-XXXXXX";
      if (mkdtemp(pattern.data()) == nullptr)
        finding("cannot create a scratch folder from " + pattern);
      const fs::path root = fs::canonical(pattern);
      copy_files("tests/bad_input/meshes", root / "case" / "meshes", ".msh");
      copy_files("tests/bad_input/tables", root / "case" / "tables", ".csv");
      copy_files("tests/fuzz/tables", root / "case" / "tables", ".csv");
      copy_files("meshes", root / "meshes", ".msh");
      return root;
    }

    void remove_scratch()
    {
      std::error_code ignored;
      fs::remove_all(scratch_folder(), ignored);
    }
  } // namespace

  const std::string &scratch_folder()
  {
    // Never destroyed: remove_scratch runs at exit, after the destructors of function statics.
    static const std::string *const root = [] {
      const auto *made = new std::string(make_scratch().string());
      std::atexit(remove_scratch);
      return made;
    }();
    return *root;
  }

  std::string write_input(const std::string &name, const uint8_t *data, const std::size_t size)
  {
    const std::string path = scratch_folder() + "/" + name;
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(reinterpret_cast<const char *>(data), static_cast<std::streamsize>(size));
    out.close();
    if (!out)
      finding("cannot write the input to " + path);
    return path;
  }

  bool inside_scratch(const std::string &folder, const std::string &path)
  {
    // A NUL byte would cut the name where the file is opened, after this check.
    if (path.find('\0') != std::string::npos)
      return false;
    const fs::path p(path);
    if (p.is_absolute() || p.has_root_name() || p.has_root_directory())
      return false;
    const std::string resolved = (fs::path(folder) / p).lexically_normal().string();
    const std::string &root = scratch_folder();
    return resolved.compare(0, root.size(), root) == 0 &&
           (resolved.size() == root.size() || resolved[root.size()] == '/');
  }

  void finding(const std::string &what)
  {
    std::cerr << "fickcast fuzz finding: " << what << std::endl;
    std::abort();
  }
} // namespace fickcast::fuzz
