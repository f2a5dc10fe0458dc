#include "case/mesh_file.h"

#include "case/input_error.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace fickcast
{
  std::vector<PhysicalGroup> MeshFileInfo::groups_of(const int d) const
  {
    std::vector<PhysicalGroup> selected;
    for (const auto &group : groups)
      if (group.dimension == d)
        selected.push_back(group);
    std::sort(selected.begin(), selected.end(),
              [](const PhysicalGroup &a, const PhysicalGroup &b) { return a.tag < b.tag; });
    return selected;
  }

  MeshFileInfo read_mesh_file_info(const std::string &path)
  {
    const std::string key = "geometry.mesh";
    std::error_code ignored;
    if (std::filesystem::is_directory(path, ignored))
      throw InputError(path, key, "expected a Gmsh .msh file, found a folder");
    std::ifstream in(path, std::ios::binary);
    if (!in)
      throw InputError(path, key, "cannot open the mesh file (expected a Gmsh .msh file, format 2.2 or 4.1)");
    MeshFileInfo info;
    info.path = path;
    std::string line;
    unsigned int number = 0;
    bool format_seen = false;
    auto where = [&]() { return path + ":" + std::to_string(number); };
    auto next = [&](std::string &out) {
      if (!std::getline(in, out))
        return false;
      ++number;
      if (!out.empty() && out.back() == '\r')
        out.pop_back();
      return true;
    };
    while (next(line))
      {
        if (line == "$MeshFormat")
          {
            std::string header;
            if (!next(header))
              break;
            std::istringstream fields(header);
            int file_type = -1, data_size = 0;
            fields >> info.version >> file_type >> data_size;
            if (!fields || info.version < 2)
              throw InputError(where(), key, "expected a Gmsh format line such as '4.1 0 8', found '" + header + "'");
            if (file_type != 0)
              throw InputError(where(), key, "expected an ASCII Gmsh file (Mesh.Binary = 0), found a binary one");
            if (!(info.version >= 2.2 && info.version < 2.3) && !(info.version >= 4.0 && info.version < 4.2))
              throw InputError(where(), key, "expected Gmsh format 2.2 or 4.1, found " + std::to_string(info.version));
            format_seen = true;
          }
        else if (line == "$PhysicalNames")
          {
            std::string count_line;
            next(count_line);
            int count = -1;
            std::istringstream(count_line) >> count;
            if (count < 0)
              throw InputError(where(), key, "expected the number of physical names, found '" + count_line + "'");
            for (int i = 0; i < count; ++i)
              {
                std::string entry;
                if (!next(entry))
                  throw InputError(where(), key, "the $PhysicalNames section ends early");
                PhysicalGroup group;
                std::istringstream fields(entry);
                fields >> group.dimension >> group.tag;
                const auto open = entry.find('"'), close = entry.rfind('"');
                if (!fields || open == std::string::npos || close <= open)
                  throw InputError(where(), key, "expected 'dimension tag \"name\"', found '" + entry + "'");
                group.name = entry.substr(open + 1, close - open - 1);
                info.groups.push_back(group);
                info.dimension = std::max(info.dimension, group.dimension);
              }
          }
        else if (line == "$Elements" && format_seen)
          {
            std::string counts;
            next(counts);
            std::istringstream header(counts);
            if (info.version < 3)
              {
                long n = 0;
                header >> n;
                for (long i = 0; i < n; ++i)
                  {
                    std::string element;
                    if (!next(element))
                      throw InputError(where(), key, "the $Elements section ends early");
                    std::istringstream fields(element);
                    long id = 0;
                    int type = 0;
                    fields >> id >> type;
                    if (!fields)
                      throw InputError(where(), key, "expected an element line, found '" + element + "'");
                    info.element_types.insert(type);
                  }
              }
            else
              {
                long blocks = 0;
                header >> blocks;
                for (long b = 0; b < blocks; ++b)
                  {
                    std::string block;
                    if (!next(block))
                      throw InputError(where(), key, "the $Elements section ends early");
                    std::istringstream fields(block);
                    int entity_dimension = 0, entity = 0, type = 0;
                    long n = 0;
                    fields >> entity_dimension >> entity >> type >> n;
                    if (!fields)
                      throw InputError(where(), key, "expected an element block header, found '" + block + "'");
                    info.element_types.insert(type);
                    for (long i = 0; i < n; ++i)
                      if (!next(block))
                        throw InputError(where(), key, "the $Elements section ends early");
                  }
              }
          }
      }
    if (!format_seen)
      throw InputError(path, key, "not a Gmsh mesh file: expected a $MeshFormat section");
    if (info.groups.empty())
      throw InputError(path, key,
                       "the mesh has no named physical groups: expected Physical Surface(\"name\") and "
                       "Physical Curve(\"name\") (or Volume/Surface in 3-D) in its .geo, so regions and "
                       "boundaries can be named in the case");
    return info;
  }
} // namespace fickcast
