// Fuzz harness: the bytes as a `file:` table (time [unit], value [unit], then rows), read as the
// case reader reads one: the value unit its concentration family is decided from, then the
// table converted to each SI unit a table can stand for. An InputError is the expected answer to
// bad input; anything else thrown, a crash, a hang, a sanitizer report, or an accepted table with
// a non-finite number, times that do not increase or fewer than two rows is a finding.
#include "case/input_error.h"
#include "case/time_table.h"
#include "fuzz_scratch.h"

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string>

namespace
{
  using namespace fickcast;

  void check_table(const TimeTable &table, const std::string &si_unit)
  {
    const std::string what = "a table read as " + si_unit;
    if (table.times.size() < 2 || table.values.size() != table.times.size())
      fuzz::finding(what + " was accepted with " + std::to_string(table.times.size()) + " times and " +
                    std::to_string(table.values.size()) + " values");
    for (std::size_t i = 0; i < table.times.size(); ++i)
      {
        if (!std::isfinite(table.times[i]) || !std::isfinite(table.values[i]))
          fuzz::finding(what + " was accepted with a non-finite number in row " + std::to_string(i + 1));
        if (i > 0 && !(table.times[i] > table.times[i - 1]))
          fuzz::finding(what + " was accepted with times that do not increase at row " + std::to_string(i + 1));
      }
    // Before and after the rows: the first and last value; between two rows: a finite value
    // between theirs.
    if (table.at(table.times.front() - 1) != table.values.front() ||
        table.at(table.times.back()) != table.values.back())
      fuzz::finding(what + ": the value before the first or after the last row is not that row's");
    for (std::size_t i = 0; i + 1 < table.times.size() && i < 64; ++i)
      {
        const double t = 0.5 * table.times[i] + 0.5 * table.times[i + 1];
        const double v = table.at(t), low = std::min(table.values[i], table.values[i + 1]),
                     high = std::max(table.values[i], table.values[i + 1]);
        if (!std::isfinite(v) || v < low || v > high)
          fuzz::finding(what + ": the interpolated value between rows " + std::to_string(i + 1) + " and " +
                        std::to_string(i + 2) + " is " + std::to_string(v) + ", not between theirs");
      }
  }
} // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, const std::size_t size)
{
  const std::string path = fuzz::write_input("table.csv", data, size);
  (void)time_table_value_unit(path); // never throws: empty when the header is not readable
  // A boundary value or initial concentration, a flux, a temperature (offset units), a diffusivity.
  for (const char *si_unit : {"kg/m3", "mol/(m2 s)", "K", "m2/s", "1"})
    try
      {
        check_table(read_time_table(path, si_unit), si_unit);
      }
    catch (const InputError &)
      {
      }
  return 0;
}
