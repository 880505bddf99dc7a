#pragma once

namespace settlewell {

/// How one time step of the storage equation is formed. With the storage terms
/// s(x) = alpha div u + S p, the step from t_n to t_{n+1} = t_n + h solves
///
///     s(x_{n+1}) + dt' (H p_{n+1} - q_{n+1}) = s((1 - c) x_n + c x_{n-1}),
///
/// an implicit-Euler step of length dt' from a weighted old state. Implicit Euler is
/// dt' = h, c = 0. BDF2 with a step h after h_previous, w = h / h_previous, is
/// dt' = h (1 + w) / (1 + 2w) and c = -w^2 / (1 + 2w): second order, and
/// zero-stable for w < 1 + sqrt(2) (Hairer & Wanner 1996, Solving Ordinary
/// Differential Equations II, from memory; the weights are the divided-difference
/// form rearranged [derived here]). Equal steps give
/// dt' = 2h/3, c = -1/3. The matrix depends on dt' alone, so one factorisation
/// serves a rung of equal steps.
struct StepWeights {
  double effective_dt = 0.0;    ///< dt', s
  double previous_weight = 0.0; ///< c
  bool second_order = false;    ///< BDF2 (else implicit Euler or a rung's first step)
};

/// The weights of a step of length h after one of h_previous (0: no usable history:
/// the first step, or the first after a change of geometry), w = h / h_previous:
///
/// - no history, w < 1/4 (a stage's ladder starting again at its smallest step) or
///   w > 2.5: implicit Euler (a restart);
/// - 0.9 <= w <= 1.1 (equal or smoothly graded steps): BDF2;
/// - otherwise (the first step of a new rung of the ladder): dt' = 2h/3, the
///   matrix the rung's equal steps go on to use, and c = -w/3, which keeps the step
///   consistent to first order [derived here: x = t gives dt' = h + c h_previous].
///   Its local error for x = t^2 is h (h - h_previous) / 3 against h^2 for implicit
///   Euler: a sixth of Euler's for a rung twice as long, and Euler's for one a
///   quarter as long. One such step per rung leaves a stage of a bounded number of
///   rungs second order, and saves the factorisation that BDF2's own dt' for that
///   one step would cost. Beyond w = 2.5 the extrapolation c x_{n-1} would
///   overshoot decaying modes.
StepWeights step_weights(double h, double h_previous);

/// Implicit-Euler steps taken after each restart (a step_weights result with
/// c = 0) before BDF2 takes over. BDF2 is not monotone: a mode of a sudden change
/// with lambda h between about 1 and 10 swings past its end value (by up to 2.9 %
/// of the change after one Euler step, 0.27 % after three, 0.11 % after four, for a
/// single mode with equal steps [derived here: the two-step recurrence]).
/// Implicit Euler never does, and by Bolley & Crouzeix (1978, from memory) no
/// second-order method is monotone for every step. Three is the compromise: after
/// a sudden change of heads the swing stays a few tenths of a percent of the change
/// (2.006 m on a 2 m drawdown, tests/examples/user_mesh.toml), and three steps of
/// a thousandth of the stage cost accuracy only in its first hundredth
/// (docs/performance.md).
constexpr unsigned int euler_steps_after_restart = 3;

/// step_weights, and implicit Euler for the euler_steps_after_restart steps from
/// a restart on: `euler_steps_left` (0 at the start) carries the count between
/// steps.
StepWeights
next_step_weights(double h, double h_previous, unsigned int& euler_steps_left);

} // namespace settlewell
