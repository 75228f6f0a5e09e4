/* The commands the fuzzing harnesses run, with their files and argument
 * lines (see fuzz.h), and the small tables a fuzzed project file may name
 * (tests/fuzz/fuzz_project.c). Hole names and columns are those of the seed
 * corpus, so that a fuzzed file meets tables it matches. */
#include <string.h>

#include "cli/cli.h"
#include "fuzz.h"

#define PROGRAM "--collars {collars.csv} --surveys {surveys.csv}"

const fuzz_cmd fuzz_commands[] = {
    {"trace", cmd_trace, {"collars.csv", "surveys.csv", "at.csv", "project.ini"},
     {"trace " PROGRAM " -o {o.csv}",
      "trace " PROGRAM " --at {at.csv} -o {o.csv}",
      "trace " PROGRAM " --step 7 -o {o.csv} --about {s.about}",
      "trace -p {project.ini} -o {o.csv}",
      "trace -p {project.ini} --at {at.csv} -o {o.csv}",
      "trace " PROGRAM " --delimiter semicolon --decimal-comma --output-delimiter semicolon "
      "--output-decimal-mark comma --step 50 -o {o.csv}",
      "trace " PROGRAM " --collar-station --dip-convention positive-down --units feet "
      "--declination 6 --convergence -1.5 --step 25 -o {o.csv}",
      "trace " PROGRAM " --surveys-dip-convention from-vertical --reject-station T1@50,T2@10 "
      "--at {at.csv} -q -o {o.csv}"},
     {NULL, "at.csv", NULL, NULL, NULL, NULL, NULL, "at.csv"}},
    {"convert", cmd_convert, {"collars.csv", "surveys.csv", "log.csv", "project.ini"},
     {"convert " PROGRAM " -o {o.csv} {log.csv}",
      "convert -p {project.ini} -o {o.csv}",
      "convert " PROGRAM " --draws 20 --seed 3 --cloud {s.csv} -o {o.csv} {log.csv}",
      "convert " PROGRAM " --section-azimuth 45 --interval-depth from --kind-codes BD=bedding,"
      "VN=vein --confidence-codes G=good,P=poor -o {o.csv} {log.csv}",
      "convert " PROGRAM " --reference-line top --beta-end up-hole --beta-sense anticlockwise "
      "--gamma-zero up-hole --gamma-sense anticlockwise -o {o.csv} {log.csv} {log.csv}",
      "convert -p {project.ini} --structures {log.csv} -o {o.csv} --about {s.about}",
      "convert " PROGRAM " --units feet --delimiter semicolon --output-delimiter tab -o {o.csv} "
      "{log.csv}",
      "convert " PROGRAM " --draws 5 --confidence-errors good=3,fair=8,poor=20 "
      "--near-parallel 20 -o {o.csv} {log.csv}"},
     {"log.csv", NULL, "log.csv", "log.csv", "log.csv", NULL, NULL, "log.csv"}},
    {"check", cmd_check, {"collars.csv", "surveys.csv", "log.csv", "runs.csv", "project.ini"},
     {"check " PROGRAM " -o {o.csv} {log.csv}",
      "check " PROGRAM " --runs {runs.csv} --report {s.html} -o {o.csv} {log.csv}",
      "check -p {project.ini} --report {s.html} -o {o.csv}",
      "check " PROGRAM " -o {o.csv}",
      "check " PROGRAM " --gap 20 --dogleg 1 --run-length 1.5 --hole-turn 5 --low-confidence "
      "poor --kind-codes BD=bedding -o {o.csv} {log.csv}",
      "check -p {project.ini} --runs {runs.csv} -o {o.csv}",
      "check " PROGRAM " --report {o.html} -o {s.csv} {log.csv}"}, {NULL}},
    {"stereonet", cmd_stereonet, {"converted.csv", "other.csv", "project.ini"},
     {"stereonet {converted.csv} -o {o.svg}",
      "stereonet {converted.csv} --stats {s.csv} -o {o.svg}",
      "stereonet {converted.csv} {other.csv} --group-by kind --terzaghi --net-per-group "
      "--stats {s.csv} -o {o.svg}",
      "stereonet --projection equal-angle --planes both --contours smooth {converted.csv} "
      "-o {o.svg}",
      "stereonet --where kind=bedding --where kind=vein --planes great-circles --contours none "
      "{converted.csv} {other.csv} -o {o.svg}",
      "stereonet -p {project.ini} {converted.csv} --stats {o.csv} -o {s.svg}",
      "stereonet --group-by hole --contour-step 1 --terzaghi --terzaghi-min-angle 30 "
      "{converted.csv} --stats {o.csv} -o {s.svg}",
      "stereonet --delimiter semicolon --decimal-mark comma --title Net {converted.csv} "
      "-o {o.svg}"}, {NULL}},
    {"section", cmd_section, {"collars.csv", "surveys.csv", "converted.csv", "project.ini"},
     {"section " PROGRAM " --origin 1000,2000 --azimuth 90 --width 20 -o {o.csv} "
      "{converted.csv}",
      "section " PROGRAM " --origin 1000,2000 --azimuth 90 --width 40 --from 0 --to 300 "
      "--svg {s.svg} -o {o.csv} {converted.csv}",
      "section -p {project.ini} --origin 1000,2000 --azimuth 0 --width 50 --kinds bedding,vein "
      "--svg {s.svg} -o {o.csv} {converted.csv}",
      "section " PROGRAM " --origin 1000,2000 --azimuth 45 --width 5 --scale 500 --step 2 "
      "--svg {o.svg} -o {s.csv} {converted.csv}"}, {NULL}},
    {"export", cmd_export,
     {"collars.csv", "surveys.csv", "converted.csv", "intervals.csv", "project.ini"},
     {"export --format csv -o {o.csv} {converted.csv}",
      "export --format vtk " PROGRAM " -o {o.vtk} {converted.csv}",
      "export --format vtk --binary --shape points --arrows 3 " PROGRAM " -o {o.vtk} "
      "{converted.csv}",
      "export --format gpkg " PROGRAM " --intervals lith={intervals.csv} --contacts "
      "{intervals.csv} -o {o.gpkg} {converted.csv}",
      "export --format geojson --layers structures -o {o.geojson} {converted.csv}",
      "export --format dxf " PROGRAM " --radius 3 -o {o.dxf} {converted.csv}",
      "export --format csv " PROGRAM " --contacts {intervals.csv} --contact-column unit "
      "--youngest-first cover,basalt,dolerite -o {o.csv} {converted.csv}",
      "export -p {project.ini} --format vtk --intervals {intervals.csv} -o {o.vtk}"}, {NULL}},
    {"plan", cmd_plan, {"holes.csv", "sets.csv", "targets.csv", "project.ini"},
     {"plan --holes {holes.csv} --sets {sets.csv} -o {o.csv}",
      "plan --holes {holes.csv} --sets {sets.csv} --targets {targets.csv} --pierce {s.csv} "
      "-o {o.csv}",
      "plan --holes {holes.csv} --sets {sets.csv} --sweep azimuth=0:360:45,dip=-30:-90:30 "
      "--best {s.csv} --svg {t.svg} -o {o.csv}",
      "plan -p {project.ini} --holes {holes.csv} --sets {sets.csv} -o {o.csv}",
      "plan --holes {holes.csv} --sets {sets.csv} --targets {targets.csv} --dip-convention "
      "from-vertical --declination 5 --near-parallel 20 --pierce {o.csv} -o {s.csv}",
      "plan --holes {holes.csv} --sets {sets.csv} --targets {targets.csv} --sweep "
      "azimuth=90:270:60,dip=-45:-90:15 --best {o.csv} --svg {s.svg} -o {t.csv}"}, {NULL}},
    {"solve", cmd_solve, {"collars.csv", "surveys.csv", "readings.csv", "project.ini"},
     {"solve " PROGRAM " --draws 20 --seed 2 -o {o.csv} {readings.csv}",
      "solve " PROGRAM " --draws 0 --residuals {s.csv} -o {o.csv} {readings.csv}",
      "solve -p {project.ini} --draws 5 --svg {s.svg} -o {o.csv} {readings.csv}",
      "solve " PROGRAM " --parallel-limit 5 --draws 10 --alpha-error 4 --svg {o.svg} "
      "--draw-sets tuff --residuals {s.csv} -o {t.csv} {readings.csv}"}, {NULL}},
    {"merge", cmd_merge, {"log.csv", "part1.csv", "part2.csv", "project.ini"},
     {"merge --structures {log.csv} -o {o.csv} {part1.csv} {part2.csv}",
      "merge -p {project.ini} --structures {log.csv} -o {o.csv} {part1.csv} {part2.csv}",
      "merge --structures {log.csv} --structures {log.csv} -o {o.csv} {part1.csv} "
      "{part2.csv}"},
     {"log.csv", "log.csv", NULL}},
};

