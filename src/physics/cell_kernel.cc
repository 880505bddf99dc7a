#include "settlewell/physics/cell_kernel.h"

#include "settlewell/core/units.h"

#include <deal.II/base/quadrature_lib.h>

#include <cmath>

namespace settlewell {

using namespace dealii;

CellCoefficients CellCoefficients::from(const PoroelasticMaterial& m, double gamma_w) {
  CellCoefficients c;
  c.lambda = m.lame_lambda();
  c.mu = m.shear_modulus();
  c.alpha = m.biot_alpha;
  c.storage = m.storage;
  c.mobility[0][0] = m.conductivity_x / gamma_w;
  c.mobility[1][1] = m.conductivity_y / gamma_w;
  return c;
}

namespace {
constexpr unsigned int n_gauss = FieldLayout::displacement_degree + 1;
}

CellKernel::CellKernel(const FieldLayout& layout,
                       AnalysisType analysis,
                       const Mapping<2>& mapping)
    : layout_(layout)
    , analysis_(analysis)
    , fe_values_(mapping,
                 layout.fe,
                 QGauss<2>(n_gauss),
                 update_values | update_gradients | update_quadrature_points |
                     update_JxW_values)
    , face_values_(mapping,
                   layout.fe,
                   QGauss<1>(n_gauss),
                   update_values | update_quadrature_points | update_normal_vectors |
                       update_JxW_values)
    , component_(layout.fe.n_dofs_per_cell())
    , strain_(layout.fe.n_dofs_per_cell())
    , hoop_(layout.fe.n_dofs_per_cell())
    , divergence_(layout.fe.n_dofs_per_cell())
    , phi_p_(layout.fe.n_dofs_per_cell())
    , grad_p_(layout.fe.n_dofs_per_cell())
    , local_(layout.fe.n_dofs_per_cell(), layout.fe.n_dofs_per_cell()) {
  for (unsigned int i = 0; i < component_.size(); ++i) {
    component_[i] = layout.fe.system_to_component_index(i).first;
    (layout.is_displacement(component_[i]) ? u_dofs_ : p_dofs_).push_back(i);
  }
}

void CellKernel::reinit(const DoFHandler<2>::active_cell_iterator& cell) {
  cell_ = cell;
  cell_values_current_ = false;
}

void CellKernel::update_cell_values() {
  if (!cell_values_current_)
    fe_values_.reinit(cell_);
  cell_values_current_ = true;
}

double CellKernel::weight(const FEValuesBase<2>& fv, unsigned int q) const {
  if (analysis_ == AnalysisType::axisymmetric)
    return fv.JxW(q) * 2.0 * units::pi * fv.quadrature_point(q)[0];
  return fv.JxW(q);
}

void CellKernel::evaluate_shapes(unsigned int q) {
  const bool axisymmetric = analysis_ == AnalysisType::axisymmetric;
  const double r = fe_values_.quadrature_point(q)[0];
  for (unsigned int i = 0; i < component_.size(); ++i) {
    if (layout_.is_displacement(component_[i])) {
      strain_[i] = fe_values_[layout_.displacement].symmetric_gradient(i, q);
      hoop_[i] = axisymmetric ? fe_values_[layout_.displacement].value(i, q)[0] / r : 0.0;
      divergence_[i] = trace(strain_[i]) + hoop_[i];
    } else {
      phi_p_[i] = fe_values_[layout_.excess_pressure].value(i, q);
      grad_p_[i] = fe_values_[layout_.excess_pressure].gradient(i, q);
    }
  }
}

void CellKernel::add_matrix(const CellCoefficients& c,
                            double dt,
                            FullMatrix<double>& out) {
  update_cell_values();
  // The blocks A and S M + dt H are symmetric and the coupling blocks are each
  // other's negated transpose: the lower triangle is integrated and mirrored.
  local_ = 0.0;
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    evaluate_shapes(q);
    const double w = weight(fe_values_, q);
    const bool elastic = !c.skeleton_from_history;
    for (unsigned int a = 0; a < u_dofs_.size(); ++a) {
      const unsigned int i = u_dofs_[a];
      const double lambda_div = c.lambda * divergence_[i] * w;
      const double two_mu = 2.0 * c.mu * w;
      for (unsigned int b = 0; elastic && b <= a; ++b) {
        const unsigned int j = u_dofs_[b];
        local_(i, j) += lambda_div * divergence_[j] +
                        two_mu * (strain_[i] * strain_[j] + hoop_[i] * hoop_[j]);
      }
      const double alpha_div = c.alpha * divergence_[i] * w;
      for (const unsigned int j : p_dofs_)
        local_(j, i) += alpha_div * phi_p_[j];
    }
    for (unsigned int a = 0; a < p_dofs_.size(); ++a) {
      const unsigned int i = p_dofs_[a];
      const Tensor<1, 2> flux = dt * w * (c.mobility * grad_p_[i]);
      const double stored = c.storage * phi_p_[i] * w;
      for (unsigned int b = 0; b <= a; ++b) {
        const unsigned int j = p_dofs_[b];
        local_(i, j) += stored * phi_p_[j] + flux * grad_p_[j];
      }
    }
  }
  mirror_into(out);
}

