// The structural check of Gmsh files: a demo mesh passes; damaged copies (lines deleted,
// truncated, tokens replaced, lines repeated; seeded, reproducible) are either rejected with an
// InputError or, if the check lets them through, read by deal.II without a crash. Before the
// check existed, such files crashed deal.II's reader (found by mutating the demo meshes).
#include "case/input_error.h"
#include "geometry/msh_check.h"

#include <deal.II/grid/grid_in.h>
#include <deal.II/grid/tria.h>

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>
#include <vector>

#ifndef FICKCAST_SOURCE_DIR
#define FICKCAST_SOURCE_DIR "."
#endif

namespace fickcast
{
  namespace
  {
    std::vector<std::string> read_lines(const std::string &path)
    {
      std::ifstream in(path);
      std::vector<std::string> lines;
      for (std::string line; std::getline(in, line);)
        lines.push_back(line);
      return lines;
    }

    std::string write_lines(const std::vector<std::string> &lines, const std::string &name)
    {
      const std::string path = (std::filesystem::temp_directory_path() / name).string();
      std::ofstream out(path);
      for (const auto &line : lines)
        out << line << '\n';
      return path;
    }

    /// True if deal.II read the file (false if it threw); a crash fails the whole test binary.
    bool deal_ii_reads(const std::string &path)
    {
      try
        {
          dealii::Triangulation<2> triangulation;
          dealii::GridIn<2> reader;
          reader.attach_triangulation(triangulation);
          std::ifstream in(path);
          reader.read_msh(in);
          return true;
        }
      catch (const std::exception &)
        {
          return false;
        }
    }
  } // namespace

  TEST(MshCheck, DemoMeshPasses)
  {
    const std::string path = std::string(FICKCAST_SOURCE_DIR) + "/meshes/coated_tablet_rz.msh";
    EXPECT_NO_THROW(check_msh_structure(path));
    EXPECT_TRUE(deal_ii_reads(path));
  }

  TEST(MshCheck, DamagedCopiesAreRejectedOrReadWithoutACrash)
  {
    const auto original = read_lines(std::string(FICKCAST_SOURCE_DIR) + "/meshes/coated_tablet_rz.msh");
    ASSERT_GT(original.size(), 100u);
    std::mt19937 random(2026);
    const std::vector<std::string> junk{"-1", "0", "999999", "x", "1e300", "$End", "\"a b\"", ""};
    unsigned int rejected = 0;
    const unsigned int trials = 60;
    for (unsigned int trial = 0; trial < trials; ++trial)
      {
        auto lines = original;
        const auto pick = [&](const std::size_t n) {
          return std::uniform_int_distribution<std::size_t>(0, n - 1)(random);
        };
        const std::size_t i = pick(lines.size());
        switch (trial % 4)
          {
            case 0:
              lines.erase(lines.begin() + static_cast<long>(i));
              break;
            case 1:
              lines.resize(i);
              break;
            case 2:
              {
                std::istringstream words(lines[i]);
                std::vector<std::string> parts;
                for (std::string w; words >> w;)
                  parts.push_back(w);
                if (parts.empty())
                  parts.push_back("");
                parts[pick(parts.size())] = junk[pick(junk.size())];
                std::string line;
                for (const auto &p : parts)
                  line += p + " ";
                lines[i] = line;
                break;
              }
            default:
              lines.insert(lines.begin() + static_cast<long>(i), lines[pick(lines.size())]);
          }
        const std::string path = write_lines(lines, "fickcast_damaged_mesh.msh");
        try
          {
            check_msh_structure(path);
            deal_ii_reads(path); // passed the check: deal.II must not crash on it
          }
        catch (const InputError &error)
          {
            ++rejected;
            EXPECT_NE(std::string(error.what()).find("geometry.mesh"), std::string::npos) << error.what();
          }
      }
    EXPECT_GE(rejected, trials / 2) << "most damage should be caught by the check";
  }
} // namespace fickcast
