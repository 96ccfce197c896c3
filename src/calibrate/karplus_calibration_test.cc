#include "calibrate/karplus_calibration.h"

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <random>

#include <unistd.h>

#include "calibrate/self_consistent.h"
#include "core/error.h"
#include "core/json_file.h"

namespace vicinal::calibrate {
namespace {

// Synthetic data from a known three-term curve, angles spread over the whole
// circle, normal noise of sigma from a seeded generator. The coefficients are
// arbitrary test values, not a published set.
std::vector<CalibrationPoint> synthetic(double a, double b, double c, double sigma, int n, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> noise(0.0, sigma);
  std::vector<CalibrationPoint> out;
  for (int i = 0; i < n; ++i) {
    const double angle = -180.0 + 360.0 * (i + 0.5) / n;
    const double x = std::cos(angle * M_PI / 180);
    out.push_back({a * x * x + b * x + c + noise(rng), sigma, angle, i + 2});
  }
  return out;
}

TEST(Calibration, RecoversKnownThreeTermCoefficients) {
  const auto points = synthetic(7.0, -1.4, 1.7, 0.3, 80, 42);
  const Calibration fit = calibrate(points, {});
  ASSERT_EQ(fit.coefficients.size(), 3u);
  const double truth[] = {7.0, -1.4, 1.7};
  for (int i = 0; i < 3; ++i) {
    EXPECT_NEAR(fit.coefficients[i], truth[i], 4 * fit.sd[i]) << fit.names[i];
    EXPECT_LT(fit.sd[i], 0.2);
  }
  // With the noise as stated, reduced chi^2 is near 1.
  EXPECT_NEAR(fit.stats.reduced_chi2, 1.0, 4 * std::sqrt(2.0 / 77));  // four sd of chi^2/77
  EXPECT_NEAR(fit.stats.rmsd_hz, 0.3, 0.08);
}

TEST(Calibration, FourierOfOrderTwoEqualsTheThreeTermCurve) {
  // A cos^2 t + B cos t + C = (A/2 + C) + B cos t + (A/2) cos 2t: an identity
  // (common practice, no source), so noise-free three-term data give these
  // Fourier coefficients exactly.
  const auto points = synthetic(9.0, -1.0, 0.5, 0.2, 36, 1);
  auto exact = points;
  for (auto& p : exact) {
    const double x = std::cos(p.dihedral_deg * M_PI / 180);
    p.j_hz = 9.0 * x * x - 1.0 * x + 0.5;
  }
  CalibrationOptions o;
  o.form = karplus::Form::Fourier;
  o.fourier_order = 2;
  const Calibration fit = calibrate(exact, o);
  ASSERT_EQ(fit.names, (std::vector<std::string>{"C0", "C1", "S1", "C2", "S2"}));
  EXPECT_NEAR(fit.coefficients[0], 5.0, 1e-6);
  EXPECT_NEAR(fit.coefficients[1], -1.0, 1e-6);
  EXPECT_NEAR(fit.coefficients[2], 0.0, 1e-6);
  EXPECT_NEAR(fit.coefficients[3], 4.5, 1e-6);
  EXPECT_NEAR(fit.coefficients[4], 0.0, 1e-6);
}

TEST(Calibration, OffsetShiftsTheAngle) {
  // Data generated at theta = phi - 60 are fitted exactly with offset -60.
  auto points = synthetic(6.5, -1.8, 1.6, 0.1, 40, 3);
  for (auto& p : points) {
    const double x = std::cos((p.dihedral_deg - 60) * M_PI / 180);
    p.j_hz = 6.5 * x * x - 1.8 * x + 1.6;
  }
  CalibrationOptions o;
  o.offset_deg = -60;
  const Calibration fit = calibrate(points, o);
  EXPECT_NEAR(fit.coefficients[0], 6.5, 1e-6);
  EXPECT_NEAR(fit.coefficients[1], -1.8, 1e-6);
  EXPECT_LT(fit.stats.chi2, 1e-8);
}

TEST(Calibration, RobustLossesResistOutliers) {
  auto points = synthetic(7.0, -1.4, 1.7, 0.3, 60, 7);
  for (int i : {5, 20, 41}) points[i].j_hz += 8.0;  // three gross outliers
  const double plain = std::fabs(calibrate(points, {}).coefficients[2] - 1.7);
  for (Loss loss : {Loss::Huber, Loss::Cauchy}) {
    CalibrationOptions o;
    o.loss = loss;
    const double robust = std::fabs(calibrate(points, o).coefficients[2] - 1.7);
    EXPECT_LT(robust, plain) << loss_name(loss);
  }
}

TEST(Calibration, BootstrapIsReproducibleWithASeed) {
  const auto points = synthetic(7.0, -1.4, 1.7, 0.3, 50, 9);
  const auto a = bootstrap(points, {}, 60, 5);
  const auto b = bootstrap(points, {}, 60, 5);
  const auto c = bootstrap(points, {}, 60, 6);
  EXPECT_EQ(a.low, b.low);
  EXPECT_EQ(a.high, b.high);
  EXPECT_NE(a.low, c.low);
  const Calibration fit = calibrate(points, {});
  for (int i = 0; i < 3; ++i) {
    EXPECT_LT(a.low[i], fit.coefficients[i]);
    EXPECT_GT(a.high[i], fit.coefficients[i]);
    // Resampling and the covariance estimate the same spread to within a factor of two.
    EXPECT_GT(a.sd[i], 0.5 * fit.sd[i]);
    EXPECT_LT(a.sd[i], 2.0 * fit.sd[i]);
  }
}

TEST(Calibration, TooFewPointsAndBadCsv) {
  EXPECT_THROW(calibrate(synthetic(7, -1, 1, 0.3, 3, 1), {}), Error);
  try {
    parse_calibration_points("j_hz,sigma_hz,dihedral_deg\n5,0.3,60\n5,0.3,sixty\n", "p.csv");
    FAIL();
  } catch (const Error& e) {
    EXPECT_EQ(e.where().line, 3);
    EXPECT_EQ(e.where().field, "dihedral_deg");
  }
  EXPECT_THROW(parse_calibration_points("j_hz,sigma_hz,dihedral_deg\n5,0,60\n", "p.csv"), Error);
  EXPECT_THROW(parse_calibration_points("j_hz,dihedral_deg\n5,60\n", "p.csv"), Error);
}

TEST(SelfConsistent, RecoversCoefficientsAndAngles) {
  // Three coupling types on one angle (3J(HN,HA), 3J(HN,C'), 3J(HN,CB), the
  // classic trio on phi) with the coefficients of shipped sets as the truth;
  // the fit starts from coefficients 15 % off and no starting angles.
  const auto& catalog = karplus::SetCatalog::shipped();
  std::vector<karplus::ParameterSet> truth;
  for (const char* id : {"hn-ha-vuister-bax-1993", "hn-co-hu-bax-1997", "hn-cb-hu-bax-1997"})
    truth.push_back(catalog.find(id));
    // The starting sets: the same files with every coefficient 15 % off.
  const auto folder = std::filesystem::temp_directory_path() / ("calibrate-test-" + std::to_string(::getpid()));
  std::filesystem::create_directories(folder);
  for (const auto& t : truth) {
    Json doc = read_json_file(t.file);
    for (auto& [name, value] : doc["coefficients"].items()) value = value.get<double>() * 1.15;
    std::ofstream(folder / (t.id + ".json")) << doc.dump();
  }
  const karplus::SetCatalog start = karplus::SetCatalog::load_directory(folder.string());
  std::filesystem::remove_all(folder);
  std::mt19937_64 rng(3);
  std::uniform_real_distribution<double> angle(-170.0, -50.0);
  std::normal_distribution<double> noise(0.0, 0.1);
  std::vector<SiteCoupling> rows;
  std::vector<double> angles;
  for (int s = 0; s < 30; ++s) {
    const double phi = s < 24 ? angle(rng) : 50.0 + 5.0 * (s - 24);  // a few positive-phi sites
    angles.push_back(phi);
    for (const auto& t : truth)
      rows.push_back({"site" + std::to_string(s), t.id, karplus::j_hz(t, phi) + noise(rng), 0.1, 0.0, false, 2});
  }
  const auto fit = fit_self_consistent(rows, start, Loss::Squared, 2.0);
  EXPECT_NE(fit.types[0].coefficients[0], truth[0].coefficients[0]);  // really started elsewhere
  for (std::size_t t = 0; t < truth.size(); ++t)
    for (int i = 0; i < 3; ++i)
      EXPECT_NEAR(fit.coefficients[t][i], truth[t].coefficients[i], 0.3) << truth[t].id << " " << i;
  int close = 0;
  for (std::size_t s = 0; s < angles.size(); ++s) {
    close += std::fabs(fit.angle_deg[s] - angles[s]) < 5.0;
  }
  EXPECT_GE(close, 27);  // a site may land on a mirror solution
}

}  // namespace
}  // namespace vicinal::calibrate
