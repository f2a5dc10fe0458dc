#include "run/flow_report.h"

#include "run/guards.h"

namespace fickcast
{
  template <int dim>
  double note_flow(const DiffusionProblem<dim> &problem, RunRecord &record)
  {
    const FlowNumbers flow = problem.flow_numbers();
    record.cell_peclet = flow.peclet;
    record.cell_peclet_region = flow.peclet_region;
    for (const std::string &warning : flow_warnings(problem.flow_warning(), flow.peclet, flow.peclet_region))
      record.warnings.insert(record.warnings.begin(), warning);
    return flow.crossing_rate;
  }

  template <int dim>
  std::vector<double> flow_parts(const DiffusionProblem<dim> &problem, const typename DiffusionProblem<dim>::Vector &u,
                                 const std::vector<double> &rates, const std::vector<bool> &active)
  {
    const std::vector<double> advective = problem.advective_inflow(u);
    std::vector<double> parts;
    for (std::size_t b = 0; b < active.size(); ++b)
      if (active[b])
        {
          parts.push_back(advective[b]);
          parts.push_back(rates[b] - advective[b]);
        }
    return parts;
  }

  template double note_flow<1>(const DiffusionProblem<1> &, RunRecord &);
  template double note_flow<2>(const DiffusionProblem<2> &, RunRecord &);
  template double note_flow<3>(const DiffusionProblem<3> &, RunRecord &);
  template std::vector<double> flow_parts<1>(const DiffusionProblem<1> &, const DiffusionProblem<1>::Vector &,
                                             const std::vector<double> &, const std::vector<bool> &);
  template std::vector<double> flow_parts<2>(const DiffusionProblem<2> &, const DiffusionProblem<2>::Vector &,
                                             const std::vector<double> &, const std::vector<bool> &);
  template std::vector<double> flow_parts<3>(const DiffusionProblem<3> &, const DiffusionProblem<3>::Vector &,
                                             const std::vector<double> &, const std::vector<bool> &);
} // namespace fickcast
