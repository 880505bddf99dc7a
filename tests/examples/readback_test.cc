// A run folder opens in VTK's own readers: the PVD series lists the output times
// in days, every VTU holds every field, and the values are those of the CSV files.
#include "example_support.h"

#include "../test_support.h"

#include <gtest/gtest.h>
#include <vtkCellData.h>
#include <vtkDataArray.h>
#include <vtkFieldData.h>
#include <vtkPointData.h>
#include <vtkSmartPointer.h>
#include <vtkStringArray.h>
#include <vtkUnstructuredGrid.h>
#include <vtkXMLUnstructuredGridReader.h>

#include <fstream>

using namespace example_support;

TEST(RunFolder, SeriesOpensInVtkWithEveryFieldAndTimesInDays) {
  const auto run = run_example("basement-pit", "readback", [](toml::table& s) {
    coarsen_section(s, 1.5, 30.0, 1.5);
  });
  ASSERT_TRUE(std::filesystem::exists(run.folder / "fields" / "fields.pvd"))
      << "no PVD series written";
  const auto series = test_support::read_pvd(run.folder / "fields" / "fields.pvd");
  // t = 0, 4 log-spaced times and the end of each of the two stages, and the four
  // extra times of the example (7, 30, 120, 200 days).
  ASSERT_EQ(series.size(), 1u + 2 * 5 + 4);
  EXPECT_EQ(series.front().first, 0.0);
  EXPECT_NEAR(series.back().first, 365.0, 1e-9);
  bool has_60 = false;
  for (std::size_t i = 1; i < series.size(); ++i) {
    EXPECT_GT(series[i].first, series[i - 1].first);
    has_60 = has_60 || std::abs(series[i].first - 60.0) < 1e-9;
  }
  EXPECT_TRUE(has_60) << "the end of the first stage (day 60) is written";

  auto reader = vtkSmartPointer<vtkXMLUnstructuredGridReader>::New();
  reader->SetFileName((run.folder / "fields" / series.back().second).c_str());
  reader->Update();
  vtkUnstructuredGrid* grid = reader->GetOutput();
  ASSERT_GT(grid->GetNumberOfCells(), 0);
  const std::vector<std::pair<const char*, int>> fields{
      {"displacement", 3},
      {"settlement", 1},
      {"excess_pore_pressure", 1},
      {"pore_pressure", 1},
      {"hydraulic_head", 1},
      {"drawdown", 1},
      {"effective_stress", 9},
      {"effective_stress_out_of_plane", 1},
      {"mean_effective_stress", 1},
      {"deviator_stress", 1},
      {"vertical_effective_stress", 1},
      {"volumetric_strain", 1},
      {"darcy_flux", 3}};
  for (const auto& [name, components] : fields) {
    vtkDataArray* array = grid->GetPointData()->GetArray(name);
    ASSERT_NE(array, nullptr) << name;
    EXPECT_EQ(array->GetNumberOfComponents(), components) << name;
  }
  // Each cell's region id and name are cell data, the names and every point
  // field's unit field data.
  for (const char* name : {"region", "process"})
    EXPECT_NE(grid->GetCellData()->GetArray(name), nullptr) << name;
  auto* names =
      vtkStringArray::SafeDownCast(grid->GetCellData()->GetAbstractArray("region_name"));
  ASSERT_NE(names, nullptr);
  EXPECT_EQ(names->GetNumberOfValues(), grid->GetNumberOfCells());
  auto* units =
      vtkStringArray::SafeDownCast(grid->GetFieldData()->GetAbstractArray("units"));
  ASSERT_NE(units, nullptr);
  for (const auto& [name, components] : fields) {
    bool found = false;
    for (vtkIdType i = 0; i < units->GetNumberOfValues(); ++i)
      found = found || units->GetValue(i).rfind(std::string(name) + ": ", 0) == 0;
    EXPECT_TRUE(found) << "no unit for " << name;
  }
  // The largest drawdown in the field equals the one the run summary reports.
  double range[2];
  grid->GetPointData()->GetArray("drawdown")->GetRange(range);
  EXPECT_NEAR(range[1], run.summary.drawdown_anywhere,
              0.01 * run.summary.drawdown_anywhere);
  // Geostatic stress is in the output: at depth the vertical effective stress is
  // far above the few kPa a change alone would give.
  grid->GetPointData()->GetArray("vertical_effective_stress")->GetRange(range);
  EXPECT_GT(range[1], 200.0);
}
