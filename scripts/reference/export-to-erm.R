#!/usr/bin/env Rscript
# eRm's RM item difficulties for a long CSV of responses, as plotgauge's export writes it.
#
# Reads a long CSV with a person column (`person` or `attempt_id`), an item column (`item` or
# `item_id`) and `score` (0/1; empty = not scored, skipped), builds the person x item matrix (NA where
# a person did not answer an item), fits eRm's RM (CML) and writes JSON with the item ids, the
# difficulties aligned with plotgauge (difficulty = -betapar, centred to mean 0) and their SEs.
#
# Usage:
#   Rscript scripts/reference/export-to-erm.R responses.csv out.json
#   Rscript scripts/reference/export-to-erm.R [output-dir]
#     (the second form converts every test/reference/export-erm-*.csv to <output-dir>/export-erm-*.json;
#      output-dir defaults to test/reference; check-fixtures.sh uses it)
# Needs Debian's r-base-core and r-cran-erm (no other packages).
suppressPackageStartupMessages(library(eRm))

num <- function(x) ifelse(is.na(x), "null", sprintf("%.12g", x))
json_strings <- function(x) paste0("[", paste0("\"", gsub("\"", "\\\\\"", x), "\"", collapse = ", "), "]")
json_numbers <- function(x) paste0("[", paste(num(x), collapse = ", "), "]")

column_of <- function(header, names, file) {
  hit <- which(tolower(header) %in% names)
  if (length(hit) != 1) stop(sprintf("%s: needs one column named %s", file, paste(names, collapse = " or ")))
  hit
}

convert <- function(csv, out) {
  raw <- read.csv(csv, colClasses = "character", check.names = FALSE, na.strings = character(0))
  header <- names(raw)
  person <- raw[[column_of(header, c("person", "attempt_id"), csv)]]
  item <- raw[[column_of(header, c("item", "item_id"), csv)]]
  score_text <- raw[[column_of(header, "score", csv)]]
  keep <- score_text != ""
  person <- person[keep]
  item <- item[keep]
  score <- as.integer(score_text[keep])
  if (any(!score %in% c(0L, 1L))) stop(sprintf("%s: scores must be 0 or 1", csv))
  persons <- unique(person)
  items <- sort(unique(item))
  X <- matrix(NA_integer_, length(persons), length(items), dimnames = list(persons, items))
  X[cbind(match(person, persons), match(item, items))] <- score
  fit <- RM(X, sum0 = TRUE)
  difficulty <- -fit$betapar
  difficulty <- difficulty - mean(difficulty)
  lines <- c(
    "{",
    sprintf("  \"source\": \"eRm %s RM on %s (difficulty = -betapar, centred)\",",
      as.character(packageVersion("eRm")), basename(csv)),
    sprintf("  \"persons\": %d,", nrow(X)),
    sprintf("  \"responses\": %d,", sum(!is.na(X))),
    sprintf("  \"itemIds\": %s,", json_strings(items)),
    sprintf("  \"difficulty\": %s,", json_numbers(unname(difficulty))),
    sprintf("  \"standardError\": %s,", json_numbers(unname(fit$se.beta))),
    sprintf("  \"logLikelihood\": %s", num(fit$loglik)),
    "}"
  )
  writeLines(lines, out)
}

args <- commandArgs(trailingOnly = TRUE)
if (length(args) == 2) {
  convert(args[1], args[2])
} else {
  out_dir <- if (length(args) == 1) args[1] else "test/reference"
  dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)
  for (csv in Sys.glob("test/reference/export-erm-*.csv")) {
    convert(csv, file.path(out_dir, sub("\\.csv$", ".json", basename(csv))))
  }
}
