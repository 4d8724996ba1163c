'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { useSWRConfig } from 'swr';
import { z } from 'zod';
import { sameNames } from '@/components/forms/apply-server-errors';
import { useApiSubmit } from '@/components/forms/use-api-submit';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { FieldShell, TextField } from '@/components/ui/field';
import { formatDateTime } from '@/components/ui/format-date';
import { Panel } from '@/components/ui/panel';
import { SelectField, type SelectOption } from '@/components/ui/select';
import { Skeleton } from '@/components/ui/skeleton';
import { Table, Td, Th } from '@/components/ui/table';
import { attachmentUrl, planAttachmentsKey, uploadAttachment, usePlanAttachments, type Attachment } from '@/hooks/use-plan-attachments';
import { MAX_ATTACHMENT_BYTES, type AttachmentKind } from '@/lib/storage/content-type';
import { attachmentFieldsSchema } from '@/lib/validations/attachment';

interface AttachmentsPanelProps {
  studyId: number;
  planId: number;
  points: { id: number; seq: number; label: string }[];
  /** the viewer may upload now (their role logs readings and the plan is on the bench) */
  canUpload: boolean;
  /** the point chosen elsewhere on the page; the upload form follows it */
  selectedPointId?: number | null;
}

const MB = 1024 * 1024;

const KIND_OPTIONS: SelectOption[] = [
  { value: 'photo', label: `Photo (JPEG, PNG or WebP, up to ${MAX_ATTACHMENT_BYTES.photo / MB} MB)` },
  { value: 'instrument', label: `Instrument file (Touchstone, CSV, text or PDF, up to ${MAX_ATTACHMENT_BYTES.instrument / MB} MB)` },
];

/** What the file picker offers for each kind; the server checks the content whatever the picker allowed. */
const ACCEPT: Record<AttachmentKind, string> = {
  photo: 'image/jpeg,image/png,image/webp',
  instrument: '.s1p,.s2p,.s3p,.s4p,.ts,.csv,.txt,.dat,.pdf,text/plain,text/csv,application/pdf',
};

/** The shared field schema plus the picked file, with the kind's size limit checked before sending. */
const formSchema = attachmentFieldsSchema
  .extend({
    file: z.custom<FileList>((value) => typeof FileList !== 'undefined' && value instanceof FileList && value.length > 0, 'Choose a file to upload.'),
  })
  .superRefine((values, ctx) => {
    const max = MAX_ATTACHMENT_BYTES[values.kind];
    if (values.file[0].size > max) {
      ctx.addIssue({ code: 'custom', path: ['file'], message: `This file is larger than ${max / MB} MB.` });
    }
  });
type FormInput = z.input<typeof formSchema>;
type FormOutput = z.output<typeof formSchema>;
const fieldFor = sameNames<FormInput>(['kind', 'pointId', 'caption', 'file']);

