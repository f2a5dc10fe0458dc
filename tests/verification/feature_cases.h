// Helpers shared by the feature checks (geometry_, coefficient_ and boundary_output_features_test.cc).
// Source: none needed here (no reference values); each check names its published source, or says
// "common practice" or "from memory", beside it in the test files.
#pragma once

#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/constants/constants.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdio>
#include <string>

namespace fickcast::testing::feature_cases
{
  inline constexpr double pi = boost::math::constants::pi<double>();

  /// A number as case text, to the last digit.
  inline std::string num(const double value)
  {
    char text[40];
    std::snprintf(text, sizeof(text), "%.17g", value);
    return text;
  }

  /// Row of series.csv at time @p t (relative match 1e-9); adds a failure if there is none.
  inline std::size_t row_at(const CsvTable &series, const double t)
  {
    const auto &time = series.column("time");
    for (std::size_t r = 0; r < time.size(); ++r)
      if (std::abs(time[r] - t) <= 1e-9 * std::max(std::abs(t), 1.0))
        return r;
    ADD_FAILURE() << "no row at t = " << t << " s";
    return time.size() - 1;
  }

  /// Runs @p text as case @p name; fails the test (and returns false) unless it completes.
  inline bool run_named(const std::string &text, const std::string &name, CaseDescription &description,
                        RunRecord &record)
  {
    description = describe(text, name);
    record = run(description);
    EXPECT_EQ(record.status, "completed") << name << ": " << record.message;
    return record.status == "completed";
  }
} // namespace fickcast::testing::feature_cases
