#include "verify/verification_suite.h"

#include "case/case_reader.h"
#include "case/input_error.h"
#include "run/run_case.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/special_functions/bessel.hpp>
#include <boost/math/special_functions/erf.hpp>
#include <boost/math/tools/roots.hpp>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <fstream>
#include <map>
#include <sstream>

namespace fickcast
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    /// One finished run: its record and its series.csv by column name.
    struct Run
    {
      RunRecord record;
      std::map<std::string, std::vector<double>> series;

      const std::vector<double> &column(const std::string &name) const
      {
        const auto it = series.find(name);
        if (it == series.end())
          throw std::runtime_error("series.csv has no column " + name);
        return it->second;
      }
      /// Value of @p name in the row at time @p t.
      double at(const std::string &name, const double t) const
      {
        const auto &time = column("time");
        for (std::size_t i = 0; i < time.size(); ++i)
          if (std::abs(time[i] - t) <= 1e-9 * std::max(1.0, std::abs(t)))
            return column(name)[i];
        throw std::runtime_error("series.csv has no row at t = " + std::to_string(t));
      }
    };

    std::map<std::string, std::vector<double>> read_series(const std::string &path)
    {
      std::ifstream in(path);
      std::string line;
      std::getline(in, line);
      std::vector<std::string> names;
      std::stringstream header(line);
      std::string cell;
      while (std::getline(header, cell, ','))
        names.push_back(cell.substr(0, cell.find(" [")));
      std::map<std::string, std::vector<double>> columns;
      while (std::getline(in, line))
        {
          std::stringstream row(line);
          for (std::size_t i = 0; i < names.size(); ++i)
            {
              std::getline(row, cell, ',');
              columns[names[i]].push_back(cell.empty() ? std::nan("") : std::stod(cell));
            }
        }
      return columns;
    }

    Run run_text(const std::string &scratch, const std::string &name, const std::string &text)
    {
      // Each check's tolerance is tied to the error of one solve of its settings (as measured);
      // the accuracy check is verified on its own (verification.AccuracyCheck).
      CaseDescription description = read_case_text(text, name + ".ini", {"numerics.accuracy=off"});
      RunOptions options;
      options.folder = scratch + "/" + name;
      options.overwrite = true;
      Run run;
      run.record = run_case(description, options, MPI_COMM_SELF).record;
      if (run.record.status == "interrupted")
        throw Interrupted("verification interrupted: run the same command again to start it over");
      if (run.record.status != "completed")
        throw std::runtime_error("the run failed: " + run.record.message);
      run.series = read_series(options.folder + "/series.csv");
      return run;
    }

    std::string list_of(const std::vector<double> &times)
    {
      std::string text;
      char buffer[32];
      for (const double t : times)
        {
          std::snprintf(buffer, sizeof(buffer), "%.10g s", t);
          text += (text.empty() ? "" : ", ") + std::string(buffer);
        }
      return text;
    }

    /// Plane sheet of half-thickness L (or a film on an impermeable base), faces at zero:
    /// Mt/Minf = 1 - sum 8 / ((2n+1)^2 pi^2) exp(-(2n+1)^2 pi^2 T / 4), T = D t / L^2.
    double sheet_fraction(const double T)
    {
      double sum = 0;
      for (int n = 0; n < 4000; ++n)
        {
          const double m = 2 * n + 1;
          sum += 8 / (m * m * pi * pi) * std::exp(-m * m * pi * pi * T / 4);
        }
      return 1 - sum;
    }

    struct Check
    {
      std::string name, source, measure;
      double tolerance;
      std::function<double(const std::string &)> error; ///< runs the case(s), returns the error
    };

    /// Tolerances: 3 to 5 times the error each check measured on the development machine
    /// (fickcast 0.8 session, printed by `fickcast verify`), so a constant-factor mistake fails;
    /// the time lag and the partition check are exact up to round-off (measured 1.1e-11, 1e-12).
    std::vector<Check> checks()
    {
      std::vector<Check> list;
      list.push_back({"Semi-infinite medium, surface concentration held: profile",
                      "Crank, The Mathematics of Diffusion, 2nd ed. (1975), sec. 2.3-2.4: C/C0 = erfc(x / 2 sqrt(Dt)) "
                      "(erfc from Boost.Math)",
                      "largest |C - C_exact| / C0 at three points and t = 0.1, 0.5, 1 s", 5e-5,
                      [](const std::string &dir) {
                        const Run run =
                          run_text(dir, "erfc",
                                   "[geometry]\nlayers = m 12 m\ncell_size = 0.05 m\n[region.m]\ndiffusivity = 1 m2/s\n"
                                   "[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n[time]\nend = 1 s\n"
                                   "tolerance = 1e-6\n[output]\nfields = false\ntimes = 0.1 s, 0.5 s\n"
                                   "point.a = 0.2 m\npoint.b = 0.5 m\npoint.c = 1 m\n");
                        double worst = 0;
                        for (const double t : {0.1, 0.5, 1.0})
                          for (const auto &[p, x] :
                               {std::pair<const char *, double>{"point.a", 0.2}, {"point.b", 0.5}, {"point.c", 1.0}})
                            worst = std::max(worst, std::abs(run.at(p, t) - boost::math::erfc(x / (2 * std::sqrt(t)))));
                        return worst;
                      }});
      list.push_back({"Semi-infinite medium: flux through the held face and amount taken up",
                      "Crank (1975) sec. 2.3: F = C0 sqrt(D / (pi t)), M = 2 C0 sqrt(D t / pi)",
                      "largest relative error of flux and amount at t = 0.25, 1 s", 4e-5, [](const std::string &dir) {
                        const Run run = run_text(
                          dir, "surface_flux",
                          "[geometry]\nlayers = m 12 m\ncell_size = 0.02 m\ngrade_toward = top\ngrading = 1.02\n"
                          "[region.m]\ndiffusivity = 1 m2/s\n[boundary.top]\ntype = concentration\nvalue = 1 "
                          "mol/m3\n[time]\nend = 1 s\ntolerance = 1e-7\n[output]\nfields = false\n"
                          "times = 0.25 s\n");
                        double worst = 0;
                        for (const double t : {0.25, 1.0})
                          {
                            worst = std::max(worst, std::abs(run.at("flux_in.top", t) / std::sqrt(1 / (pi * t)) - 1));
                            worst = std::max(worst, std::abs(run.at("amount_in.top", t) / (2 * std::sqrt(t / pi)) - 1));
                          }
                        return worst;
                      }});
      list.push_back(
        {"Semi-infinite medium with surface mass transfer",
         "Carslaw & Jaeger, Conduction of Heat in Solids, 2nd ed. (1959), sec. 2.7 (section number from memory)",
         "largest |C - C_exact| / Cs at three points and t = 0.25, 1, 4 s", 5e-5, [](const std::string &dir) {
           const Run run =
             run_text(dir, "transfer",
                      "[geometry]\nlayers = m 25 m\ncell_size = 0.05 m\n[region.m]\ndiffusivity = 1 m2/s\n"
                      "[boundary.top]\ntype = transfer\ncoefficient = 1 m/s\nambient = 1 mol/m3\n"
                      "[time]\nend = 4 s\ntolerance = 1e-6\n[output]\nfields = false\n"
                      "times = 0.25 s, 1 s\npoint.a = 0 m\npoint.b = 0.5 m\npoint.c = 2 m\n");
           double worst = 0;
           for (const double t : {0.25, 1.0, 4.0})
             for (const auto &[p, x] :
                  {std::pair<const char *, double>{"point.a", 0.0}, {"point.b", 0.5}, {"point.c", 2.0}})
               {
                 const double eta = x / (2 * std::sqrt(t));
                 const double exact = boost::math::erfc(eta) - std::exp(x + t) * boost::math::erfc(eta + std::sqrt(t));
                 worst = std::max(worst, std::abs(run.at(p, t) - exact));
               }
           return worst;
         }});
      list.push_back({"Instantaneous plane source: spread",
                      "Crank (1975) sec. 2.2; mean-square displacement 2 D t (common practice)",
                      "relative error of the variance growth at t = 1.75 s", 1e-5, [](const std::string &dir) {
                        const Run run =
                          run_text(dir, "plane_source",
                                   "[geometry]\nlayers = m 20 m\ncell_size = 0.05 m\n[region.m]\ndiffusivity = 1 m2/s\n"
                                   "[initial]\nvalue = {exp(-(x-10)^2)/sqrt(pi)} mol/m3\n[time]\nend = 1.75 s\n"
                                   "tolerance = 1e-6\n[output]\nfields = false\nmoments = true\n");
                        const auto &m = run.record.moments;
                        return std::abs((m.back().variance - m.front().variance) / (2 * 1.75) - 1);
                      }});
      list.push_back({"Plane sheet releasing through both faces: released fraction", "Crank (1975) eq. 4.18, p. 48",
                      "largest |F - F_exact| at ten times", 6e-5, [](const std::string &dir) {
                        // Half of a sheet of thickness l = 2 m (centre plane sealed), D = 1 m2/s.
                        const std::vector<double> times{0.01, 0.02, 0.05, 0.1, 0.2, 0.3, 0.5, 0.7, 1.0, 1.5};
                        const Run run =
                          run_text(dir, "sheet",
                                   "[geometry]\nlayers = sheet 1 m\ncell_size = 0.01 m\n[region.sheet]\ndiffusivity = "
                                   "1 m2/s\n[initial]\nvalue = 1 mol/m3\n[boundary.top]\ntype = concentration\n"
                                   "value = 0 mol/m3\n[time]\nend = 1.5 s\ntolerance = 1e-6\n[output]\nfields = "
                                   "false\ntimes = " +
                                     list_of(times) + "\n");
                        double worst = 0;
                        for (const double t : times)
                          worst = std::max(worst, std::abs(run.at("released_fraction", t) - sheet_fraction(t)));
                        return worst;
                      }});
      list.push_back(
        {"Plane sheet: half-time of release",
         "Crank (1975) ch. 4: D t_half / l^2 = 0.04918 for a sheet of thickness l (exact root of eq. 4.18)",
         "relative error of D t_half / l^2 from the release event", 2e-5, [](const std::string &dir) {
           const Run run = run_text(dir, "half_time",
                                    "[geometry]\nlayers = sheet 1 m\ncell_size = 0.01 m\n[region.sheet]\ndiffusivity = "
                                    "1 m2/s\n[initial]\nvalue = 1 mol/m3\n[boundary.top]\ntype = concentration\n"
                                    "value = 0 mol/m3\n[time]\nend = 0.5 s\ntolerance = 1e-6\n[output]\nfields = "
                                    "false\nrelease.half = 50 %\n");
           boost::uintmax_t iterations = 100;
           const auto root =
             boost::math::tools::toms748_solve([](double T) { return sheet_fraction(T) - 0.5; }, 0.1, 0.3,
                                               boost::math::tools::eps_tolerance<double>(50), iterations);
           const double exact = 0.5 * (root.first + root.second) / 4; // D t / l^2 with l = 2 L
           return std::abs(run.record.releases.at(0).time / 4 / exact - 1);
         }});
      list.push_back(
        {"Membrane permeation: time lag", "Crank (1975) ch. 4, eqs 4.24a-c (Daynes 1920, Barrer 1939): l^2 / (6 D)",
         "relative error of the time lag", 1e-10, [](const std::string &dir) {
           const Run run = run_text(dir, "time_lag",
                                    "[geometry]\nlayers = membrane 100 um\ncell_size = 2 um\n[region.membrane]\n"
                                    "diffusivity = 1e-11 m2/s\npartition = 2\n[boundary.top]\ntype = concentration\n"
                                    "ambient = 5 mol/m3\n[boundary.bottom]\ntype = concentration\nambient = 0 mol/m3\n"
                                    "[time]\nend = 3000 s\ntolerance = 1e-6\n[output]\nfields = false\n"
                                    "time_lag.out = bottom\n");
           return std::abs(run.record.time_lags.at(0).time_lag / (1e-8 / 6e-11) - 1);
         }});
      list.push_back(
        {"Two layers with a partition jump at steady state",
         "series resistances R = l / (D K) (common practice; Crank 1975 ch. 4, composite membranes)",
         "largest relative error of flux and both interface concentrations", 5e-12, [](const std::string &dir) {
           const Run run = run_text(dir, "partition",
                                    "[geometry]\nlayers = a 1 m, b 2 m\ncell_size = 0.1 m\n[region.a]\ndiffusivity = 1 "
                                    "m2/s\n[region.b]\ndiffusivity = 0.25 m2/s\npartition = 3\n[boundary.top]\ntype = "
                                    "concentration\nambient = 1 mol/m3\n[boundary.bottom]\ntype = concentration\n"
                                    "ambient = 0 mol/m3\n[time]\nend = 2000 s\n[output]\nfields = false\n"
                                    "point.left = 1 m in a\npoint.right = 1 m in b\n");
           const auto &flux = run.column("flux_in.top");
           return std::max({std::abs(flux.back() / (3.0 / 11) - 1),
                            std::abs(run.record.points[0].final_value / (8.0 / 11) - 1),
                            std::abs(run.record.points[1].final_value / (24.0 / 11) - 1)});
         }});
      list.push_back({"Sphere releasing into a perfect sink", "Crank (1975) eq. 6.20, p. 91",
                      "largest |F - F_exact| at five times", 4e-5, [](const std::string &dir) {
                        const std::vector<double> times{0.01, 0.02, 0.05, 0.1, 0.2};
                        const Run run =
                          run_text(dir, "sphere",
                                   "[case]\ncoordinates = sphere\n[geometry]\nlayers = s 1 m\ncell_size = 0.01 m\n"
                                   "[region.s]\ndiffusivity = 1 m2/s\n[initial]\nvalue = 1 mol/m3\n[boundary.outer]\n"
                                   "type = concentration\nvalue = 0 mol/m3\n[time]\nend = 0.2 s\ntolerance = 1e-6\n"
                                   "[output]\nfields = false\ntimes = " +
                                     list_of(times) + "\n");
                        double worst = 0;
                        for (const double t : times)
                          {
                            double sum = 0;
                            for (int n = 1; n < 3000; ++n)
                              sum += std::exp(-n * n * pi * pi * t) / (n * n);
                            worst =
                              std::max(worst, std::abs(run.at("released_fraction", t) - (1 - 6 / (pi * pi) * sum)));
                          }
                        return worst;
                      }});
      list.push_back({"Infinite cylinder releasing into a perfect sink",
                      "Crank (1975) eq. 5.52 (number from memory); Bessel zeros from Boost.Math",
                      "largest |F - F_exact| at five times", 4e-5, [](const std::string &dir) {
                        const std::vector<double> times{0.01, 0.02, 0.05, 0.1, 0.2};
                        const Run run =
                          run_text(dir, "cylinder",
                                   "[case]\ncoordinates = cylinder\n[geometry]\nlayers = c 1 m\ncell_size = 0.01 m\n"
                                   "[region.c]\ndiffusivity = 1 m2/s\n[initial]\nvalue = 1 mol/m3\n[boundary.outer]\n"
                                   "type = concentration\nvalue = 0 mol/m3\n[time]\nend = 0.2 s\ntolerance = 1e-6\n"
                                   "[output]\nfields = false\ntimes = " +
                                     list_of(times) + "\n");
                        double worst = 0;
                        for (const double t : times)
                          {
                            double sum = 0;
                            for (int n = 1; n <= 400; ++n)
                              {
                                const double a = boost::math::cyl_bessel_j_zero(0.0, n);
                                sum += 4 * std::exp(-a * a * t) / (a * a);
                              }
                            worst = std::max(worst, std::abs(run.at("released_fraction", t) - (1 - sum)));
                          }
                        return worst;
                      }});
      list.push_back(
        {"Sorbing, decaying solute entering a semi-infinite porous medium",
         "Crank (1975) ch. 14 (first-order reaction); van Genuchten & Alves, USDA Tech. Bull. 1661 (1982), "
         "zero velocity",
         "largest |c - c_exact| / c0 at three points, 10 and 100 yr", 4e-5, [](const std::string &dir) {
           const Run run =
             run_text(dir, "sorption",
                      "[geometry]\nlayers = clay 8 m\ncell_size = 1 cm\ngrade_toward = top\ngrading = 1.02\n"
                      "[region.clay]\ndiffusivity = 5e-10 m2/s\nporosity = 0.4\nbulk_density = 1.6 g/cm3\n"
                      "distribution_coefficient = 0.5 mL/g\nhalf_life = 10 yr\n[boundary.top]\ntype = concentration\n"
                      "value = 1 mg/L\n[time]\nend = 100 yr\ntolerance = 1e-6\n[output]\nfields = false\n"
                      "times = 10 yr\npoint.a = 0.3 m\npoint.b = 0.6 m\npoint.c = 0.9 m\n");
           const double year = 365.25 * 86400, d = 5e-10 / 3, k = std::log(2.0) / (10 * year);
           double worst = 0;
           for (const double years : {10.0, 100.0})
             for (const auto &[p, x] :
                  {std::pair<const char *, double>{"point.a", 0.3}, {"point.b", 0.6}, {"point.c", 0.9}})
               {
                 const double t = years * year, eta = x / (2 * std::sqrt(d * t)), root = std::sqrt(k * t),
                              m = std::sqrt(k / d);
                 const double exact = 0.5 * std::exp(-x * m) * boost::math::erfc(eta - root) +
                                      0.5 * std::exp(x * m) * boost::math::erfc(eta + root);
                 worst = std::max(worst, std::abs(run.at(p, t) / 1e-3 - exact));
               }
           return worst;
         }});
      list.push_back({"Plane sheet releasing into a finite well-stirred bath",
                      "Crank (1975) eq. 4.37 (number from memory); roots by Boost.Math TOMS 748",
                      "largest |F - F_exact| at T = 0.05, 0.2, 1 (alpha = 1)", 5e-5, [](const std::string &dir) {
                        const Run run =
                          run_text(dir, "bath",
                                   "[geometry]\nlayers = sheet 1 m\ncell_size = 0.02 m\n[region.sheet]\ndiffusivity = "
                                   "1 m2/s\n[initial]\nvalue = 1 mol/m3\n[boundary.top]\ntype = bath\nvolume = 1 m\n"
                                   "[time]\nend = 1 s\ntolerance = 1e-6\n[output]\nfields = false\n"
                                   "times = 0.05 s, 0.2 s\n");
                        double worst = 0;
                        for (const double T : {0.05, 0.2, 1.0})
                          {
                            double sum = 0;
                            for (int n = 1; n <= 200; ++n)
                              {
                                boost::uintmax_t iterations = 200;
                                const auto root = boost::math::tools::toms748_solve(
                                  [](double q) { return std::sin(q) + q * std::cos(q); }, (n - 0.5) * pi, n * pi,
                                  boost::math::tools::eps_tolerance<double>(50), iterations);
                                const double q = 0.5 * (root.first + root.second);
                                sum += 4 * std::exp(-q * q * T) / (2 + q * q);
                              }
                            worst = std::max(worst, std::abs(run.at("bath.top", T) / 0.5 - (1 - sum)));
                          }
                        return worst;
                      }});
      list.push_back(
        {"Breakthrough through a slab on an impermeable base",
         "Crank (1975) eq. 4.17 (sheet profile at its centre plane); time found with Boost.Math TOMS 748",
         "relative error of the time the base reaches 10 % of the surface value", 1.5e-4, [](const std::string &dir) {
           const Run run = run_text(dir, "breakthrough",
                                    "[geometry]\nlayers = slab 1 m\ncell_size = 0.01 m\n[region.slab]\ndiffusivity = "
                                    "1e-9 m2/s\n[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n[time]\n"
                                    "end = 1e9 s\ntolerance = 1e-6\n[output]\nfields = false\npoint.base = 1 m\n"
                                    "threshold.base = 0.1 mol/m3\n");
           // c(L, t) / c0 = 1 - (4/pi) sum (-1)^n / (2n+1) exp(-(2n+1)^2 pi^2 T / 4), T = D t / L^2.
           auto base = [](double T) {
             double sum = 0;
             for (int n = 0; n < 2000; ++n)
               sum += (n % 2 ? -1.0 : 1.0) / (2 * n + 1) * std::exp(-(2 * n + 1) * (2 * n + 1) * pi * pi * T / 4);
             return 1 - 4 / pi * sum;
           };
           boost::uintmax_t iterations = 100;
           const auto root =
             boost::math::tools::toms748_solve([&](double T) { return base(T) - 0.1; }, 0.01, 1.0,
                                               boost::math::tools::eps_tolerance<double>(50), iterations);
           const double exact = 0.5 * (root.first + root.second) / 1e-9;
           return std::abs(run.record.points.at(0).threshold_time / exact - 1);
         }});
      list.push_back({"Junction depth of an erfc profile",
                      "Jaeger, Introduction to Microelectronic Fabrication, 2nd ed. (2002), ch. 4: x_j = 2 sqrt(D t) "
                      "erfcinv(Nb / Ns) (erfcinv from Boost.Math)",
                      "relative error of the depth where N falls to 1e-4 Ns", 1e-3, [](const std::string &dir) {
                        const Run run =
                          run_text(dir, "junction",
                                   "[geometry]\nlayers = si 3 um\ncell_size = 5 nm\n[region.si]\ndiffusivity = "
                                   "1e-17 m2/s\n[boundary.top]\ntype = concentration\nvalue = 1e20 1/cm3\n[time]\n"
                                   "end = 1 h\ntolerance = 1e-6\n[output]\nfields = false\n"
                                   "depth.junction = 1e16 1/cm3\n");
                        const double exact = 2 * std::sqrt(1e-17 * 3600) * boost::math::erfc_inv(1e-4);
                        return std::abs(run.record.depths.at(0).depths.back() / exact - 1);
                      }});
      list.push_back(
        {"Temperature schedule against constant diffusivity at the same integral of D dt",
         "exact change of time variable (the thermal budget, common practice); integral by Boost.Math "
         "Gauss-Kronrod",
         "largest relative difference of three points", 3e-9, [](const std::string &dir) {
           const std::string common = "[geometry]\nlayers = si 2 um\ncell_size = 10 nm\n[boundary.top]\ntype = "
                                      "concentration\nvalue = 1e20 1/cm3\n[output]\nfields = false\npoint.a = 50 nm\n"
                                      "point.b = 150 nm\npoint.c = 300 nm\n";
           const Run ramp = run_text(dir, "schedule",
                                     common + "[region.si]\ndiffusivity_prefactor = 0.76 cm2/s\nactivation_energy = "
                                              "3.46 eV\n[temperature]\nschedule = 900 degC, ramp 10 degC/min to 1100 "
                                              "degC, hold 20 min\n[time]\nend = 40 min\ntolerance = 1e-7\n");
           const double k = 8.617333262e-5; // eV/K
           auto d = [&](double t) {
             const double kelvin = t < 1200 ? 1173.15 + 200 * t / 1200 : 1373.15;
             return 0.76e-4 * std::exp(-3.46 / (k * kelvin));
           };
           using boost::math::quadrature::gauss_kronrod;
           const double budget = gauss_kronrod<double, 61>::integrate(d, 0, 1200, 15, 1e-14) +
                                 gauss_kronrod<double, 61>::integrate(d, 1200, 2400, 15, 1e-14);
           char text[256];
           std::snprintf(text, sizeof(text),
                         "[region.si]\ndiffusivity = %.17g m2/s\n[time]\nend = %.17g s\n"
                         "tolerance = 1e-7\n",
                         d(2400), budget / d(2400));
           const Run constant = run_text(dir, "constant", common + text);
           double worst = 0;
           for (std::size_t i = 0; i < 3; ++i)
             worst =
               std::max(worst, std::abs(ramp.record.points[i].final_value / constant.record.points[i].final_value - 1));
           return worst;
         }});
      return list;
    }
  } // namespace

  std::vector<CheckResult> run_verification(const std::string &scratch,
                                            const std::function<void(const CheckResult &)> &on_result)
  {
    std::vector<CheckResult> results;
    for (const Check &check : checks())
      {
        CheckResult result;
        result.name = check.name;
        result.source = check.source;
        result.measure = check.measure;
        result.tolerance = check.tolerance;
        const auto start = std::chrono::steady_clock::now();
        try
          {
            result.error = check.error(scratch);
            result.passed = std::isfinite(result.error) && result.error <= check.tolerance;
          }
        catch (const Interrupted &)
          {
            throw; // not a failed check: nothing is written
          }
        catch (const std::exception &error)
          {
            result.error = std::nan("");
            result.passed = false;
            result.note = error.what();
          }
        result.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        if (on_result)
          on_result(result);
        results.push_back(result);
      }
    return results;
  }
} // namespace fickcast
