# The whole job done the plain way in base R, to time warrant against (`npm run bench`, bench/run.mjs):
# read the respondent CSV, count answers and agreement (codes 4 and 5) per unit, year and question, then for each
# compare claim run prop.test(correct = FALSE) (the same test as the pooled two-proportion z test; fisher.test when an
# expected count is below 5, as warrant does), take each
# unit's Wilson interval (prop.test's interval for one proportion without continuity correction), draw one bar chart
# per claim into a PDF and write a results CSV.
#   Rscript bench/job.R <data.csv> <claims.csv> <out folder>
# Charts go through cairo_pdf(): base pdf() drops letters outside Latin-1 (the ŵ, ŷ and Ł in unit names) with a
# warning, cairo_pdf keeps them.
args <- commandArgs(trailingOnly = TRUE)
data_file <- args[1]
claims_file <- args[2]
out_dir <- args[3]

d <- read.csv(data_file, encoding = "UTF-8", stringsAsFactors = FALSE)
claims <- read.csv(claims_file, encoding = "UTF-8", stringsAsFactors = FALSE)
questions <- grep("^q[0-9]+$", names(d), value = TRUE)

# Counts per unit, year and question (respondents who answered, and those who agreed), tabulated by a group index.
unit <- factor(d$unit)
year <- factor(d$year)
group <- (as.integer(unit) - 1L) * nlevels(year) + as.integer(year)
bins <- nlevels(unit) * nlevels(year)
counts <- do.call(rbind, lapply(questions, function(q) {
  x <- d[[q]]
  data.frame(unit = rep(levels(unit), each = nlevels(year)), year = rep(levels(year), nlevels(unit)), question = q,
             n = tabulate(group[!is.na(x)], bins), agree = tabulate(group[x %in% c(4, 5)], bins))
}))
latest <- max(levels(year))
now <- counts[counts$year == latest, ]
key <- paste(now$unit, now$question, sep = "\r")

cairo_pdf(file.path(out_dir, "charts.pdf"), width = 6.4, height = 3, onefile = TRUE)
rows <- lapply(seq_len(nrow(claims)), function(i) {
  cl <- claims[i, ]
  f <- now[match(paste(cl$focus, cl$question, sep = "\r"), key), ]
  a <- now[match(paste(cl$against, cl$question, sep = "\r"), key), ]
  # Fisher's exact test when an expected count is below 5, where the z test's approximation is rough (warrant's rule).
  tab <- matrix(c(f$agree, a$agree, f$n - f$agree, a$n - a$agree), 2)
  small <- any(outer(rowSums(tab), colSums(tab)) / sum(tab) < 5)
  test <- if (small) fisher.test(tab) else prop.test(c(f$agree, a$agree), c(f$n, a$n), correct = FALSE)
  wf <- prop.test(f$agree, f$n, correct = FALSE)$conf.int
  wa <- prop.test(a$agree, a$n, correct = FALSE)$conf.int
  rates <- c(f$agree / f$n, a$agree / a$n)
  mids <- barplot(rates, names.arg = c(cl$focus, cl$against), ylim = c(0, 1), col = "#1f4e8c",
                  main = paste0(cl$id, ": agreement on ", cl$question, " in ", latest), ylab = "agreeing")
  arrows(mids, c(wf[1], wa[1]), mids, c(wf[2], wa[2]), angle = 90, code = 3, length = 0.05)
  data.frame(id = cl$id, method = if (small) "fisher" else "prop.test", focus_n = f$n, focus_agree = f$agree, against_n = a$n, against_agree = a$agree,
             p = test$p.value, focus_lower = wf[1], focus_upper = wf[2], against_lower = wa[1], against_upper = wa[2])
})
invisible(dev.off())
write.csv(do.call(rbind, rows), file.path(out_dir, "results.csv"), row.names = FALSE)
