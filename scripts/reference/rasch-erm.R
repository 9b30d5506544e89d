#!/usr/bin/env Rscript
# Reference fixtures for the Rasch engine (server/scoring/rasch/).
#
# Fits eRm's RM, person.parameter, itemfit, personfit, SepRel and LRtest, and a fully converged
# CML reference from psychotools::raschmodel (reltol = 1e-16) whose gradient is recomputed here
# from psychotools' elementary symmetric functions and stored, on:
#   raschdat1            eRm's bundled 100 x 30 data
#   raschdat1-missing    the same with cells set missing by a fixed rule
#   simulated-complete   sim.rasch, 500 x 20, fixed seed
#   simulated-booklets   600 persons, 24 items, 6 rotated booklets of 8 items, fixed seed
# The data are stored in each fixture (rows of 0/1 with "." for missing) so the tests read
# exactly what R saw. Usage: Rscript scripts/reference/rasch-erm.R [output-dir]
# Needs Debian's r-base-core, r-cran-erm and r-cran-psychotools (no other packages).
suppressPackageStartupMessages({
  library(eRm)
  library(psychotools)
})

args <- commandArgs(trailingOnly = TRUE)
out_dir <- if (length(args) >= 1) args[1] else "test/reference"
dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)

source(file.path(dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE))), "json-writer.R"))

rows_of <- function(X) {
  apply(X, 1, function(r) paste(ifelse(is.na(r), ".", as.character(r)), collapse = ""))
}

# Elementary symmetric functions by the summation algorithm, in base R (independent of the TS code).
esf_sum <- function(eps) {
  g <- c(1, rep(0, length(eps)))
  for (k in seq_along(eps)) g[2:(k + 1)] <- g[2:(k + 1)] + eps[k] * g[1:k]
  g
}

# CML gradient d logL / d b_i (difficulty) = E_i - s_i over the persons with non-extreme scores,
# per missing pattern, E_i = sum_r n_r eps_i gamma^(i)_{r-1} / gamma_r. Difficulties are centred,
# so the gammas stay in range for these small sets.
cml_gradient <- function(X, difficulty) {
  eps <- exp(-difficulty)
  pattern <- apply(is.na(X), 1, function(r) paste(as.integer(r), collapse = ""))
  grad <- rep(0, ncol(X))
  for (pat in unique(pattern)) {
    rows <- which(pattern == pat)
    items <- which(!is.na(X[rows[1], ]))
    Xp <- X[rows, items, drop = FALSE]
    r <- rowSums(Xp)
    keep <- r > 0 & r < length(items)
    if (!any(keep)) next
    grad[items] <- grad[items] - colSums(Xp[keep, , drop = FALSE])
    counts <- tabulate(r[keep], nbins = length(items))
    g <- esf_sum(eps[items])
    for (j in seq_along(items)) {
      gi <- esf_sum(eps[items][-j])
      for (s in seq_along(counts)) {
        if (counts[s] == 0) next
        grad[items[j]] <- grad[items[j]] + counts[s] * eps[items[j]] * gi[s] / g[s + 1]
      }
    }
  }
  grad
}