const size_t fuzz_ncommands = sizeof fuzz_commands / sizeof *fuzz_commands;

/* Small good tables (from tests/cli/data). */
static const struct {
    const char *name, *text;
} tables[] = {
    {"collars.csv", "hole,x,y,z,azimuth,dip,length\nT1,1000,2000,300,90,-60,200\n"
                    "T2,1100,2000,300,,,150\nT3,1200,2000,300,45,-70,120\n"},
    {"surveys.csv", "hole,depth,azimuth,dip\nT1,0,90,-60\nT1,50,91,-59\nT1,100,92,-58\n"
                    "T2,10,180,-80\nT2,70,182,-78\n"},
    {"at.csv", "sample,hole,depth,comment\ns1,T1,0,collar\ns2,T1,25.5,\"on the arc\"\n"
               "s3,T2,5,above first station\n"},
    {"log.csv", "hole,depth,alpha,beta,gamma,kind,confidence\nT1,10,30,90,,bedding,good\n"
                "T1,40,45,270,30,fault,fair\nT2,20,60,10,,vein,poor\n"},
    {"runs.csv", "hole,from,to,confidence\nT1,0,30,good\nT1,30,60,fair\n"},
    {"converted.csv",
     "hole,depth,kind,hole_azimuth,hole_plunge,dip,dip_direction,trend,plunge,x,y,z,status,"
     "note\nT1,10,bedding,90,60,60,270,,,1005,2000,291,ok,\n"
     "T1,45,vein,91,59,80,0,,,1022,2000,261,ok,\nT1,70,fault,91,59,45,135,20,100,1035,2000,"
     "240,ok,\n"},
    {"other.csv", "hole,depth,kind,dip,dip_direction,trend,plunge,status\n"
                  "T2,10,joint,30,200,,,ok\nT2,20,lineation,,,40,180,ok\n"},
    {"intervals.csv", "hole,from,to,unit\nT1,0,12.5,cover\nT1,12.5,40,basalt\n"
                      "T1,40,95,dolerite\n"},
    {"readings.csv", "hole,depth,alpha,set\nT1,20,40,tuff\nT2,30,55,tuff\nT3,25,35,tuff\n"
                     "T1,60,70,vein\n"},
    {"holes.csv", "hole,x,y,z,azimuth,dip,length,lift,drift\nPA,1000,2000,300,135,-60,250,,\n"
                  "PB,1100,2000,300,90,-70,300,2,1\n"},
    {"sets.csv", "set,dip,dip_direction,kappa,weight\nsteep,84,90,,1\ngentle,30,300,40,2\n"},
    {"targets.csv", "target,x,y,z,dip,dip_direction\nvein,1150,2000,200,85,90\n"},
};

const char *fuzz_table(const char *name)
{
    for (size_t i = 0; i < sizeof tables / sizeof *tables; i++)
        if (strcmp(tables[i].name, name) == 0)
            return tables[i].text;
    return "";
}
