#pragma once

#include "settlewell/core/linear_algebra.h"
#include "settlewell/materials/cam_clay.h"
#include "settlewell/materials/retention.h"
#include "settlewell/physics/biot_setup.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/base/quadrature.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/lac/vector.h>

#include <vector>

namespace settlewell {

/// Material data in the form the kernel uses at a quadrature point.
struct CellCoefficients {
  double lambda = 0.0;           ///< kPa
  double mu = 0.0;               ///< kPa
  double alpha = 1.0;            ///< Biot coefficient
  double storage = 0.0;          ///< 1/kPa
  dealii::Tensor<2, 2> mobility; ///< k / gamma_w, m^4/(kN s)
  /// The skeleton's stiffness comes from a stress history (a clay), not from
  /// lambda and mu: add_matrix leaves the displacement block out, and
  /// add_tangent_block adds it from a tangent per quadrature point.
  bool skeleton_from_history = false;

  static CellCoefficients from(const PoroelasticMaterial& m, double gamma_w);
};

/// What a partly saturated cell needs besides its CellCoefficients.
struct UnsaturatedCoefficients {
  const RetentionCurve* curve = nullptr;
  double gamma_w = 0.0; ///< kN/m^3
  /// The start's (absolute) pore pressure at a point, kPa: the unknowns are its
  /// change.
  std::function<double(const dealii::Point<2>&)> start_pressure;
};

/// Per-cell integrals of one time step of the Biot system,
///   [ A        -alpha B^T ] [u]   [ f                                 ]
///   [ alpha B  S M + dt H ] [p] = [ alpha B u_n + S M p_n - dt q_out ]
/// (the storage equation times dt). For BDF2, dt is the effective step dt' and
/// (u_n, p_n) the weighted old state of step_weights. Its Schur complement S M + dt H +
/// alpha^2 B A^-1 B^T is positive definite, which the block preconditioner needs.
/// Axisymmetric integrals carry the weight 2 pi r and the hoop strain u_r / r.
class CellKernel {
public:
  CellKernel(const FieldLayout& layout,
             AnalysisType analysis,
             const dealii::Mapping<2>& mapping);

  /// Sets the cell. Its values at the quadrature points are computed only when a
  /// cell integral asks for them: a step's right-hand side mostly needs none.
  void reinit(const dealii::DoFHandler<2>::active_cell_iterator& cell);
  unsigned int dofs_per_cell() const { return fe_values_.dofs_per_cell; }

