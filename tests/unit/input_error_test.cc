// Messages stay one readable line whatever the input held (issue 14 item 5).
#include "case/input_error.h"

#include <gtest/gtest.h>

#include <string>

namespace fickcast
{
  TEST(InputError, LongInputIsClippedAndCounted)
  {
    const std::string huge(1 << 20, 'a'); // a 1 MB value echoed into a message
    const InputError error("case.ini:3", "region.clay.diffusivity", "expected a number, found '" + huge + "'");
    const std::string text = error.what();
    EXPECT_LT(text.size(), 600u);
    EXPECT_NE(text.find("more bytes)"), std::string::npos) << text.substr(0, 200);
    EXPECT_EQ(text.rfind("case.ini:3: region.clay.diffusivity: expected a number, found 'aaa", 0), 0u);
  }

  TEST(InputError, ControlCharactersAndBrokenUtf8AreEscaped)
  {
    // A terminal escape (ESC [ 2 J clears the screen), a newline, a byte that is not UTF-8, and
    // valid UTF-8 (micro sign, degree sign) that must stay as it is.
    const InputError error("case.ini:7", "", std::string("found '\x1b[2J\nx\xff' in µm at 20 °C"));
    const std::string text = error.what();
    EXPECT_EQ(text, "case.ini:7: found '\\x1b[2J\\x0ax\\xff' in µm at 20 °C");
    EXPECT_EQ(text.find('\n'), std::string::npos);
    EXPECT_EQ(error.message(), "found '\\x1b[2J\\x0ax\\xff' in µm at 20 °C");
  }

  TEST(InputError, ShortPlainTextIsUnchanged)
  {
    EXPECT_EQ(printable("expected a diffusivity > 0, found -1e-09 m2/s", 480),
              "expected a diffusivity > 0, found -1e-09 m2/s");
    EXPECT_EQ(printable("abcdef", 3), "abc... (3 more bytes)");
  }
} // namespace fickcast
