#include "case/quantity_text.h"
#include "case/units.h"

#include <gtest/gtest.h>

namespace fickcast
{
  TEST(QuantityText, SplitsNumberAndUnit)
  {
    const QuantityText q = split_quantity("1.9e-9 m2/s", false);
    EXPECT_DOUBLE_EQ(q.number, 1.9e-9);
    EXPECT_EQ(q.unit, "m2/s");
    EXPECT_EQ(split_quantity("5mm", false).unit, "mm");
    EXPECT_EQ(split_quantity("42", false).unit, "");
    EXPECT_DOUBLE_EQ(split_quantity("-.5 h", false).number, -0.5);
  }

  TEST(QuantityText, SplitsExpressionAndUnit)
  {
    const QuantityText q = split_quantity("{1500*exp(-t/(2*h))} mg/L", true);
    EXPECT_EQ(q.expression, "1500*exp(-t/(2*h))");
    EXPECT_EQ(q.unit, "mg/L");
    EXPECT_THROW(split_quantity("{1 + x} mg/L", false), UnitError);
    EXPECT_THROW(split_quantity("{1 + x mg/L", true), UnitError);
  }

  TEST(QuantityText, RejectsNonNumbers)
  {
    EXPECT_THROW(split_quantity("nan m", false), UnitError);
    EXPECT_THROW(split_quantity("inf", false), UnitError);
    EXPECT_THROW(split_quantity("-Infinity m2/s", false), UnitError);
    EXPECT_THROW(split_quantity("1.5.3 m", false), UnitError);
    EXPECT_THROW(split_quantity("abc", false), UnitError);
    EXPECT_THROW(split_quantity("1e999 m", false), UnitError);
    EXPECT_THROW(split_quantity("", false), UnitError);
  }

  TEST(QuantityText, SplitsListsOutsideBraces)
  {
    const auto items = split_list("1 h, {min(t, 2)} s, 3 d");
    ASSERT_EQ(items.size(), 3u);
    EXPECT_EQ(items[1], "{min(t, 2)} s");
  }

  TEST(QuantityText, SuggestsNearestName)
  {
    EXPECT_EQ(nearest("difusivity", {"diffusivity", "porosity"}), "diffusivity");
    EXPECT_EQ(nearest("zzzzzzzz", {"diffusivity", "porosity"}), "");
  }
} // namespace fickcast
