// Parameter conversions against the check values of
// docs/verification-references.md, section 9 (Terzaghi 1925 for cv; the oedometer modulus
// relation).
#include "settlewell/core/errors.h"
#include "settlewell/materials/poroelastic.h"

#include <gtest/gtest.h>

using settlewell::PoroelasticMaterial;

TEST(Materials, ConstrainedModulusAndConsolidationCoefficient) {
  PoroelasticMaterial m;
  m.youngs_modulus = 10000.0;
  m.poisson_ratio = 0.3;
  m.conductivity_x = m.conductivity_y = 1e-9;
  EXPECT_NEAR(m.constrained_modulus(), 13461.5, 0.1);
  EXPECT_NEAR(1.0 / m.constrained_modulus(), 7.42857e-5, 1e-10);
  EXPECT_NEAR(m.consolidation_coefficient(1e-9, 9.81), 1.37223e-6, 1e-11);
}

TEST(Materials, YoungsModulusFromMvRoundTrips) {
  PoroelasticMaterial m;
  m.poisson_ratio = 0.25;
  m.youngs_modulus = PoroelasticMaterial::youngs_from_mv(0.5e-3, 0.25);
  EXPECT_NEAR(m.constrained_modulus(), 2000.0, 1e-9);
}

TEST(Materials, OutOfRangeValuesAreRejectedWithTheirName) {
  PoroelasticMaterial m;
  m.youngs_modulus = 1000.0;
  m.poisson_ratio = 0.5;
  m.conductivity_x = m.conductivity_y = 1e-6;
  try {
    m.validate("material 'clay'");
    FAIL() << "nu = 0.5 was accepted";
  } catch (const settlewell::InputError& e) {
    EXPECT_NE(std::string(e.what()).find("material 'clay'"), std::string::npos);
    EXPECT_NE(std::string(e.what()).find("Poisson"), std::string::npos);
  }
  m.poisson_ratio = 0.3;
  m.conductivity_y = 0.0;
  EXPECT_THROW(m.validate("x"), settlewell::InputError);
  m.conductivity_y = 1e-6;
  EXPECT_NO_THROW(m.validate("x"));
  m.storage = -1e-6;
  EXPECT_THROW(m.validate("x"), settlewell::InputError);
}
