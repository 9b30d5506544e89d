# A minimal JSON writer shared by the fixture scripts here (jsonlite is not in every Debian set we
# install). Sourced by each script with:
#   source(file.path(dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE))), "json-writer.R"))
# Numbers are written to 12 significant digits; NA becomes null and infinities the strings
# "Infinity" / "-Infinity". A vector of length one is a scalar unless marked with arr().
num <- function(x) {
  ifelse(is.na(x), "null", ifelse(is.infinite(x), ifelse(x > 0, "\"Infinity\"", "\"-Infinity\""),
    sprintf("%.12g", x)))
}
json <- function(x, indent = "") {
  inner <- paste0(indent, "  ")
  if (is.list(x)) {
    keys <- names(x)
    if (is.null(keys)) {
      items <- vapply(x, json, "", indent = inner)
      return(paste0("[\n", inner, paste(items, collapse = paste0(",\n", inner)), "\n", indent, "]"))
    }
    items <- vapply(seq_along(x), function(i) paste0("\"", keys[i], "\": ", json(x[[i]], inner)), "")
    return(paste0("{\n", inner, paste(items, collapse = paste0(",\n", inner)), "\n", indent, "}"))
  }
  if (is.character(x)) {
    s <- paste0("\"", gsub("\"", "\\\\\"", x), "\"")
    return(if (length(x) == 1 && is.null(attr(x, "array"))) s else paste0("[", paste(s, collapse = ", "), "]"))
  }
  if (is.logical(x) && length(x) == 1) return(if (x) "true" else "false")
  s <- num(as.numeric(x))
  if (length(x) == 1 && is.null(attr(x, "array"))) s else paste0("[", paste(s, collapse = ", "), "]")
}
# Marks a vector to be written as a JSON array even when it has one element.
arr <- function(x) structure(x, array = TRUE)
