// Source: Crank, The Mathematics of Diffusion, 2nd ed. 1975, sec. 3.4 (published).
// A transient across an interface with a partition jump: two semi-infinite media in contact, the
// first initially at C0, the second empty, with c2 = K c1 and equal fluxes at the interface.
// Exact (Crank, The Mathematics of Diffusion, 2nd ed. 1975, sec. 3.4, composite media), with
// r = sqrt(D2 / D1), x measured from the interface into the second medium:
//   first  (x < 0): c1 = C0 [1 + K r erf(-x / (2 sqrt(D1 t)))] / (1 + K r)
//   second (x > 0): c2 = C0 K erfc(x / (2 sqrt(D2 t))) / (1 + K r)
// and the amount that has crossed, integral of c2: C0 K / (1 + K r) 2 sqrt(D2 t / pi).
// Boost.Math erf/erfc. Checked on both sides of the interface: a partition applied on the wrong
// side, or a flux condition that is not continuous, moves every value.
#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace fickcast::testing
{
  TEST(Interfaces, TwoSemiInfiniteMediaWithAPartitionJump)
  {
    const double d1 = 1, d2 = 0.25, k = 2, t = 1; // m2/s, m2/s, -, s; C0 = 1 mol/m3
    const std::string text = R"(
[case]
title = two media in contact, partition 2
[geometry]
layers = first 10 m, second 10 m
cell_size = 0.02 m
[region.first]
diffusivity = 1 m2/s
initial = 1 mol/m3
[region.second]
diffusivity = 0.25 m2/s
partition = 2
initial = 0 mol/m3
[time]
end = 1 s
tolerance = 1e-7
[output]
fields = false
point.deep_first = 9.4 m
point.face_first = 10 m in first
point.face_second = 10 m in second
point.deep_second = 10.3 m
)";
    const CaseDescription description = describe(text, "two_media_partition");
    const RunRecord record = run(description);
    ASSERT_EQ(record.status, "completed") << record.message;
    const double r = std::sqrt(d2 / d1), scale = 1 / (1 + k * r);
    auto first = [&](const double x) { return (1 + k * r * boost::math::erf(-x / (2 * std::sqrt(d1 * t)))) * scale; };
    auto second = [&](const double x) { return k * boost::math::erfc(x / (2 * std::sqrt(d2 * t))) * scale; };
    const double exact[4] = {first(-0.6), first(0.0), second(0.0), second(0.3)};
    for (std::size_t i = 0; i < 4; ++i)
      {
        std::printf("two media: point %s = %.8f (exact %.8f, error %.2e)\n", record.points[i].name.c_str(),
                    record.points[i].final_value, exact[i], record.points[i].final_value - exact[i]);
        EXPECT_NEAR(record.points[i].final_value, exact[i], 1e-4) << record.points[i].name;
      }
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double crossed = series.column("amount.second").back();
    const double crossed_exact = k * scale * 2 * std::sqrt(d2 * t / boost::math::constants::pi<double>());
    std::printf("two media: amount in the second medium %.8f (exact %.8f, relative %.2e)\n", crossed, crossed_exact,
                crossed / crossed_exact - 1);
    EXPECT_NEAR(crossed / crossed_exact, 1.0, 1e-4);
  }
} // namespace fickcast::testing
