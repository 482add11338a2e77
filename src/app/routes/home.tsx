import { HomePage } from "@/features/home/components/home-page";
import { ProjectsTable } from "@/features/projects/components/projects-table";

/** `/`: the home page, with the projects feature's table composed in (its own chunk: the first page most see). */
export function HomeRoute() {
  return (
    <HomePage renderProjects={(projects) => <ProjectsTable projects={projects} label="My projects" />} />
  );
}
