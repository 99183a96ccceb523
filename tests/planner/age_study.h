#pragma once
// An invented 3-level ordered age study with gender assigned between
// vacancies: each vacancy receives three applications (aged 28, 45 and 58,
// signalled by birth and graduation years) from applicants of one gender
// (signalled by the names). Every town, firm and person is fictional. The
// same study is the worked example of docs/designs.md.
#include <cstdio>
#include <string>

#include "testing/testing.h"

namespace twinprobe::testing {

inline std::string AgeStudyToml() {
  return R"toml(# Invented example: ages 28, 45 and 58 within each vacancy, gender between vacancies.
[study]
id = "ostervale-age-study"
title = "Callbacks by age in Ostervale (invented example)"
seed = 20270412
kind = "sets"

[[factor]]
name = "age"
label = "age (years)"
levels = ["28", "45", "58"]
reference = "28"
scores = [28, 45, 58]
labels = { "28" = "aged 28", "45" = "aged 45", "58" = "aged 58" }
fields = { birth_year = ["1999", "1982", "1969"], graduation_year = ["2020", "2003", "1990"] }

[[factor]]
name = "gender"
vary = "between"
levels = ["f", "m"]
reference = "f"
labels = { "f" = "woman", "m" = "man" }

[arms]
include = "all"

[profiles]
mailbox = "{given}.{family}@postbox.example"

[[profiles.pool]]
factor = "gender"
level = "f"
file = "names/f.csv"

[[profiles.pool]]
factor = "gender"
level = "m"
file = "names/m.csv"

[templates]
files = ["templates/cv_a.md", "templates/cv_b.md", "templates/cv_c.md"]

[vacancies]
file = "vacancies.csv"

[schedule]
start = "2027-05-03"
gap_hours = [24, 72]
sets_per_day = 12

[strata]
columns = ["region"]

[ethics]
approval = "OREB-2027-031 (Ostervale Research Ethics Board, invented)"
retention_days = 365
decline_within_hours = 24
cap_per_employer = 3
)toml";
}

// Writes the study into `dir`: 48 vacancies (30 in Northmere, 18 in
// Saltbridge), 8 names per gender, three templates.
inline void WriteAgeStudy(const std::string& dir, const std::string& toml = AgeStudyToml()) {
  WriteFile(dir + "/study.toml", toml);
  std::string vacancies = "vacancy,employer,contact,occupation,region\n";
  for (int i = 1; i <= 48; ++i) {
    char row[200];
    std::snprintf(row, sizeof row, "A%03d,Ostervale Firm %02d (invented),jobs%02d@firm.example,clerk,%s\n", i, i, i,
                  i <= 30 ? "Northmere" : "Saltbridge");
    vacancies += row;
  }
  WriteFile(dir + "/vacancies.csv", vacancies);
  WriteFile(dir + "/names/f.csv",
            "given_name,family_name\nAnneli,Varrow\nBritt,Olsmark\nCora,Helvin\nDagny,Sorrel\nEbba,Tallgren\n"
            "Frida,Moraine\nGunn,Keswald\nHedda,Lindqvar\n");
  WriteFile(dir + "/names/m.csv",
            "given_name,family_name\nArvid,Stenholt\nBjarke,Fennow\nCasper,Ruddle\nDaven,Oakhurst\nEinar,Pellby\n"
            "Fredrik,Quarne\nGorm,Waltrup\nHalvar,Brisk\n");
  for (const char* name : {"a", "b", "c"})
    WriteFile(dir + "/templates/cv_" + std::string(name) + ".md",
              "# {{full_name}}\n\n{{mailbox}}\n\nBorn {{birth_year}}. Application for {{occupation}} ({{vacancy}}).\n\n"
              "Vocational certificate, Ostervale Technical College ({{graduation_year}}). Template " +
                  std::string(name) + ".\n");
}

}  // namespace twinprobe::testing
