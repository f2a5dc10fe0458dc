#include "verify/verification_report.h"

#include "case/input_error.h"
#include "results/json_file.h"
#include "results/summary.h"

#include <boost/version.hpp>
#include <deal.II/base/config.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <ctime>
#include <fstream>
#include <sstream>

#include <sys/utsname.h>
#include <unistd.h>

namespace fickcast
{
  std::vector<std::pair<std::string, std::string>> installation_facts()
  {
    const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    char date[32];
    std::strftime(date, sizeof(date), "%Y-%m-%d %H:%M:%S UTC", std::gmtime(&now));
    char host[256] = {0};
    ::gethostname(host, sizeof(host) - 1);
    utsname system{};
    ::uname(&system);
    std::vector<std::pair<std::string, std::string>> facts;
    facts.emplace_back("fickcast version", fickcast_version());
    facts.emplace_back("date", date);
    facts.emplace_back("host", host);
    facts.emplace_back("system", std::string(system.sysname) + " " + system.release + " " + system.machine);
    facts.emplace_back("compiler", __VERSION__);
    facts.emplace_back("deal.II", DEAL_II_PACKAGE_VERSION);
    facts.emplace_back("Boost", std::to_string(BOOST_VERSION / 100000) + "." +
                                  std::to_string(BOOST_VERSION / 100 % 1000) + "." +
                                  std::to_string(BOOST_VERSION % 100));
    return facts;
  }

  std::string verification_report_text(const std::vector<CheckResult> &results)
  {
    std::ostringstream out;
    out << "fickcast verification report\n"
        << "=============================\n\n";
    for (const auto &[key, value] : installation_facts())
      out << "  " << key << std::string(key.size() < 18 ? 18 - key.size() : 1, ' ') << value << '\n';
    out << "\nEach check solves a small case with this installation and compares a result with a\n"
           "published analytic solution, computed here with a reference library (Boost.Math) or the\n"
           "C++ standard library. Citations marked 'from memory' have not been checked against the book.\n\n";
    unsigned int failed = 0;
    char line[512];
    for (std::size_t i = 0; i < results.size(); ++i)
      {
        const CheckResult &r = results[i];
        failed += r.passed ? 0 : 1;
        std::snprintf(line, sizeof(line), "%2zu. %s\n", i + 1, r.name.c_str());
        out << line << "    source:    " << r.source << '\n' << "    measure:   " << r.measure << '\n';
        std::snprintf(line, sizeof(line), "    error:     %.3e   tolerance: %.1e   %s   (%.1f s)\n", r.error,
                      r.tolerance, r.passed ? "PASS" : "FAIL", r.seconds);
        out << line;
        if (!r.note.empty())
          out << "    note:      " << r.note << '\n';
        out << '\n';
      }
    if (failed == 0)
      out << "Result: all " << results.size() << " checks passed.\n";
    else
      out << "Result: " << failed << " of " << results.size() << " checks FAILED.\n";
    out << "\nA passed verification shows that this installation solves these equations as published; it\n"
           "does not validate a model of a particular material or device. Model predictions support, but do\n"
           "not replace, testing; medical, containment and safety uses follow the applicable regulations,\n"
           "codes and licensed practice.\n";
    return out.str();
  }

  void write_verification_report(const std::vector<CheckResult> &results, const std::string &folder)
  {
    {
      std::ofstream out(folder + "/verification_report.txt");
      if (!out)
        throw IoError("cannot write " + folder + "/verification_report.txt");
      out << verification_report_text(results);
    }
    Json::Value report(Json::objectValue);
    report["program"] = "fickcast";
    Json::Value facts(Json::objectValue);
    for (const auto &[key, value] : installation_facts())
      facts[key] = value;
    report["installation"] = facts;
    Json::Value checks(Json::arrayValue);
    unsigned int failed = 0;
    for (const auto &r : results)
      {
        Json::Value check(Json::objectValue);
        check["name"] = r.name;
        check["source"] = r.source;
        check["measure"] = r.measure;
        check["error"] = r.error;
        check["tolerance"] = r.tolerance;
        check["passed"] = r.passed;
        check["seconds"] = r.seconds;
        if (!r.note.empty())
          check["note"] = r.note;
        checks.append(check);
        failed += r.passed ? 0 : 1;
      }
    report["checks"] = checks;
    report["passed"] = failed == 0;
    write_json(report, folder + "/verification_report.json");
  }
} // namespace fickcast
