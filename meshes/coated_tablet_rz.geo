// A coated tablet in axisymmetric (r, z) form, a shape of our own: a core of radius 4 mm and
// height 3 mm inside a 0.2 mm coating on the faces and the side. Use with coordinates =
// axisymmetric (x = r, y = z).
// Regions: core, coating. Boundaries: axis (r = 0, symmetry), top, bottom, side.
// Make the .msh with: gmsh -2 -format msh41 coated_tablet_rz.geo -o coated_tablet_rz.msh
rc = 4e-3;   // core radius
hc = 3e-3;   // core height
t = 0.2e-3;  // coating thickness
nr = 24; nt = 4; nz = 18;
r[] = {0, rc, rc + t};
z[] = {0, t, t + hc, 2 * t + hc};
For j In {0:3}
  For i In {0:2}
    Point(1 + i + 3 * j) = {r[i], z[j], 0};
  EndFor
EndFor
// Horizontal lines (along r) and vertical lines (along z).
For j In {0:3}
  Line(1 + 2 * j) = {1 + 3 * j, 2 + 3 * j};
  Line(2 + 2 * j) = {2 + 3 * j, 3 + 3 * j};
EndFor
For j In {0:2}
  For i In {0:2}
    Line(20 + i + 3 * j) = {1 + i + 3 * j, 4 + i + 3 * j};
  EndFor
EndFor
// Six blocks: (i, j) with i = 0 core column, 1 coating column; j = 0 bottom coat, 1 core, 2 top coat.
For j In {0:2}
  For i In {0:1}
    Curve Loop(100 + i + 2 * j) = {1 + i + 2 * j, 21 + i + 3 * j, -(3 + i + 2 * j), -(20 + i + 3 * j)};
    Plane Surface(100 + i + 2 * j) = {100 + i + 2 * j};
  EndFor
EndFor
Transfinite Curve {1, 3, 5, 7} = nr + 1;
Transfinite Curve {2, 4, 6, 8} = nt + 1;
Transfinite Curve {20, 21, 22, 26, 27, 28} = nt + 1;
Transfinite Curve {23, 24, 25} = nz + 1;
Transfinite Surface {100, 101, 102, 103, 104, 105};
Recombine Surface {100, 101, 102, 103, 104, 105};
Physical Surface("core") = {102};
Physical Surface("coating") = {100, 101, 103, 104, 105};
Physical Curve("axis") = {20, 23, 26};
Physical Curve("bottom") = {1, 2};
Physical Curve("top") = {7, 8};
Physical Curve("side") = {22, 25, 28};
