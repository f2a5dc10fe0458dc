#include "run/face_histories.h"

#include "case/input_error.h"
#include "run/time_lags.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  namespace
  {
    using Kind = FaceResultSpec::Kind;

    /// @p values at time @p when, linear between the recorded times (exact at a recorded time).
    double at_time(const std::vector<double> &times, const std::vector<double> &values, const double when)
    {
      if (times.empty())
        return not_a_number;
      const auto after = std::lower_bound(times.begin(), times.end(), when);
      if (after == times.end())
        return std::abs(times.back() - when) <= 1e-12 * std::max(1.0, std::abs(when)) ? values.back() : not_a_number;
      const std::size_t k = static_cast<std::size_t>(after - times.begin());
      if (*after == when || k == 0)
        return values[k];
      const double w = (when - times[k - 1]) / (times[k] - times[k - 1]);
      return (1 - w) * values[k - 1] + w * values[k];
    }

    /// First time @p sign * values reaches @p limit, linear between recorded times; NaN if never.
    /// @p from_start: the value was already at the limit at the first finite entry.
    double first_reaching(const std::vector<double> &times, const std::vector<double> &values, const double sign,
                          const double limit, bool &from_start)
    {
      from_start = false;
      double previous_t = not_a_number, previous_v = not_a_number;
      for (std::size_t k = 0; k < times.size(); ++k)
        {
          if (!std::isfinite(values[k]))
            continue;
          const double v = sign * values[k];
          if (v >= limit)
            {
              if (!std::isfinite(previous_v))
                {
                  from_start = true;
                  return times[k];
                }
              return previous_t + (limit - previous_v) / (v - previous_v) * (times[k] - previous_t);
            }
          previous_t = times[k];
          previous_v = v;
        }
      return not_a_number;
    }
  } // namespace

  FaceHistories::FaceHistories(const CaseDescription &c, const std::vector<std::string> &names)
    : names_(names)
  {
    std::vector<std::string> wanted;
    for (const auto &[name, boundary] : c.output.time_lags)
      wanted.push_back(boundary);
    for (const auto &face : c.output.face_results)
      wanted.push_back(face.boundary);
    for (const auto &boundary : wanted)
      {
        const auto id = static_cast<unsigned int>(std::find(names.begin(), names.end(), boundary) - names.begin());
        if (id >= names.size())
          throw InputError(c.file, "", "the boundary '" + boundary + "' a named result asks about is not in the mesh");
        if (std::none_of(histories_.begin(), histories_.end(), [&](const History &h) { return h.boundary == id; }))
          histories_.push_back(History{id, {0.0}, {not_a_number}, {0.0}});
      }
  }

  void FaceHistories::record(const double t, const std::vector<double> &rates_in, const std::vector<double> &entered)
  {
    for (auto &h : histories_)
      {
        h.times.push_back(t);
        h.rates.push_back(rates_in[h.boundary]);
        h.amounts.push_back(entered[h.boundary]);
      }
  }

  void FaceHistories::save(StateArchive &a) const
  {
    a.put_count(histories_.size());
    for (const auto &h : histories_)
      {
        a.put_count(h.boundary);
        a.put(h.times);
        a.put(h.rates);
        a.put(h.amounts);
      }
  }

  void FaceHistories::load(StateArchive &a, const std::string &folder)
  {
    if (a.get_count() != histories_.size())
      throw IoError("the checkpoint in " + folder + " does not fit this case's results through faces");
    for (auto &h : histories_)
      {
        if (a.get_count() != h.boundary)
          throw IoError("the checkpoint in " + folder + " does not fit this case's results through faces");
        h.times = a.get_values();
        h.rates = a.get_values();
        h.amounts = a.get_values();
        if (h.rates.size() != h.times.size() || h.amounts.size() != h.times.size())
          throw IoError("the checkpoint in " + folder + " is damaged (results through faces)");
      }
  }

  const FaceHistories::History &FaceHistories::of(const std::string &boundary) const
  {
    for (const auto &h : histories_)
      if (names_[h.boundary] == boundary)
        return h;
    throw std::logic_error("no history kept for boundary " + boundary);
  }

  std::vector<TimeLagRecord> FaceHistories::time_lags(const CaseDescription &c, const std::vector<double> &entered,
                                                      const double t) const
  {
    std::vector<FluxHistory> histories;
    for (const auto &[name, boundary] : c.output.time_lags)
      {
        const History &h = of(boundary);
        FluxHistory flux{h.boundary, {}};
        for (std::size_t k = 0; k < h.times.size(); ++k)
          if (std::isfinite(h.rates[k]))
            flux.second.emplace_back(h.times[k], h.rates[k]);
        histories.push_back(std::move(flux));
      }
    return time_lag_records(c.output.time_lags, histories, entered, t);
  }

  std::vector<FaceResultRecord> FaceHistories::results(const CaseDescription &c, const double t) const
  {
    std::vector<FaceResultRecord> records;
    for (const auto &spec : c.output.face_results)
      {
        const History &h = of(spec.boundary);
        const double sign = spec.outward ? -1.0 : 1.0;
        FaceResultRecord r;
        r.prefix = spec.prefix();
        r.name = spec.name;
        r.boundary = spec.boundary;
        r.outward = spec.outward;
        switch (spec.kind)
          {
            case Kind::flux:
              r.asked_time = spec.time > 0 ? spec.time : t;
              r.value = sign * at_time(h.times, h.rates, r.asked_time);
              break;
            case Kind::crossed:
              r.asked_time = spec.time > 0 ? spec.time : t;
              r.value = sign * at_time(h.times, h.amounts, r.asked_time);
              break;
            case Kind::steady_flux:
              {
                r.value = sign * h.rates.back();
                const double earlier = at_time(h.times, h.rates, 0.8 * t);
                r.steady =
                  std::isfinite(earlier) && std::abs(h.rates.back() - earlier) <= 1e-3 * std::abs(h.rates.back());
                if (!r.steady)
                  r.note = "not yet steady: the rate changed by more than 0.1 % over the last fifth of the run";
                break;
              }
            case Kind::peak_flux:
              {
                std::size_t best = h.times.size();
                for (std::size_t k = 0; k < h.times.size(); ++k)
                  if (std::isfinite(h.rates[k]) && (best == h.times.size() || sign * h.rates[k] > sign * h.rates[best]))
                    best = k;
                if (best == h.times.size())
                  break;
                r.value = sign * h.rates[best];
                r.when = h.times[best];
                const bool first = best == 0 || !std::isfinite(h.rates[best - 1]);
                const bool last = best + 1 == h.times.size();
                // A rate that rises to a plateau has no peak of its own: its largest value is
                // round-off above the level it settles at, at a time of no meaning.
                const double final = sign * h.rates.back();
                if (!last && r.value - final <= 1e-4 * std::abs(r.value))
                  {
                    r.value = final;
                    r.when = h.times.back();
                    r.note = "no distinct peak: the rate levels off at its largest value by the end";
                  }
                else if (last)
                  r.note = "largest at the end of the run: the rate was still rising";
                else if (first)
                  r.note = "largest at the first step: the rate falls from the start";
                else
                  {
                    // The vertex of the parabola through the largest recorded rate and its two
                    // neighbours (the steps land anywhere near the peak).
                    const double t0 = h.times[best - 1], t1 = h.times[best], t2 = h.times[best + 1];
                    const double y0 = sign * h.rates[best - 1], y1 = r.value, y2 = sign * h.rates[best + 1];
                    const double d01 = (y1 - y0) / (t1 - t0), d12 = (y2 - y1) / (t2 - t1);
                    const double curvature = (d12 - d01) / (t2 - t0); // half the second derivative
                    if (curvature < 0)
                      {
                        const double vertex = 0.5 * (t0 + t1) - d01 / (2 * curvature);
                        if (vertex > t0 && vertex < t2)
                          {
                            r.when = vertex;
                            r.value = y1 + d01 * (vertex - t1) + curvature * (vertex - t0) * (vertex - t1);
                          }
                      }
                  }
                break;
              }
            case Kind::flux_limit:
            case Kind::crossed_limit:
              {
                bool from_start = false;
                const auto &values = spec.kind == Kind::flux_limit ? h.rates : h.amounts;
                r.limit = spec.limit;
                r.value = first_reaching(h.times, values, sign, spec.limit, from_start);
                if (from_start && spec.kind == Kind::flux_limit)
                  r.note = "at or above the limit from the first step";
                break;
              }
          }
        records.push_back(r);
      }
    return records;
  }
} // namespace fickcast
