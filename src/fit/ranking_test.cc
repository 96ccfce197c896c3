#include "fit/ranking.h"

#include <gtest/gtest.h>

#include "core/error.h"
#include "fit/assignments.h"

namespace vicinal::fit {
namespace {

PopulationProblem problem(const Eigen::MatrixXd& j, const Eigen::VectorXd& obs, double sigma = 0.5) {
  PopulationProblem p;
  p.j_hz = j;
  p.j_obs_hz = obs;
  p.sigma_hz = Eigen::VectorXd::Constant(obs.size(), sigma);
  p.rms_hz = Eigen::VectorXd::Zero(obs.size());
  fill_default_names(p);
  return p;
}

TEST(Ranking, TheRightEnsembleWins) {
  Eigen::MatrixXd right(4, 2), wrong(4, 2);
  right << 9.5, 2.0, 3.0, 10.0, 4.0, 4.5, 1.5, 8.0;
  wrong << 2.0, 3.0, 9.0, 8.0, 10.0, 9.0, 7.0, 6.5;
  const Eigen::VectorXd obs = right * Eigen::Vector2d(0.7, 0.3);
  const auto r = rank_candidates({{"A", problem(right, obs), {}}, {"B", problem(wrong, obs), {}}});
  EXPECT_EQ(r.candidates[0].name, "A");
  EXPECT_GT(r.candidates[0].probability, 0.99);
  EXPECT_EQ(r.confidence, "strong");
  EXPECT_NE(r.verdict.find("confirm it independently"), std::string::npos);
  EXPECT_NEAR(r.candidates[0].contributions.sum(), r.candidates[0].misfit, 1e-12);
}

TEST(Ranking, StudentTErrorsStopOneOutlierFromDeciding) {
  // A matches four couplings exactly but one is off by 4 Hz (8 sigma);
  // B misses all five by 1.6 sigma.
  Eigen::MatrixXd a(5, 1), b(5, 1);
  const Eigen::VectorXd obs = (Eigen::VectorXd(5) << 2, 4, 6, 8, 10).finished();
  a = obs;
  a(4) += 4.0;
  b = obs.array() + 0.8;
  RankOptions gaussian;
  EXPECT_EQ(rank_candidates({{"A", problem(a, obs), {}}, {"B", problem(b, obs), {}}}, gaussian).candidates[0].name, "B");
  RankOptions robust;
  robust.error_model = ErrorModel::StudentT;
  robust.student_nu = 2;
  EXPECT_EQ(rank_candidates({{"A", problem(a, obs), {}}, {"B", problem(b, obs), {}}}, robust).candidates[0].name, "A");
}

TEST(Ranking, EnergiesOverruleAHighEnergyConformer) {
  // B fits only by loading its conformer 2, which lies 6 kcal/mol up; A fits
  // nearly as well with its low-energy conformer.
  Eigen::MatrixXd a(3, 2), b(3, 2);
  const Eigen::Vector3d obs(3.0, 9.0, 5.0);
  a << 3.4, 1.0, 8.6, 2.0, 5.3, 9.0;
  b << 9.0, 3.0, 2.0, 9.0, 1.0, 5.0;
  std::vector<Candidate> c = {{"A", problem(a, obs), {0.0, 1.0}}, {"B", problem(b, obs), {0.0, 6.0}}};
  const auto free_only = rank_candidates({{"A", problem(a, obs), {}}, {"B", problem(b, obs), {}}});
  EXPECT_EQ(free_only.candidates[0].name, "B");
  const auto r = rank_candidates(c);
  EXPECT_EQ(r.candidates[0].name, "A");
  EXPECT_TRUE(r.energies_used);
  EXPECT_TRUE(r.energies_decided);
  EXPECT_NE(r.verdict.find("energies rather than the couplings"), std::string::npos);
  EXPECT_GT(r.candidates[1].prior_penalty, 1.0);
}

TEST(Ranking, NoFreeWinnerIsNamedWhenBothFitFreely) {
  // Both candidates reproduce the couplings exactly at 50:50 populations (free
  // misfit ~0 for both); only the energies separate them (B needs its
  // conformer 2, 3 kcal/mol up, at half the population). The verdict must not
  // name a "free-population winner": there is none.
  Eigen::MatrixXd a(2, 2), b(2, 2);
  const Eigen::Vector2d obs(5.0, 5.0);
  a << 8.0, 2.0, 2.0, 8.0;
  b << 9.0, 1.0, 1.0, 9.0;
  const auto r = rank_candidates({{"A", problem(a, obs), {0.0, 0.3}}, {"B", problem(b, obs), {0.0, 3.0}}});
  ASSERT_EQ(r.candidates[0].name, "A");
  EXPECT_LT(r.candidates[0].free_misfit, 1e-3);
  EXPECT_LT(r.candidates[1].free_misfit, 1e-3);
  EXPECT_TRUE(r.energies_decided);
  EXPECT_EQ(r.verdict.find("fits the couplings best"), std::string::npos) << r.verdict;
  EXPECT_NE(r.verdict.find("energies rather than the couplings"), std::string::npos) << r.verdict;
}

TEST(Ranking, NeedsTwoCandidates) {
  Eigen::MatrixXd a = Eigen::MatrixXd::Constant(2, 1, 5.0);
  EXPECT_THROW(rank_candidates({{"A", problem(a, Eigen::Vector2d(5, 5)), {}}}), Error);
}

TEST(Assignments, PrefersTheAssignmentThatFits) {
  // Two couplings to a diastereotopic pair: measured 2.0 and 9.5 Hz; the
  // structure predicts 9.3 for the first proton and 2.2 for the second.
  Eigen::MatrixXd j(2, 1);
  j << 9.3, 2.2;
  const auto c = compare_assignments({{"as written", problem(j, Eigen::Vector2d(2.0, 9.5))},
                                      {"swapped", problem(j, Eigen::Vector2d(9.5, 2.0))}});
  EXPECT_EQ(c.best, 1);
  EXPECT_GT(c.scores[0].delta_chi2, 100);
  EXPECT_GT(c.scores[1].probability, 0.999);
  EXPECT_NE(c.verdict.find("swapped"), std::string::npos);
}

}  // namespace
}  // namespace vicinal::fit
