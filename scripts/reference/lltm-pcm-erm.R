#!/usr/bin/env Rscript
# Reference fixtures for the LLTM and the partial credit model (server/scoring/rasch/calibrate-lltm.ts,
# calibrate-pcm.ts), from eRm's LLTM, RM and PCM (CML):
#   lltm-lltmdat1.json    eRm's lltmdat1 (100 x 30), LLTM(mpoints = 2) with eRm's generated W
#   lltm-lltmdat2.json    eRm's lltmdat2 (15 x 5) with the 5 x 2 W of eRm's help page
#   lltm-simulated.json   600 simulated persons, 12 items from three design features, fixed seed
#   pcm-pcmdat.json       eRm's pcmdat (20 x 7, categories 0..3)
#   pcm-pcmdat2.json      eRm's pcmdat2 (300 x 4, categories 0..2)
#   pcm-simulated-mixed.json  500 simulated persons: 8 dichotomous items and 3 items scored 0/1/2
# Each fixture stores the data (rows of digits) so the tests read exactly what eRm saw.
# eRm parametrises easiness: LLTM betapar = W %*% etapar with P(X = 1) = plogis(theta + beta), so
# the difficulty weights are -etapar; PCM betapar are cumulative category easinesses
# beta_ih = -(delta_i1 + ... + delta_ih), and thresholds() gives the step difficulties delta_ih.
# Usage: Rscript scripts/reference/lltm-pcm-erm.R [output-dir]
# Needs Debian's r-base-core and r-cran-erm.
suppressPackageStartupMessages(library(eRm))
args <- commandArgs(trailingOnly = TRUE)
out_dir <- if (length(args) >= 1) args[1] else "test/reference"
dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)

source(file.path(dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE))), "json-writer.R"))
versions <- list(R = R.version.string, eRm = as.character(packageVersion("eRm")))
rows_of <- function(X) apply(X, 1, paste, collapse = "")
write_fixture <- function(name, x) {
  path <- file.path(out_dir, paste0(name, ".json"))
  writeLines(json(x), path)
  cat("wrote", path, "\n")
}

lltm_fixture <- function(name, X, W, description, fit) {
  X <- as.matrix(X)
  rasch <- RM(X)
  lr <- anova(rasch, fit)
  stat <- 2 * (rasch$loglik - fit$loglik)
  stopifnot(abs(stat - (lr$statistics$dev[2] - lr$statistics$dev[1])) < 1e-9)
  write_fixture(paste0("lltm-", name), list(
    description = description,
    generator = "scripts/reference/lltm-pcm-erm.R", versions = versions,
    rows = arr(rows_of(X)),
    design = lapply(seq_len(nrow(W)), function(i) arr(unname(W[i, ]))),
    erm = list(
      note = "easiness: betapar = W %*% etapar; difficulty weights are -etapar",
      etapar = arr(unname(fit$etapar)), seEta = arr(unname(fit$se.eta)),
      betapar = arr(unname(fit$betapar)), logLikelihood = fit$loglik, npar = fit$npar
    ),
    rasch = list(logLikelihood = rasch$loglik, npar = rasch$npar,
      difficulty = arr(-unname(rasch$betapar))),
    likelihoodRatio = list(
      note = paste("statistic = 2 (logL_RM - logL_LLTM), the deviance difference; eRm 1.0-2 anova.eRm",
        "prints |logL_RM - logL_LLTM| as LR (no factor 2) and takes its p-value from that"),
      statistic = stat, df = lr$statistics$df[2],
      pValue = pchisq(stat, lr$statistics$df[2], lower.tail = FALSE),
      ermAnovaLR = lr$statistics$LR[2], ermAnovaPValue = lr$statistics$p[2])
  ))
}

fit1 <- LLTM(lltmdat1, mpoints = 2)
lltm_fixture("lltmdat1", lltmdat1, fit1$W,
  "eRm lltmdat1 (100 persons, 15 items at 2 time points), LLTM(mpoints = 2) with eRm's generated W", fit1)