namespace {
/// (xx, yy, zz, xy) of a shape function's strain.
PlaneTensor plane(const SymmetricTensor<2, 2>& e, double hoop) {
  return {{e[0][0], e[1][1], hoop, e[0][1]}};
}
} // namespace

void CellKernel::strains(const Vector<double>& local, std::vector<PlaneTensor>& out) {
  update_cell_values();
  out.assign(fe_values_.n_quadrature_points, PlaneTensor{});
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    evaluate_shapes(q);
    for (const unsigned int i : u_dofs_) {
      const PlaneTensor e = plane(strain_[i], hoop_[i]);
      for (unsigned int k = 0; k < 4; ++k)
        out[q][k] += local(i) * e[k];
    }
  }
}

void CellKernel::add_tangent_and_force(const std::vector<PlaneTangent>& tangents,
                                       const std::vector<PlaneTensor>& stresses,
                                       FullMatrix<double>& matrix,
                                       Vector<double>& vector) {
  update_cell_values();
  // The u block in a dense scratch (rows of u dofs), added to `matrix` once.
  const unsigned int n = u_dofs_.size();
  std::vector<PlaneTensor> shape(n), stress(n);
  block_.assign(n * n, 0.0);
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    evaluate_shapes(q);
    const double w = weight(fe_values_, q);
    const PlaneTangent& d = tangents[q];
    for (unsigned int b = 0; b < n; ++b) {
      shape[b] = plane(strain_[u_dofs_[b]], hoop_[u_dofs_[b]]);
      for (unsigned int r = 0; r < 4; ++r)
        stress[b][r] = w * (d[r][0] * shape[b][0] + d[r][1] * shape[b][1] +
                            d[r][2] * shape[b][2] + d[r][3] * shape[b][3]);
      // The shear entry enters a : b twice.
      stress[b][3] *= 2.0;
    }
    for (unsigned int a = 0; a < n; ++a) {
      vector(u_dofs_[a]) -= w * double_contraction(shape[a], stresses[q]);
      const PlaneTensor& sa = shape[a];
      double* row = &block_[a * n];
      for (unsigned int b = 0; b < n; ++b) {
        const PlaneTensor& sb = stress[b];
        row[b] += sa[0] * sb[0] + sa[1] * sb[1] + sa[2] * sb[2] + sa[3] * sb[3];
      }
    }
  }
  for (unsigned int a = 0; a < n; ++a)
    for (unsigned int b = 0; b < n; ++b)
      matrix(u_dofs_[a], u_dofs_[b]) += block_[a * n + b];
}

void CellKernel::add_strain_dependent_flow(const Tensor<2, 2>& mobility,
                                           double rate,
                                           const Vector<double>& local,
                                           double dt,
                                           FullMatrix<double>& matrix,
                                           Vector<double>& vector) {
  update_cell_values();
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    evaluate_shapes(q);
    double trace = 0.0;
    for (const unsigned int i : u_dofs_)
      trace += local(i) * divergence_[i];
    Tensor<1, 2> grad_p;
    for (const unsigned int i : p_dofs_)
      grad_p += local(i) * grad_p_[i];
    const double factor = std::exp(rate * trace);
    const double w = dt * weight(fe_values_, q);
    // The flux's change per unit tr eps, and the mobility's change from m0.
    const Tensor<1, 2> per_strain = rate * factor * w * (mobility * grad_p);
    const Tensor<2, 2> extra = (factor - 1.0) * w * mobility;
    for (const unsigned int i : p_dofs_) {
      const double along = grad_p_[i] * per_strain;
      vector(i) += along * trace;
      for (const unsigned int j : u_dofs_)
        matrix(i, j) += along * divergence_[j];
      const Tensor<1, 2> extra_i = extra * grad_p_[i]; // m0 is symmetric
      for (const unsigned int j : p_dofs_)
        matrix(i, j) += extra_i * grad_p_[j];
    }
  }
}

