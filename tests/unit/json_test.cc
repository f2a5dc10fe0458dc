#include "results/json.h"

#include <gtest/gtest.h>

#include <cmath>

namespace fickcast
{
  TEST(Json, WritesOrderedObjectsArraysAndEscapes)
  {
    Json j = Json::object();
    j["b"] = 1.5;
    j["a"] = "say \"hi\"\n";
    Json list = Json::array();
    list.push_back(1);
    list.push_back(true);
    j["list"] = list;
    j["nan"] = std::nan("");
    const std::string text = j.dump();
    EXPECT_LT(text.find("\"b\""), text.find("\"a\""));
    EXPECT_NE(text.find("\"say \\\"hi\\\"\\n\""), std::string::npos);
    EXPECT_NE(text.find("\"nan\": null"), std::string::npos);
    EXPECT_NE(text.find("true"), std::string::npos);
  }
} // namespace fickcast
