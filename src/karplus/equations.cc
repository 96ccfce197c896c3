// Forward map dihedral -> J for every form, and the small helpers around it.
#include <fmt/format.h>

#include <cmath>
#include <stdexcept>

#include "core/error.h"
#include "karplus/curve.h"
#include "karplus/karplus.h"

namespace vicinal::karplus {

namespace {

std::size_t expected_coefficients(Form form) {
  switch (form) {
    case Form::ThreeTerm: return 3;
    case Form::PiecewiseThreeTerm: return 6;
    case Form::Haasnoot: return 7;
    case Form::Fourier: return 0;  // any odd count >= 1
  }
  return 0;
}

}  // namespace

std::string form_name(Form form) {
  switch (form) {
    case Form::ThreeTerm: return "three-term";
    case Form::PiecewiseThreeTerm: return "piecewise-three-term";
    case Form::Fourier: return "fourier";
    case Form::Haasnoot: return "haasnoot";
  }
  return "?";
}

Form parse_form(const std::string& name) {
  for (Form f : {Form::ThreeTerm, Form::PiecewiseThreeTerm, Form::Fourier, Form::Haasnoot})
    if (form_name(f) == name) return f;
  throw Error(fmt::format("unknown Karplus form '{}'", name), {},
              "use three-term, piecewise-three-term, fourier or haasnoot");
}

double ParameterSet::beta_factor() const {
  if (form != Form::Haasnoot || coefficients.size() < 7)
    throw Error(fmt::format("set '{}' is not a Haasnoot set and has no beta-substituent factor", id));
  return coefficients[6];
}

double beta_corrected_delta_chi(double delta_chi_alpha, std::span<const double> delta_chi_beta, double p7) {
  double sum = 0;
  for (double d : delta_chi_beta) sum += d;
  return delta_chi_alpha - p7 * sum;
}

namespace detail {

Curve compile(const ParameterSet& set, std::span<const Substituent> substituents) {
  const std::size_t n = set.coefficients.size();
  const std::size_t want = expected_coefficients(set.form);
  const bool count_ok = set.form == Form::Fourier ? n % 2 == 1 : n == want;
  if (!count_ok)
    throw Error(fmt::format("set '{}' has {} coefficients; the {} form needs {}", set.id, n, form_name(set.form),
                            set.form == Form::Fourier ? "an odd number (C0, then C1 S1, C2 S2, ...)"
                                                      : std::to_string(want)));
  if (!substituents.empty() && set.form != Form::Haasnoot)
    throw Error(fmt::format("set '{}' ({} form) takes no substituents", set.id, form_name(set.form)), {},
                "substituents apply to Haasnoot sets only");
  if (substituents.size() > kMaxSubstituents)
    throw Error(fmt::format("{} substituents given; an H-C-C-H fragment has at most {}", substituents.size(),
                            kMaxSubstituents));

  Curve curve;
  curve.form = set.form;
  curve.offset_deg = set.offset_deg;
  if (set.form == Form::Fourier) {
    curve.fourier = set.coefficients;
  } else {
    for (std::size_t i = 0; i < n && i < curve.c.size(); ++i) curve.c[i] = set.coefficients[i];
  }
  if (set.form == Form::Haasnoot) {
    const double p4 = set.coefficients[3], p5 = set.coefficients[4], p6_deg = set.coefficients[5];
    for (const Substituent& s : substituents) {
      if (!std::isfinite(s.delta_chi))
        throw Error("substituent electronegativity difference must be a finite number");
      if (s.orientation != 1 && s.orientation != -1)
        throw Error(fmt::format("substituent orientation must be +1 or -1, not {}", s.orientation));
      const double phase = p6_deg * std::abs(s.delta_chi) * detail::kRadPerDeg;
      const std::size_t i = curve.substituents++;
      curve.sub_constant[i] = s.delta_chi * p4;
      curve.sub_amplitude[i] = s.delta_chi * p5;
      curve.sub_cos_phase[i] = std::cos(phase);
      curve.sub_xi_sin_phase[i] = s.orientation * std::sin(phase);
    }
  }
  return curve;
}

}  // namespace detail

double j_hz(const ParameterSet& set, double dihedral_deg, std::span<const Substituent> substituents) {
  return detail::compile(set, substituents).at_deg(dihedral_deg);
}

void j_hz(const ParameterSet& set, std::span<const double> dihedral_deg, std::span<double> out,
          std::span<const Substituent> substituents) {
  if (out.size() != dihedral_deg.size())
    throw std::invalid_argument("karplus::j_hz: output span size differs from input");
  const detail::Curve curve = detail::compile(set, substituents);
  const double offset = curve.offset_deg;
  const std::size_t n = dihedral_deg.size();
  const double* d = dihedral_deg.data();
  double* o = out.data();
  // One loop per form, so that each body is branch-free straight-line code.
  switch (curve.form) {
    case Form::ThreeTerm: {
      const double a = curve.c[0], b = curve.c[1], c = curve.c[2];
      for (std::size_t i = 0; i < n; ++i) {
        const double x = std::cos((d[i] + offset) * detail::kRadPerDeg);
        o[i] = (a * x + b) * x + c;
      }
      break;
    }
    case Form::PiecewiseThreeTerm: {
      const auto& k = curve.c;
      for (std::size_t i = 0; i < n; ++i) {
        const double x = std::cos((d[i] + offset) * detail::kRadPerDeg);
        const double near = (k[0] * x + k[1]) * x + k[2], far = (k[3] * x + k[4]) * x + k[5];
        o[i] = x >= 0 ? near : far;
      }
      break;
    }
    case Form::Fourier:
      for (std::size_t i = 0; i < n; ++i) {
        const double t = (d[i] + offset) * detail::kRadPerDeg;
        o[i] = curve.fourier_at(std::cos(t), std::sin(t));
      }
      break;
    case Form::Haasnoot:
      for (std::size_t i = 0; i < n; ++i) {
        const double t = (d[i] + offset) * detail::kRadPerDeg;
        o[i] = curve.haasnoot_at(std::cos(t), std::sin(t));
      }
      break;
  }
}

}  // namespace vicinal::karplus
