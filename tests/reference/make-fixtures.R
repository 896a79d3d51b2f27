# Loamwork reference fixtures from R's spatstat.
#
# Run by hand from the repository root (never by CI):
#   Rscript tests/reference/make-fixtures.R
# Needs R with the Debian packages r-cran-spatstat (3.0 family) and r-cran-jsonlite.
# Writes tests/reference/fixtures/*.json, which tests/reference/spatstat.test.ts checks the engine against.
#
# Every fixture records the R and spatstat.* versions, the date, the seeds and the exact calls used.
# Where spatstat's default path is an approximation (pixel-based translation weights, FFT-binned pair
# correlation), the exact quantity is computed here from spatstat's own building blocks (closepairs,
# edge.Trans(exact = TRUE), edge.Ripley, whist) and the fixture says so in its "call" field.

suppressPackageStartupMessages({
  library(spatstat)
  library(jsonlite)
})

args_all <- commandArgs(trailingOnly = FALSE)
script_file <- sub("^--file=", "", args_all[grep("^--file=", args_all)])
here <- if (length(script_file) == 1) dirname(normalizePath(script_file)) else "tests/reference"
out_dir <- file.path(here, "fixtures")
dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)

pkgs <- c("spatstat", "spatstat.geom", "spatstat.explore", "spatstat.random",
          "spatstat.data", "spatstat.model", "spatstat.utils", "jsonlite")
versions <- as.list(sapply(pkgs, function(p) as.character(packageVersion(p))))
meta_common <- list(
  generatedAt = format(Sys.time(), "%Y-%m-%dT%H:%M:%SZ", tz = "UTC"),
  R = R.version.string,
  packages = versions,
  rng = paste(RNGkind(), collapse = " / "),
  script = "tests/reference/make-fixtures.R"
)

# Deparse an expression to one line: the exact call recorded beside each quantity.
cl <- function(e) paste(trimws(deparse(e, width.cutoff = 500L)), collapse = " ")
# Evaluate an expression and return list(value, call).
run <- function(expr) {
  e <- substitute(expr)
  list(value = eval(e, parent.frame()), call = cl(e))
}

ring_matrix <- function(r) cbind(r$x, r$y)

# Window as outer ring(s) and holes: spatstat stores outer rings anticlockwise and holes clockwise.
window_json <- function(W) {
  P <- as.polygonal(W)
  rings <- P$bdry
  outer <- list(); holes <- list()
  for (r in rings) {
    if (spatstat.utils::is.hole.xypolygon(r)) holes[[length(holes) + 1]] <- ring_matrix(r)
    else outer[[length(outer) + 1]] <- ring_matrix(r)
  }
  stopifnot(length(outer) == 1)
  list(outer = outer[[1]], holes = holes,
       xrange = W$xrange, yrange = W$yrange, type = W$type)
}

# K with isotropic, border and translation corrections on grid r, plus exact-overlap translation.
k_block <- function(X, r) {
  W <- Window(X)
  n <- npoints(X)
  lambda2area <- n * (n - 1) / area(W)
  K <- run(Kest(X, r = r, correction = c("isotropic", "border", "translate")))
  close <- closepairs(X, max(r), what = "all")
  wT <- edge.Trans(dx = close$dx, dy = close$dy, W = W, paired = TRUE, exact = TRUE)
  breaks <- breakpts.from.r(r)
  KtransExact <- cumsum(whist(close$d, breaks$val, wT)) / lambda2area
  kd <- as.data.frame(K$value)
  list(
    iso = kd$iso, border = kd$border,
    transExact = KtransExact,
    transPixel = kd$trans,
    L = list(iso = sqrt(kd$iso / pi), border = sqrt(kd$border / pi), transExact = sqrt(KtransExact / pi)),
    call = K$call,
    callTransExact = paste(
      "close <- closepairs(X, rmax, what = 'all');",
      "w <- edge.Trans(dx = close$dx, dy = close$dy, W = Window(X), paired = TRUE, exact = TRUE);",
      "cumsum(whist(close$d, breakpts.from.r(r)$val, w)) / (n * (n - 1) / area(Window(X)))"),
    note = paste("transPixel is spatstat's default pixel-approximated translation weight (information only);",
                 "transExact uses the exact polygon overlap. Bins: K(r_k) counts d < r_k (whist, breaks c(-dr, r)).")
  )
}

