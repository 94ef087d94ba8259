import { accessLayout } from "./page-access";

// Every project page: signed in and a member of this project, else 404 (sign-in when anonymous).
// Checked here, above every loading state below, so the answer is a real 404, not a streamed 200.
export default accessLayout("project.view");
