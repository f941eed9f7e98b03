import { ErrorNotice, InfoNotice, Progress } from '../components/Notice';
import { Panel } from '../components/Panel';
import { can } from '../features/auth';
import {
  AnswersStep,
  DropZone,
  OutgoingList,
  UploadHistory,
  needsAnswers,
  useSendFiles,
  useUploads,
} from '../features/intake';
import { useCurrentCruise } from './CruiseLayout';

/** Intake: cast files in, with bytes, processing and errors shown file by file. */
export default function Intake() {
  const cruise = useCurrentCruise();
  const uploads = useUploads(cruise.id);
  const sender = useSendFiles(cruise.id);
  const mayUpload = can.uploadCasts(cruise.role);
  // The batch waiting for answers: every failed upload whose files lack what a cast needs.
  const waiting = (uploads.data ?? []).filter(needsAnswers);

  return (
    <div className="flex flex-col gap-5">
      {mayUpload && !cruise.locked && (
        <>
          <DropZone onFiles={sender.send} />
          <OutgoingList
            cruiseId={cruise.id}
            outgoing={sender.outgoing}
            onCancel={sender.cancel}
            onClear={sender.clearFinished}
          />
        </>
      )}
      {mayUpload && !cruise.locked && waiting.length > 0 && <AnswersStep cruiseId={cruise.id} uploads={waiting} />}
      {mayUpload && cruise.locked && <InfoNotice>This cruise is locked: no more files can come in.</InfoNotice>}
      {!mayUpload && (
        <InfoNotice>
          Technicians and the chief scientist upload cast files. You can follow what came in and how it went.
        </InfoNotice>
      )}
      <Panel title="Upload history" titleId="upload-history">
        {uploads.isPending && <Progress label="Loading the uploads…" />}
        {uploads.isError && (
          <div className="p-4">
            <ErrorNotice error={uploads.error} title="The uploads could not be loaded" />
          </div>
        )}
        {uploads.isSuccess && (
          <UploadHistory cruiseId={cruise.id} uploads={uploads.data} canUpload={mayUpload && !cruise.locked} />
        )}
      </Panel>
    </div>
  );
}
