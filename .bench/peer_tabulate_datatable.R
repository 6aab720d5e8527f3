# Peer for `flowregime tabulate OUT.csv --by taxon`: the same per-group
# summaries written by hand with R data.table (fread, one group-by, fwrite),
# to time tabulate against. CI does not run this; see README.md here.
#
#   Rscript .bench/peer_tabulate_datatable.R OUT.csv summary.csv
#
# OUT.csv is batch output of the synthetic survey (cmd/internal/survey).
# Per taxon: rows; median, 5th and 95th percentile (empirical quantile,
# R type 1) of reynolds, strouhal, drag_N, power_W; the share of rows in
# each regime; log10-log10 fits of reynolds on length (m) and power_W on
# mass (kg), by least squares and standardised major axis, with 95 %
# intervals on slope and intercept.
suppressPackageStartupMessages(library(data.table))
args <- commandArgs(trailingOnly = TRUE)
setDTthreads(0)
used <- c("taxon", "reynolds", "strouhal", "drag_N", "power_W", "regime", "length (mm)", "mass (g)")
d <- fread(args[1], select = used)
setnames(d, c("length (mm)", "mass (g)"), c("length_mm", "mass_g"))

q <- function(v, p) { v <- v[!is.na(v)]; if (length(v) == 0) NA_real_ else quantile(v, p, type = 1, names = FALSE) }

fit <- function(x, y) {
  ok <- !is.na(x) & !is.na(y) & x > 0 & y > 0 & is.finite(x) & is.finite(y)
  lx <- log10(x[ok]); ly <- log10(y[ok]); n <- length(lx)
  na <- rep(NA_real_, 13)
  if (n < 3) return(as.list(c(n, na)))
  sx <- sd(lx); sy <- sd(ly)
  if (!(sx > 0) || !(sy > 0)) return(as.list(c(n, na)))
  r <- cor(lx, ly); t <- qt(0.975, n - 2); mx <- mean(lx); my <- mean(ly)
  b <- r * sy / sx; a <- my - b * mx
  se <- sy / sx * sqrt((1 - r^2) / (n - 2))
  rv <- function(a, b) sum((ly - a - b * lx)^2) / (n - 2)
  ase <- sqrt(rv(a, b) * (1 / n + mx^2 / (sx^2 * (n - 1))))
  bs <- sign(r) * sy / sx; as <- my - bs * mx
  B <- (1 - r^2) * t^2 / (n - 2)
  lo <- bs * (sqrt(B + 1) - sqrt(B)); hi <- bs * (sqrt(B + 1) + sqrt(B))
  sse <- sqrt(rv(as, bs) / n + mx^2 * bs^2 * (1 - r^2) / (n - 2))
  as.list(c(n, b, b - t * se, b + t * se, a, a - t * ase, a + t * ase,
            bs, min(lo, hi), max(lo, hi), as, as - t * sse, as + t * sse, r^2))
}
fitnames <- function(p) paste0(p, c("_n", "_ols_b", "_ols_b_lo", "_ols_b_hi", "_ols_a", "_ols_a_lo", "_ols_a_hi",
                                     "_sma_b", "_sma_b_lo", "_sma_b_hi", "_sma_a", "_sma_a_lo", "_sma_a_hi", "_r2"))

s <- d[, c(list(rows = .N,
  re_med = q(reynolds, 0.5), re_p5 = q(reynolds, 0.05), re_p95 = q(reynolds, 0.95),
  st_med = q(strouhal, 0.5), st_p5 = q(strouhal, 0.05), st_p95 = q(strouhal, 0.95),
  drag_med = q(drag_N, 0.5), drag_p5 = q(drag_N, 0.05), drag_p95 = q(drag_N, 0.95),
  power_med = q(power_W, 0.5), power_p5 = q(power_W, 0.05), power_p95 = q(power_W, 0.95),
  viscous = mean(regime == "viscous"), intermediate = mean(regime == "intermediate"), inertial = mean(regime == "inertial")),
  setNames(fit(length_mm / 1000, reynolds), fitnames("re_length")),
  setNames(fit(mass_g / 1000, power_W), fitnames("power_mass"))), by = taxon]
setorder(s, taxon)
fwrite(s, args[2])
