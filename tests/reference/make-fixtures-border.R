# Reference for the border-corrected K where it is undefined: spatstat gives K(r) wherever some point lies at
# least the previous grid value from the edge, and NaN (NA) beyond. Run by hand from the repository root,
# after make-fixtures.R (it reads two of that script's fixtures for their windows and points):
#   Rscript tests/reference/make-fixtures-border.R
# Writes tests/reference/fixtures/border-undefined.json with the versions, the calls and the grids used.

suppressPackageStartupMessages({
  library(spatstat)
  library(jsonlite)
})

args_all <- commandArgs(trailingOnly = FALSE)
script_file <- sub("^--file=", "", args_all[grep("^--file=", args_all)])
here <- if (length(script_file) == 1) dirname(normalizePath(script_file)) else "tests/reference"
out_dir <- file.path(here, "fixtures")

pkgs <- c("spatstat", "spatstat.geom", "spatstat.explore", "spatstat.random",
          "spatstat.data", "spatstat.model", "spatstat.utils", "jsonlite")
meta <- list(
  generatedAt = format(Sys.time(), "%Y-%m-%dT%H:%M:%SZ", tz = "UTC"),
  R = R.version.string,
  packages = as.list(sapply(pkgs, function(p) as.character(packageVersion(p)))),
  script = "tests/reference/make-fixtures-border.R"
)

pattern_of <- function(file) {
  fx <- fromJSON(file.path(out_dir, file), simplifyVector = TRUE)
  outer <- fx$window$outer
  holes <- fx$window$holes
  W <- if (fx$window$type == "rectangle") {
    owin(range(outer[, 1]), range(outer[, 2]))
  } else {
    rings <- c(list(list(x = outer[, 1], y = outer[, 2])),
               lapply(seq_len(if (is.null(dim(holes))) length(holes) else dim(holes)[1]), function(h) {
                 H <- if (is.list(holes)) holes[[h]] else holes[h, , ]
                 list(x = H[, 1], y = H[, 2])
               }))
    owin(poly = rings)
  }
  list(X = ppp(fx$points$x, fx$points$y, window = W), window = fx$window, points = fx$points)
}

case <- function(file, stretch, count) {
  p <- pattern_of(file)
  X <- p$X
  deepest <- max(bdist.points(X))
  r <- seq(0, stretch * deepest, length.out = count)
  # "isotropic" alongside keeps Kest on its general path (Kount, as make-fixtures.R and the engine);
  # correction = "border" alone takes the fast C path, Kborder.engine, which discretises differently
  K <- Kest(X, r = r, correction = c("border", "isotropic"))
  border <- as.data.frame(K)$border
  list(
    source = file, windowType = Window(X)$type, window = p$window, points = p$points,
    deepest = deepest, r = r,
    border = ifelse(is.finite(border), border, NA_real_),
    call = sprintf("Kest(X, r = seq(0, %s * max(bdist.points(X)), length.out = %d), correction = c(\"border\", \"isotropic\"))$border", stretch, count),
    note = "border is NA (null) where no point lies at least the previous grid value from the edge."
  )
}

cases <- list(
  trench = case("trench-l-random.json", 1.5, 129),
  rectangle = case("dataset-cells.json", 1.5, 129)
)

writeLines(toJSON(list(meta = meta, cases = cases), digits = I(17), auto_unbox = TRUE, na = "null", pretty = FALSE),
           file.path(out_dir, "border-undefined.json"))
cat("wrote", file.path(out_dir, "border-undefined.json"), "\n")