# Pair correlation: exact Epanechnikov kernel sum (no FFT binning), isotropic and exact translation
# weights, divisor r; plus spatstat's own (FFT-binned, pixel translation) pcf for information.
pcf_block <- function(X, r) {
  W <- Window(X)
  n <- npoints(X)
  lambda <- n / area(W)
  lambda2area <- n * (n - 1) / area(W)
  h <- 0.15 / sqrt(lambda)
  close <- closepairs(X, max(r) + h, what = "all")
  XI <- ppp(close$xi, close$yi, window = W, check = FALSE)
  wI <- edge.Ripley(XI, matrix(close$d, ncol = 1))
  wT <- edge.Trans(dx = close$dx, dy = close$dy, W = W, paired = TRUE, exact = TRUE)
  epa <- function(u) ifelse(abs(u) < h, 0.75 * (1 - (u / h)^2) / h, 0)
  g_exact <- function(w) sapply(r, function(rk) {
    if (rk <= 0) return(NA_real_)
    sum(w * epa(rk - close$d)) / (2 * pi * rk * lambda2area)
  })
  G <- run(pcf(X, r = r, correction = c("isotropic", "translate"), kernel = "epanechnikov", stoyan = 0.15, divisor = "r"))
  gd <- as.data.frame(G$value)
  fin <- function(v) ifelse(is.finite(v), v, NA_real_)
  list(
    h = h, bwSd = h / sqrt(5),
    isoExact = g_exact(wI), transExact = g_exact(wT),
    spatstatIso = fin(gd$iso), spatstatTrans = fin(gd$trans),
    call = G$call,
    callExact = paste(
      "h <- 0.15/sqrt(lambda); close <- closepairs(X, rmax + h, what = 'all');",
      "wIso <- edge.Ripley(ppp(close$xi, close$yi, window = W, check = FALSE), matrix(close$d, ncol = 1));",
      "wTrans <- edge.Trans(dx = close$dx, dy = close$dy, W = W, paired = TRUE, exact = TRUE);",
      "g(r) = sum(w * k_h(r - d)) / (2 * pi * r * n * (n - 1) / area(W)), k_h(u) = 0.75 * (1 - (u/h)^2) / h for |u| < h"),
    note = "g at r = 0 is undefined (divisor r) and stored as null. spatstat* columns are FFT-binned (density.default), information only."
  )
}

# Mass of a Gaussian kernel (sd sigma, centred at (ux, uy)) inside W, computed by vertical slices: at each x
# the slice of W is a union of y-intervals whose Gaussian mass is exact through pnorm, and the x-integral
# is done by integrate() between the vertices' x values. Independent of spatstat's pixel edge factor.
gaussian_mass_exact <- function(W, ux, uy, sigma) {
  rings <- as.polygonal(W)$bdry
  seg <- do.call(rbind, lapply(rings, function(r) {
    k <- length(r$x); nx <- c(2:k, 1)
    cbind(r$x, r$y, r$x[nx], r$y[nx])
  }))
  seg <- seg[seg[, 1] != seg[, 3], , drop = FALSE]   # vertical edges never cross a vertical slice
  slice <- function(xs) vapply(xs, function(x) {
    sel <- (seg[, 1] <= x & x < seg[, 3]) | (seg[, 3] <= x & x < seg[, 1])
    s <- seg[sel, , drop = FALSE]
    ys <- sort(s[, 2] + (x - s[, 1]) * (s[, 4] - s[, 2]) / (s[, 3] - s[, 1]))
    lo <- ys[c(TRUE, FALSE)]; hi <- ys[c(FALSE, TRUE)]
    dnorm(x, ux, sigma) * sum(pnorm(hi, uy, sigma) - pnorm(lo, uy, sigma))
  }, numeric(1))
  # beyond 10 sigma on either side the kernel's mass is below 1e-23: the x-integral stops there
  lo <- ux - 10 * sigma; hi <- ux + 10 * sigma
  b <- sort(unique(c(seg[, 1], seg[, 3], ux)))
  b <- sort(unique(c(pmin(pmax(b, lo), hi))))
  total <- 0
  for (k in seq_len(length(b) - 1)) {
    total <- total + integrate(slice, b[k], b[k + 1], rel.tol = 1e-13, abs.tol = 0, subdivisions = 1000L)$value
  }
  total
}

