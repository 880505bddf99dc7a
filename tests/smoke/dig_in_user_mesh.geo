// An invented pit for the test of digging in a user's mesh (dig_in_user_mesh.py):
// half of a 12 m wide pit (x >= 0, the axis at x = 0) behind a 0.6 m wall down to
// -12 m, in silt (0 to -5 m) over sand, the far side 40 m from the axis. The pit's
// soil is two regions, pit_upper (silt) and pit_lower (sand, -5 to -6 m), with
// mesh lines at the two dig levels, -2.5 m and -6 m. A grid of blocks, each a
// transfinite patch of quadrilaterals:
//   gmsh -2 dig_in_user_mesh.geo -format msh41 -o dig_in_user_mesh.msh
xs[] = {0, 6, 6.6, 40};
nx[] = {8, 1, 12};
px[] = {1, 1, 1.2};
ys[] = {0, -2.5, -5, -6, -12, -20};
ny[] = {4, 4, 2, 8, 6};
NX = #xs[];
NY = #ys[];

For j In {0 : NY - 1}
  For i In {0 : NX - 1}
    Point(j * NX + i + 1) = {xs[i], ys[j], 0};
  EndFor
EndFor
// Line 1000 + j NX + i runs right from point (i, j); line 2000 + j NX + i down.
For j In {0 : NY - 1}
  For i In {0 : NX - 2}
    Line(1000 + j * NX + i) = {j * NX + i + 1, j * NX + i + 2};
    Transfinite Curve {1000 + j * NX + i} = nx[i] + 1 Using Progression px[i];
  EndFor
EndFor
For j In {0 : NY - 2}
  For i In {0 : NX - 1}
    Line(2000 + j * NX + i) = {j * NX + i + 1, (j + 1) * NX + i + 1};
    Transfinite Curve {2000 + j * NX + i} = ny[j] + 1;
  EndFor
EndFor
// Block (i, j) is surface j NX + i + 1, its loop counter-clockwise.
For j In {0 : NY - 2}
  For i In {0 : NX - 2}
    b = j * NX + i;
    Curve Loop(b + 1) = {2000 + b, 1000 + b + NX, -(2000 + b + 1), -(1000 + b)};
    Plane Surface(b + 1) = {b + 1};
    Transfinite Surface {b + 1};
    Recombine Surface {b + 1};
  EndFor
EndFor

Physical Surface("pit_upper") = {1, 5};
Physical Surface("pit_lower") = {9};
Physical Surface("silt") = {3, 7};
Physical Surface("wall") = {2, 6, 10, 14};
Physical Surface("sand") = {11, 13, 15, 17, 18, 19};
Physical Curve("pit_top") = {1000};
Physical Curve("ground") = {1001, 1002};
Physical Curve("axis") = {2000, 2004, 2008, 2012, 2016};
Physical Curve("far") = {2003, 2007, 2011, 2015, 2019};
Physical Curve("base") = {1020, 1021, 1022};
