#!/usr/bin/env Rscript
# Reference fixture for the MML Rasch calibration: lme4::glmer with a random person intercept
# and fixed item effects (a Rasch model with theta ~ N(0, sigma^2)), fitted by adaptive
# Gauss-Hermite quadrature (nAGQ = 20) on a simulated complete data set with a fixed seed.
#
# Usage: Rscript scripts/reference/rasch-lme4.R [output-directory]   (default test/reference)
# Needs Debian's r-base-core and r-cran-lme4 (jsonlite comes with them).
# Writes <output-directory>/lme4-rasch-complete.json with the data, the estimates and the
# R and package versions. glmer's fixed effects are easiness (logit P = beta_i + u_p), so the
# file also carries difficulty = -beta_i, which is on the scale "person mean 0".

suppressPackageStartupMessages({
  library(lme4)
  library(jsonlite)
})

args <- commandArgs(trailingOnly = TRUE)
out_dir <- if (length(args) >= 1) args[[1]] else "test/reference"
dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)

RNGversion("4.2.0")
set.seed(20240611)
n_persons <- 500
n_items <- 10
true_difficulty <- seq(-1.8, 1.8, length.out = n_items)
true_sd <- 1.3
theta <- rnorm(n_persons, 0, true_sd)
p <- plogis(outer(theta, true_difficulty, "-"))
responses <- matrix(rbinom(length(p), 1, p), n_persons, n_items)
colnames(responses) <- sprintf("i%02d", seq_len(n_items))

long <- data.frame(
  person = factor(rep(seq_len(n_persons), times = n_items)),
  item = factor(rep(colnames(responses), each = n_persons), levels = colnames(responses)),
  score = as.vector(responses)
)

# bobyqa for both optimiser stages with a raised evaluation budget: glmer's default second
# stage (Nelder_Mead) stops here with max|grad| about 0.01 and item effects about 1.5e-3 short
# of the optimum; bobyqa reaches it.
control <- glmerControl(optimizer = "bobyqa", optCtrl = list(maxfun = 100000))
fit <- glmer(score ~ 0 + item + (1 | person), data = long, family = binomial, nAGQ = 20,
             control = control)

easiness <- unname(fixef(fit))
person_sd <- unname(attr(VarCorr(fit)$person, "stddev"))
easiness_se <- unname(sqrt(diag(as.matrix(vcov(fit)))))

fixture <- list(
  description = paste(
    "Rasch model as a GLMM: glmer(score ~ 0 + item + (1 | person), family = binomial, nAGQ = 20)",
    "on simulated complete data (set.seed(20240611), 500 persons x 10 items).",
    "difficulty = -easiness; person mean fixed at 0."
  ),
  generatedBy = "scripts/reference/rasch-lme4.R",
  rVersion = R.version.string,
  lme4Version = as.character(packageVersion("lme4")),
  matrixVersion = as.character(packageVersion("Matrix")),
  nAGQ = 20,
  optimizer = paste(fit@optinfo$optimizer, collapse = ","),
  maxAbsGradient = max(abs(fit@optinfo$derivs$gradient)),
  convergenceMessages = as.list(unlist(fit@optinfo$conv$lme4$messages)),
  itemIds = colnames(responses),
  responses = apply(responses, 1, paste, collapse = ""),
  trueDifficulty = true_difficulty,
  trueSd = true_sd,
  easiness = easiness,
  easinessStandardError = easiness_se,
  difficulty = -easiness,
  personSd = person_sd,
  logLikelihood = as.numeric(logLik(fit))
)

path <- file.path(out_dir, "lme4-rasch-complete.json")
writeLines(toJSON(fixture, auto_unbox = TRUE, digits = NA, pretty = TRUE), path)
cat("wrote", path, "\n")
