#include "case/temperature_schedule.h"
#include "case/units.h"

#include <gtest/gtest.h>

namespace fickcast
{
  TEST(TemperatureSchedule, RampsAndHolds)
  {
    const TemperatureSchedule s =
      parse_temperature_schedule("800 degC, ramp 10 degC/min to 1100 degC, hold 1 h, ramp to 800 degC in 2 h");
    ASSERT_EQ(s.times.size(), 4u);
    EXPECT_DOUBLE_EQ(s.times[1], 1800.0); // 300 K at 10 K/min
    EXPECT_DOUBLE_EQ(s.times[2], 1800.0 + 3600.0);
    EXPECT_DOUBLE_EQ(s.times[3], 5400.0 + 7200.0);
    EXPECT_DOUBLE_EQ(s.at(900.0), 1073.15 + 150.0); // halfway up
    EXPECT_DOUBLE_EQ(s.at(4000.0), 1373.15);
    EXPECT_DOUBLE_EQ(s.at(1e6), 1073.15); // held after the end
  }

  TEST(TemperatureSchedule, ConstantAndRampDown)
  {
    EXPECT_DOUBLE_EQ(parse_temperature_schedule("1050 degC").at(123.0), 1323.15);
    const TemperatureSchedule s = parse_temperature_schedule("1100 K, ramp 5 K/min to 1000 K");
    EXPECT_DOUBLE_EQ(s.times.back(), 1200.0); // the sign of the rate follows the target
  }

  TEST(TemperatureSchedule, MistakesNameTheItem)
  {
    EXPECT_THROW(parse_temperature_schedule(""), UnitError);
    EXPECT_THROW(parse_temperature_schedule("800 degC, warm up to 900 degC"), UnitError);
    EXPECT_THROW(parse_temperature_schedule("800 degC, hold -1 h"), UnitError);
    EXPECT_THROW(parse_temperature_schedule("800 degC, ramp 10 degC/min to 800 degC"), UnitError);
    try
      {
        parse_temperature_schedule("800 degC, hold 1 h, ramp 10 m to 900 degC");
        FAIL();
      }
    catch (const UnitError &error)
      {
        EXPECT_NE(std::string(error.what()).find("ramp 10 m to 900 degC"), std::string::npos) << error.what();
      }
  }
} // namespace fickcast
