import { bondingStudySchema } from '../../lib/schemas/bonding-study.schema';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import StudyForm from './StudyForm';
import GeneralSection from './GeneralSection';
import CablesSection from './CablesSection';
import LayoutsSection from './LayoutsSection';
import SectionsSection from './SectionsSection';
import BondingSection from './BondingSection';
import EccsSection from './EccsSection';
import SvlsSection from './SvlsSection';
import EarthingStrip from './EarthingStrip';
import CasesSection from './CasesSection';

/** The designer's editor for a bonding study: every field of the model, validated by the schema the server uses. */
export default function BondingEditor({ detail, readOnly }: { detail: RevisionDetail; readOnly: boolean }) {
  return (
    <StudyForm detail={detail} readOnly={readOnly} schema={bondingStudySchema}>
      {(onNotes) => (
        <>
          <GeneralSection />
          <CablesSection onNotes={onNotes} />
          <LayoutsSection />
          <SectionsSection studyCode={detail.study.code} onNotes={onNotes} />
          <BondingSection />
          <EccsSection />
          <SvlsSection />
          <EarthingStrip />
          <CasesSection />
        </>
      )}
    </StudyForm>
  );
}
