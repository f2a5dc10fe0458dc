// A barrier panel with a pipe penetration, a shape of our own: a 1 m x 1 m panel, 0.3 m thick
// (along z), crossed by a pipe of radius 0.1 m sealed with a 0.05 m grout collar. The pipe
// itself is not meshed (its wall is a boundary). Hexahedral mesh by extrusion of an O-grid.
// Regions: panel, grout. Boundaries: upstream (z = 0), downstream (z = 0.3), pipe_wall, edges.
// Make the .msh with: gmsh -3 -format msh41 barrier_panel_pipe.geo -o barrier_panel_pipe.msh
rp = 0.1;   // pipe radius
rg = 0.15;  // grout collar outer radius
L = 0.5;    // half side of the panel
H = 0.3;    // panel thickness
na = 6;     // cells along a quarter arc
ng = 3;     // cells across the collar
no = 8;     // cells from the collar to the panel edge
nz = 10;    // cells through the thickness
c = Sqrt(0.5);
Point(1) = {0, 0, 0};
For k In {0:3}
  sx = (k == 0 || k == 3) ? 1 : -1;
  sy = (k < 2) ? 1 : -1;
  Point(10 + k) = {sx * c * rp, sy * c * rp, 0};
  Point(20 + k) = {sx * c * rg, sy * c * rg, 0};
  Point(30 + k) = {sx * L, sy * L, 0};
EndFor
// Corners go counter-clockwise: k = 0 (+,+), 1 (-,+), 2 (-,-), 3 (+,-).
For k In {0:3}
  k1 = (k + 1) % 4;
  Circle(100 + k) = {10 + k, 1, 10 + k1};   // pipe wall arc
  Circle(110 + k) = {20 + k, 1, 20 + k1};   // collar arc
  Line(120 + k) = {30 + k, 30 + k1};        // panel edge
  Line(130 + k) = {10 + k, 20 + k};         // across the collar
  Line(140 + k) = {20 + k, 30 + k};         // collar to corner
EndFor
For k In {0:3}
  k1 = (k + 1) % 4;
  Curve Loop(200 + k) = {100 + k, 130 + k1, -(110 + k), -(130 + k)};
  Plane Surface(200 + k) = {200 + k};
  Curve Loop(210 + k) = {110 + k, 140 + k1, -(120 + k), -(140 + k)};
  Plane Surface(210 + k) = {210 + k};
EndFor
Transfinite Curve {100:103, 110:113, 120:123} = na + 1;
Transfinite Curve {130:133} = ng + 1;
Transfinite Curve {140:143} = no + 1 Using Progression 1.15;
Transfinite Surface {200:203, 210:213};
Recombine Surface {200:203, 210:213};
grout_volumes[] = {}; panel_volumes[] = {}; downstream[] = {}; wall[] = {}; edges[] = {};
For k In {0:3}
  e[] = Extrude {0, 0, H} { Surface{200 + k}; Layers{nz}; Recombine; };
  grout_volumes[] += e[1]; downstream[] += e[0]; wall[] += e[2];
  f[] = Extrude {0, 0, H} { Surface{210 + k}; Layers{nz}; Recombine; };
  panel_volumes[] += f[1]; downstream[] += f[0]; edges[] += f[4];
EndFor
Physical Volume("panel") = {panel_volumes[]};
Physical Volume("grout") = {grout_volumes[]};
Physical Surface("upstream") = {200:203, 210:213};
Physical Surface("downstream") = {downstream[]};
Physical Surface("pipe_wall") = {wall[]};
Physical Surface("edges") = {edges[]};
