#include "pucker/two_state_fit.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/error.h"

namespace vicinal::pucker {
namespace {

// The forward model of the ring file itself generates the "measured" values, so
// these tests check the fit, not the published relations (those are checked in
// tests/validation/pucker_relations.py).
RingCouplings deoxyribose() {
  const RingModel ring = RingModel::load("deoxyribose");
  return RingCouplings(ring, karplus::SetCatalog::shipped());
}

std::vector<MeasuredRingCoupling> synthetic(const RingCouplings& m, double pn, double an, double ps, double as,
                                            double xs, double sigma) {
  std::vector<MeasuredRingCoupling> out;
  for (std::size_t i = 0; i < m.ring().couplings.size(); ++i)
    out.push_back({i, (1 - xs) * m.j_hz(i, pn, an) + xs * m.j_hz(i, ps, as), sigma, static_cast<long>(i + 2)});
  return out;
}

TEST(TwoStateFit, RecoversTheParametersOfNoiseFreeCouplings) {
  const auto model = deoxyribose();
  const auto measured = synthetic(model, 9.0, 36.0, 162.0, 36.0, 0.72, 0.2);
  TwoStateOptions o;  // amplitudes fixed at 36, P_N, P_S and x_S free
  o.start = {20.0, 36.0, 150.0, 36.0, 0.5};
  const auto fit = fit_two_state(model, measured, o);
  EXPECT_NEAR(fit.value[kPhaseN], 9.0, 0.5);
  EXPECT_NEAR(fit.value[kPhaseS], 162.0, 0.5);
  EXPECT_NEAR(fit.value[kFractionS], 0.72, 0.005);
  EXPECT_LT(fit.chi2, 1e-6);
  EXPECT_TRUE(fit.covariance_ok);
  EXPECT_TRUE(std::isnan(fit.sd[kAmplitudeN]));  // fixed
  EXPECT_GT(fit.sd[kFractionS], 0.0);
}

TEST(TwoStateFit, RecoversFreeTiedAmplitude) {
  const auto model = deoxyribose();
  const auto measured = synthetic(model, 18.0, 40.0, 150.0, 40.0, 0.35, 0.2);
  TwoStateOptions o;
  o.fixed = {false, false, false, false, false};
  o.tie_amplitudes = true;
  const auto fit = fit_two_state(model, measured, o);
  EXPECT_NEAR(fit.value[kAmplitudeN], 40.0, 1.0);
  EXPECT_EQ(fit.value[kAmplitudeN], fit.value[kAmplitudeS]);
  EXPECT_NEAR(fit.value[kFractionS], 0.35, 0.02);
  EXPECT_EQ(fit.free_parameters, 4);
}

TEST(TwoStateFit, RecoversAProlineExoEndoEquilibrium) {
  // Ten ring couplings of the pyrrolidine ring: both phases, one amplitude and
  // the fraction of C-gamma-endo are all free, and all come back.
  const RingModel ring = RingModel::load("proline");
  const RingCouplings model(ring, karplus::SetCatalog::shipped());
  const auto measured = synthetic(model, 18.0, 38.0, 190.0, 38.0, 0.7, 0.3);
  ASSERT_EQ(measured.size(), 10u);
  TwoStateOptions o;
  o.fixed = {false, false, false, false, false};
  o.tie_amplitudes = true;
  const auto fit = fit_two_state(model, measured, o);
  EXPECT_NEAR(fit.value[kPhaseN], 18.0, 0.5);
  EXPECT_NEAR(fit.value[kPhaseS], 190.0, 0.5);
  EXPECT_NEAR(fit.value[kAmplitudeN], 38.0, 0.2);
  EXPECT_NEAR(fit.value[kFractionS], 0.7, 0.005);
  EXPECT_EQ(ring.envelope(fit.value[kPhaseN]), "CG-exo");
  EXPECT_EQ(ring.envelope(fit.value[kPhaseS]), "CG-endo");
}

TEST(TwoStateFit, MonteCarloIsReproducibleWithASeed) {
  const auto model = deoxyribose();
  const auto measured = synthetic(model, 9.0, 36.0, 162.0, 36.0, 0.6, 0.3);
  const TwoStateOptions o;
  const auto fit = fit_two_state(model, measured, o);
  const auto a = monte_carlo_sd(model, measured, o, fit, 40, 11);
  const auto b = monte_carlo_sd(model, measured, o, fit, 40, 11);
  const auto c = monte_carlo_sd(model, measured, o, fit, 40, 12);
  EXPECT_EQ(a[kFractionS], b[kFractionS]);
  EXPECT_NE(a[kFractionS], c[kFractionS]);
  EXPECT_GT(a[kFractionS], 0.0);
  EXPECT_LT(a[kFractionS], 0.2);
}

TEST(TwoStateFit, Chi2MapHasItsMinimumNearTheFit) {
  const auto model = deoxyribose();
  const auto measured = synthetic(model, 9.0, 36.0, 162.0, 36.0, 0.7, 0.2);
  const TwoStateOptions o;
  const auto fit = fit_two_state(model, measured, o);
  const auto map = chi2_map(model, measured, o, fit, 18.0);
  ASSERT_EQ(map.chi2.size(), map.phase_n_deg.size() * map.phase_s_deg.size());
  std::size_t best = 0;
  for (std::size_t i = 0; i < map.chi2.size(); ++i)
    if (map.chi2[i] < map.chi2[best]) best = i;
  const double pn = map.phase_n_deg[best % map.phase_n_deg.size()];
  const double ps = map.phase_s_deg[best / map.phase_n_deg.size()];
  EXPECT_NEAR(pn, 9.0, 18.0);
  EXPECT_NEAR(ps, 162.0, 18.0);
}

TEST(TwoStateFit, TooFewCouplingsIsAnError) {
  const auto model = deoxyribose();
  auto measured = synthetic(model, 9.0, 36.0, 162.0, 36.0, 0.7, 0.2);
  measured.resize(2);
  EXPECT_THROW(fit_two_state(model, measured, TwoStateOptions{}), Error);
}

TEST(RingCouplingsCsv, ErrorsNameLineAndColumn) {
  const RingModel ring = RingModel::load("deoxyribose");
  try {
    parse_ring_couplings("coupling,j_hz,sigma_hz\nH1'-H2',9.8,0.2\nH9-H10,3,0.2\n", "x.csv", ring);
    FAIL() << "unknown coupling accepted";
  } catch (const Error& e) {
    EXPECT_EQ(e.where().line, 3);
    EXPECT_EQ(e.where().field, "coupling");
  }
  EXPECT_THROW(parse_ring_couplings("coupling,j_hz,sigma_hz\nH1'-H2',9.8,0\n", "x.csv", ring), Error);
  EXPECT_THROW(parse_ring_couplings("coupling,j_hz,sigma_hz\nH1'-H2',abc,0.2\n", "x.csv", ring), Error);
  EXPECT_THROW(parse_ring_couplings("coupling,j_hz,sigma_hz\nH1'-H2',9,0.2\nH1'-H2',8,0.2\n", "x.csv", ring), Error);
  EXPECT_THROW(parse_ring_couplings("coupling,j_hz\nH1'-H2',9\n", "x.csv", ring), Error);
  const auto ok = parse_ring_couplings("coupling,j_hz,sigma_hz,note\nH3'-H4',4.1,0.3,x\n", "x.csv", ring);
  ASSERT_EQ(ok.size(), 1u);
  EXPECT_EQ(ring.couplings[ok[0].coupling].name, "H3'-H4'");
}

}  // namespace
}  // namespace vicinal::pucker