# Inhomogeneous K with a fixed intensity vector: the lambda values are stored so the engine can use them.
kinhom_block <- function(X, r, sigma) {
  lam <- run(density.ppp(X, sigma = sigma, at = "points", leaveoneout = TRUE, edge = TRUE))
  lamNoEdge <- run(density.ppp(X, sigma = sigma, at = "points", leaveoneout = TRUE, edge = FALSE))
  lambda <- as.numeric(lam$value)
  mass <- mapply(function(x, y) gaussian_mass_exact(Window(X), x, y, sigma), X$x, X$y)
  k0 <- run(Kinhom(X, lambda = lambda, r = r, correction = "isotropic", renormalise = FALSE))
  k1 <- run(Kinhom(X, lambda = lambda, r = r, correction = "isotropic", renormalise = TRUE))
  list(
    sigma = sigma, lambda = lambda, lambdaCall = lam$call,
    lambdaNoEdge = as.numeric(lamNoEdge$value), lambdaNoEdgeCall = lamNoEdge$call,
    edgeMassExact = mass, lambdaEdgeExact = as.numeric(lamNoEdge$value) / mass,
    edgeMassCall = paste("gaussian_mass_exact(W, x_i, y_i, sigma) in make-fixtures.R: vertical slices, pnorm per slice,",
                         "integrate(rel.tol = 1e-13) over x; lambdaEdgeExact = lambdaNoEdge / edgeMassExact",
                         "(the 'uniform' edge correction of density.ppp(edge = TRUE, diggle = FALSE), without its pixels)"),
    scott = unname(bw.scott(X, isotropic = TRUE)), scottCall = "bw.scott(X, isotropic = TRUE)",
    diggle = unname(as.numeric(bwd <- bw.diggle(X, correction = "isotropic"))),
    diggleH = attr(bwd, "h"), diggleCV = ifelse(is.finite(attr(bwd, "cv")), attr(bwd, "cv"), NA_real_),
    diggleCall = "bw.diggle(X, correction = 'isotropic') (nr = 512 on the default r max; h = sigma values tried, cv = criterion M)",
    iso = as.data.frame(k0$value)$iso, call = k0$call,
    isoRenormalised = as.data.frame(k1$value)$iso, callRenormalised = k1$call,
    note = paste("Kinhom iso = sum_{i != j} w_ij / (lambda_i lambda_j) / |W| over ordered pairs with d < r;",
                 "renormalised multiplies by |W| / sum(1/lambda_i).",
                 "lambda (edge = TRUE) uses spatstat's pixel edge correction, so it is input data, not a check;",
                 "lambdaNoEdge is the exact leave-one-out Gaussian kernel sum and can be checked.")
  )
}

clark_evans_block <- function(X) {
  W <- Window(X)
  n <- npoints(X)
  A <- area(W)
  Rv <- run(clarkevans(X, correction = "none"))
  t2 <- run(clarkevans.test(X, correction = "none", alternative = "two.sided"))
  tl <- run(clarkevans.test(X, correction = "none", alternative = "clustered"))
  tg <- run(clarkevans.test(X, correction = "none", alternative = "regular"))
  dobs <- mean(nndist(X))
  dpois <- 1 / (2 * sqrt(n / A))
  se <- sqrt((4 - pi) * A / (4 * pi)) / n
  z <- (dobs - dpois) / se
  stopifnot(abs(2 * (1 - pnorm(abs(z))) - t2$value$p.value) < 1e-12)
  list(
    R = as.numeric(Rv$value), z = z, meanNN = dobs, expectedNN = dpois, se = se,
    pTwoSided = t2$value$p.value, pClustered = tl$value$p.value, pRegular = tg$value$p.value,
    call = Rv$call, callTest = t2$call, callTestClustered = tl$call, callTestRegular = tg$call,
    note = "z = (dbar - 1/(2 sqrt(lambda))) / SE, SE = sqrt((4 - pi) |W| / (4 pi)) / n, as in clarkevans.test (z recomputed here, p checked equal)."
  )
}

