#include "field_series.h"

#include "post_error.h"
#include "time_units.h"

#include <vtkCallbackCommand.h>
#include <vtkCellData.h>
#include <vtkCommand.h>
#include <vtkDataArray.h>
#include <vtkPointData.h>
#include <vtkXMLDataElement.h>
#include <vtkXMLDataParser.h>
#include <vtkXMLPUnstructuredGridReader.h>
#include <vtkXMLUnstructuredGridReader.h>

#include <algorithm>
#include <cmath>
#include <filesystem>

namespace fickcast::post
{
  namespace
  {
    /// Collects VTK error and warning messages of one object instead of printing them.
    struct VtkMessages
    {
      std::string first;
      bool failed = false;

      static void record(vtkObject *, unsigned long, void *client, void *call)
      {
        auto *self = static_cast<VtkMessages *>(client);
        self->failed = true;
        if (self->first.empty() && call != nullptr)
          self->first = static_cast<const char *>(call);
      }

      void watch(vtkObject *object)
      {
        auto callback = vtkSmartPointer<vtkCallbackCommand>::New();
        callback->SetCallback(&VtkMessages::record);
        callback->SetClientData(this);
        object->AddObserver(vtkCommand::ErrorEvent, callback);
        object->AddObserver(vtkCommand::WarningEvent, callback);
      }
    };

    bool ends_with(const std::string &text, const std::string &tail)
    {
      return text.size() >= tail.size() && text.compare(text.size() - tail.size(), tail.size(), tail) == 0;
    }

    template <typename ReaderType>
    vtkSmartPointer<vtkUnstructuredGrid> read_with(const std::string &path)
    {
      auto reader = vtkSmartPointer<ReaderType>::New();
      VtkMessages messages;
      messages.watch(reader);
      reader->SetFileName(path.c_str());
      reader->Update();
      vtkSmartPointer<vtkUnstructuredGrid> grid = reader->GetOutput();
      if (messages.failed || reader->GetErrorCode() != 0 || grid == nullptr || grid->GetNumberOfPoints() == 0)
        throw PostInputError(path, "a readable VTK XML unstructured grid with points",
                             messages.first.empty() ? std::string("none") : one_line(messages.first, 120));
      return grid;
    }
  } // namespace

  vtkSmartPointer<vtkUnstructuredGrid> read_grid(const std::string &path)
  {
    if (!std::filesystem::is_regular_file(path))
      throw PostInputError(path, "a field file listed in fields.pvd", "no such file");
    if (ends_with(path, ".pvtu"))
      return read_with<vtkXMLPUnstructuredGridReader>(path);
    return read_with<vtkXMLUnstructuredGridReader>(path);
  }

  FieldSeries::FieldSeries(const std::string &results_folder)
    : pvd_path_(results_folder + "/fields/fields.pvd")
  {
    if (!std::filesystem::is_regular_file(pvd_path_))
      throw PostInputError(pvd_path_, "the PVD index of the fields a run writes", "no such file");
    auto parser = vtkSmartPointer<vtkXMLDataParser>::New();
    VtkMessages messages;
    messages.watch(parser);
    parser->SetFileName(pvd_path_.c_str());
    if (!parser->Parse() || messages.failed)
      throw PostInputError(pvd_path_, "a well-formed PVD (XML) file",
                           messages.first.empty() ? "unparsable XML" : one_line(messages.first, 120));
    vtkXMLDataElement *root = parser->GetRootElement();
    vtkXMLDataElement *collection = root ? root->FindNestedElementWithName("Collection") : nullptr;
    if (collection == nullptr)
      throw PostInputError(pvd_path_, "a <VTKFile type=\"Collection\"> with a <Collection>", "none");
    const std::filesystem::path folder = std::filesystem::path(pvd_path_).parent_path();
    for (int i = 0; i < collection->GetNumberOfNestedElements(); ++i)
      {
        vtkXMLDataElement *item = collection->GetNestedElement(i);
        if (std::string(item->GetName()) != "DataSet")
          continue;
        const char *timestep = item->GetAttribute("timestep");
        const char *file = item->GetAttribute("file");
        double time = 0;
        if (timestep == nullptr || file == nullptr || !item->GetScalarAttribute("timestep", time))
          throw PostInputError(pvd_path_, "<DataSet timestep=\"T\" file=\"F\"> entries",
                               "one without a numeric timestep or a file");
        times_.push_back({time, (folder / file).string()});
      }
    if (times_.empty())
      throw PostInputError(pvd_path_, "at least one <DataSet> output time", "none");
  }

  std::size_t FieldSeries::find(const double seconds) const
  {
    const double scale = std::max(std::abs(times_.back().time), 1e-300);
    for (std::size_t i = 0; i < times_.size(); ++i)
      if (std::abs(times_[i].time - seconds) <= 1e-6 * scale)
        return i;
    return npos;
  }

  std::vector<std::size_t> FieldSeries::select(const std::string &spec) const
  {
    std::vector<std::size_t> indices;
    if (spec == "all")
      {
        for (std::size_t i = 0; i < times_.size(); ++i)
          indices.push_back(i);
        return indices;
      }
    if (spec == "last" || spec == "end")
      return {times_.size() - 1};
    const double seconds = parse_time(spec, "--time");
    const std::size_t index = find(seconds);
    if (index == npos)
      {
        std::string listed;
        for (std::size_t i = 0; i < times_.size() && i < 8; ++i)
          listed += (i ? ", " : "") + format_number(times_[i].time, 6);
        if (times_.size() > 8)
          listed += ", ... " + format_number(times_.back().time, 6);
        throw PostInputError(pvd_path_, "an output time (" + listed + " s), `last` or `all`",
                             format_number(seconds, 6) + " s");
      }
    return {index};
  }

  vtkSmartPointer<vtkUnstructuredGrid> FieldSeries::load(const std::size_t index) const
  {
    return read_grid(times_.at(index).file);
  }

  std::vector<std::string> field_names(vtkUnstructuredGrid *grid)
  {
    std::vector<std::string> names;
    for (vtkFieldData *data :
         {static_cast<vtkFieldData *>(grid->GetPointData()), static_cast<vtkFieldData *>(grid->GetCellData())})
      for (int a = 0; a < data->GetNumberOfArrays(); ++a)
        if (data->GetArray(a) != nullptr && data->GetArrayName(a) != nullptr)
          names.emplace_back(data->GetArrayName(a));
    return names;
  }

  void require_field(vtkUnstructuredGrid *grid, const std::string &name, const std::string &file)
  {
    const auto names = field_names(grid);
    if (std::find(names.begin(), names.end(), name) != names.end())
      return;
    std::string listed;
    for (const auto &known : names)
      listed += (listed.empty() ? "" : ", ") + known;
    throw PostInputError(file, "a field among " + listed, "'" + name + "'");
  }
} // namespace fickcast::post
