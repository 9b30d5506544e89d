#!/usr/bin/env Rscript
# Reference fixtures for the Mantel-Haenszel DIF statistics (server/scoring/dif/).
#
#   mantel-haenszel-ucb-admissions.json  base R mantelhaen.test on UCBAdmissions (2 x 2 x 6),
#                                        reference = Male, "correct" = Admitted
#   mantel-haenszel-simulated-dif.json   1000 simulated persons (500 reference N(0,1), 500 focal
#                                        N(-0.5,1)), 20 Rasch items, focal difficulty +0.8 on item 5
#                                        and -0.8 on item 14; per item: mantelhaen.test over
#                                        total-score strata, plus D-DIF, its Robins-Breslow-Greenland
#                                        SE and the ETS class computed here from the formulas
# Usage: Rscript scripts/reference/mantel-haenszel.R [output-dir]
# Needs only Debian's r-base-core (UCBAdmissions ships with R's datasets package).
args <- commandArgs(trailingOnly = TRUE)
out_dir <- if (length(args) >= 1) args[1] else "test/reference"
dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)

source(file.path(dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE))), "json-writer.R"))
versions <- list(R = R.version.string)

# D-DIF, RBG SE and ETS class from the formulas (an implementation independent of the TS code).
# tab: 2 x 2 x K with [group (reference, focal), answer (correct, wrong), stratum].
mh_summary <- function(tab) {
  A <- tab[1, 1, ]; B <- tab[1, 2, ]; C <- tab[2, 1, ]; D <- tab[2, 2, ]; N <- A + B + C + D
  R <- A * D / N; S <- B * C / N; P <- (A + D) / N; Q <- (B + C) / N
  alpha <- sum(R) / sum(S)
  var_log <- sum(P * R) / (2 * sum(R)^2) + sum(P * S + Q * R) / (2 * sum(R) * sum(S)) +
    sum(Q * S) / (2 * sum(S)^2)
  d <- -2.35 * log(alpha)
  se <- 2.35 * sqrt(var_log)
  corrected <- mantelhaen.test(tab, correct = TRUE)
  plain <- mantelhaen.test(tab, correct = FALSE)
  significant <- corrected$p.value < 0.05
  large <- abs(d) >= 1.5 && (abs(d) - 1) / se > qnorm(0.95)
  class <- if (abs(d) < 1 || !significant) "A" else if (large) "C" else "B"
  if (class != "A") class <- paste0(class, if (d > 0) "+" else "-")
  list(
    alpha = unname(corrected$estimate),
    confidenceInterval = arr(unname(corrected$conf.int)),
    chiSquaredCorrected = unname(corrected$statistic), pValueCorrected = corrected$p.value,
    chiSquared = unname(plain$statistic), pValue = plain$p.value,
    dDif = d, dDifStandardError = se, logAlphaStandardError = sqrt(var_log), etsClass = class
  )
}

# --- UCBAdmissions: dimnames Admit x Gender x Dept; rearrange to Gender x Admit x Dept ---
ucb <- aperm(UCBAdmissions, c(2, 1, 3))
stopifnot(dimnames(ucb)$Gender[1] == "Male", dimnames(ucb)$Admit[1] == "Admitted")
ucb_result <- mh_summary(ucb)
first <- ucb[, , 1]
ucb_result$strataOddsRatioFirst <- (first[1, 1] * first[2, 2]) / (first[1, 2] * first[2, 1])
strata <- lapply(seq_len(dim(ucb)[3]), function(k) arr(as.numeric(ucb[, , k])[c(1, 3, 2, 4)]))
writeLines(json(list(
  description = "UCBAdmissions, reference = Male, correct = Admitted; strata = departments A-F",
  generator = "scripts/reference/mantel-haenszel.R", versions = versions,
  strataOrder = "each stratum is [reference correct, reference wrong, focal correct, focal wrong]",
  strata = strata, result = ucb_result
)), file.path(out_dir, "mantel-haenszel-ucb-admissions.json"))

# --- simulated DIF ---
set.seed(20240807)
n_items <- 20
difficulty <- seq(-1.8, 1.8, length.out = n_items)
shift <- rep(0, n_items); shift[5] <- 0.8; shift[14] <- -0.8
group <- rep(c(0, 1), each = 500) # 0 reference, 1 focal
theta <- rnorm(1000, mean = ifelse(group == 1, -0.5, 0))
X <- matrix(0, 1000, n_items)
for (i in seq_len(n_items)) {
  b <- difficulty[i] + shift[i] * group
  X[, i] <- as.numeric(runif(1000) < plogis(theta - b))
}
total <- rowSums(X)
items <- lapply(seq_len(n_items), function(i) {
  # strata = total score including the studied item; mantelhaen.test needs > 1 person per stratum
  tab <- table(factor(group, levels = c(0, 1)), factor(1 - X[, i], levels = c(0, 1)), total)
  tab <- tab[, , apply(tab, 3, sum) > 1, drop = FALSE]
  mh_summary(tab)
})
writeLines(json(list(
  description = paste("set.seed(20240807); 500 reference N(0,1) and 500 focal N(-0.5,1) persons,",
    "20 Rasch items from -1.8 to 1.8; focal difficulty +0.8 on item 5 (I05), -0.8 on item 14 (I14)"),
  generator = "scripts/reference/mantel-haenszel.R", versions = versions,
  itemIds = arr(sprintf("I%02d", seq_len(n_items))),
  groups = arr(group),
  rows = arr(apply(X, 1, paste, collapse = "")),
  strata = "total score including the studied item; strata with fewer than two persons dropped",
  items = items
)), file.path(out_dir, "mantel-haenszel-simulated-dif.json"))
cat("wrote mantel-haenszel fixtures to", out_dir, "\n")
