import { useEffect, useRef } from 'react';
import { useNavigate, useParams } from 'react-router';
import { StationDetailView } from '../features/stations/components/station-detail';
import { StationList } from '../features/stations/components/station-list';
import { StationUploadForm } from '../features/stations/components/station-upload-form';
import { BulkImportForm } from '../features/stations/components/bulk-import-form';
import { NormalsReleases } from '../features/stations/components/normals-releases';

/** Editors' Stations tab: the list, the upload form, and the selected station's frost dates. */
export default function EditorsStationsRoute() {
  const { stationId } = useParams();
  const navigate = useNavigate();
  const selectedId = stationId ? Number(stationId) : null;
  const detailRef = useRef<HTMLDivElement>(null);
  // The chosen station's dates sit below the list and the upload form: bring them into view.
  useEffect(() => {
    if (selectedId !== null) detailRef.current?.scrollIntoView?.({ block: 'start', behavior: 'smooth' });
  }, [selectedId]);
  return (
    <div className="mx-auto max-w-6xl px-4 py-8">
      <h1 className="text-2xl font-semibold text-fig-900">Climate stations</h1>
      <p className="mt-2 mb-6 max-w-3xl text-ink/80">
        Daily minimum temperatures from a weather station give the frost-free season the atlas shows near it. Upload a station’s daily file; Syconium works out each year’s last spring and first
        fall freeze at 32, 28 and 24 °F and the dates and season lengths at 10, 50 and 90 %, the way national climate normals do. NOAA’s published normals come with the app as
        reference climate for everywhere else; a whole set of files can be imported at once.
      </p>
      <div className="grid gap-6 lg:grid-cols-2">
        <section aria-labelledby="stations-list-title" className="min-w-0">
          <h2 id="stations-list-title" className="mb-2 font-medium text-fig-900">
            Stations
          </h2>
          <StationList selectedId={selectedId} onDeleted={(id) => id === selectedId && navigate('/editors/stations')} />
        </section>
        <section aria-labelledby="stations-upload-title" className="min-w-0">
          <h2 id="stations-upload-title" className="mb-2 font-medium text-fig-900">
            Upload a station
          </h2>
          <StationUploadForm onUploaded={(id) => navigate(`/editors/stations/${id}`)} />
          <h2 id="stations-bulk-title" className="mt-6 mb-2 font-medium text-fig-900">
            Import a whole set
          </h2>
          <BulkImportForm />
          <NormalsReleases />
        </section>
      </div>
      <div ref={detailRef} className="mt-10 scroll-mt-4">
        {selectedId !== null && Number.isInteger(selectedId) ? <StationDetailView id={selectedId} /> : <p className="text-ink/70">Choose a station to see its freeze dates.</p>}
      </div>
    </div>
  );
}
