// The units a case was written in, for printing results the way the user thinks of them.
#pragma once

#include "case/case_description.h"

#include <string>

namespace fickcast
{
  /// Converts SI results back into the units the case used (time of time.end, length of the
  /// layers or else of the first geometry key or point written with a length unit,
  /// the first concentration unit written).
  class DisplayUnits
  {
  public:
    /// @p digits: significant digits printed.
    explicit DisplayUnits(const CaseDescription &description, int digits = 4);

    std::string time(double seconds) const;
    std::string length(double metres) const;
    std::string concentration(double si) const;
    /// An amount (the case's amount unit: per area in 1-D, per length in 2-D) in the numerator of
    /// the concentration unit as written, per the area or length of its volume where it has one
    /// (1/cm3 gives 1/cm2, mg/L gives mg/m2), else SI.
    std::string amount(double si) const;
    /// An amount per time: amount() per the time unit of time.end.
    std::string rate(double si) const;

    /**
     * A named result given in SI with its SI unit (as summary.json and sweep.csv carry it):
     * times, lengths and concentrations in the case's units, fractions (unit 1) in per cent,
     * anything else in SI. Infinite or, for an @p event, NaN: "not reached"; otherwise NaN: "-".
     */
    std::string result(double value, const std::string &si_unit, bool event = false) const;

    /// A unit to show a quantity in and its size in SI (shown value = SI value / si_per_unit).
    struct Choice
    {
      std::string symbol;
      double si_per_unit = 1;
    };

    /**
     * The case's unit for a column or value whose SI unit is @p si_unit: times, lengths,
     * concentrations, amounts and amounts per time as the printout shows them; a fraction
     * (unit `1` or empty) stays a fraction; anything else (a diffusivity, a temperature) stays SI.
     */
    Choice for_si_unit(const std::string &si_unit) const;

  private:
    std::string format(double value, const std::string &unit) const;
    int digits_;
    std::string time_unit_, length_unit_, concentration_unit_, amount_unit_, rate_unit_;
    std::string si_concentration_, si_amount_;
    double time_factor_ = 1, length_factor_ = 1, concentration_factor_ = 1, amount_factor_ = 1, rate_factor_ = 1;
  };
} // namespace fickcast
