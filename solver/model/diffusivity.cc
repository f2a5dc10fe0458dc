#include "model/diffusivity.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  Diffusivity::Diffusivity(const RegionSpec &region, const TemperatureSchedule &temperature)
    : temperature_(temperature)
  {
    if (region.arrhenius)
      {
        arrhenius_ = true;
        prefactor_ = region.prefactor;
        activation_energy_ = region.activation_energy;
        constant_ = temperature.empty() || temperature.temperatures.size() == 1 ||
                    std::all_of(temperature.temperatures.begin(), temperature.temperatures.end(),
                                [&](double t) { return t == temperature.temperatures.front(); });
        time_ = !constant_;
        value_ =
          constant_ && !temperature.empty()
            ? prefactor_ * std::exp(-activation_energy_ / (boltzmann_constant * temperature.temperatures.front()))
            : 0.0;
        return;
      }
    const ScalarField &field = region.diffusivity;
    value_ = field.value;
    if (!field.table.empty())
      {
        table_ = field.table;
        constant_ = false;
        time_ = true;
        return;
      }
    if (field.expression.empty())
      return;
    expression_ =
      std::make_shared<Expression>(field.expression, std::vector<std::string>{"x", "y", "z", "t", "T", "c"});
    scale_ = field.scale;
    offset_ = field.offset;
    space_ = expression_->uses("x") || expression_->uses("y") || expression_->uses("z");
    time_ = expression_->uses("t") || (expression_->uses("T") && temperature.temperatures.size() > 1);
    concentration_ = expression_->uses("c");
    constant_ = !space_ && !time_ && !concentration_;
    if (constant_)
      value_ = (*this)(0, 0, 0, 0, 0);
  }

  double Diffusivity::operator()(const double x, const double y, const double z, const double t, const double c) const
  {
    if (arrhenius_)
      return prefactor_ * std::exp(-activation_energy_ / (boltzmann_constant * temperature_.at(t)));
    if (!table_.empty())
      return table_.at(t);
    if (!expression_)
      return value_;
    const double values[6] = {x, y, z, t, temperature_.empty() ? 0.0 : temperature_.at(t), c};
    return scale_ * expression_->evaluate(values, 6) + offset_;
  }

  double Diffusivity::derivative(const double x, const double y, const double z, const double t, const double c) const
  {
    if (!concentration_)
      return 0;
    const double h = 1e-6 * std::max(std::abs(c), 1e-6);
    return ((*this)(x, y, z, t, c + h) - (*this)(x, y, z, t, c - h)) / (2 * h);
  }
} // namespace fickcast
