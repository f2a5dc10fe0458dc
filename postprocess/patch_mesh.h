// The cells of a written VTU regrouped into the finite-element cells (patches) they came from.
#pragma once

#include <vtkSmartPointer.h>
#include <vtkStaticCellLocator.h>
#include <vtkUnstructuredGrid.h>

#include <array>
#include <string>
#include <vector>

namespace fickcast::post
{
  /// One finite-element cell: its (order+1)^dim point ids in lexicographic order and its region.
  struct PatchElement
  {
    std::vector<vtkIdType> nodes;
    int region = 0;
  };

  /**
   * fickcast (deal.II's DataOut) writes each cell of degree p as a patch of p^dim linear
   * sub-cells on (p+1)^dim points, lexicographically ordered, which are the nodes of the cell's
   * Lagrange element (equally spaced; for p = 1, 2 the finite element's own support points).
   * PatchMesh checks the file has exactly that structure (point counts and every sub-cell's
   * vertices in VTK order); if so the written field is the degree-p tensor-product Lagrange
   * function on each patch, the finite-element function itself on the solver's affine and
   * bilinear cells. Otherwise each VTK cell is its own multilinear element (order 1).
   */
  class PatchMesh
  {
  public:
    /// @p degree from summary.json; @p file for messages. Region ids from cell or point data `region`.
    PatchMesh(vtkUnstructuredGrid *grid, unsigned int dim, unsigned int degree, const std::string &file);

    unsigned int dim() const { return dim_; }
    unsigned int order() const { return order_; }
    const std::vector<PatchElement> &elements() const { return elements_; }
    /// How fields are represented, for the record.
    std::string description() const;

    /// Element containing @p point and its reference coordinates in [0,1]^dim; false if outside.
    bool locate(const std::array<double, 3> &point, std::size_t &element, std::array<double, 3> &xi) const;

    /// As locate, but on the side of @p inside_point: the element containing @p inside_point (a
    /// point strictly inside an element, say its centre) and @p point's reference coordinates in
    /// it, so a point on a face between two elements is read from the element wanted. False if
    /// @p point is not in (or on the boundary of) that element.
    bool locate_beside(const std::array<double, 3> &point, const std::array<double, 3> &inside_point,
                       std::size_t &element, std::array<double, 3> &xi) const;

    /// Lagrange shape values (one per node, lexicographic) at reference point @p xi.
    void shape_values(const std::array<double, 3> &xi, std::vector<double> &values) const;
    /// Shape values and reference gradients at @p xi.
    void shape_gradients(const std::array<double, 3> &xi, std::vector<double> &values,
                         std::vector<std::array<double, 3>> &gradients) const;

  private:
    vtkUnstructuredGrid *grid_;
    unsigned int dim_;
    unsigned int order_;
    bool patches_ = false;
    std::vector<PatchElement> elements_;
    mutable vtkSmartPointer<vtkStaticCellLocator> locator_;
    /// The grid the locator searches: grid_ with its points scaled to a unit diagonal (VTK 9.1's
    /// static locator runs out of memory on a mesh micrometres across), and that scale.
    mutable vtkSmartPointer<vtkUnstructuredGrid> unit_grid_;
    mutable double unit_scale_ = 1;
  };

  /// Gauss-Legendre points and weights on [0, 1].
  void gauss_legendre(unsigned int n, std::vector<double> &points, std::vector<double> &weights);
} // namespace fickcast::post