quadrat_block <- function(X, nx, ny) {
  q <- run(quadrat.test(X, nx = nx, ny = ny, alternative = "two.sided"))
  qc <- attr(q$value, "quadratcount")
  te <- attr(qc, "tess")
  list(
    nx = nx, ny = ny, X2 = unname(q$value$statistic), df = unname(q$value$parameter), p = q$value$p.value,
    observed = as.integer(q$value$observed), expected = as.numeric(q$value$expected),
    tileAreas = as.numeric(sapply(tiles(te), area)), tileNames = names(tiles(te)),
    xbreaks = seq(Window(X)$xrange[1], Window(X)$xrange[2], length.out = nx + 1),
    ybreaks = seq(Window(X)$yrange[1], Window(X)$yrange[2], length.out = ny + 1),
    call = q$call,
    note = "Tiles split the bounding box equally and are clipped to W; row 1 is the TOP row (largest y). Empty tiles dropped; E = n * tileArea / |W|."
  )
}

cross_block <- function(X, r) {
  kab <- run(Kcross(X, i = "A", j = "B", r = r, correction = "isotropic"))
  kba <- run(Kcross(X, i = "B", j = "A", r = r, correction = "isotropic"))
  kdot <- run(Kdot(X, i = "A", r = r, correction = "isotropic"))
  sp <- split(X)
  kaa <- run(Kest(sp$A, r = r, correction = "isotropic"))
  kbb <- run(Kest(sp$B, r = r, correction = "isotropic"))
  iso <- function(k) as.data.frame(k$value)$iso
  list(
    KcrossAB = iso(kab), KcrossBA = iso(kba), KdotA = iso(kdot), KAA = iso(kaa), KBB = iso(kbb),
    LcrossAB = sqrt(iso(kab) / pi), LcrossBA = sqrt(iso(kba) / pi),
    callKcrossAB = kab$call, callKcrossBA = kba$call, callKdotA = kdot$call, callKAA = kaa$call, callKBB = kbb$call,
    note = "Kcross(i, j) divides by n_i n_j / |W|, circle centred at the type-i point; KAA/KBB are Kest of each class in the full window W."
  )
}

# Global MAD and DCLF tests on L (isotropic) from one envelope with saved functions.
mc_block <- function(X, r, nsim, seed, fix.n) {
  set.seed(seed)
  E <- run(envelope(X, Lest, nsim = nsim, r = r, correction = "isotropic", use.theory = TRUE,
                    fix.n = fix.n, savefuns = TRUE, verbose = FALSE))
  out <- list(nsim = nsim, seed = seed, fixN = fix.n, envelopeCall = E$call, mad = list(), dclf = list())
  keys <- c(two.sided = "twoSided", greater = "greater", less = "less")
  for (alt in names(keys)) {
    set.seed(seed + 1)
    m <- mad.test(E$value, alternative = alt, verbose = FALSE)
    set.seed(seed + 1)
    d <- dclf.test(E$value, alternative = alt, verbose = FALSE)
    out$mad[[keys[[alt]]]] <- list(statistic = m$statistic[[1]], rank = m$statistic$rank, p = m$p.value,
                                   call = sprintf("set.seed(seed + 1); mad.test(E, alternative = '%s')", alt))
    out$dclf[[keys[[alt]]]] <- list(statistic = d$statistic[[1]], rank = d$statistic$rank, p = d$p.value,
                                    call = sprintf("set.seed(seed + 1); dclf.test(E, alternative = '%s')", alt))
  }
  out$note <- paste("Reference curve is the theoretical L(r) = r (use.theory = TRUE); rinterval is the whole r grid.",
                    "MAD = max |L - r|; DCLF u = (rmax - rmin) * mean over the grid (r = 0 included) of (L - r)^2",
                    "(signed squares for one-sided). p = rank/(nsim + 1), ties broken at random.",
                    "'greater' = observed above theory (clustering), 'less' = below (regularity).",
                    if (fix.n) "Simulations: n fixed (runifpoint(n, W))." else "Simulations: Poisson n with intensity n/|W| (spatstat default).")
  out
}