void CellKernel::add_unsaturated_terms(const CellCoefficients& c,
                                       const UnsaturatedCoefficients& u,
                                       const Vector<double>& local,
                                       const Vector<double>& old,
                                       double dt,
                                       FullMatrix<double>* tangent,
                                       Vector<double>& residual) {
  update_cell_values();
  const RetentionCurve& curve = *u.curve;
  const double gw = u.gamma_w, theta_s = curve.saturated_content;
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    // The pressures first: most points of a region with a retention curve lie
    // below the water table, and need no other shape data.
    double p = 0.0, p_old = 0.0, strain = 0.0, strain_old = 0.0;
    for (const unsigned int i : p_dofs_) {
      const double phi = fe_values_[layout_.excess_pressure].value(i, q);
      p += local(i) * phi;
      p_old += old(i) * phi;
    }
    const double start = u.start_pressure(fe_values_.quadrature_point(q));
    const double now = start + p, before = start + p_old;
    if (now >= 0.0 && before >= 0.0 && start >= 0.0)
      continue; // saturated throughout: the saturated system holds
    Tensor<1, 2> grad_p;
    evaluate_shapes(q);
    for (const unsigned int i : p_dofs_)
      grad_p += local(i) * grad_p_[i];
    for (const unsigned int i : u_dofs_) {
      strain += local(i) * divergence_[i];
      strain_old += old(i) * divergence_[i];
    }
    const auto at = curve.at(now / gw), at_old = curve.at(before / gw),
               at_start = curve.at(start / gw);
    const double capacity = at.capacity / gw; // d theta / dP, 1/kPa
    const double saturation_slope = capacity / theta_s;
    const double volume_change = strain - strain_old;
    const double w = weight(fe_values_, q);
    // The p rows.
    const double stored =
        at.content - at_old.content + c.alpha * (at.saturation - 1.0) * volume_change;
    const Tensor<1, 2> flux = dt * w * (at.conductivity - 1.0) * (c.mobility * grad_p);
    const Tensor<1, 2> flux_slope =
        dt * w * at.conductivity_slope / gw * (c.mobility * grad_p);
    for (const unsigned int i : p_dofs_) {
      residual(i) += w * phi_p_[i] * stored + grad_p_[i] * flux;
      if (tangent == nullptr)
        continue;
      const double by_pressure =
          w * phi_p_[i] * (capacity + c.alpha * saturation_slope * volume_change);
      const double by_gradient = grad_p_[i] * flux_slope;
      const Tensor<1, 2> flow_i =
          dt * w * (at.conductivity - 1.0) * (c.mobility * grad_p_[i]);
      for (const unsigned int j : p_dofs_)
        (*tangent)(i, j) += (by_pressure + by_gradient) * phi_p_[j] + flow_i * grad_p_[j];
      const double by_strain = w * phi_p_[i] * c.alpha * (at.saturation - 1.0);
      for (const unsigned int j : u_dofs_)
        (*tangent)(i, j) += by_strain * divergence_[j];
    }
    // The u rows: Bishop's stress with chi = S_r, and the weight of the water.
    const double bishop = at.saturation * now - at_start.saturation * start - p;
    const double bishop_slope = at.saturation + saturation_slope * now - 1.0;
    const double water_weight = gw * (at.content - at_start.content);
    for (const unsigned int i : u_dofs_) {
      const double v_y = fe_values_[layout_.displacement].value(i, q)[1];
      residual(i) += w * (-c.alpha * divergence_[i] * bishop + water_weight * v_y);
      if (tangent == nullptr)
        continue;
      const double by_pressure =
          w * (-c.alpha * divergence_[i] * bishop_slope + gw * capacity * v_y);
      for (const unsigned int j : p_dofs_)
        (*tangent)(i, j) += by_pressure * phi_p_[j];
    }
  }
}

