import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { Sheet } from '../../../components/ui/sheet';
import { ApiError } from '../../../lib/api';
import { createProject } from '../api/project-queries';
import { projectKeys } from '../../../lib/query-keys';

export function NewProjectForm() {
  const queryClient = useQueryClient();
  const [name, setName] = useState('');
  const [description, setDescription] = useState('');
  const mutation = useMutation({
    mutationFn: createProject,
    onSuccess: async () => {
      setName('');
      setDescription('');
      await queryClient.invalidateQueries({ queryKey: projectKeys.all });
    },
  });
  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    mutation.mutate({ name, description });
  };
  const error = mutation.error instanceof ApiError ? mutation.error : null;
  return (
    <Sheet title="New project" className="mt-8 max-w-xl">
      <form onSubmit={onSubmit} className="space-y-3">
        <label className="block text-sm">
          <span className="mb-1 block font-medium">Name</span>
          <input value={name} onChange={(e) => setName(e.target.value)} required maxLength={160} className="w-full rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night" />
        </label>
        <label className="block text-sm">
          <span className="mb-1 block font-medium">Description</span>
          <textarea value={description} onChange={(e) => setDescription(e.target.value)} rows={2} maxLength={4000} className="w-full rounded-md border border-rule bg-sheet px-3 py-2 dark:border-night-rule dark:bg-night" />
        </label>
        {error && (
          <p role="alert" className="text-sm text-short">
            {error.message}
          </p>
        )}
        <Button type="submit" disabled={!name.trim() || mutation.isPending}>
          {mutation.isPending ? 'Creating…' : 'Create project'}
        </Button>
      </form>
    </Sheet>
  );
}
