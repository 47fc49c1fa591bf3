import { useNavigate } from "react-router-dom";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { HomeForm } from "@/features/properties/components/home-form";

/** Admins add a home; its rooms are added on the home's own page next. */
export default function NewHomePage() {
  const navigate = useNavigate();
  return (
    <>
      <title>Add a home · Dewline</title>
      <p className="mb-2 text-sm">
        <TextLink to="/homes">All homes</TextLink>
      </p>
      <PageHeader title="Add a home" description="Its details first; you add its rooms on the next page." />
      <Panel as="div">
        <HomeForm onSaved={(home) => void navigate(`/homes/${home.id}#home-rooms`)} onCancel={() => void navigate("/homes")} />
      </Panel>
    </>
  );
}
