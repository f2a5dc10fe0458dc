// Physical units: parsing "number unit" text and converting to SI with UDUNITS-2.
#pragma once

#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

namespace fickcast
{
  /// A unit text could not be parsed or has the wrong dimension. Caught and re-thrown as
  /// InputError with the file, line and key by the case reader.
  class UnitError : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };

  /**
   * The units database (UDUNITS-2) with fickcast's three deliberate departures from it:
   *
   * - `yr`, `year`, `years` mean the Julian year, 365.25 d = 31 557 600 s exactly (IAU; the
   *   usual year of geo-environmental and decay calculations). The database's own `year` is the
   *   tropical year (365.242198781 d), 0.002 % shorter; fickcast never uses it.
   * - `eV` is the exact SI value 1.602176634e-19 J (SI Brochure, 9th ed., 2019). The database
   *   still carries the 1992 value 1.60217733e-19 J (4e-7 relative difference).
   * - `a` stays what the database says, the are (100 m2); a time given in `a` is therefore
   *   rejected with a hint to write `yr`. Likewise `C` is the coulomb: temperatures need `degC`.
   *
   * Temperatures given in `degC` convert with their offset (`1050 degC` is 1323.15 K);
   * temperature rates such as `10 degC/min` convert without it (0.1667 K/s).
   * One instance per process (the database takes about 20 ms to load); it is read-only after
   * loading, so the instance can be shared.
   */
  class UnitSystem
  {
  public:
    /// The process-wide instance; loads the database on first use. Throws IoError if absent.
    static const UnitSystem &instance();

    ~UnitSystem();
    UnitSystem(const UnitSystem &) = delete;
    UnitSystem &operator=(const UnitSystem &) = delete;

    /**
     * Converts @p number given in @p unit_text to the SI unit @p si_unit (a UDUNITS-2 string
     * such as `m2/s`, `kg/m3` or `1`). An empty @p unit_text means the number is SI already.
     * Throws UnitError when the text does not parse or is not convertible; the message says what
     * dimension was found and, for known traps (`a`, `C`), what to write instead. Also when the
     * SI value is not finite (`1e300 Gm` overflows): a number beyond the range is never a value.
     */
    double to_si(double number, const std::string &unit_text, const std::string &si_unit) const;

    /// Whether @p unit_text parses and converts to @p si_unit.
    bool convertible(const std::string &unit_text, const std::string &si_unit) const;

    /// First of @p si_units that @p unit_text converts to, or empty if none.
    std::string first_convertible(const std::string &unit_text, const std::vector<std::string> &si_units) const;

    /// The unit text with fickcast's substitutions applied (Julian year, exact eV).
    static std::string normalise(const std::string &unit_text);

    /// Words for the dimension of @p unit_text ("a length", "an area", ...), for messages.
    std::string describe(const std::string &unit_text) const;

  private:
    UnitSystem();
    struct Database;
    std::unique_ptr<Database> database;
  };
} // namespace fickcast
