#include "settlewell/physics/step_weights.h"

#include "settlewell/core/errors.h"

namespace settlewell {

StepWeights step_weights(double h, double h_previous) {
  if (!(h > 0.0) || !(h_previous >= 0.0))
    throw InternalError("step weights need a positive step and a previous one >= 0");
  const StepWeights euler{h, 0.0, false};
  if (h_previous == 0.0)
    return euler;
  const double w = h / h_previous;
  if (w >= 0.9 && w <= 1.1) // graded steps: variable-step BDF2
    return {h * (1.0 + w) / (1.0 + 2.0 * w), -w * w / (1.0 + 2.0 * w), true};
  if (w < 0.25 || w > 2.5)
    return euler;
  return {2.0 * h / 3.0, -w / 3.0, false}; // a new rung: the rung's matrix
}

StepWeights
next_step_weights(double h, double h_previous, unsigned int& euler_steps_left) {
  const StepWeights weights = step_weights(h, h_previous);
  if (weights.previous_weight == 0.0)
    euler_steps_left = euler_steps_after_restart;
  if (euler_steps_left == 0)
    return weights;
  --euler_steps_left;
  return {h, 0.0, false};
}

} // namespace settlewell
