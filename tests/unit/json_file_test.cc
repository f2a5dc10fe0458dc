// JSON as fickcast writes it (JsonCpp): what a reader gets back must be what was written.
#include "case/input_error.h"
#include "results/json_file.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <limits>

namespace fickcast
{
  namespace
  {
    /// Writes @p value with write_json and reads the file back.
    Json::Value round_trip(const Json::Value &value, const std::string &name)
    {
      const std::string path = (std::filesystem::temp_directory_path() / name).string();
      write_json(value, path);
      const Json::Value back = read_json(path);
      std::filesystem::remove(path);
      return back;
    }
  } // namespace

  TEST(JsonFile, NonFiniteNumbersAreWrittenAsNull)
  {
    Json::Value value(Json::objectValue);
    value["nan"] = std::numeric_limits<double>::quiet_NaN();
    value["inf"] = std::numeric_limits<double>::infinity();
    value["list"].append(-std::numeric_limits<double>::infinity());
    value["list"].append(1.5);
    value["nested"]["depth"] = std::nan("");
    const std::string text = json_text(value);
    EXPECT_NE(text.find("\"nan\": null"), std::string::npos) << text;
    EXPECT_NE(text.find("\"inf\": null"), std::string::npos) << text;
    EXPECT_EQ(text.find("e+9999"), std::string::npos) << text; // JsonCpp's own spelling of infinity
    const Json::Value back = round_trip(value, "fickcast_json_null.json");
    EXPECT_TRUE(back["nan"].isNull());
    EXPECT_TRUE(back["inf"].isNull());
    EXPECT_TRUE(back["list"][0].isNull());
    EXPECT_EQ(back["list"][1].asDouble(), 1.5);
    EXPECT_TRUE(back["nested"]["depth"].isNull());
  }

  TEST(JsonFile, DoublesReadBackExactly)
  {
    // 1/3 and 0.1 + 0.2 need 17 significant digits (15, as the hand-made writer wrote, lose them).
    const std::vector<double> numbers{0.1,
                                      1e-300,
                                      1.0 / 3.0,
                                      0.1 + 0.2,
                                      -2.5e-05,
                                      6.02214076e23,
                                      std::numeric_limits<double>::max(),
                                      std::numeric_limits<double>::min(),
                                      31557600.0 * 60};
    Json::Value value(Json::arrayValue);
    for (const double x : numbers)
      value.append(x);
    const Json::Value back = round_trip(value, "fickcast_json_doubles.json");
    ASSERT_EQ(back.size(), numbers.size());
    for (Json::ArrayIndex i = 0; i < back.size(); ++i)
      {
        EXPECT_TRUE(back[i].isDouble());
        EXPECT_EQ(back[i].asDouble(), numbers[i]) << "written as " << json_text(value[i]);
      }
    // Any reader, not only JsonCpp: the text itself holds the exact double.
    EXPECT_EQ(std::strtod(json_text(Json::Value(1.0 / 3.0)).c_str(), nullptr), 1.0 / 3.0);
  }

  TEST(JsonFile, IntegersStayIntegers)
  {
    Json::Value value(Json::objectValue);
    value["cells"] = 12345678901234567ul; // more digits than a double holds
    value["degree"] = 2u;
    value["offset"] = -3;
    const std::string text = json_text(value);
    EXPECT_NE(text.find("\"cells\": 12345678901234567"), std::string::npos) << text;
    EXPECT_NE(text.find("\"degree\": 2,"), std::string::npos) << text;
    EXPECT_NE(text.find("\"offset\": -3\n"), std::string::npos) << text;
    const Json::Value back = round_trip(value, "fickcast_json_integers.json");
    EXPECT_TRUE(back["cells"].isUInt64());
    EXPECT_EQ(back["cells"].asUInt64(), 12345678901234567ul);
    EXPECT_TRUE(back["degree"].isIntegral());
    EXPECT_EQ(back["offset"].asInt(), -3);
  }

  TEST(JsonFile, TextStaysUtf8AndEscapesWhatJsonNeeds)
  {
    Json::Value value(Json::objectValue);
    value["unit"] = "µm";
    value["temperature °C"] = "180 °C, 3 µm/s, 5 m³";
    value["message"] = "say \"hi\"\\\n\ttab \x01";
    const std::string text = json_text(value);
    EXPECT_NE(text.find("\"unit\": \"µm\""), std::string::npos) << text;
    EXPECT_NE(text.find("\"temperature °C\": \"180 °C, 3 µm/s, 5 m³\""), std::string::npos) << text;
    EXPECT_EQ(text.find("\\u00b5"), std::string::npos) << text;
    EXPECT_NE(text.find(R"("say \"hi\"\\\n\ttab \u0001")"), std::string::npos) << text;
    const Json::Value back = round_trip(value, "fickcast_json_text.json");
    EXPECT_EQ(back["unit"].asString(), "µm");
    EXPECT_EQ(back["temperature °C"].asString(), "180 °C, 3 µm/s, 5 m³");
    EXPECT_EQ(back["message"].asString(), "say \"hi\"\\\n\ttab \x01");
  }

  TEST(JsonFile, LayoutIsTwoSpacesAndKeyColonValue)
  {
    // Scripts and tests grep for `"status": "failed"`; the file ends with a newline.
    Json::Value value(Json::objectValue);
    value["status"] = "failed";
    value["time"]["scheme"] = "bdf2";
    const std::string text = json_text(value);
    EXPECT_NE(text.find("\n  \"status\": \"failed\""), std::string::npos) << text;
    EXPECT_NE(text.find("\n    \"scheme\": \"bdf2\""), std::string::npos) << text;
    EXPECT_EQ(text.back(), '\n');
  }

  TEST(JsonFile, ReadAndWriteErrorsAreIoErrors)
  {
    const std::string path = (std::filesystem::temp_directory_path() / "fickcast_json_bad.json").string();
    std::ofstream(path) << "{\"program\": \"fickcast\", \"version\": ";
    EXPECT_THROW(read_json(path), IoError);
    std::filesystem::remove(path);
    EXPECT_THROW(read_json(path), IoError);
    EXPECT_THROW(write_json(Json::Value(1), "/nonexistent-folder/x.json"), IoError);
  }
} // namespace fickcast
