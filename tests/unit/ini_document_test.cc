#include "case/ini_document.h"
#include "case/input_error.h"

#include <gtest/gtest.h>

namespace fickcast
{
  TEST(IniDocument, TracksLinesAndSections)
  {
    const IniDocument document = IniDocument::parse("# header\n[time]\nend = 3 h   # comment\n\n[region.clay]\n"
                                                    "diffusivity = 1e-9 m2/s\n",
                                                    "c.ini");
    ASSERT_EQ(document.entries().size(), 2u);
    EXPECT_EQ(document.entries()[0].full_key(), "time.end");
    EXPECT_EQ(document.entries()[0].value, "3 h");
    EXPECT_EQ(document.entries()[0].origin(), "c.ini:3");
    EXPECT_EQ(document.entries()[1].section, "region.clay");
    EXPECT_EQ(document.entries()[1].origin(), "c.ini:6");
    EXPECT_EQ(document.section_line("region.clay"), 5u);
  }

  namespace
  {
    std::string error_of(const std::string &text)
    {
      try
        {
          IniDocument::parse(text, "bad.ini");
        }
      catch (const InputError &error)
        {
          return error.what();
        }
      return "";
    }
  } // namespace

  TEST(IniDocument, StructuralMistakesNameTheLine)
  {
    EXPECT_NE(error_of("[time\nend = 1 h\n").find("bad.ini:1"), std::string::npos);
    EXPECT_NE(error_of("[time\nend = 1 h\n").find("unterminated"), std::string::npos);
    EXPECT_NE(error_of("[time]\nend = 1 h\n[time]\nstep = 1 s\n").find("duplicate section [time]"), std::string::npos);
    EXPECT_NE(error_of("[time]\nend = 1 h\nend = 2 h\n").find("bad.ini:3: time.end: key given twice"),
              std::string::npos);
    EXPECT_NE(error_of("end = 1 h\n").find("before any [section]"), std::string::npos);
    EXPECT_NE(error_of("[time]\njust words\n").find("bad.ini:2"), std::string::npos);
    EXPECT_NE(error_of("").find("empty"), std::string::npos);
    EXPECT_NE(error_of("# only a comment\n\n").find("empty"), std::string::npos);
    EXPECT_NE(error_of(std::string("[time]\nend = 1\0 h\n", 17)).find("binary"), std::string::npos);
    EXPECT_NE(error_of("[time]\nend = \xff\xfe\n").find("binary"), std::string::npos);
  }
} // namespace fickcast
