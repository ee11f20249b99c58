# Georeference a data frame of records with a running whereabouts service, and bind the answers back
# by occurrenceID. Needs httr and jsonlite (Debian: r-cran-httr r-cran-jsonlite).
# Run: Rscript georeference.R http://127.0.0.1:8737
library(httr)
library(jsonlite)

service <- commandArgs(trailingOnly = TRUE)[1]
if (is.na(service)) service <- "http://127.0.0.1:8737"

records <- data.frame(
  occurrenceID = c("QV-1", "QV-2", "QV-3", "QV-4"),
  locality = c("10 km NE of Puerto Lindo", "Santa Rosa", "5 km N of Puerto Lindo", "Puerto Lindo"),
  countryCode = "QV"
)

# At most 1000 records a request: send them in chunks; each answer line is one record.
georeference <- function(chunk) {
  response <- POST(paste0(service, "/api/v1/georeference/records"),
                   body = toJSON(chunk), content_type_json())
  stop_for_status(response)
  answers <- stream_in(textConnection(content(response, as = "text", encoding = "UTF-8")), verbose = FALSE)
  cbind(occurrenceID = answers$occurrenceID, status = answers$status, answers$darwinCore)
}
chunks <- split(records, ceiling(seq_len(nrow(records)) / 1000))
answers <- rbind_pages(lapply(chunks, georeference))

bound <- cbind(records, answers[match(records$occurrenceID, answers$occurrenceID), -1])
write.csv(bound, stdout(), row.names = FALSE)
