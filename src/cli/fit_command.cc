// vicinal fit   conformer populations from measured couplings
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/ensemble_fit.h"
#include "cli/fit_inputs.h"
#include "core/error.h"

namespace vicinal::cli {

namespace {

struct FitOptions {
  std::string couplings, ensemble, structure, matrix, labels;
  std::optional<double> sigma_hz, rms_hz;
  EnsembleFitOptions fit;
};

void run_fit(const FitOptions& o, const Globals& g) {
  if (o.matrix.empty() == o.ensemble.empty())
    throw Error("give either --ensemble (with an optional --structure) or --matrix", Location::field_in("", "--ensemble"),
                "--matrix takes a precomputed J matrix CSV, e.g. from `vicinal predict --csv`");
  if (!o.matrix.empty() && o.fit.model != "linear")
    throw Error(fmt::format("the {} model needs dihedral angles, which a J matrix does not carry", o.fit.model),
                Location::field_in("", "--model"), "give --ensemble instead of --matrix");
  const MeasuredCouplings measured = read_measured_couplings(o.couplings, o.sigma_hz);
  if (!o.matrix.empty()) {
    const auto problem = problem_from_matrix(o.matrix, measured, o.fit.set, o.rms_hz);
    report_linear(analyse_linear(problem, o.fit.analysis, g), o.fit, g, Json::object(), "");
    return;
  }
  std::vector<std::string> notes;
  const LoadedEnsemble in = load_ensemble(o.ensemble, o.structure, o.labels, &notes);
  for (const auto& n : notes) g.note("note: " + n);
  fit_ensemble_and_report(in, measured, o.fit, g);
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<FitOptions>();
  auto* c = root.add_subcommand("fit", "Fit conformer populations to measured couplings");
  c->add_option("--couplings", o->couplings, "Couplings CSV: nuclei,j_hz,sigma_hz[,set] ('|' for unassigned nuclei)")
      ->required();
  c->add_option("--ensemble", o->ensemble, "Conformers (multi-conformer SDF, multi-model PDB, multi-frame XYZ)");
  c->add_option("--structure", o->structure, "Structure giving topology and atom labels for the ensemble");
  c->add_option("--labels", o->labels, "Atom labels CSV (label,atom)");
  c->add_option("--matrix", o->matrix,
                "Precomputed J matrix CSV instead of an ensemble: one row per conformer, one column per coupling "
                "named like the couplings' nuclei (the output of `vicinal predict --csv` works)");
  c->add_option("--sigma-hz", o->sigma_hz, "Uncertainty for couplings without a sigma_hz value")
      ->check(CLI::PositiveNumber);
  c->add_option("--rms-hz", o->rms_hz, "Karplus RMS error to add to every coupling with --matrix (default: the set's)")
      ->check(CLI::NonNegativeNumber);
  add_ensemble_fit_options(*c, o->fit);
  c->footer(
      "Example: vicinal fit --couplings couplings.csv --ensemble conformers.sdf --svg populations.svg\n"
      "Minimises chi2 = sum ((J_obs - sum_i w_i J_i) / s)^2 over w_i >= 0, sum w_i = 1, with\n"
      "s = sqrt(sigma^2 + rms^2) (rms: the Karplus set's own error). The optimum is exact (Wolfe's\n"
      "nearest-point algorithm). When conformers outnumber couplings the populations are not unique:\n"
      "the range column gives every value compatible with chi2 <= chi2_min + delta (chi-square,\n"
      "1 degree of freedom, --confidence). Rows whose nuclei share '|' alternatives (e.g.\n"
      "H-5,H-6a|H-6b and H-5,H-6b|H-6a) are fitted under every assignment and compared.\n"
      "J matrix CSV for --matrix (one row per conformer):  title,H-2/H-3,H-3/H-4\n"
      "                                                    chair A,9.6,9.4");
  c->callback([o, &g] { run_fit(*o, g); });
}

const bool registered = register_command(50, setup);

}  // namespace

}  // namespace vicinal::cli