# jsonlite prints at most 15 significant digits, so doubles are formatted here with %.17g (enough to
# round-trip every double) and handed to jsonlite verbatim. NA, NaN and Inf become null.
num17 <- function(v) ifelse(is.finite(v), sprintf("%.17g", v), "null")
verbatim <- function(x) {
  if (is.list(x)) {
    out <- lapply(x, verbatim)
    attributes(out) <- attributes(x)[intersect(names(attributes(x)), c("names"))]
    return(out)
  }
  if (is.double(x) && is.matrix(x)) {
    rows <- apply(x, 1, function(row) paste0("[", paste(num17(row), collapse = ","), "]"))
    return(structure(paste0("[", paste(rows, collapse = ","), "]"), class = "json"))
  }
  if (is.double(x)) {
    body <- paste(num17(unname(x)), collapse = ",")
    return(structure(if (length(x) == 1) body else paste0("[", body, "]"), class = "json"))
  }
  x
}
# Between-class Monte Carlo tests (classes A and B), 199 simulations, isotropic correction:
# random labelling of the fixed locations (cross-L and the K difference K_AA - K_BB, reference = mean of
# the simulations, spatstat's leaveout = 1), and class A fixed with B replaced by n_B uniform points
# (cross-L against the theoretical L = r).
cross_mc_block <- function(X, r, nsim, seed) {
  W <- Window(X)
  XA <- split(X)$A
  nB <- sum(marks(X) == "B")
  env <- environment()
  kdiff <- function(X, r, ...) {
    KA <- Kcross(X, "A", "A", r = r, correction = "isotropic")
    KB <- Kcross(X, "B", "B", r = r, correction = "isotropic")
    eval.fv(KA - KB)
  }
  tests <- function(E, what, seedT) {
    out <- list()
    for (t in c("mad", "dclf")) {
      set.seed(seedT)
      f <- if (t == "mad") mad.test else dclf.test
      v <- f(E, verbose = FALSE)
      out[[t]] <- list(statistic = v$statistic[[1]], rank = v$statistic$rank, p = v$p.value,
                       call = sprintf("set.seed(%d); %s(E, alternative = 'two.sided')", seedT, if (t == "mad") "mad.test" else "dclf.test"))
    }
    out$what <- what
    out
  }
  # envelope() keeps no theoretical column when `simulate` is an expression, so mad.test/dclf.test would
  # silently fall back to the mean of the simulations; the theory-referenced test is computed here from
  # the saved simulated curves with envelopeTest's own formulas (MAD = max |L - r|,
  # DCLF = (rmax - rmin) * mean((L - r)^2), p = rank / (nsim + 1), ties at random).
  theory_tests <- function(E, r, seedT) {
    obs <- E$obs
    sims <- as.matrix(as.data.frame(attr(E, "simfuns")))[, -1, drop = FALSE]
    out <- list()
    for (t in c("mad", "dclf")) {
      dev <- function(f) if (t == "mad") max(abs(f - r)) else diff(range(r)) * mean((f - r)^2)
      tobs <- dev(obs)
      tsim <- apply(sims, 2, dev)
      set.seed(seedT)
      nties <- sum(tsim == tobs)
      rank <- sum(tobs < tsim) + 1 + (if (nties > 0) sample(1:nties, 1L) else 0)
      out[[t]] <- list(statistic = tobs, rank = rank, p = rank / (ncol(sims) + 1),
                       call = sprintf("%s of E$obs against r, from attr(E, 'simfuns') (envelopeTest's formulas)", t))
    }
    out
  }
  set.seed(seed + 1)
  E1 <- run(envelope(X, Lcross, i = "A", j = "B", r = r, correction = "isotropic", nsim = nsim,
                     simulate = expression(rlabel(X)), envir.simul = env, savefuns = TRUE, verbose = FALSE))
  set.seed(seed + 2)
  E2 <- run(envelope(X, kdiff, r = r, nsim = nsim, simulate = expression(rlabel(X)), envir.simul = env,
                     savefuns = TRUE, verbose = FALSE))
  set.seed(seed + 3)
  E3 <- run(envelope(X, Lcross, i = "A", j = "B", r = r, correction = "isotropic", nsim = nsim,
                     simulate = expression(superimpose(A = XA, B = runifpoint(nB, W))), envir.simul = env,
                     savefuns = TRUE, verbose = FALSE))
  list(
    nsim = nsim, seed = seed,
    labellingCrossL = c(tests(E1$value, "Lcross(A, B) under random labelling, reference = mean of simulations", seed + 11),
                        list(envelopeCall = paste("set.seed(seed + 1);", E1$call))),
    labellingKDiff = c(tests(E2$value, "K_AA - K_BB under random labelling, reference = mean of simulations", seed + 12),
                       list(envelopeCall = paste("set.seed(seed + 2);", E2$call,
                                                 "with kdiff = eval.fv(Kcross(X, 'A', 'A', r, 'isotropic') - Kcross(X, 'B', 'B', r, 'isotropic'))"))),
    fixedACrossL = c(theory_tests(E3$value, r, seed + 13),
                     list(what = "Lcross(A, B) with A fixed and B = runifpoint(nB, W), reference = theoretical L = r",
                          envelopeCall = paste("set.seed(seed + 3);", E3$call)))
  )
}