fixture <- function(name, X, description) {
  cat("fitting", name, "\n")
  storage.mode(X) <- "double"
  colnames(X) <- sprintf("I%02d", seq_len(ncol(X)))
  fit <- RM(X, se = TRUE, sum0 = TRUE)
  # eRm reports easiness beta with sum zero; difficulty = -beta keeps the sum at zero.
  erm_difficulty <- -unname(fit$betapar)
  erm_se <- unname(fit$se.beta)

  ref <- raschmodel(X, reltol = 1e-16, gradtol = 1e-16, maxit = 1000L, iterlim = 1000L, hessian = TRUE)
  full <- c(0, unname(coef(ref))) # psychotools fixes item 1 at 0 (difficulty)
  centred <- full - mean(full)
  k <- length(full)
  V <- matrix(0, k, k)
  V[-1, -1] <- vcov(ref)
  A <- diag(k) - matrix(1 / k, k, k)
  ref_se <- sqrt(diag(A %*% V %*% t(A)))
  grad <- cml_gradient(X, centred)
  cat("  psychotools max |gradient| =", format(max(abs(grad)), digits = 3), "\n")
  cat("  eRm vs converged max |diff| =", format(max(abs(erm_difficulty - centred)), digits = 3), "\n")

  pp <- person.parameter(fit)
  raw <- rowSums(X, na.rm = TRUE)
  answered <- rowSums(!is.na(X))
  theta <- unname(coef(pp))
  extreme <- raw == 0 | raw == answered
  se_all <- unlist(pp$se.theta)
  names(se_all) <- sub("^NAgroup[0-9]+\\.", "", names(se_all))
  person_se <- unname(se_all[rownames(X)])
  if (is.null(rownames(X))) person_se <- unname(se_all[paste0("P", seq_len(nrow(X)))])

  ifit <- itemfit(pp)
  pfit <- personfit(pp)
  sep <- SepRel(pp)
  lr <- LRtest(fit, splitcr = "median", se = FALSE)

  result <- list(
    description = description,
    generator = "scripts/reference/rasch-erm.R",
    versions = list(R = R.version.string, eRm = as.character(packageVersion("eRm")),
      psychotools = as.character(packageVersion("psychotools"))),
    itemIds = arr(colnames(X)),
    rows = arr(rows_of(X)),
    erm = list(
      difficulty = arr(erm_difficulty),
      standardError = arr(erm_se),
      logLikelihood = fit$loglik,
      iterations = fit$iter
    ),
    converged = list(
      source = "psychotools::raschmodel reltol=1e-16, centred; SE by the centring transform of vcov",
      difficulty = arr(centred),
      standardError = arr(ref_se),
      logLikelihood = as.numeric(logLik(ref)),
      maxAbsGradient = max(abs(grad))
    ),
    persons = list(
      note = "eRm person.parameter MLE on eRm's difficulties; extreme scores left out",
      rawScore = arr(raw[!extreme]),
      theta = arr(theta[!extreme]),
      standardError = arr(person_se[!extreme])
    ),
    separation = list(reliability = sep$sep.rel, observedVariance = sep$SSD.PS, meanSquaredError = sep$MSE),
    likelihoodRatio = list(split = "median", statistic = lr$LR, df = lr$df, pValue = lr$pvalue)
  )
  if (!any(is.na(X))) {
    kept <- !extreme
    result$itemFit <- list(
      note = "eRm itemfit on person.parameter; persons with extreme scores excluded",
      outfit = arr(unname(ifit$i.outfitMSQ)), infit = arr(unname(ifit$i.infitMSQ)),
      outfitZ = arr(unname(ifit$i.outfitZ)), infitZ = arr(unname(ifit$i.infitZ))
    )
    result$personFit <- list(
      note = "eRm personfit, persons in the order of rows with extreme scores left out",
      outfit = arr(unname(pfit$p.outfitMSQ)), infit = arr(unname(pfit$p.infitMSQ)),
      outfitZ = arr(unname(pfit$p.outfitZ)), infitZ = arr(unname(pfit$p.infitZ))
    )
    stopifnot(length(pfit$p.outfitMSQ) == sum(kept))
  }
  path <- file.path(out_dir, paste0("erm-", name, ".json"))
  writeLines(json(result), path)
  cat("  wrote", path, "\n")
}

data("raschdat1", package = "eRm")
X1 <- as.matrix(raschdat1)
rownames(X1) <- paste0("P", seq_len(nrow(X1)))
fixture("raschdat1", X1, "eRm's bundled raschdat1 (100 persons x 30 items), complete")

X1m <- X1
X1m[seq(1, 100, by = 3), 1:4] <- NA
X1m[seq(2, 100, by = 5), 26:30] <- NA
fixture("raschdat1-missing", X1m,
  "raschdat1 with items 1-4 missing for persons 1,4,7,... and items 26-30 for persons 2,7,12,...")

set.seed(20240611)
Xs <- sim.rasch(persons = rnorm(500), items = seq(-2, 2, length.out = 20))
rownames(Xs) <- paste0("P", seq_len(nrow(Xs)))
fixture("simulated-complete", Xs, "sim.rasch, set.seed(20240611), 500 N(0,1) persons, 20 items from -2 to 2")

set.seed(20240612)
n_items <- 24
truth <- seq(-2.3, 2.3, length.out = n_items)
n_persons <- 600
theta <- rnorm(n_persons)
Xb <- matrix(NA_real_, n_persons, n_items)
for (p in seq_len(n_persons)) {
  booklet <- (p - 1) %% 6 # block k = items 4k+1..4k+4; booklet k takes blocks k and k+1 (mod 6)
  items <- c(4 * booklet + 1:4, 4 * ((booklet + 1) %% 6) + 1:4)
  Xb[p, items] <- as.numeric(runif(8) < plogis(theta[p] - truth[items]))
}
rownames(Xb) <- paste0("P", seq_len(n_persons))
fixture("simulated-booklets", Xb,
  "set.seed(20240612); 600 N(0,1) persons; 24 items from -2.3 to 2.3 in 6 blocks of 4; person p takes booklet (p-1) mod 6 = blocks k and k+1 mod 6")