W2 <- matrix(c(1, 2, 1, 3, 2, 2, 2, 1, 1, 1), ncol = 2)
fit2 <- LLTM(lltmdat2, W2)
lltm_fixture("lltmdat2", lltmdat2, W2, "eRm lltmdat2 (15 x 5) with the W of eRm's LLTM help page", fit2)

set.seed(20240808)
marks <- rep(1:4, 3)
legend <- rep(c(0, 1), each = 6)
log_axis <- rep(c(0, 0, 1), 4)
Ws <- cbind(marks, legend, log_axis)
truth <- 0.45 * marks + 0.7 * legend + 0.5 * log_axis + rnorm(12, 0, 0.15)
truth <- truth - mean(truth)
theta <- rnorm(600)
Xs <- matrix(as.numeric(runif(600 * 12) < plogis(outer(theta, truth, "-"))), 600, 12)
fits <- LLTM(Xs, Ws)
lltm_fixture("simulated", Xs, Ws, paste("set.seed(20240808); 600 N(0,1) persons; 12 items,",
  "difficulty 0.45 marks + 0.7 legend + 0.5 log axis + N(0, 0.15) residual, centred"), fits)

pcm_fixture <- function(name, X, description) {
  X <- as.matrix(X)
  fit <- PCM(X)
  th <- thresholds(fit)$threshtable[[1]]
  # eRm's person MLE per raw score (complete data: one theta per score), extreme scores left out
  pp <- person.parameter(fit)
  raw <- rowSums(X)
  theta <- unname(coef(pp))
  inner <- raw > 0 & raw < sum(apply(X, 2, max))
  scores <- sort(unique(raw[inner]))
  person_theta <- vapply(scores, function(r) theta[which(inner & raw == r)[1]], 0)
  steps <- lapply(seq_len(nrow(th)), function(i) arr(unname(th[i, -1][!is.na(th[i, -1])])))
  write_fixture(paste0("pcm-", name), list(
    description = description,
    generator = "scripts/reference/lltm-pcm-erm.R", versions = versions,
    rows = arr(rows_of(X)),
    erm = list(
      note = "betapar: cumulative category easiness beta_ih = -(delta_i1 + ... + delta_ih); steps from thresholds()",
      betapar = arr(unname(fit$betapar)), seBeta = arr(unname(fit$se.beta)),
      steps = steps, location = arr(unname(th[, 1])), logLikelihood = fit$loglik, npar = fit$npar
    ),
    persons = list(note = "eRm person.parameter MLE on eRm's item parameters, one per non-extreme raw score",
      rawScore = arr(scores), theta = arr(person_theta))
  ))
}
pcm_fixture("pcmdat", pcmdat, "eRm pcmdat (20 persons x 7 items, categories 0..3)")
pcm_fixture("pcmdat2", pcmdat2, "eRm pcmdat2 (300 persons x 4 items, categories 0..2)")

set.seed(20240809)
n <- 500
theta <- rnorm(n)
dich <- seq(-1.5, 1.5, length.out = 8)
Xm <- matrix(0, n, 11)
for (i in 1:8) Xm[, i] <- as.numeric(runif(n) < plogis(theta - dich[i]))
step_sets <- list(c(-1, 0.5), c(-0.3, 0.4), c(0.2, 1.2))
for (k in 1:3) {
  d <- step_sets[[k]]
  num_ <- cbind(0, theta - d[1], 2 * theta - d[1] - d[2])
  p <- exp(num_) / rowSums(exp(num_))
  u <- runif(n)
  Xm[, 8 + k] <- (u > p[, 1]) + (u > p[, 1] + p[, 2])
}
pcm_fixture("simulated-mixed", Xm, paste("set.seed(20240809); 500 N(0,1) persons; 8 Rasch items from -1.5 to 1.5",
  "and 3 partial credit items with steps (-1, 0.5), (-0.3, 0.4), (0.2, 1.2)"))