# Clark-Evans Monte Carlo test with n fixed (spatstat uses simulation when nsim is given).
ce_mc_block <- function(X, nsim, seed) {
  set.seed(seed)
  t <- run(clarkevans.test(X, correction = "none", alternative = "two.sided", nsim = nsim))
  list(nsim = nsim, seed = seed, R = unname(t$value$statistic), p = t$value$p.value,
       call = paste("set.seed(seed);", t$call),
       note = "p = min(1, 2 min(p_lower, p_upper)), p_upper = (1 + #{R_sim >= R}) / (nsim + 1), CSR with n fixed.")
}

write_fixture <- function(name, obj) {
  path <- file.path(out_dir, paste0(name, ".json"))
  write_json(verbatim(obj), path, json_verbatim = TRUE, auto_unbox = TRUE, pretty = TRUE, na = "null")
  cat("wrote", path, "\n")
}

points_json <- function(X) {
  p <- list(x = X$x, y = X$y)
  if (is.marked(X)) p$marks <- as.character(marks(X))
  p
}

pattern_fixture <- function(name, windowName, X, generator, seed, r, mc) {
  W <- Window(X)
  fx <- list(
    meta = c(meta_common, list(fixture = name, seed = seed, generator = generator)),
    window = c(list(name = windowName), window_json(W)),
    points = points_json(X),
    n = npoints(X),
    area = area(W), areaCall = "area(Window(X))",
    perimeter = perimeter(W), perimeterCall = "perimeter(Window(X)) (holes included)",
    nndist = nndist(X), nndistCall = "nndist(X)",
    clarkEvans = clark_evans_block(X),
    quadrat = quadrat_block(X, nx = 4, ny = 3),
    r = r,
    K = k_block(X, r),
    pcf = pcf_block(X, r),
    Kinhom = kinhom_block(X, r, sigma = 1)
  )
  kd <- Kest(X, correction = "isotropic")
  fx$defaultR <- list(rmax = max(kd$r), count = length(kd$r), call = "Kest(X, correction = 'isotropic')$r (spatstat's default grid)")
  if (is.marked(X)) {
    fx$cross <- cross_block(X, r)
    fx$crossMonteCarlo <- cross_mc_block(X, r, nsim = 199, seed = seed + 300)
  }
  if (mc) {
    fx$monteCarlo <- list(poissonN = mc_block(unmark(X), r, nsim = 199, seed = seed + 100, fix.n = FALSE),
                          fixedN = mc_block(unmark(X), r, nsim = 199, seed = seed + 200, fix.n = TRUE),
                          clarkEvans = ce_mc_block(unmark(X), nsim = 199, seed = seed + 400))
  }
  write_fixture(name, fx)
}

