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

  // Found by tests/fuzz: holds whose sum overflows gave a schedule ending at inf.
  TEST(TemperatureSchedule, EndsWithinTheRangeOfNumbers)
  {
    try
      {
        parse_temperature_schedule("1000 K, hold 1.5e308 s, hold 1.5e308 s");
        FAIL() << "a schedule ending at inf was accepted";
      }
    catch (const UnitError &error)
      {
        const std::string message = error.what();
        EXPECT_NE(message.find("item 3"), std::string::npos) << message;
        EXPECT_NE(message.find("range of numbers"), std::string::npos) << message;
      }
    // A duration lost in rounding after a long schedule would give two equal times.
    EXPECT_THROW(parse_temperature_schedule("1000 K, hold 1e300 s, hold 1 s"), UnitError);
    const TemperatureSchedule far = parse_temperature_schedule("1000 K, hold 1e300 s, ramp to 2000 K in 1e300 s");
    EXPECT_DOUBLE_EQ(far.at(1.5e300), 1500.0);
  }
} // namespace fickcast
