#include "case/expression.h"

#include <gtest/gtest.h>

#include <cmath>

namespace fickcast
{
  TEST(Expression, EvaluatesVariablesFunctionsAndConstants)
  {
    const Expression e("2*x + y^2 + erfc(t)", {"x", "y", "t"});
    EXPECT_DOUBLE_EQ(e({1.0, 3.0, 0.0}), 2 + 9 + 1);
    EXPECT_NEAR(e({0.0, 0.0, 1.0}), std::erfc(1.0), 1e-15);
    EXPECT_DOUBLE_EQ(Expression("pi", {})({}), M_PI);
  }

  TEST(Expression, UnitConstantsAreSI)
  {
    EXPECT_DOUBLE_EQ(Expression("2*h", {})({}), 7200.0);
    EXPECT_DOUBLE_EQ(Expression("yr", {})({}), 31557600.0);
    EXPECT_DOUBLE_EQ(Expression("3*mm", {})({}), 3e-3);
    EXPECT_DOUBLE_EQ(Expression("min(2, 3)", {})({}), 2.0);
  }

  TEST(Expression, ReportsUsedVariables)
  {
    const Expression e("x*t", {"x", "y", "z", "t"});
    EXPECT_TRUE(e.uses("x"));
    EXPECT_TRUE(e.uses("t"));
    EXPECT_FALSE(e.uses("y"));
  }

  TEST(Expression, RejectsUnknownVariablesAndBadSyntax)
  {
    EXPECT_THROW(Expression("x + q", {"x"}), ExpressionError);
    EXPECT_THROW(Expression("2*(x", {"x"}), ExpressionError);
    try
      {
        Expression("c*2", {"x", "y", "z"});
        FAIL();
      }
    catch (const ExpressionError &error)
      {
        EXPECT_NE(std::string(error.what()).find("x, y, z"), std::string::npos) << error.what();
      }
  }

  TEST(Expression, CopiesAreIndependent)
  {
    const Expression a("x + 1", {"x"});
    const Expression b = a;
    EXPECT_DOUBLE_EQ(a({1.0}), 2.0);
    EXPECT_DOUBLE_EQ(b({5.0}), 6.0);
    EXPECT_DOUBLE_EQ(a({2.0}), 3.0);
  }
} // namespace fickcast