# ---- Windows: an invented L-shaped trench (metres, about 12 x 8 m, two slanted edges) and the same
# trench with a rectangular baulk left standing (a hole).
outerL <- list(x = c(0, 12, 12, 5.5, 5, 0), y = c(0, 0, 3, 3.4, 8, 8))       # anticlockwise
baulk <- list(x = c(1.5, 1.5, 3.5, 3.5), y = c(4.5, 5.5, 5.5, 4.5))          # clockwise (hole)
windows <- list(
  "trench-l" = owin(poly = list(outerL)),
  "trench-l-baulk" = owin(poly = list(outerL, baulk))
)

r_trench <- seq(0, 2, length.out = 65)   # 0 .. 2 m by 1/32 m; 2 m = short side of the bounding box / 4

make_patterns <- function(W, base) {
  pats <- list()
  set.seed(base + 1)
  pats$random <- list(X = runifpoint(120, win = W), gen = "set.seed(seed); runifpoint(120, win = W)")
  set.seed(base + 2)
  pats$clustered <- list(X = rMatClust(kappa = 0.12, scale = 0.7, mu = 14, win = W),
                         gen = "set.seed(seed); rMatClust(kappa = 0.12, scale = 0.7, mu = 14, win = W)")
  set.seed(base + 3)
  reg <- rSSI(r = 0.55, n = 100, win = W)
  stopifnot(npoints(reg) == 100)
  pats$regular <- list(X = reg, gen = "set.seed(seed); rSSI(r = 0.55, n = 100, win = W)")
  set.seed(base + 4)
  P <- rThomas(kappa = 0.12, scale = 0.45, mu = 14, win = W)
  marks(P) <- factor(sample(c("A", "B"), npoints(P), replace = TRUE), levels = c("A", "B"))
  pats$together <- list(X = P, gen = paste(
    "set.seed(seed); P <- rThomas(kappa = 0.12, scale = 0.45, mu = 14, win = W);",
    "marks(P) <- factor(sample(c('A', 'B'), npoints(P), replace = TRUE)) (both classes from the same clusters)"))
  set.seed(base + 5)
  A <- rMatClust(kappa = 0.1, scale = 0.7, mu = 9, win = W)
  C <- runifpoint(600, win = W)
  far <- C[nncross(C, A)$dist > 0.9]
  B <- far[seq_len(min(70, npoints(far)))]
  pats$apart <- list(X = superimpose(A = A, B = B), gen = paste(
    "set.seed(seed); A <- rMatClust(kappa = 0.1, scale = 0.7, mu = 9, win = W); C <- runifpoint(600, win = W);",
    "far <- C[nncross(C, A)$dist > 0.9]; B <- far[1:min(70, npoints(far))]; superimpose(A = A, B = B)",
    "(B avoids A: segregated classes)"))
  pats
}

base_seed <- 20261201
wi <- 0
for (wname in names(windows)) {
  W <- windows[[wname]]
  pats <- make_patterns(W, base_seed + 10 * wi)
  for (pname in names(pats)) {
    p <- pats[[pname]]
    seed <- base_seed + 10 * wi + match(pname, names(pats))
    cat(wname, pname, "n =", npoints(p$X), "\n")
    pattern_fixture(paste0(wname, "-", pname), wname, p$X, p$gen, seed, r_trench,
                    mc = pname %in% c("random", "clustered"))
  }
  wi <- wi + 1
}

