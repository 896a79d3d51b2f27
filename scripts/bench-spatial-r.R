# Times spatstat on the same work as scripts/bench-spatial.ts: one isotropic K, and a MAD test on L
# (isotropic) with `nsim` simulations, for the points in the CSV given. Prints one JSON line.
# Usage: Rscript scripts/bench-spatial-r.R POINTS.csv NSIM
args <- commandArgs(trailingOnly = TRUE)
suppressMessages(library(spatstat))
pts <- read.csv(args[1])
nsim <- as.integer(args[2])
outer <- list(x = c(0, 12.1, 11.8, 5.2, 5.0, 0.2), y = c(0, 0.3, 3.9, 4.3, 8.0, 7.8))
hole <- list(x = c(7, 7, 9, 9), y = c(1.5, 2.3, 2.3, 1.5)) # clockwise
W <- owin(poly = list(outer, hole))
X <- ppp(pts$x, pts$y, window = W)
tk <- system.time(K <- Kest(X, correction = "isotropic"))[["elapsed"]]
tm <- system.time(m <- mad.test(X, Lest, nsim = nsim, correction = "isotropic", verbose = FALSE))[["elapsed"]]
cat(sprintf('{"spatstat":"%s","k":%.4f,"test":%.4f,"nsim":%d,"p":%.5f}\n', packageVersion("spatstat"), tk, tm, nsim, m$p.value))
