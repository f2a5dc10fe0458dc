// The case builder's [sweep] and [size]: the parameters and limits of studies over whole runs.
#include "case/section_builders.h"

#include "case/quantity_text.h"

namespace fickcast
{
  void build_sweep_and_size(const SectionReader &reader, CaseDescription &c)
  {
    SweepSpec &s = c.sweep;
    for (const auto &value : reader.settings.all())
      {
        if (value.section != "sweep")
          continue;
        const auto dot = value.key.find('.');
        const std::string prefix = dot == std::string::npos ? value.key : value.key.substr(0, dot);
        const std::string rest = dot == std::string::npos ? "" : value.key.substr(dot + 1);
        if (prefix == "vary")
          {
            StudyParameter p;
            p.key = rest;
            p.origin = value.origin;
            // Whole strings (such as layer lists) are separated by |, numbers by commas.
            if (value.text.find('|') != std::string::npos)
              {
                std::string item;
                for (const char ch : value.text + "|")
                  if (ch == '|')
                    {
                      const auto a = item.find_first_not_of(" \t");
                      if (a == std::string::npos)
                        reader.fail(value, "expected values between the | separators, found an empty one");
                      p.values.push_back(item.substr(a, item.find_last_not_of(" \t") - a + 1));
                      item.clear();
                    }
                  else
                    item += ch;
              }
            else
              p.values = split_list(value.text);
            if (p.values.empty())
              reader.fail(value, "expected at least one value, found none");
            s.vary.push_back(p);
          }
        else if (prefix == "sample")
          {
            StudyParameter p;
            p.key = rest;
            p.distribution = value.text;
            p.origin = value.origin;
            s.sample.push_back(p);
          }
        else if (prefix == "exceed" || prefix == "below")
          s.limits.push_back(StudyLimit{rest, value.text, prefix == "exceed", value.origin});
      }
    s.zip = reader.text("sweep", "combine") == "zip";
    s.samples = static_cast<unsigned int>(reader.quantity("sweep", "samples", 100));
    s.seed = static_cast<unsigned long>(reader.quantity("sweep", "seed", 1));
    if (!s.vary.empty() && !s.sample.empty())
      reader.fail(*reader.get("sweep", "sample." + s.sample.front().key),
                  "expected either vary.* (a sweep) or sample.* (an uncertainty study), found both");
    if (s.zip)
      for (const auto &p : s.vary)
        if (p.values.size() != s.vary.front().values.size())
          reader.fail(*reader.get("sweep", "vary." + p.key), "expected as many values as vary." + s.vary.front().key +
                                                               " (" + std::to_string(s.vary.front().values.size()) +
                                                               ") with combine = zip, found " +
                                                               std::to_string(p.values.size()));
    SizeSpec &z = c.size;
    if (const auto *key = reader.get("size", "parameter"))
      {
        z.parameter.key = key->text;
        z.parameter.origin = key->origin;
        for (const char *part : {"from", "to", "result", "aim"})
          if (!reader.get("size", part))
            reader.missing("size", part, "the rest of the sizing definition (from, to, result, aim)");
        z.parameter.values = {reader.get("size", "from")->text, reader.get("size", "to")->text};
        z.result = reader.get("size", "result")->text;
        z.result_origin = reader.get("size", "result")->origin;
        z.aim = reader.get("size", "aim")->text;
        z.aim_origin = reader.get("size", "aim")->origin;
        z.tolerance = reader.quantity("size", "tolerance", 1e-4);
        z.max_runs = static_cast<unsigned int>(reader.quantity("size", "max_runs", 40));
      }
    else
      for (const char *part : {"from", "to", "result", "aim"})
        if (const auto *v = reader.get("size", part))
          reader.fail(*v, "expected size.parameter with the other sizing keys, found none");
  }
} // namespace fickcast
