#include "app/command_line.h"

#include "case/input_error.h"
#include "case/quantity_text.h"
#include "case/renamed_spellings.h"

#include <boost/program_options.hpp>

#include <sstream>

namespace fickcast
{
  namespace po = boost::program_options;

  const std::vector<std::pair<std::string, std::string>> &verbs()
  {
    static const std::vector<std::pair<std::string, std::string>> list = {
      {"run", "solve one case and write its results folder"},
      {"check", "validate a case and print every effective setting with units; solve nothing"},
      {"sweep", "run the cases of the [sweep] section (a grid, zipped lists or random samples); one table"},
      {"size", "find the value of one parameter at which a named result takes an aimed value ([size])"},
      {"verify", "solve the built-in checks against published solutions; print and write a report"},
    };
    return list;
  }

  namespace
  {
    /// The options of @p verb, and only those (help shows what applies).
    po::options_description verb_options(const std::string &verb)
    {
      const bool reads_case = verb != "verify";
      const bool writes = verb != "check";
      po::options_description options("Options");
      if (reads_case)
        options.add_options()("set", po::value<std::vector<std::string>>()->composing(),
                              "override a case key: --set section.key=value (repeatable), e.g. "
                              "--set region.clay.diffusivity=\"2e-10 m2/s\"");
      if (writes)
        options.add_options() //
          ("output", po::value<std::string>(),
           verb == "verify" ? "folder for the verification report (default: verification-DATE-TIME)"
                            : "results folder (instead of the case's output.folder)") //
          ("overwrite", "replace an existing results folder");
      if (reads_case)
        options.add_options()("allow-large",
                              "run a case even if its estimated memory, steps or outputs exceed the limits");
      options.add_options()            //
        ("quiet", "print errors only") //
        ("help", "show this help");
      if (verb == "check")
        options.add_options()("keys", "list every case key with its default and meaning");
      if (verb == "run")
        options.add_options()("resume", "continue the interrupted run of this case from its newest checkpoint "
                                        "(same case, same number of ranks); without one, start at t = 0");
      if (verb == "run" || verb == "sweep" || verb == "size")
        options.add_options()("report", "also write the plots and the HTML report (FOLDER/report/index.html)");
      if (verb == "sweep")
        options.add_options()("vary", po::value<std::vector<std::string>>()->composing(),
                              "sweep a case key: --vary key=value,value,... or key=\"text | text\" "
                              "(repeatable; adds to the case's [sweep] vary keys, replacing one of the same key)");
      return options;
    }

    bool is_verb(const std::string &word)
    {
      for (const auto &[name, text] : verbs())
        if (name == word)
          return true;
      return false;
    }
  } // namespace

  Invocation parse_command_line(const std::vector<std::string> &arguments)
  {
    Invocation invocation;
    if (arguments.empty())
      {
        invocation.help = true;
        return invocation;
      }
    const std::string &first = arguments.front();
    if (first == "--help" || first == "-h" || first == "help")
      {
        invocation.help = true;
        if (arguments.size() > 1 && is_verb(arguments[1]))
          invocation.verb = arguments[1];
        return invocation;
      }
    if (first == "--version")
      {
        invocation.version = true;
        return invocation;
      }
    if (!is_verb(first))
      {
        std::vector<std::string> names;
        std::string list;
        for (const auto &[name, text] : verbs())
          {
            names.push_back(name);
            list += (list.empty() ? "" : ", ") + name;
          }
        const std::string suggestion = nearest(first, names);
        const std::string renamed = renamed_verb(first);
        if (!renamed.empty())
          throw InputError("command line", "",
                           "the verb '" + first + "' is a spelling of fickcast 0.7; write 'fickcast " + renamed +
                             "' instead (and a [" + renamed + "] section in the case)");
        throw InputError("command line", "",
                         "unknown verb '" + first + "'; expected one of " + list +
                           (suggestion.empty() ? "" : " (did you mean '" + suggestion + "'?)"));
      }
    invocation.verb = first;

    po::options_description options = verb_options(first);
    po::options_description hidden;
    hidden.add_options()("case", po::value<std::vector<std::string>>(), "case file");
    po::options_description all;
    all.add(options).add(hidden);
    po::positional_options_description positional;
    positional.add("case", -1);
    po::variables_map values;
    try
      {
        const std::vector<std::string> rest(arguments.begin() + 1, arguments.end());
        po::store(po::command_line_parser(rest).options(all).positional(positional).run(), values);
        po::notify(values);
      }
    catch (const po::error &error)
      {
        throw InputError("command line", "", std::string(error.what()) + " (see fickcast " + first + " --help)");
      }
    invocation.help = values.count("help") != 0;
    invocation.overwrite = values.count("overwrite") != 0;
    invocation.allow_large = values.count("allow-large") != 0;
    invocation.quiet = values.count("quiet") != 0;
    invocation.list_keys = values.count("keys") != 0;
    invocation.report = values.count("report") != 0;
    invocation.resume = values.count("resume") != 0;
    if (invocation.resume && invocation.overwrite)
      throw InputError("command line", "--resume",
                       "expected --resume (continue an interrupted run) or --overwrite (start it again), found both");
    if (values.count("set"))
      invocation.overrides = values["set"].as<std::vector<std::string>>();
    if (values.count("vary"))
      for (const auto &item : values["vary"].as<std::vector<std::string>>())
        {
          const auto equals = item.find('=');
          if (equals == std::string::npos || equals == 0)
            throw InputError("command line", "--vary", "expected 'key=value,value,...', found '" + item + "'");
          invocation.vary.push_back("sweep.vary." + item);
        }
    if (values.count("output"))
      invocation.output = values["output"].as<std::string>();
    if (values.count("case"))
      {
        const auto cases = values["case"].as<std::vector<std::string>>();
        if (cases.size() > 1)
          throw InputError("command line", "",
                           "expected one case file, found " + std::to_string(cases.size()) + " ('" + cases[0] + "', '" +
                             cases[1] + "', ...)");
        invocation.case_file = cases.front();
      }
    if (first == "verify" && !invocation.case_file.empty())
      throw InputError("command line", "", "verify takes no case file, found '" + invocation.case_file + "'");
    if (invocation.case_file.empty() && !invocation.help && !invocation.list_keys && first != "verify")
      throw InputError("command line", "", "expected a case file: fickcast " + first + " CASE.ini");
    return invocation;
  }

