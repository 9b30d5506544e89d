# Writes test/reference/pnorm.json: base R's pnorm at a spread of z values, the reference for
# server/scoring/statistics/standard-normal-cdf.ts. Usage: Rscript scripts/reference/normal-cdf.R [outdir]
args <- commandArgs(trailingOnly = TRUE)
out <- if (length(args) >= 1) args[1] else "test/reference"
tail <- c(-8, -5)
z <- c(-3.5, -3, -2.5, -1.96, -1, -0.5, 0, 0.3, 1, 1.6449, 1.96, 2.5, 3, 3.5)
fixture <- list(
  generator = "scripts/reference/normal-cdf.R",
  r_version = as.character(getRversion()),
  z = z,
  p = pnorm(z),
  tail_z = tail,
  tail_p = pnorm(tail)
)
writeLines(jsonlite::toJSON(fixture, digits = 15, auto_unbox = TRUE, pretty = TRUE), file.path(out, "pnorm.json"))
