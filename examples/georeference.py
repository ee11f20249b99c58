"""Georeference a list of records with a running whereabouts service, and bind the answers back by
occurrenceID. Python's standard library only. Run: python3 georeference.py http://127.0.0.1:8737"""
import csv
import json
import sys
import urllib.request

service = sys.argv[1] if len(sys.argv) > 1 else "http://127.0.0.1:8737"

records = [
    {"occurrenceID": "QV-1", "locality": "10 km NE of Puerto Lindo", "countryCode": "QV"},
    {"occurrenceID": "QV-2", "locality": "Santa Rosa", "countryCode": "QV"},
    {"occurrenceID": "QV-3", "locality": "5 km N of Puerto Lindo", "countryCode": "QV"},
    {"occurrenceID": "QV-4", "locality": "Puerto Lindo", "countryCode": "QV"},
]


def georeference(records, per_request=1000):
    """Answers by occurrenceID; at most 1000 records a request, each answer line is one record."""
    answers = {}
    for start in range(0, len(records), per_request):
        body = json.dumps(records[start:start + per_request]).encode("utf-8")
        request = urllib.request.Request(service + "/api/v1/georeference/records", data=body,
                                         headers={"content-type": "application/json"})
        with urllib.request.urlopen(request) as response:
            for line in response:
                answer = json.loads(line)
                answers[answer["occurrenceID"]] = answer
    return answers


answers = georeference(records)
bound = [{**record, "status": answers[record["occurrenceID"]]["status"],
          **answers[record["occurrenceID"]].get("darwinCore", {})} for record in records]

columns = list(dict.fromkeys(column for row in bound for column in row))
writer = csv.DictWriter(sys.stdout, fieldnames=columns, restval="")
writer.writeheader()
writer.writerows(bound)
