// A unit square meshed with triangles (for a bad-input test: fickcast needs quadrilaterals).
Point(1) = {0, 0, 0, 0.5}; Point(2) = {1, 0, 0, 0.5}; Point(3) = {1, 1, 0, 0.5}; Point(4) = {0, 1, 0, 0.5};
Line(1) = {1, 2}; Line(2) = {2, 3}; Line(3) = {3, 4}; Line(4) = {4, 1};
Curve Loop(1) = {1, 2, 3, 4}; Plane Surface(1) = {1};
Physical Surface("plate") = {1};
Physical Curve("edge") = {1, 2, 3, 4};
