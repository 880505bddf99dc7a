"""Open a Settlewell run in ParaView with a section view of the drawdown.

    pvpython postprocess/paraview_section.py RUN_DIR [FIELD] [--png OUT.png]
    (or in ParaView: View > Python Shell > Run Script, after setting RUN_DIR)

Loads RUN_DIR/fields/fields.pvd (times in days), colours the section by FIELD
(default: drawdown; others: settlement, hydraulic_head, excess_pore_pressure,
vertical_effective_stress, ...), adds contour lines, looks at the x-y plane and
jumps to the last time. With --png it saves a screenshot and exits.

Written for ParaView's paraview.simple module (5.9 or later); not run by the test
suite, which has no ParaView.
"""

import os
import sys

from paraview.simple import (  # noqa: F401  (ParaView's own module)
    ColorBy, Contour, GetActiveViewOrCreate, GetAnimationScene, GetColorTransferFunction,
    PVDReader, Render, ResetCamera, SaveScreenshot, Show)


def main(argv):
    png = None
    if "--png" in argv:
        png = argv[argv.index("--png") + 1]
        argv = argv[:argv.index("--png")]
    run = argv[1] if len(argv) > 1 else os.environ.get("RUN_DIR", ".")
    field = argv[2] if len(argv) > 2 else "drawdown"
    series = PVDReader(FileName=os.path.join(run, "fields", "fields.pvd"))
    view = GetActiveViewOrCreate("RenderView")
    view.InteractionMode = "2D"
    display = Show(series, view)
    ColorBy(display, ("POINTS", field))
    display.SetScalarBarVisibility(view, True)
    lut = GetColorTransferFunction(field)
    lut.ApplyPreset("Viridis (matplotlib)", True)
    lines = Contour(Input=series, ContourBy=["POINTS", field], Isosurfaces=[0.5 * i for i in range(1, 40)])
    line_display = Show(lines, view)
    line_display.DiffuseColor = [0.1, 0.1, 0.1]
    ColorBy(line_display, None)
    scene = GetAnimationScene()
    scene.UpdateAnimationUsingDataTimeSteps()
    scene.AnimationTime = series.TimestepValues[-1] if series.TimestepValues else 0.0
    view.CameraPosition = [0, 0, 1]
    view.CameraViewUp = [0, 1, 0]
    ResetCamera(view)
    Render(view)
    if png:
        SaveScreenshot(png, view, ImageResolution=[1600, 700])


if __name__ == "__main__":
    main(sys.argv)
