#include "case/input_error.h"
#include "case/time_table.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace fickcast
{
  namespace
  {
    std::string write(const std::string &name, const std::string &text)
    {
      const std::string path = (std::filesystem::temp_directory_path() / name).string();
      std::ofstream(path) << text;
      return path;
    }
  } // namespace

  TEST(TimeTable, ReadsUnitsAndInterpolates)
  {
    const std::string path = write("fickcast_table.csv", "# inflow (invented)\ntime [h], value [mg/L]\n0, 100\n"
                                                         "2, 300\n\n4, 300\n");
    const TimeTable table = read_time_table(path, "kg/m3");
    ASSERT_EQ(table.times.size(), 3u);
    EXPECT_DOUBLE_EQ(table.times[1], 7200.0);
    EXPECT_DOUBLE_EQ(table.values[0], 0.1);
    EXPECT_DOUBLE_EQ(table.at(3600.0), 0.2); // halfway up the ramp
    EXPECT_DOUBLE_EQ(table.at(-5.0), 0.1);   // constant before the first row
    EXPECT_DOUBLE_EQ(table.at(1e9), 0.3);    // and after the last
  }

  TEST(TimeTable, MistakesNameTheLine)
  {
    auto message = [](const std::string &text) {
      try
        {
          read_time_table(write("fickcast_bad_table.csv", text), "kg/m3");
        }
      catch (const InputError &error)
        {
          return std::string(error.what());
        }
      return std::string();
    };
    EXPECT_NE(message("time, value\n0, 1\n1, 2\n").find(":1"), std::string::npos);
    EXPECT_NE(message("time [h], value [mg/L]\n0, 1\n0, 2\n").find(":3"), std::string::npos);
    EXPECT_NE(message("time [h], value [mg/L]\n0, 1\n1, abc\n").find(":3"), std::string::npos);
    EXPECT_NE(message("time [h], value [m]\n0, 1\n1, 2\n").find("kg/m3"), std::string::npos);
    EXPECT_NE(message("time [h], value [mg/L]\n0, 1\n").find("at least two rows"), std::string::npos);
  }

  TEST(TimeTable, AFileThatIsNotATableIsNotEchoed)
  {
    // A `file:` path aimed at any readable file must not print that file's content (issue 14).
    try
      {
        read_time_table(write("fickcast_not_a_table.csv", "secret-user:x:1000:1000:Secret Person,,,:/home/s\n"),
                        "kg/m3");
        FAIL() << "a file that is not a table was read";
      }
    catch (const InputError &error)
      {
        const std::string text = error.what();
        EXPECT_EQ(text.find("secret"), std::string::npos) << text;
        EXPECT_NE(text.find(":1"), std::string::npos) << text;
      }
    try
      {
        read_time_table(write("fickcast_not_a_table2.csv", "secret-word [a], other [b]\n"), "kg/m3");
        FAIL() << "a header of unknown units was read";
      }
    catch (const InputError &error)
      {
        EXPECT_EQ(std::string(error.what()).find("secret"), std::string::npos) << error.what();
      }
  }

  // Found by tests/fuzz: rows finite as written but beyond the range of doubles once in SI were
  // accepted as inf (the time 1e308 h; a time unit of 1e300 s).
  TEST(TimeTable, RowsBeyondTheRangeOfNumbersNameTheLine)
  {
    for (const std::string text :
         {"time [h], value [mg/L]\n0, 1\n1e308, 2\n", "time [1e300 s], value [mg/L]\n0, 1\n1e10, 2\n",
          "time [s], value [1e300 kg/m3]\n0, 1\n1, 1e10\n"})
      try
        {
          read_time_table(write("fickcast_table_overflow.csv", text), "kg/m3");
          FAIL() << "accepted: " << text;
        }
      catch (const InputError &error)
        {
          const std::string message = error.what();
          EXPECT_NE(message.find("fickcast_table_overflow.csv:3"), std::string::npos) << message;
          EXPECT_NE(message.find("range of numbers"), std::string::npos) << message;
        }
  }

  // Found by tests/fuzz: between rows of -1.7e308 and 1.7e308 kg/m3 the interpolation gave inf.
  TEST(TimeTable, InterpolationBetweenExtremeRowsIsFinite)
  {
    const TimeTable table = read_time_table(
      write("fickcast_table_extremes.csv", "time [s], value [kg/m3]\n0, -1.7e308\n10, 1.7e308\n"), "kg/m3");
    EXPECT_DOUBLE_EQ(table.at(5.0), 0.0);
    EXPECT_DOUBLE_EQ(table.at(7.5), 0.85e308);
  }
} // namespace fickcast
