# The script an analyst would write in R for the same job, kept as a yardstick for
# `npm run bench -- peers` (bench/peers.bench.ts). Not part of Plotrate.
#
# What it fits, per site-year (Site and Year columns), yield against N rate in the
# file's own units, blocks ignored:
#   - quadratic          y = a + b x + c x^2               lm()
#   - linear-plateau     y = a + b min(x, x0)              nls(), starts guessed from the data
#   - quadratic-plateau  y = a + b x + c x^2 up to x0 = -b/(2c), flat after
#                                                          nls(), starts from the quadratic
# Starts: a = mean yield at the lowest rate, b = slope between the two lowest rate
# means, x0 = the middle tested rate; a fit that does not converge is recorded as
# such (no retries). It writes one CSV row per site and model with the parameters,
# the residual sum of squares and whether the fit converged. No quality checks,
# no ANOVA, no optimum, no intervals, no across-site work: Plotrate does all of
# those on top of six models, so the comparison flatters this script.
#
# Usage: Rscript bench/peers/plateauFits.R trial.csv out.csv
args <- commandArgs(trailingOnly = TRUE)
d <- read.csv(args[1], check.names = FALSE)
rate <- grep("rate", names(d), ignore.case = TRUE, value = TRUE)[1]
yield <- grep("yield", names(d), ignore.case = TRUE, value = TRUE)[1]
d$x <- d[[rate]]
d$y <- d[[yield]]
d$key <- paste(d$Site, d$Year)

fit_site <- function(s) {
  means <- tapply(s$y, s$x, mean)
  xs <- as.numeric(names(means))
  a0 <- means[[1]]
  b0 <- max((means[[2]] - means[[1]]) / (xs[2] - xs[1]), 1e-3)
  x00 <- xs[ceiling(length(xs) / 2)]
  rows <- list()
  row <- function(model, p, sse, ok) {
    data.frame(site = s$key[1], model = model, a = p[1], b = p[2], c = p[3],
               x0 = p[4], sse = sse, converged = ok)
  }
  q <- lm(y ~ x + I(x^2), data = s)
  cq <- unname(coef(q))
  rows[[1]] <- row("quadratic", c(cq, NA), sum(resid(q)^2), TRUE)
  lp <- tryCatch(nls(y ~ a + b * pmin(x, x0), data = s,
                     start = list(a = a0, b = b0, x0 = x00)),
                 error = function(e) NULL)
  rows[[2]] <- if (is.null(lp)) row("linear-plateau", rep(NA, 4), NA, FALSE) else {
    p <- coef(lp)
    row("linear-plateau", c(p[["a"]], p[["b"]], NA, p[["x0"]]), deviance(lp), TRUE)
  }
  qp <- tryCatch(nls(y ~ ifelse(x < -b / (2 * c), a + b * x + c * x^2, a - b^2 / (4 * c)),
                     data = s, start = list(a = cq[1], b = cq[2], c = min(cq[3], -1e-6))),
                 error = function(e) NULL)
  rows[[3]] <- if (is.null(qp)) row("quadratic-plateau", rep(NA, 4), NA, FALSE) else {
    p <- coef(qp)
    row("quadratic-plateau", c(p[["a"]], p[["b"]], p[["c"]], -p[["b"]] / (2 * p[["c"]])),
        deviance(qp), TRUE)
  }
  do.call(rbind, rows)
}

out <- do.call(rbind, lapply(split(d, d$key), fit_site))
write.csv(out, args[2], row.names = FALSE)
cat(sprintf("%d site-years, %d fits, %d did not converge\n",
            length(unique(out$site)), nrow(out), sum(!out$converged)))
