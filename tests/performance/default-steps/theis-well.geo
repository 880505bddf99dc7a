// An invented confined aquifer around one pumped well, for the accuracy of the
// default time steps against Theis (1935): r from the well radius 0.15 m to
// 1500 m, 10 m thick, four layers of quadrilaterals graded away from the well.
//   gmsh -2 theis-well.geo -format msh41 -o theis-well.msh
rw = 0.15;
R = 1500;
Point(1) = {rw, -10, 0};
Point(2) = {R, -10, 0};
Point(3) = {R, 0, 0};
Point(4) = {rw, 0, 0};
Line(1) = {1, 2};
Line(2) = {2, 3};
Line(3) = {3, 4};
Line(4) = {4, 1};
Transfinite Curve {1} = 101 Using Progression 1.07;
Transfinite Curve {3} = 101 Using Progression 1 / 1.07;
Transfinite Curve {2, 4} = 5;
Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};
Transfinite Surface {1};
Recombine Surface {1};
Physical Surface("aquifer") = {1};
Physical Curve("well_W1") = {4};
Physical Curve("far") = {2};
Physical Curve("top") = {3};
Physical Curve("base") = {1};
