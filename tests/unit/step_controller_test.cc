#include "numerics/step_controller.h"

#include <gtest/gtest.h>

namespace fickcast
{
  TEST(StepController, LandsExactlyOnOutputTimesWithoutSlivers)
  {
    TimeSpec spec;
    spec.adaptive = false;
    spec.step = 0.3;
    StepController controller(spec, 1.0);
    EXPECT_DOUBLE_EQ(controller.step_from(0.0, 1.0, 0), 0.3);
    EXPECT_DOUBLE_EQ(controller.step_from(0.9, 1.0, 0.3), 1.0 - 0.9); // lands on 1.0
  }

  TEST(StepController, AdaptiveGrowsAndShrinksWithTheError)
  {
    TimeSpec spec;
    spec.adaptive = true;
    spec.initial_step = 1e-3;
    StepController controller(spec, 100.0);
    EXPECT_TRUE(controller.judge(1e-3, 1e-4, 2, false));
    EXPECT_DOUBLE_EQ(controller.proposal(), 2e-3); // growth capped at 2
    EXPECT_FALSE(controller.judge(2e-3, 8.0, 2, false));
    EXPECT_LT(controller.proposal(), 2e-3 * 0.5);
    EXPECT_TRUE(controller.judge(1e-3, 0.5, 2, false));
    EXPECT_DOUBLE_EQ(controller.proposal(), 1e-3); // small gains are not taken
  }

  TEST(StepController, AdaptiveSplitsTheLastTwoStepsBeforeAnOutputTime)
  {
    TimeSpec spec;
    spec.adaptive = true;
    spec.initial_step = 1.0;
    StepController controller(spec, 100.0);
    EXPECT_DOUBLE_EQ(controller.step_from(0.0, 1.5, 0), 0.75);
    EXPECT_DOUBLE_EQ(controller.step_from(0.0, 0.5, 0), 0.5);
    EXPECT_DOUBLE_EQ(controller.step_from(0.0, 10.0, 0.25), 0.5); // at most double the previous step
  }
} // namespace fickcast
