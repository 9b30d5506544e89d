#!/usr/bin/env Rscript
# Reference fixtures for Cohen's weighted kappa (server/scoring/agreement/weighted-kappa.ts).
#
# Kappa and its two large-sample variances (Fleiss, Cohen & Everitt 1969: the variance for
# confidence intervals and the variance under the null hypothesis of chance agreement) are computed
# here in base R from the formulas; psych::cohen.kappa (an independent implementation) must agree
# on the weighted and unweighted kappa and on the unweighted variance (see check_psych):
#   kappa-cohen-1968.json   Cohen (1968)'s 3 x 3 table of proportions (n = 200) with his
#                           disagreement weights (0,1,3 / 1,0,6 / 3,6,0), as transcribed in psych's
#                           help page, which says "cohen reports .492 and .348"
#   kappa-simulated.json    300 invented answers scored 0/1/2 by two raters, fixed seed; linear
#                           and quadratic weights
# Usage: Rscript scripts/reference/weighted-kappa.R [output-dir]
# Needs r-base-core and psych (Debian r-cran-psych).
suppressPackageStartupMessages(library(psych))
args <- commandArgs(trailingOnly = TRUE)
out_dir <- if (length(args) >= 1) args[1] else "test/reference"
dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)
source(file.path(dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE))), "json-writer.R"))
versions <- list(R = R.version.string, psych = as.character(packageVersion("psych")))
rows <- function(m) lapply(seq_len(nrow(m)), function(i) arr(unname(m[i, ])))

# counts: k x k table (rater 1 in rows); w: agreement weights (1 on the diagonal)
kappa_formula <- function(counts, w) {
  n <- sum(counts)
  p <- counts / n
  r <- rowSums(p); cc <- colSums(p)
  po <- sum(w * p); pe <- sum(w * outer(r, cc))
  kappa <- (po - pe) / (1 - pe)
  wr <- as.vector(w %*% cc) # w̄_i. = Σ_j p_.j w_ij
  wc <- as.vector(t(w) %*% r) # w̄_.j = Σ_i p_i. w_ij
  spread <- outer(wr, wc, "+")
  var1 <- (sum(p * (w * (1 - pe) - spread * (1 - po))^2) - (po * pe - 2 * pe + po)^2) / (n * (1 - pe)^4)
  var0 <- (sum(outer(r, cc) * (w - spread)^2) - pe^2) / (n * (1 - pe)^2)
  list(kappa = kappa, variance = var1, nullVariance = var0, observed = po, expected = pe)
}
check_psych <- function(counts, w, ours) {
  ck <- cohen.kappa(counts, w, n.obs = sum(counts))
  plain <- kappa_formula(counts, diag(nrow(counts)))
  # psych agrees on both kappas and on the unweighted variance; its weighted variance builds the
  # weighted marginal means by R's column recycling (rowSums(w * rs) = rs_i * sum_j w_ij), which is
  # not the Fleiss-Cohen-Everitt w-bar_i. = sum_j p_.j w_ij, so it is not used as a reference.
  stopifnot(abs(ck$weighted.kappa - ours$kappa) < 1e-12, abs(ck$kappa - plain$kappa) < 1e-12,
    abs(ck$var.kappa - plain$variance) < 1e-12)
  list(weightedKappa = ck$weighted.kappa, kappa = ck$kappa, varianceUnweighted = ck$var.kappa)
}

cohen <- matrix(c(0.44, 0.07, 0.09, 0.05, 0.20, 0.05, 0.01, 0.03, 0.06), ncol = 3, byrow = TRUE) * 200
disagreement <- matrix(c(0, 1, 3, 1, 0, 6, 3, 6, 0), ncol = 3)
agreement <- 1 - disagreement / max(disagreement)
ours <- kappa_formula(cohen, agreement)
unweighted <- kappa_formula(cohen, diag(3))
writeLines(json(list(
  description = "Cohen (1968) table of proportions x 200 with his disagreement weights",
  generator = "scripts/reference/weighted-kappa.R", versions = versions,
  counts = rows(cohen), disagreementWeights = rows(disagreement),
  weighted = ours, unweighted = unweighted, psych = check_psych(cohen, agreement, ours)
)), file.path(out_dir, "kappa-cohen-1968.json"))

set.seed(20240810)
truth <- sample(0:2, 300, replace = TRUE, prob = c(0.3, 0.45, 0.25))
noisy <- function() pmin(2, pmax(0, truth + sample(c(-1, 0, 1), 300, replace = TRUE, prob = c(0.15, 0.7, 0.15))))
first <- noisy(); second <- noisy()
counts <- table(factor(first, 0:2), factor(second, 0:2))
linear <- 1 - abs(outer(0:2, 0:2, "-")) / 2
quadratic <- 1 - (outer(0:2, 0:2, "-") / 2)^2
lin <- kappa_formula(counts, linear)
quad <- kappa_formula(counts, quadratic)
writeLines(json(list(
  description = "set.seed(20240810); 300 invented answers, true score 0/1/2, each rater off by one with probability 0.3",
  generator = "scripts/reference/weighted-kappa.R", versions = versions,
  first = arr(first), second = arr(second), counts = rows(matrix(counts, 3)),
  linear = lin, quadratic = quad,
  psychLinear = check_psych(matrix(counts, 3), linear, lin),
  psychQuadratic = check_psych(matrix(counts, 3), quadratic, quad)
)), file.path(out_dir, "kappa-simulated.json"))
cat("wrote kappa fixtures to", out_dir, "\n")
