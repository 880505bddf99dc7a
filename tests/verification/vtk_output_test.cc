// Writes a case's fields and reads them back with VTK's own readers: the series
// must list the report times in days and every field must be present.
#include "settlewell/verification/cases.h"

#include "../test_support.h"

#include <gtest/gtest.h>
#include <vtkPointData.h>
#include <vtkSmartPointer.h>
#include <vtkUnstructuredGrid.h>
#include <vtkXMLUnstructuredGridReader.h>

#include <filesystem>
#include <fstream>

namespace v = settlewell::verification;
namespace fs = std::filesystem;

TEST(VtkOutput, MandelSeriesOpensInVtkWithEveryField) {
  const fs::path dir = fs::temp_directory_path() / "settlewell_vtk_test";
  fs::remove_all(dir);
  v::find_case("mandel").run(v::CaseSettings{dir.string()}, MPI_COMM_WORLD);

  ASSERT_TRUE(std::filesystem::exists(dir / "mandel" / "mandel.pvd"))
      << "no PVD series written";
  const auto series = test_support::read_pvd(dir / "mandel" / "mandel.pvd");
  ASSERT_GE(series.size(), 10u);
  EXPECT_EQ(series.front().first, 0.0);
  for (std::size_t i = 1; i < series.size(); ++i)
    EXPECT_GT(series[i].first, series[i - 1].first);
  // The last output is the drained state at t* = 1000: about 13,600 days here.
  EXPECT_GT(series.back().first, 1e4);
  EXPECT_LT(series.back().first, 2e4);

  auto reader = vtkSmartPointer<vtkXMLUnstructuredGridReader>::New();
  reader->SetFileName((dir / "mandel" / series[3].second).c_str());
  reader->Update();
  vtkUnstructuredGrid* grid = reader->GetOutput();
  ASSERT_GT(grid->GetNumberOfPoints(), 0);
  for (const char* field : {"displacement", "excess_pore_pressure", "settlement",
                            "hydraulic_head", "drawdown"})
    EXPECT_NE(grid->GetPointData()->GetArray(field), nullptr) << field;
  EXPECT_EQ(grid->GetPointData()->GetArray("displacement")->GetNumberOfComponents(), 3);
  double range[2];
  grid->GetPointData()->GetArray("excess_pore_pressure")->GetRange(range);
  EXPECT_GT(range[1], 10.0); // undrained pressure of the order of p0 = 18.75 kPa
  fs::remove_all(dir);
}
