// A plain cylindrical tablet, radius 1 m, height 2 m (a unit shape for checks; scale it in the
// case's units by choosing D and times), hexahedral mesh: an O-grid disc extruded along z.
// Regions: tablet. Boundaries: top (z = 2), bottom (z = 0), side (r = 1).
// Make the .msh with: gmsh -3 -format msh41 tablet_3d.geo -o tablet_3d.msh
a = 1;    // radius
h = 2;    // height
s = 0.45; // half-diagonal of the central diamond
n = 12;   // cells along a quarter circle
nr = 10;  // cells from the diamond to the rim
nz = 24;  // cells along the height
Point(1) = {0, 0, 0};
Point(2) = {s, 0, 0}; Point(3) = {0, s, 0}; Point(4) = {-s, 0, 0}; Point(5) = {0, -s, 0};
Point(6) = {a, 0, 0}; Point(7) = {0, a, 0}; Point(8) = {-a, 0, 0}; Point(9) = {0, -a, 0};
Line(1) = {2, 3}; Line(2) = {3, 4}; Line(3) = {4, 5}; Line(4) = {5, 2};
Circle(5) = {6, 1, 7}; Circle(6) = {7, 1, 8}; Circle(7) = {8, 1, 9}; Circle(8) = {9, 1, 6};
Line(9) = {2, 6}; Line(10) = {3, 7}; Line(11) = {4, 8}; Line(12) = {5, 9};
Curve Loop(1) = {1, 2, 3, 4};      Plane Surface(1) = {1};
Curve Loop(2) = {9, 5, -10, -1};   Plane Surface(2) = {2};
Curve Loop(3) = {10, 6, -11, -2};  Plane Surface(3) = {3};
Curve Loop(4) = {11, 7, -12, -3};  Plane Surface(4) = {4};
Curve Loop(5) = {12, 8, -9, -4};   Plane Surface(5) = {5};
Transfinite Curve {1, 2, 3, 4, 5, 6, 7, 8} = n + 1;
Transfinite Curve {9, 10, 11, 12} = nr + 1 Using Progression 0.88;
Transfinite Surface {1, 2, 3, 4, 5};
Recombine Surface {1, 2, 3, 4, 5};
e1[] = Extrude {0, 0, h} { Surface{1}; Layers{nz}; Recombine; };
e2[] = Extrude {0, 0, h} { Surface{2}; Layers{nz}; Recombine; };
e3[] = Extrude {0, 0, h} { Surface{3}; Layers{nz}; Recombine; };
e4[] = Extrude {0, 0, h} { Surface{4}; Layers{nz}; Recombine; };
e5[] = Extrude {0, 0, h} { Surface{5}; Layers{nz}; Recombine; };
Physical Volume("tablet") = {e1[1], e2[1], e3[1], e4[1], e5[1]};
Physical Surface("bottom") = {1, 2, 3, 4, 5};
Physical Surface("top") = {e1[0], e2[0], e3[0], e4[0], e5[0]};
Physical Surface("side") = {e2[3], e3[3], e4[3], e5[3]};
