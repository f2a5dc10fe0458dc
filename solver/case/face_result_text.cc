#include "case/face_result_text.h"

#include "case/input_error.h"
#include "case/quantity_text.h"
#include "case/settings.h"
#include "case/units.h"

#include <algorithm>
#include <sstream>

namespace fickcast
{
  namespace
  {
    using Kind = FaceResultSpec::Kind;

    /// Each kind with its prefix (FaceResultSpec::prefix() names them; this only lists them).
    const std::vector<std::pair<std::string, Kind>> &kinds()
    {
      static const std::vector<std::pair<std::string, Kind>> table = [] {
        std::vector<std::pair<std::string, Kind>> all;
        for (const Kind kind :
             {Kind::flux, Kind::crossed, Kind::peak_flux, Kind::flux_limit, Kind::crossed_limit, Kind::steady_flux})
          {
            FaceResultSpec spec;
            spec.kind = kind;
            all.emplace_back(spec.prefix(), kind);
          }
        return all;
      }();
      return table;
    }

    /// What may follow the face for @p kind, as a message shows it.
    std::string tail_form(const Kind kind)
    {
      switch (kind)
        {
          case Kind::flux:
            return "optionally 'at TIME'";
          case Kind::crossed:
            return "optionally 'by TIME'";
          case Kind::flux_limit:
            return "'reaches RATE' (an amount per time)";
          case Kind::crossed_limit:
            return "'reaches AMOUNT'";
          case Kind::peak_flux:
          case Kind::steady_flux:
            break;
        }
      return "nothing";
    }
  } // namespace

  bool is_face_result_prefix(const std::string &prefix)
  {
    return std::any_of(kinds().begin(), kinds().end(), [&](const auto &k) { return k.first == prefix; });
  }

  FaceResultSpec parse_face_result(const std::string &prefix, const std::string &name, const std::string &text,
                                   const std::vector<std::string> &faces, const std::string &amount_unit,
                                   const double end, const std::string &origin, const std::string &key)
  {
    FaceResultSpec spec;
    spec.name = name;
    spec.origin = origin;
    const auto kind = std::find_if(kinds().begin(), kinds().end(), [&](const auto &k) { return k.first == prefix; });
    if (kind == kinds().end())
      throw InputError(origin, key, "expected a result through a face, found the prefix '" + prefix + "'");
    spec.kind = kind->second;
    const std::string form = "'in|out through FACE' followed by " + tail_form(spec.kind);
    const auto fail = [&](const std::string &what) { throw InputError(origin, key, "expected " + form + ", " + what); };

    std::istringstream words(text);
    std::string direction, through, face;
    words >> direction >> through >> face;
    if (direction != "in" && direction != "out")
      fail("found '" + direction + "' where 'in' or 'out' goes (the direction the amount is counted in)");
    spec.outward = direction == "out";
    if (through != "through")
      fail("found '" + through + "' after '" + direction + "'");
    std::vector<std::string> open;
    for (const auto &f : faces)
      if (!GeometrySpec::is_symmetry_face(f))
        open.push_back(f);
    if (std::find(open.begin(), open.end(), face) == open.end())
      {
        std::string list;
        for (const auto &f : open)
          list += (list.empty() ? "" : ", ") + f;
        const std::string suggestion = nearest(face, open);
        throw InputError(origin, key,
                         "expected a boundary name (" + list + ") after 'through', found '" + face + "'" +
                           (suggestion.empty() ? "" : " (did you mean '" + suggestion + "'?)"));
      }
    spec.boundary = face;

    std::string word;
    words >> word;
    std::string rest;
    std::getline(words, rest);
    rest.erase(0, rest.find_first_not_of(" \t"));
    rest.erase(rest.find_last_not_of(" \t") + 1);
    const std::string expected_word = spec.kind == Kind::flux                                             ? "at"
                                      : spec.kind == Kind::crossed                                        ? "by"
                                      : spec.kind == Kind::flux_limit || spec.kind == Kind::crossed_limit ? "reaches"
                                                                                                          : "";
    const bool optional = spec.kind == Kind::flux || spec.kind == Kind::crossed;
    if (word.empty())
      {
        if (!optional && !expected_word.empty())
          fail("found nothing after the face");
        return spec;
      }
    if (word != expected_word || expected_word.empty())
      fail("found '" + word + (rest.empty() ? "" : " " + rest) + "' after the face");
    if (rest.empty())
      fail("found nothing after '" + word + "'");

    // The quantity after the word, with its unit (a bare number is refused: it would be SI).
    const bool is_time = spec.kind == Kind::flux || spec.kind == Kind::crossed;
    const std::string unit = is_time ? "s" : spec.kind == Kind::flux_limit ? amount_unit + "/s" : amount_unit;
    const std::string what = is_time                         ? "a time"
                             : spec.kind == Kind::flux_limit ? "an amount per time (" + amount_unit + "/s or alike)"
                                                             : "an amount (" + amount_unit + " or alike)";
    double si = 0;
    try
      {
        const QuantityText q = split_quantity(rest, false);
        if (q.unit.empty())
          fail("found the bare number '" + rest + "' after '" + word + "' (write " + what + " with its unit)");
        si = UnitSystem::instance().to_si(q.number, q.unit, unit);
      }
    catch (const UnitError &error)
      {
        fail("found '" + rest + "' after '" + word + "' where " + what + " goes: " + error.what());
      }
    if (is_time)
      {
        if (!(si > 0) || si > end * (1 + 1e-12))
          fail("found '" + rest + "' after '" + word + "': expected a time within the run (above 0 s, at most " +
               format_si(end, "s") + ")");
        spec.time = std::min(si, end);
      }
    else
      {
        if (!(si > 0))
          fail("found '" + rest +
               "' after 'reaches': expected a limit above zero (the direction word says which "
               "way it is counted)");
        spec.limit = si;
      }
    return spec;
  }
} // namespace fickcast