  std::string help_text(const std::string &verb)
  {
    std::ostringstream out;
    if (verb.empty())
      {
        out << "fickcast: finite-element solver for Fick's second law in layered, porous and\n"
               "heterogeneous media.\n\n"
               "Usage: fickcast VERB [options] CASE.ini\n\n"
               "Verbs:\n";
        for (const auto &[name, text] : verbs())
          out << "  " << name << std::string(10 - name.size(), ' ') << text << '\n';
        out << "\nOptions of most verbs (fickcast VERB --help lists each verb's own):\n"
            << verb_options("run") << "\n"
            << "  --version             print the version\n\n"
               "Exit codes: 0 success, 1 run failed (numerical), 2 bad input (case, mesh, flag), 3 I/O,\n"
               "4 interrupted (a signal; `run --resume` or the same sweep continues it).\n"
               "More: fickcast VERB --help\n";
        return out.str();
      }
    if (verb == "run")
      out << "Usage: fickcast run [options] CASE.ini\n\n"
             "Solves the case and writes its results folder (fields/, series.csv, summary.json).\n"
             "The folder appears only when complete; an existing one is kept unless --overwrite.\n\n";
    else if (verb == "verify")
      out << "Usage: fickcast verify [--output DIR] [--overwrite] [--quiet]\n\n"
             "Solves a set of small cases and compares them with published analytic solutions (erfc,\n"
             "Gaussian, Crank's series for sheets, spheres and cylinders, membranes, sorption with decay,\n"
             "finite baths, junction depths, temperature schedules). Prints each check and writes\n"
             "verification_report.txt and .json (date, version, machine, each source, error, tolerance).\n"
             "Exit code 1 if any check fails. Takes a few seconds.\n\n";
    else if (verb == "sweep")
      out << "Usage: fickcast sweep [options] CASE.ini\n"
             "       mpirun -np N fickcast sweep [options] CASE.ini\n\n"
             "Runs the cases the [sweep] section defines: every combination of the vary.KEY lists\n"
             "(combine = zip pairs them element by element), or `samples` Latin hypercube draws of the\n"
             "sample.KEY distributions. Each case is solved on one rank; ranks take the next case as\n"
             "they finish. Writes FOLDER/cases/case_NNNN (a results folder each), FOLDER/sweep.csv\n"
             "and FOLDER/sweep_summary.json (statistics and limit probabilities for samples). FOLDER is\n"
             "--output or the case's output.folder with _sweep appended. Running the same study again\n"
             "into the same folder keeps finished cases and runs only the rest (--overwrite starts over).\n"
             "Exit code 1 if any case failed (the table says which and why).\n\n";
    else if (verb == "size")
      out << "Usage: fickcast size [options] CASE.ini\n\n"
             "Finds the value of size.parameter between size.from and size.to at which the\n"
             "named result size.result equals size.aim, by a bracketing root finder\n"
             "(TOMS 748), to size.tolerance (relative). Prints every run. Writes\n"
             "FOLDER/runs/run_NN, FOLDER/size.csv and FOLDER/size_summary.json; FOLDER is\n"
             "--output or the case's output.folder with _size appended. Exit code 2 if the range does\n"
             "not bracket the aim (the results at both ends are shown).\n\n";
    else if (verb == "check")
      out << "Usage: fickcast check [options] CASE.ini\n"
             "       fickcast check --keys\n\n"
             "Validates the case and prints every effective setting: key, value as written, SI value\n"
             "and unit, and where it came from (file:line, --set or default). Solves nothing.\n\n";
    out << verb_options(verb);
    return out.str();
  }
} // namespace fickcast