function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < MB) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / MB).toFixed(1)} MB`;
}

/** Short type labels for instrument files, where a photo shows its thumbnail. */
const TYPE_LABEL: Record<string, string> = { 'application/pdf': 'PDF', 'text/csv': 'CSV', 'text/plain': 'Text' };

/** Photos and instrument files of a plan: the upload form for those who log readings, and the list for everyone. */
export function AttachmentsPanel({ studyId, planId, points, canUpload, selectedPointId }: AttachmentsPanelProps) {
  const { attachments, error, isLoading } = usePlanAttachments(studyId, planId);
  return (
    <Panel title="Photos and instrument files" description="Bench photos and the files your instruments export, kept with the plan." flush>
      {canUpload && (
        <div className="border-b border-ink-100 px-5 py-4">
          <UploadForm studyId={studyId} planId={planId} points={points} selectedPointId={selectedPointId} />
        </div>
      )}
      {isLoading && <Skeleton label="Loading files…" className="px-5 py-5" />}
      {error && (
        <div className="px-5 py-4">
          <Alert tone="error">The files could not be loaded. {error.message}</Alert>
        </div>
      )}
      {attachments && attachments.length === 0 && <p className="px-5 py-4 text-sm text-ink-600">No files yet.</p>}
      {attachments && attachments.length > 0 && <AttachmentTable studyId={studyId} attachments={attachments} />}
    </Panel>
  );
}

function UploadForm({ studyId, planId, points, selectedPointId }: Omit<AttachmentsPanelProps, 'canUpload'>) {
  const { mutate } = useSWRConfig();
  const fileInput = useRef<HTMLInputElement | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    setValue,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(formSchema),
    defaultValues: { kind: 'photo', pointId: selectedPointId ? String(selectedPointId) : '', caption: '' },
  });
  const { formError, notice, run } = useApiSubmit(setError, fieldFor);
  const kind = watch('kind') as AttachmentKind;
  const fileField = register('file');

  useEffect(() => {
    if (selectedPointId !== undefined) setValue('pointId', selectedPointId === null ? '' : String(selectedPointId));
  }, [selectedPointId, setValue]);

  const pointOptions: SelectOption[] = [{ value: '', label: 'The whole plan' }, ...points.map((p) => ({ value: String(p.id), label: p.label }))];

  async function onSubmit(values: FormOutput) {
    await run(async () => {
      const form = new FormData();
      form.append('kind', values.kind);
      form.append('pointId', values.pointId === null ? '' : String(values.pointId));
      form.append('caption', values.caption ?? '');
      form.append('file', values.file[0]);
      const attachment = await uploadAttachment(studyId, planId, form);
      await mutate(planAttachmentsKey(studyId, planId));
      reset({ kind: values.kind, pointId: values.pointId === null ? '' : String(values.pointId), caption: '' });
      if (fileInput.current) fileInput.current.value = '';
      return `Uploaded ${attachment.fileName}.`;
    });
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-4">
      {/* A refused file (413, 415) is explained beside the file input; say it once. */}
      {formError && formError !== errors.file?.message && <Alert tone="error">{formError}</Alert>}
      {notice && <Alert tone="success">{notice}</Alert>}
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField label="Kind" options={KIND_OPTIONS} error={errors.kind?.message} {...register('kind')} />
        <SelectField label="Point" options={pointOptions} hint="Leave it at the whole plan for files that cover several points." error={errors.pointId?.message} {...register('pointId')} />
      </div>
      <TextField label="Caption" placeholder="e.g. ferrite plate 2 mm under the pad" error={errors.caption?.message} {...register('caption')} />
      <FieldShell label="File" hint="Checked by its content, not its name." error={errors.file?.message}>
        {(control) => (
          <input
            {...control}
            {...fileField}
            ref={(element) => {
              fileField.ref(element);
              fileInput.current = element;
            }}
            type="file"
            accept={ACCEPT[kind] ?? ACCEPT.photo}
            className="block w-full text-sm text-ink-700 file:mr-3 file:rounded-md file:border file:border-ink-300 file:bg-white file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink-800 hover:file:bg-ink-50"
          />
        )}
      </FieldShell>
      <Button type="submit" variant="primary" disabled={isSubmitting}>
        {isSubmitting ? 'Uploading…' : 'Upload'}
      </Button>
    </form>
  );
}

function AttachmentTable({ studyId, attachments }: { studyId: number; attachments: Attachment[] }) {
  return (
    <Table caption="Files of this plan, newest first">
      <thead>
        <tr>
          <Th dense>Preview</Th>
          <Th dense>File</Th>
          <Th dense>Point</Th>
          <Th dense>Size</Th>
          <Th dense>Uploaded by</Th>
          <Th dense>When</Th>
          <Th dense>SHA-256</Th>
        </tr>
      </thead>
      <tbody>
        {attachments.map((attachment) => {
          const url = attachmentUrl(studyId, attachment.id);
          const photo = attachment.kind === 'photo';
          return (
            <tr key={attachment.id}>
              <Td dense>
                {photo ? (
                  // The API route answers with a redirect to a short-lived signed link; next/image cannot follow that.
                  <img src={url} alt={attachment.caption ?? attachment.fileName} width={64} height={48} loading="lazy" className="h-12 w-16 rounded border border-ink-200 bg-ink-50 object-cover" />
                ) : (
                  <Badge>{TYPE_LABEL[attachment.contentType] ?? 'File'}</Badge>
                )}
              </Td>
              <Td dense className="max-w-xs">
                <a
                  href={url}
                  {...(photo ? { target: '_blank', rel: 'noopener noreferrer' } : {})}
                  className="break-all font-medium text-flux-700 hover:underline"
                >
                  {attachment.fileName}
                </a>
                {attachment.caption && <p className="mt-0.5 text-xs text-ink-600">{attachment.caption}</p>}
              </Td>
              <Td dense>{attachment.pointSeq === null ? <span className="text-ink-500">whole plan</span> : `#${attachment.pointSeq}`}</Td>
              <Td dense className="whitespace-nowrap tabular-nums">{formatBytes(attachment.sizeBytes)}</Td>
              <Td dense>{attachment.uploadedBy.name}</Td>
              <Td dense className="whitespace-nowrap">{formatDateTime(attachment.createdAt)}</Td>
              <Td dense>
                <span title={attachment.sha256} className="font-mono text-xs text-ink-600">
                  {attachment.sha256.slice(0, 12)}…
                </span>
              </Td>
            </tr>
          );
        })}
      </tbody>
    </Table>
  );
}