  void add_matrix(const CellCoefficients& c, double dt, dealii::FullMatrix<double>& out);
  unsigned int n_quadrature_points() const { return fe_values_.n_quadrature_points; }
  const std::vector<dealii::Point<2>>& quadrature_points() {
    update_cell_values();
    return fe_values_.get_quadrature_points();
  }
  /// The strain (xx, yy, zz, xy; zz the hoop strain u_r/r in axisymmetric, 0 in
  /// plane strain) of the displacement in `local` (the cell's dof values) at each
  /// quadrature point.
  void strains(const dealii::Vector<double>& local, std::vector<PlaneTensor>& out);
  /// For a skeleton with a tangent D and a stress tau per quadrature point: the
  /// displacement block, the integral of eps(v_i) : D eps(v_j) (in general not
  /// symmetric), into `matrix`, and minus the internal force of tau, -integral of
  /// eps(v_i) : tau, into the displacement rows of `vector`.
  void add_tangent_and_force(const std::vector<PlaneTangent>& tangents,
                             const std::vector<PlaneTensor>& stresses,
                             dealii::FullMatrix<double>& matrix,
                             dealii::Vector<double>& vector);
  /// A mobility that follows the volumetric strain, m = f m0 with f = exp(c tr
  /// eps), linearised for Newton's method about the state `local` (the cell's dof
  /// values): into `matrix` the p-p entries dt integral of grad phi_i . (f - 1) m0
  /// grad phi_j (add_matrix holds m0) and the p-u entries dt integral of grad phi_i
  /// . c f m0 grad p tr eps(v_j); into the p rows of `vector` those p-u entries
  /// applied to the state itself, so that the rows' residual is exact at `local`.
  void add_strain_dependent_flow(const dealii::Tensor<2, 2>& mobility,
                                 double rate,
                                 const dealii::Vector<double>& local,
                                 double dt,
                                 dealii::FullMatrix<double>& matrix,
                                 dealii::Vector<double>& vector);
  /// The terms by which partly saturated soil differs from the saturated system
  /// that add_matrix integrates, at the state `local` with the old state `old`
  /// (the cells' dof values; absolute pore pressure P = P0 + p). In the p rows,
  ///   theta(P) - theta(P_old) + alpha (S_r(P) - 1)(eps_v - eps_v,old)
  ///   + dt (k_r(P) - 1) grad phi . m grad p
  /// (water content, the skeleton's volume change filled in the share S_r, the
  /// flow at the relative conductivity; the mixed form of Celia et al. 1990 with
  /// implicit Euler), and in the u rows Bishop's (1959) effective stress with
  /// chi = S_r, -alpha div v (S_r(P) P - S_r(P0) P0 - p), and the weight of the
  /// water gained, gamma_w (theta(P) - theta(P0)) v_y. Adds these residual terms
  /// to `residual` and, if `tangent` is not null, their derivatives by the dof
  /// values to it (not symmetric). In saturated soil (P >= 0 throughout) every
  /// term is zero.
  void add_unsaturated_terms(const CellCoefficients& c,
                             const UnsaturatedCoefficients& u,
                             const dealii::Vector<double>& local,
                             const dealii::Vector<double>& old,
                             double dt,
                             dealii::FullMatrix<double>* tangent,
                             dealii::Vector<double>& residual);
  /// The fixed-stress approximation of the Schur complement in the p-p entries:
  /// (S + alpha^2/K) phi_i phi_j + dt grad phi_i . kappa grad phi_j, with K the
  /// drained plane bulk modulus lambda + mu.
  void add_schur_approximation(const CellCoefficients& c,
                               double dt,
                               dealii::FullMatrix<double>& out);
  void add_body_force(const dealii::Tensor<1, 2>& b, dealii::Vector<double>& out);
  /// The out-of-balance nodal force of a cell in a geostatic state, in the
  /// displacement rows: the weight (unit weight `gamma`, kN/m^3, downward) minus
  /// the internal force of the total stress sigma' - alpha p I, with sigma' (xx, yy,
  /// zz) and p (kPa) given per point. Cells in equilibrium sum to zero at shared
  /// nodes; a removed cell's share is what excavation releases.
  void add_geostatic_imbalance(
      const CellCoefficients& c,
      double gamma,
      const std::function<dealii::SymmetricTensor<2, 3>(const dealii::Point<2>&)>&
          effective_stress,
      const std::function<double(const dealii::Point<2>&)>& pore_pressure,
      dealii::Vector<double>& out);

  /// A traction vector `t` (kPa) given per face point, on face `face`.
  void add_face_traction(unsigned int face,
                         const std::function<dealii::Tensor<1, 2>(
                             const dealii::Point<2>&, const dealii::Tensor<1, 2>&)>& t,
                         dealii::Vector<double>& out);
  /// Minus dt times an outflow q.n (m/s) in the p rows, on face `face`.
  void add_face_outflow(unsigned int face,
                        double dt,
                        const FieldFunction& q,
                        double t,
                        dealii::Vector<double>& out);

  /// Integration weight at a point: JxW, times 2 pi r if axisymmetric.
  double weight(const dealii::FEValuesBase<2>& fv, unsigned int q) const;

private:
  void update_cell_values();
  void evaluate_shapes(unsigned int q);
  /// Adds local_ to `out`: its lower triangle in the A and S M + dt H blocks,
  /// mirrored; its alpha B block, and that block's negated transpose.
  void mirror_into(dealii::FullMatrix<double>& out) const;

  const FieldLayout& layout_;
  AnalysisType analysis_;
  dealii::DoFHandler<2>::active_cell_iterator cell_;
  dealii::FEValues<2> fe_values_;
  bool cell_values_current_ = false;
  dealii::FEFaceValues<2> face_values_;
  std::vector<unsigned int> component_;
  std::vector<unsigned int> u_dofs_, p_dofs_; ///< local indices of each field
  std::vector<double> block_;                 ///< scratch for add_tangent_and_force
  // Shape data at one quadrature point.
  std::vector<dealii::SymmetricTensor<2, 2>> strain_;
  std::vector<double> hoop_, divergence_, phi_p_;
  std::vector<dealii::Tensor<1, 2>> grad_p_;
  dealii::FullMatrix<double> local_; ///< add_matrix's lower triangle
};

} // namespace settlewell