void CellKernel::mirror_into(FullMatrix<double>& out) const {
  for (const auto* block : {&u_dofs_, &p_dofs_})
    for (unsigned int a = 0; a < block->size(); ++a)
      for (unsigned int b = 0; b <= a; ++b) {
        const unsigned int i = (*block)[a], j = (*block)[b];
        out(i, j) += local_(i, j);
        if (i != j)
          out(j, i) += local_(i, j);
      }
  for (const unsigned int i : u_dofs_)
    for (const unsigned int j : p_dofs_) {
      out(j, i) += local_(j, i);
      out(i, j) -= local_(j, i);
    }
}

void CellKernel::add_schur_approximation(const CellCoefficients& c,
                                         double dt,
                                         FullMatrix<double>& out) {
  update_cell_values();
  const double fixed_stress = c.alpha * c.alpha / (c.lambda + c.mu);
  const unsigned int n = component_.size();
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    evaluate_shapes(q);
    const double w = weight(fe_values_, q);
    for (unsigned int i = 0; i < n; ++i) {
      if (layout_.is_displacement(component_[i]))
        continue;
      for (unsigned int j = 0; j < n; ++j)
        if (!layout_.is_displacement(component_[j]))
          out(i, j) += ((c.storage + fixed_stress) * phi_p_[i] * phi_p_[j] +
                        dt * (grad_p_[i] * (c.mobility * grad_p_[j]))) *
                       w;
    }
  }
}

void CellKernel::add_body_force(const Tensor<1, 2>& b, Vector<double>& out) {
  update_cell_values();
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    const double w = weight(fe_values_, q);
    for (unsigned int i = 0; i < component_.size(); ++i)
      if (layout_.is_displacement(component_[i]))
        out(i) += (fe_values_[layout_.displacement].value(i, q) * b) * w;
  }
}

void CellKernel::add_geostatic_imbalance(
    const CellCoefficients& c,
    double gamma,
    const std::function<SymmetricTensor<2, 3>(const Point<2>&)>& effective_stress,
    const std::function<double(const Point<2>&)>& pore_pressure,
    Vector<double>& out) {
  update_cell_values();
  const Tensor<1, 2> weight_density{{0.0, -gamma}};
  for (unsigned int q = 0; q < fe_values_.n_quadrature_points; ++q) {
    evaluate_shapes(q);
    const Point<2>& x = fe_values_.quadrature_point(q);
    const SymmetricTensor<2, 3> s = effective_stress(x);
    SymmetricTensor<2, 2> in_plane;
    in_plane[0][0] = s[0][0];
    in_plane[1][1] = s[1][1];
    in_plane[0][1] = s[0][1];
    const double alpha_p = c.alpha * pore_pressure(x);
    const double w = weight(fe_values_, q);
    for (unsigned int i = 0; i < component_.size(); ++i)
      if (layout_.is_displacement(component_[i])) {
        const double internal =
            strain_[i] * in_plane + hoop_[i] * s[2][2] - alpha_p * divergence_[i];
        out(i) +=
            (fe_values_[layout_.displacement].value(i, q) * weight_density - internal) *
            w;
      }
  }
}

void CellKernel::add_face_traction(
    unsigned int face,
    const std::function<Tensor<1, 2>(const Point<2>&, const Tensor<1, 2>&)>& traction,
    Vector<double>& out) {
  face_values_.reinit(cell_, face);
  for (unsigned int q = 0; q < face_values_.n_quadrature_points; ++q) {
    const Tensor<1, 2> t =
        traction(face_values_.quadrature_point(q), face_values_.normal_vector(q));
    const double w = weight(face_values_, q);
    for (unsigned int i = 0; i < component_.size(); ++i)
      if (layout_.is_displacement(component_[i]))
        out(i) += (face_values_[layout_.displacement].value(i, q) * t) * w;
  }
}

void CellKernel::add_face_outflow(unsigned int face,
                                  double dt,
                                  const FieldFunction& q_out,
                                  double t,
                                  Vector<double>& out) {
  face_values_.reinit(cell_, face);
  for (unsigned int q = 0; q < face_values_.n_quadrature_points; ++q) {
    const double flux =
        -dt * q_out(face_values_.quadrature_point(q), t) * weight(face_values_, q);
    for (unsigned int i = 0; i < component_.size(); ++i)
      if (!layout_.is_displacement(component_[i]))
        out(i) += flux * face_values_[layout_.excess_pressure].value(i, q);
  }
}

} // namespace settlewell
