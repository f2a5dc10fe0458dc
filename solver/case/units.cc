#include "case/units.h"

#include "case/input_error.h"

#include <udunits2.h>

#include <cmath>
#include <cstdio>
#include <mutex>
#include <regex>

namespace fickcast
{
  namespace
  {
    /// Exact values: SI Brochure, 9th edition (BIPM 2019), table 3 and section 2.2.
    constexpr double electronvolt_in_joule = 1.602176634e-19;
    /// Julian year, 365.25 d of 86 400 s (IAU; common practice for years in decay data).
    constexpr double julian_year_in_second = 365.25 * 86400.0;

    struct UnitDeleter
    {
      void operator()(ut_unit *unit) const { ut_free(unit); }
    };
    using UnitHandle = std::unique_ptr<ut_unit, UnitDeleter>;

    struct ConverterDeleter
    {
      void operator()(cv_converter *converter) const { cv_free(converter); }
    };
    using ConverterHandle = std::unique_ptr<cv_converter, ConverterDeleter>;
  } // namespace

  struct UnitSystem::Database
  {
    ut_system *system = nullptr;
    mutable std::mutex mutex; // UDUNITS-2 keeps a global status: serialise calls.

    UnitHandle parse(const std::string &text) const { return UnitHandle(ut_parse(system, text.c_str(), UT_UTF8)); }
  };

  const UnitSystem &UnitSystem::instance()
  {
    static const UnitSystem system;
    return system;
  }

  UnitSystem::UnitSystem()
    : database(std::make_unique<Database>())
  {
    ut_set_error_message_handler(ut_ignore);
    database->system = ut_read_xml(nullptr);
    if (database->system == nullptr)
      throw IoError("cannot load the UDUNITS-2 units database (install Debian's libudunits2-data; "
                    "UDUNITS2_XML_PATH may point at udunits2.xml)");
  }

  UnitSystem::~UnitSystem()
  {
    if (database && database->system)
      ut_free_system(database->system);
  }

  std::string UnitSystem::normalise(const std::string &unit_text)
  {
    static const std::regex year(R"((^|[^A-Za-z_])(yr|years?)(?![A-Za-z_]))");
    static const std::regex electronvolt(R"((^|[^A-Za-z_])eV(?![A-Za-z_]))");
    static const std::string year_text = "(" + std::to_string(static_cast<long>(julian_year_in_second)) + " s)";
    std::string text = std::regex_replace(unit_text, year, "$1" + year_text);
    char buffer[64];
    std::snprintf(buffer, sizeof(buffer), "(%.10g J)", electronvolt_in_joule);
    text = std::regex_replace(text, electronvolt, std::string("$1") + buffer);
    return text;
  }

  double UnitSystem::to_si(const double number, const std::string &unit_text, const std::string &si_unit) const
  {
    if (unit_text.empty())
      return number;
    {
      std::lock_guard<std::mutex> lock(database->mutex);
      const auto unit = database->parse(normalise(unit_text));
      if (!unit)
        throw UnitError("cannot read the unit '" + unit_text + "' (expected units convertible to " + si_unit + ")");
      const auto target = database->parse(si_unit);
      if (!target)
        throw std::logic_error("fickcast: bad SI unit string '" + si_unit + "'");
      if (ut_are_convertible(unit.get(), target.get()))
        {
          const ConverterHandle converter(ut_get_converter(unit.get(), target.get()));
          if (!converter)
            throw UnitError("cannot convert '" + unit_text + "' to " + si_unit);
          const double si = cv_convert_double(converter.get(), number);
          if (!std::isfinite(si))
            {
              char written[64];
              std::snprintf(written, sizeof(written), "%.10g", number);
              throw UnitError("expected a value within the range of numbers once converted to " + si_unit + ", found " +
                              written + " " + unit_text + " (beyond 1.8e308 " + si_unit + ")");
            }
          return si;
        }
    }
    std::string message =
      "expected units convertible to " + si_unit + ", found '" + unit_text + "' (" + describe(unit_text) + ")";
    static const std::regex are_token(R"((^|[^A-Za-z_])a(?![A-Za-z_]))");
    static const std::regex coulomb_token(R"((^|[^A-Za-z_])C(?![A-Za-z_]))");
    if (si_unit == "s" && std::regex_search(unit_text, are_token))
      message += "; 'a' is the are (100 m2) in the units database, write yr for years";
    else if (si_unit == "K" && std::regex_search(unit_text, coulomb_token))
      message += "; 'C' is the coulomb, write degC for degrees Celsius";
    throw UnitError(message);
  }

  bool UnitSystem::convertible(const std::string &unit_text, const std::string &si_unit) const
  {
    std::lock_guard<std::mutex> lock(database->mutex);
    const auto unit = database->parse(normalise(unit_text));
    const auto target = database->parse(si_unit);
    return unit && target && ut_are_convertible(unit.get(), target.get());
  }

  std::string UnitSystem::first_convertible(const std::string &unit_text,
                                            const std::vector<std::string> &si_units) const
  {
    for (const auto &si_unit : si_units)
      if (convertible(unit_text, si_unit))
        return si_unit;
    return "";
  }

  std::string UnitSystem::describe(const std::string &unit_text) const
  {
    static const std::vector<std::pair<std::string, std::string>> known = {
      {"1", "a pure number"},
      {"m", "a length"},
      {"m2", "an area"},
      {"m3", "a volume"},
      {"s", "a time"},
      {"m2/s", "a diffusivity"},
      {"m/s", "a velocity or transfer coefficient"},
      {"1/s", "a rate"},
      {"K", "a temperature"},
      {"K/s", "a temperature rate"},
      {"kg/m3", "a mass concentration or density"},
      {"mol/m3", "an amount concentration"},
      {"1/m3", "a number density"},
      {"kg", "a mass"},
      {"J", "an energy"},
      {"J/mol", "a molar energy"},
      {"m3/kg", "a specific volume"},
      {"A s", "an electric charge"},
    };
    for (const auto &[si, words] : known)
      if (convertible(unit_text, si))
        return words;
    return "units of another kind";
  }
} // namespace fickcast
