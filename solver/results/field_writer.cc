#include "results/field_writer.h"

#include "case/input_error.h"

#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <cerrno>
#include <cstring>
#include <fstream>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    /// Phase concentration, amount per volume and flux from u and grad u, per cell region.
    template <int dim>
    class PhaseFields : public DataPostprocessor<dim>
    {
    public:
      PhaseFields(const FieldView<dim> &field, const double time)
        : field_(field)
        , time_(time)
      {
      }

      void evaluate_scalar_field(const DataPostprocessorInputs::Scalar<dim> &inputs,
                                 std::vector<dealii::Vector<double>> &computed) const override
      {
        const auto cell = inputs.template get_cell<dim>();
        const auto region = cell->material_id();
        const double k = field_.partition(region);
        const double c = field_.capacity(region);
        for (unsigned int q = 0; q < inputs.solution_values.size(); ++q)
          {
            const double u = inputs.solution_values[q];
            computed[q](0) = k * u;
            computed[q](1) = c * u;
            const double g = field_.conductance(region, inputs.evaluation_points[q], time_, k * u);
            for (int d = 0; d < dim; ++d)
              computed[q](2 + d) = -g * inputs.solution_gradients[q][d];
          }
      }

      std::vector<std::string> get_names() const override
      {
        std::vector<std::string> names{"concentration", "amount_per_volume"};
        for (int d = 0; d < dim; ++d)
          names.emplace_back("flux");
        return names;
      }

      std::vector<DataComponentInterpretation::DataComponentInterpretation>
      get_data_component_interpretation() const override
      {
        std::vector<DataComponentInterpretation::DataComponentInterpretation> kinds(
          2, DataComponentInterpretation::component_is_scalar);
        for (int d = 0; d < dim; ++d)
          kinds.push_back(DataComponentInterpretation::component_is_part_of_vector);
        return kinds;
      }

      UpdateFlags get_needed_update_flags() const override
      {
        return update_values | update_gradients | update_quadrature_points;
      }

    private:
      const FieldView<dim> &field_;
      double time_;
    };
  } // namespace

  template <int dim>
  FieldWriter<dim>::FieldWriter(const FieldView<dim> &field, const std::string &folder)
    : field_(field)
    , folder_(folder)
  {
  }

  template <int dim>
  void FieldWriter<dim>::write(const Vector &u, const double t)
  {
    const PhaseFields<dim> phase(field_, t);
    DataOut<dim> data_out;
    data_out.attach_dof_handler(*field_.dof_handler);
    data_out.add_data_vector(u, phase);
    data_out.add_data_vector(u, "reference_concentration");

    const auto &triangulation = field_.triangulation();
    dealii::Vector<float> region(triangulation.n_active_cells());
    dealii::Vector<float> diffusivity(triangulation.n_active_cells());
    for (const auto &cell : triangulation.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          region(cell->active_cell_index()) = static_cast<float>(cell->material_id());
          diffusivity(cell->active_cell_index()) =
            static_cast<float>(field_.effective_diffusivity(cell->material_id(), cell->center(), t));
        }
    field_.check_coefficients();
    data_out.add_data_vector(region, "region", DataOut<dim>::type_cell_data);
    data_out.add_data_vector(diffusivity, "effective_diffusivity", DataOut<dim>::type_cell_data);
    data_out.build_patches(*field_.mapping, field_.degree());

    DataOutBase::VtkFlags flags;
    flags.time = t;
    flags.cycle = static_cast<unsigned int>(records_.size());
    flags.compression_level = DataOutBase::VtkFlags::best_speed;
    data_out.set_flags(flags);

    const unsigned int index = static_cast<unsigned int>(records_.size());
    const MPI_Comm communicator = field_.communicator;
    std::string name;
    // deal.II reports a failed write (a full disk, a folder that is not writable) as an
    // exception of its own with a long text: here it becomes one IoError naming the file.
    const auto cannot_write = [&](const std::string &file) {
      const int code = errno;
      return IoError("cannot write " + file + ": " +
                     (code != 0 ? std::string(std::strerror(code)) : std::string("the write failed")) +
                     " (a full disk or a folder that is not writable)");
    };
    if (Utilities::MPI::n_mpi_processes(communicator) == 1)
      {
        name = "fields_" + Utilities::int_to_string(index, 4) + ".vtu";
        const std::string file = folder_ + "/" + name;
        errno = 0;
        std::ofstream out(file);
        if (!out)
          throw cannot_write(file);
        try
          {
            data_out.write_vtu(out);
            out.flush();
          }
        catch (const ExceptionBase &)
          {
            throw cannot_write(file);
          }
        if (!out)
          throw cannot_write(file);
      }
    else
      try
        {
          errno = 0;
          name = data_out.write_vtu_with_pvtu_record(folder_ + "/", "fields", index, communicator, 4);
        }
      catch (const ExceptionBase &)
        {
          throw cannot_write(folder_ + "/fields_" + Utilities::int_to_string(index, 4) + ".pvtu");
        }
    records_.emplace_back(t, name);
  }

  template <int dim>
  void FieldWriter<dim>::finish() const
  {
    if (Utilities::MPI::this_mpi_process(field_.communicator) != 0)
      return;
    std::ofstream out(folder_ + "/fields.pvd");
    if (!out)
      throw IoError("cannot write " + folder_ + "/fields.pvd");
    try
      {
        DataOutBase::write_pvd_record(out, records_);
        out.flush();
      }
    catch (const ExceptionBase &)
      {
        throw IoError("cannot write " + folder_ + "/fields.pvd (a full disk or a folder that is not writable)");
      }
    if (!out)
      throw IoError("cannot write " + folder_ + "/fields.pvd (a full disk or a folder that is not writable)");
  }

  template class FieldWriter<1>;
  template class FieldWriter<2>;
  template class FieldWriter<3>;
} // namespace fickcast
