// A layered wafer with a trench, in cross-section, a shape of our own: 0.2 um of oxide on 5 um of
// silicon, 10 um wide, with a trench 1 um wide etched through the oxide 1.5 um into the silicon.
// y points up: silicon from y = 0 to 5 um, oxide from 5 to 5.2 um.
// Regions: silicon, oxide. Boundaries: surface (top of the oxide), trench (its walls and floor),
// back (y = 0), sides (x = 0 and x = 10 um).
// Make the .msh with: gmsh -2 -format msh41 wafer_trench.geo -o wafer_trench.msh
u = 1e-6;
x[] = {0, 4.5 * u, 5.5 * u, 10 * u};
y[] = {0, 3.5 * u, 5 * u, 5.2 * u};
For j In {0:3}
  For i In {0:3}
    Point(1 + i + 4 * j) = {x[i], y[j], 0};
  EndFor
EndFor
For j In {0:3}
  For i In {0:2}
    Line(100 + i + 3 * j) = {1 + i + 4 * j, 2 + i + 4 * j};   // along x
  EndFor
EndFor
For j In {0:2}
  For i In {0:3}
    Line(200 + i + 4 * j) = {1 + i + 4 * j, 5 + i + 4 * j};   // along y
  EndFor
EndFor
// Blocks (i, j); the trench removes (1, 1) and (1, 2).
s[] = {};
For j In {0:2}
  For i In {0:2}
    If (!(i == 1 && j >= 1))
      Curve Loop(300 + i + 3 * j) = {100 + i + 3 * j, 201 + i + 4 * j, -(103 + i + 3 * j), -(200 + i + 4 * j)};
      Plane Surface(300 + i + 3 * j) = {300 + i + 3 * j};
      s[] += 300 + i + 3 * j;
    EndIf
  EndFor
EndFor
Transfinite Curve {100, 103, 106, 109, 102, 105, 108, 111} = 19;  // 4.5 um wide columns
Transfinite Curve {101, 104, 107, 110} = 9;                        // trench column
Transfinite Curve {200:203} = 15 Using Progression 0.9;            // lower silicon
Transfinite Curve {204:207} = 13;                                  // silicon beside the trench
Transfinite Curve {208:211} = 4;                                   // oxide
Transfinite Surface {s[]};
Recombine Surface {s[]};
Physical Surface("silicon") = {300, 301, 302, 303, 305};
Physical Surface("oxide") = {306, 308};
Physical Curve("surface") = {109, 111};
Physical Curve("trench") = {205, 206, 209, 210, 104};
Physical Curve("back") = {100, 101, 102};
Physical Curve("sides") = {200, 204, 208, 203, 207, 211};
