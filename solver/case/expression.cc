#include "case/expression.h"

#include <muParser.h>

#include <algorithm>
#include <cmath>

namespace fickcast
{
  namespace
  {
    double erf_function(double x)
    {
      return std::erf(x);
    }
    double erfc_function(double x)
    {
      return std::erfc(x);
    }
    double pow_function(double x, double y)
    {
      return std::pow(x, y);
    }
    double floor_function(double x)
    {
      return std::floor(x);
    }
    double ceil_function(double x)
    {
      return std::ceil(x);
    }
  } // namespace

  Expression::Expression(const std::string &text, const std::vector<std::string> &variables)
    : text_(text)
    , variables_(variables)
  {
    compile();
  }

  Expression::Expression(const Expression &other)
    : text_(other.text_)
    , variables_(other.variables_)
  {
    compile();
  }

  Expression &Expression::operator=(const Expression &other)
  {
    if (this != &other)
      {
        text_ = other.text_;
        variables_ = other.variables_;
        compile();
      }
    return *this;
  }

  Expression::~Expression() = default;

  void Expression::compile()
  {
    storage_ = std::make_unique<double[]>(std::max<std::size_t>(1, variables_.size()));
    parser_ = std::make_unique<mu::Parser>();
    used_.clear();
    try
      {
        parser_->DefineConst("pi", M_PI);
        parser_->DefineConst("e", M_E);
        // Unit constants in SI (exact by definition; yr is the Julian year of 365.25 d).
        parser_->DefineConst("s", 1.0);
        parser_->DefineConst("h", 3600.0);
        parser_->DefineConst("d", 86400.0);
        parser_->DefineConst("yr", 365.25 * 86400.0);
        parser_->DefineConst("m", 1.0);
        parser_->DefineConst("cm", 1e-2);
        parser_->DefineConst("mm", 1e-3);
        parser_->DefineConst("um", 1e-6);
        parser_->DefineConst("nm", 1e-9);
        parser_->DefineFun("erf", erf_function);
        parser_->DefineFun("erfc", erfc_function);
        parser_->DefineFun("pow", pow_function);
        parser_->DefineFun("floor", floor_function);
        parser_->DefineFun("ceil", ceil_function);
        for (std::size_t i = 0; i < variables_.size(); ++i)
          parser_->DefineVar(variables_[i], &storage_[i]);
        parser_->SetExpr(text_);
        // GetUsedVar parses the expression and reports unknown names as errors.
        for (const auto &[name, address] : parser_->GetUsedVar())
          {
            (void)address;
            used_.push_back(name);
          }
        parser_->Eval();
      }
    catch (const mu::Parser::exception_type &error)
      {
        std::string allowed;
        for (const auto &name : variables_)
          allowed += (allowed.empty() ? "" : ", ") + name;
        throw ExpressionError("cannot read the expression '" + text_ + "': " + error.GetMsg() +
                              " (variables allowed here: " + (allowed.empty() ? "none" : allowed) + ")");
      }
  }

  double Expression::operator()(const std::vector<double> &values) const
  {
    return evaluate(values.data(), values.size());
  }

  double Expression::evaluate(const double *values, const std::size_t count) const
  {
    const std::size_t n = std::min(count, variables_.size());
    std::copy(values, values + n, storage_.get());
    return parser_->Eval();
  }

  bool Expression::uses(const std::string &name) const
  {
    return std::find(used_.begin(), used_.end(), name) != used_.end();
  }
} // namespace fickcast