# ---- Open datasets shipped with spatstat.data (original units: the windows are rescaled unit squares).
datasets <- list(
  cells = list(expect = "regular", source = paste(
    "Centres of 42 biological cells in a histological section, recorded by F.H.C. Crick and B.D. Ripley;",
    "Ripley, B.D. (1977) Modelling spatial patterns (with discussion), JRSS B 39:172-212;",
    "also Ripley (1981) Spatial Statistics, Wiley; Diggle (1983) Statistical Analysis of Spatial Point Patterns.")),
  redwood = list(expect = "clustered", source = paste(
    "62 California redwood seedlings and saplings: Strauss, D.J. (1975) A model for clustering, Biometrika 62:467-475;",
    "subset extracted and rescaled to the unit square by Ripley, B.D. (1977) JRSS B 39:172-212 (spatstat.data 'redwood',",
    "from Ripley's package 'spatial').")),
  japanesepines = list(expect = "random", source = paste(
    "65 Japanese black pine saplings in a 5.7 x 5.7 m square rescaled to the unit square: Numata, M. (1961)",
    "Bulletin of Choshi Marine Laboratory, Chiba University 3:28-48; as used in Diggle, P.J. (2003)",
    "Statistical Analysis of Spatial Point Patterns, Arnold.")),
  amacrine = list(expect = "two types", source = paste(
    "Austin Hughes' displaced amacrine cells in a rabbit retina, 152 'on' and 142 'off' cells in a 1060 x 662 micron",
    "frame rescaled to height 1: Diggle, P.J. (1986) Displaced amacrine cells in the retina of a rabbit: analysis of",
    "a bivariate spatial point pattern, J. Neurosci. Meth. 18:115-125 (data: P. Diggle, personal communication to spatstat)."))
)

r_unit <- seq(0, 0.25, length.out = 65)
di <- 0
for (dname in names(datasets)) {
  X <- get(dname, envir = asNamespace("spatstat.data"))
  W <- Window(X)
  seed <- base_seed + 1000 + di
  di <- di + 1
  XU <- unmark(X)
  K <- run(Kest(XU, r = r_unit, correction = c("isotropic", "border")))
  kd <- as.data.frame(K$value)
  fx <- list(
    meta = c(meta_common, list(fixture = paste0("dataset-", dname), dataset = dname,
                               datasetCall = sprintf("data(%s, package = 'spatstat.data')", dname),
                               source = datasets[[dname]]$source, expectedVerdict = datasets[[dname]]$expect,
                               seed = seed)),
    window = c(list(name = dname), window_json(W)),
    points = points_json(X),
    n = npoints(X),
    area = area(W), perimeter = perimeter(W),
    nndist = nndist(XU), nndistCall = "nndist(X)",
    clarkEvans = clark_evans_block(XU),
    donnelly = list(R = unname(clarkevans(XU, correction = "Donnelly")),
                    call = "clarkevans(X, correction = 'Donnelly')",
                    note = "spatstat's Donnelly mean: 1/(2 sqrt(lambda)) + (0.0514 + 0.0412/sqrt(n)) * perimeter / n (rectangles only)."),
    r = r_unit,
    K = list(iso = kd$iso, border = kd$border, L = list(iso = sqrt(kd$iso / pi), border = sqrt(kd$border / pi)),
             call = K$call),
    monteCarlo = list(poissonN = mc_block(XU, r_unit, nsim = 199, seed = seed, fix.n = FALSE),
                      clarkEvans = ce_mc_block(XU, nsim = 199, seed = seed + 400))
  )
  if (dname == "amacrine") {
    kab <- run(Kcross(X, i = "on", j = "off", r = r_unit, correction = "isotropic"))
    kba <- run(Kcross(X, i = "off", j = "on", r = r_unit, correction = "isotropic"))
    fx$cross <- list(KcrossOnOff = as.data.frame(kab$value)$iso, callKcrossOnOff = kab$call,
                     KcrossOffOn = as.data.frame(kba$value)$iso, callKcrossOffOn = kba$call)
  }
  write_fixture(paste0("dataset-", dname), fx)
}
cat("done\n")
