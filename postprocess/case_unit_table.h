// A CSV table of a results folder or a study written again in the units the case was written in.
#pragma once

#include "csv_table.h"

#include "case/display_units.h"

#include <string>

namespace fickcast::post
{
  /**
   * @p table (header `name [SI unit]`) as CSV text in the case's units: times in the unit of
   * time.end, lengths in the unit of the layers, concentrations in the first concentration unit
   * of the case, amounts and amounts per time derived from it (as `fickcast run` prints them),
   * fractions (`released_fraction`, `uptake_fraction`) in per cent. Columns in other units
   * (a diffusivity, a temperature) and text cells (a parameter written with its unit, a status)
   * are copied as they are. With @p event_columns, an empty cell of an event result in a
   * completed row reads `not reached`. `wall_time` stays in seconds. Numbers keep 10 significant digits.
   */
  std::string table_in_case_units(const CsvTable &table, const DisplayUnits &units, bool event_columns = false);
} // namespace fickcast::post
